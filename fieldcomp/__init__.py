"""fieldcomp: the edges (job files, CLI, Textual workbench) around the pure `engine`."""

__version__ = "0.1.0"

CAUTION = (
    "Results support, and do not replace, the engineer of record; local codes and licensed "
    "practice govern; field repairs need the engineer of record's approval."
)
