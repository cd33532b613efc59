"""The house rules that a tool can hold: layer contracts (import-linter, configured in
pyproject.toml), no import cycles between modules (imports inside functions count), an engine
that loads none of the edge packages, and clean `ruff check` and strict `mypy` runs (both
configured in pyproject.toml)."""

from __future__ import annotations

import pkgutil
import subprocess
import sys
from pathlib import Path

import grimp
import pytest

import engine

ROOT = Path(__file__).resolve().parents[1]


def test_import_contracts_hold():
    out = subprocess.run([str(Path(sys.executable).with_name("lint-imports")), "--no-cache"], cwd=ROOT,
                         capture_output=True, text=True, check=False)
    assert out.returncode == 0, out.stdout + out.stderr
    assert "BROKEN" not in out.stdout


def _run_tool(name: str, *args: str) -> subprocess.CompletedProcess:
    """Run a console script of this interpreter's environment from the repository root."""
    return subprocess.run([str(Path(sys.executable).with_name(name)), *args], cwd=ROOT, capture_output=True, text=True,
                          check=False)


def test_ruff_check_is_clean():
    """`ruff check engine tests tools` finds nothing (rules in pyproject.toml [tool.ruff]; fieldcomp/ is linted later)."""
    out = _run_tool("ruff", "check", "engine", "tests", "tools")
    assert out.returncode == 0, out.stdout + out.stderr


def test_mypy_strict_is_clean():
    """`mypy` over engine/ finds nothing (strict; files and options in pyproject.toml [tool.mypy])."""
    out = _run_tool("mypy")
    assert out.returncode == 0, out.stdout + out.stderr


def _cycles(graph) -> list[list[str]]:
    """Strongly connected components of more than one module (Tarjan, iterative)."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    on_stack: set[str] = set()
    stack: list[str] = []
    found: list[list[str]] = []
    for root in sorted(graph.modules):
        if root in index:
            continue
        work = [(root, iter(sorted(graph.find_modules_directly_imported_by(root))))]
        index[root] = low[root] = len(index)
        stack.append(root)
        on_stack.add(root)
        while work:
            node, children = work[-1]
            child = next(children, None)
            if child is not None:
                if child not in index:
                    index[child] = low[child] = len(index)
                    stack.append(child)
                    on_stack.add(child)
                    work.append((child, iter(sorted(graph.find_modules_directly_imported_by(child)))))
                elif child in on_stack:
                    low[node] = min(low[node], index[child])
                continue
            work.pop()
            if work:
                low[work[-1][0]] = min(low[work[-1][0]], low[node])
            if low[node] == index[node]:
                component = []
                while True:
                    m = stack.pop()
                    on_stack.discard(m)
                    component.append(m)
                    if m == node:
                        break
                if len(component) > 1:
                    found.append(sorted(component))
    return found


def test_no_module_imports_another_in_a_cycle():
    graph = grimp.build_graph("engine", "fieldcomp")
    assert _cycles(graph) == []


def test_cycle_finder_finds_a_cycle():
    graph = grimp.ImportGraph()
    for name in ("a", "b", "c"):
        graph.add_module(name)
    graph.add_import(importer="a", imported="b")
    graph.add_import(importer="b", imported="a")
    graph.add_import(importer="b", imported="c")
    assert _cycles(graph) == [["a", "b"]]


ENGINE_MODULES = sorted(m.name for m in pkgutil.walk_packages(engine.__path__, "engine."))


@pytest.mark.parametrize("module", ENGINE_MODULES)
def test_engine_module_loads_no_edge_package(module):
    """Imported alone in a fresh interpreter, no engine module brings in the job-file, UI or CSV
    packages (the engine is pure computation)."""
    code = (f"import sys, {module}\n"
            "print(','.join(m for m in ('fieldcomp', 'textual', 'rich', 'pydantic', 'tomllib', 'tomlkit', 'tomli_w', "
            "'csv') if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert out.strip() == ""


def _all_modules() -> list[str]:
    import fieldcomp

    found = []
    for package in (engine, fieldcomp):
        found += [m.name for m in pkgutil.walk_packages(package.__path__, package.__name__ + ".")]
    return sorted(found)


def test_every_error_is_a_fieldcomp_error_named_error():
    """One base class for the errors fieldcomp raises on purpose; each subclass says it is an error."""
    import importlib
    import inspect

    from engine.model.errors import FieldcompError

    errors = []
    for name in _all_modules():
        module = importlib.import_module(name)
        errors += [cls for _, cls in inspect.getmembers(module, inspect.isclass)
                   if issubclass(cls, BaseException) and cls.__module__ == name]
    assert len(errors) >= 8
    for cls in errors:
        assert issubclass(cls, FieldcompError), cls
        assert cls.__name__.endswith("Error"), cls


def test_no_source_cites_a_file_users_do_not_have():
    """What users read cites published sources only: no module, test or job names a notes file
    outside this repository (reports once printed such a citation; tests cite the publication)."""
    names = ("REFERENCE" + ".md", "DESIGN" + ".md")  # spelt apart so this test does not name them itself
    offenders = [str(p.relative_to(ROOT)) for folder in ("engine", "fieldcomp", "tests", "tools", "jobs")
                 for p in (ROOT / folder).rglob("*")
                 if p.suffix in (".py", ".tcss", ".toml", ".json")
                 and any(name in p.read_text(encoding="utf-8") for name in names)]
    assert offenders == []
