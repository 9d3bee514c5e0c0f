"""The engine's layout is its architecture: layers import downward only, with no cycles.

Layers, top of the list first: physics, data, model, system, checks, stages, pipeline, edges. A module
imports only from its own layer or the layers listed before it; function-level imports count.
Physics imports nothing from the rest of the engine; no stage imports another stage. Functions
stay short enough to read (none over 100 lines) and modules under about 600 lines.
Source: the project's layer rules (DEVELOPERS.md), checked on the source text.
"""
from __future__ import annotations

import ast
from pathlib import Path

import pytest

CALC = Path(__file__).resolve().parent.parent / "calc"
LAYERS = ("physics", "data", "model", "system", "checks", "stages", "pipeline", "edges")
MAX_FUNCTION_LINES = 100
MAX_MODULE_LINES = 650


def _modules() -> dict[str, Path]:
    out = {}
    for path in sorted(CALC.rglob("*.py")):
        rel = path.relative_to(CALC.parent).with_suffix("")
        name = ".".join(rel.parts)
        out[name[: -len(".__init__")] if name.endswith(".__init__") else name] = path
    return out


MODULES = _modules()


def _layer(module: str) -> str | None:
    parts = module.split(".")
    if len(parts) < 2:
        return None  # the calc package itself and calc.__main__
    return parts[1] if parts[1] in LAYERS else None


def _imports(module: str, path: Path) -> set[str]:
    """Every calc module that ``module`` imports, at any depth of its code."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    package = module if path.name == "__init__.py" else module.rsplit(".", 1)[0]
    out = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            names = [a.name for a in node.names]
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = package.split(".")
                base = base[: len(base) - node.level + 1]
                stem = ".".join(base + ([node.module] if node.module else []))
            else:
                stem = node.module or ""
            names = [stem] + [f"{stem}.{a.name}" for a in node.names]
        else:
            continue
        out.update(n for n in names if n in MODULES and n != module)
    return out


GRAPH = {m: _imports(m, p) for m, p in MODULES.items()}


def test_every_engine_module_is_in_a_layer():
    # Source: the layer rules; only the package's own __init__ and __main__ sit outside the layers.
    loose = [m for m in MODULES if _layer(m) is None and m not in ("calc", "calc.__main__")]
    assert loose == []


@pytest.mark.parametrize("module", sorted(MODULES))
def test_imports_go_downward_only(module):
    # Source: the layer rules: a module imports its own layer or the layers before it.
    layer = _layer(module)
    if layer is None:
        return
    for dep in GRAPH[module]:
        dep_layer = _layer(dep)
        if dep_layer is None:  # the package itself: only its docstring and a lazy entry point
            continue
        assert LAYERS.index(dep_layer) <= LAYERS.index(layer), f"{module} imports {dep} (a higher layer)"


def test_physics_imports_nothing_from_the_rest_of_the_engine():
    # Source: the layer rules: physics takes numbers and imports no job, table or stage.
    for module in MODULES:
        if _layer(module) == "physics":
            assert all(_layer(d) == "physics" for d in GRAPH[module]), (module, GRAPH[module])


def test_no_stage_imports_another_stage():
    # Source: the layer rules: each stage reads earlier stages' sections, never their modules.
    for module in MODULES:
        if _layer(module) == "stages":
            assert not [d for d in GRAPH[module] if _layer(d) == "stages" and d != "calc.stages"], module


def test_no_import_cycles():
    # Source: the layer rules: no cycles, function-level imports included (depth-first search).
    state: dict[str, int] = {}

    def visit(m, stack):
        state[m] = 1
        for d in GRAPH[m]:
            if state.get(d) == 1:
                pytest.fail("import cycle: " + " -> ".join(stack[stack.index(d):] + [d]))
            if d not in state:
                visit(d, stack + [d])
        state[m] = 2

    for m in MODULES:
        if m not in state:
            visit(m, [m])


@pytest.mark.parametrize("module", sorted(MODULES))
def test_functions_and_modules_stay_readable(module):
    # Source: the project's style rule (a function reads in one screen; modules under about 600 lines).
    text = MODULES[module].read_text(encoding="utf-8")
    assert len(text.splitlines()) <= MAX_MODULE_LINES, module
    for node in ast.walk(ast.parse(text)):
        if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef)):
            length = node.end_lineno - node.lineno + 1
            assert length <= MAX_FUNCTION_LINES, f"{module}.{node.name} is {length} lines"
