"""One module per CLI verb. Each defines `register(subparsers)` and `run(args) -> int`, and
imports numpy, pydantic and the engine only inside `run` so `fieldcomp --help` stays light."""

VERBS = ("open", "check", "camber", "marks", "findings", "shapes", "new", "schema", "import_floor")
