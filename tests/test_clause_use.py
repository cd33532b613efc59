"""engine/codes is the one home of the equations, constants and rules, and production uses them.

Every public function, class and constant defined in engine/codes must be reached by production
code (engine/ outside codes, fieldcomp/): imported and referenced there, or used by a codes
definition that is. A public name nothing reaches is either dead or re-implemented somewhere
else. The check reads the source with `ast` and executes nothing; names are matched by spelling
(a local variable spelled like a codes definition counts as a use), so it can miss an unused
name but never reports a used one.
"""

from __future__ import annotations

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
CODES = "engine.codes"

# Public names production need not reach, each with the reason.
ALLOWED_UNUSED = {
    # Cb of segments given by their ends, for any caller; production's segments come from brace
    # points through `unbraced_segments`, which shares its kernel (`_segment_moments`, Eq. F1-1).
    "engine.codes.aisc360_22.f_flexure.cb_for_segment",
}


def _module(path: Path) -> str:
    parts = path.relative_to(ROOT).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def _sources(*folders: str) -> dict[str, ast.Module]:
    return {_module(p): ast.parse(p.read_text(), str(p))
            for folder in folders for p in sorted((ROOT / folder).rglob("*.py"))}


def _in_codes(module: str) -> bool:
    return module == CODES or module.startswith(CODES + ".")


def _imports(tree: ast.Module) -> tuple[dict[str, tuple[str, str]], dict[str, str]]:
    """Names bound by `from engine.codes... import` ({alias: (module, name)}) and codes modules
    bound by any import ({alias: module}) anywhere in `tree`."""
    names: dict[str, tuple[str, str]] = {}
    modules: dict[str, str] = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom) and node.module and _in_codes(node.module):
            for a in node.names:
                names[a.asname or a.name] = (node.module, a.name)
        elif isinstance(node, ast.Import):
            for a in node.names:
                if _in_codes(a.name) and a.asname:
                    modules[a.asname] = a.name
    return names, modules


def _references(node: ast.AST, names: dict[str, tuple[str, str]], modules: dict[str, str],
                known: set[str]) -> set[tuple[str, str]]:
    """(module, name) of every codes definition `node` refers to: imported names it loads and
    `module.name` attributes (module bound by `import ... as` or imported from a codes package)."""
    found = set()
    for sub in ast.walk(node):
        if isinstance(sub, ast.Name) and isinstance(sub.ctx, ast.Load) and sub.id in names:
            found.add(names[sub.id])
        elif isinstance(sub, ast.Attribute) and isinstance(sub.value, ast.Name):
            base = sub.value.id
            module = modules.get(base) or (".".join(names[base]) if base in names else None)
            if module in known:
                found.add((module, sub.attr))
    return found


def _definitions(tree: ast.Module) -> dict[str, ast.AST]:
    """Top-level functions, classes and assigned names of a module."""
    defs: dict[str, ast.AST] = {}
    for node in tree.body:
        if isinstance(node, (ast.FunctionDef, ast.ClassDef)):
            defs[node.name] = node
        elif isinstance(node, ast.Assign):
            for target in node.targets:
                for leaf in ast.walk(target):
                    if isinstance(leaf, ast.Name):
                        defs[leaf.id] = node
        elif isinstance(node, ast.AnnAssign) and isinstance(node.target, ast.Name):
            defs[node.target.id] = node
    return defs


def _reached() -> tuple[set[tuple[str, str]], set[tuple[str, str]]]:
    """(every public codes definition, those production reaches)."""
    codes = _sources("engine/codes")
    production = {m: t for m, t in _sources("engine", "fieldcomp").items() if not _in_codes(m)}
    defs = {m: _definitions(t) for m, t in codes.items()}
    known = set(codes)
    frontier = set()
    for tree in production.values():
        names, modules = _imports(tree)
        frontier |= _references(tree, names, modules, known)
    reached: set[tuple[str, str]] = set()
    while frontier:
        module, name = frontier.pop()
        if (module, name) in reached or name not in defs.get(module, {}):
            continue
        reached.add((module, name))
        names, modules = _imports(codes[module])
        names = {**{n: (module, n) for n in defs[module]}, **names}  # its own names, then imports
        frontier |= _references(defs[module][name], names, modules, known)
    public = {(m, n) for m, d in defs.items() for n in d if not n.startswith("_")}
    return public, reached


def test_every_public_clause_definition_is_used_by_production():
    public, reached = _reached()
    unused = sorted(f"{m}.{n}" for m, n in public - reached if f"{m}.{n}" not in ALLOWED_UNUSED)
    assert unused == [], f"defined in engine/codes but not used by engine/ or fieldcomp/: {unused}"


def test_allowed_unused_names_exist_and_are_unused():
    public, reached = _reached()
    names = {f"{m}.{n}" for m, n in public}
    assert ALLOWED_UNUSED <= names  # no stale entry
    assert not ALLOWED_UNUSED & {f"{m}.{n}" for m, n in reached}  # production uses it: drop the entry


def test_codes_import_nothing_else_from_engine():
    for module, tree in _sources("engine/codes").items():
        for node in ast.walk(tree):
            targets = ([a.name for a in node.names] if isinstance(node, ast.Import)
                       else [node.module or ""] if isinstance(node, ast.ImportFrom) else [])
            outside = [t for t in targets if t.split(".")[0] == "engine" and not _in_codes(t)]
            assert not outside, f"{module} imports {outside}: engine/codes may import only engine/codes"
