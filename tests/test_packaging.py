"""What pip installs is imported as ``ionicity`` and lives beside a user's own
``scorer`` and ``pipelines`` packages without either shadowing the other
(common practice: an installed distribution owns only its own top-level name).
"""
from __future__ import annotations

import subprocess
import sys
import textwrap
from pathlib import Path

import ionicity

ROOT = Path(__file__).resolve().parents[1]


def _user_project(tmp_path: Path) -> Path:
    # a user's project with packages named like our source folders
    for name in ("scorer", "pipelines"):
        package = tmp_path / name
        package.mkdir()
        (package / "__init__.py").write_text(f"OWNER = 'user {name}'\n", encoding="utf-8")
        (package / "transformer.py").write_text("WHO = 'user transformer'\n", encoding="utf-8")
    (tmp_path / "stock.csv").write_text("id,formula\n1,NaCl\n2,CuSO4·5H2O\n", encoding="utf-8")
    return tmp_path


def test_import_ionicity_from_a_folder_with_its_own_scorer_and_pipelines(tmp_path):
    project = _user_project(tmp_path)
    code = textwrap.dedent(
        """
        import ionicity, pipelines, scorer, pipelines.transformer
        print(ionicity.score_formula('NaCl')['status'])
        print(pipelines.OWNER, scorer.OWNER, pipelines.transformer.WHO)
        from ionicity.pipelines.transformer import FormulaDescriptors
        print(FormulaDescriptors.__module__)
        """
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=project, capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr
    assert done.stdout.split("\n")[:3] == [
        "ok", "user pipelines user scorer user transformer", "ionicity.pipelines.transformer",
    ]


def test_the_command_line_runs_from_such_a_folder(tmp_path):
    project = _user_project(tmp_path)
    done = subprocess.run(
        [sys.executable, "-m", "ionicity", "score", "stock.csv", "-o", "-", "--quiet"],
        cwd=project, capture_output=True, text=True, timeout=120,
    )
    assert done.returncode == 0, done.stderr
    lines = done.stdout.splitlines()
    assert len(lines) == 3 and lines[1].startswith('"1","NaCl","ok"')


def test_the_documented_api_is_importable_from_the_top():
    for name in ("score_formula", "parse_formula", "score_table", "score_file", "explain", "FormulaDescriptors"):
        assert name in ionicity.__all__
        assert callable(getattr(ionicity, name))
    assert ionicity.parse_formula("CaCO3.6H2O") == ionicity.parse_formula("CaCO3(H2O)6")
    assert "NaCl" in ionicity.explain("NaCl")


def _imports(path: Path) -> set[str]:
    """The ionicity modules a source file imports (``scorer.x``, ``pipelines.y``),
    at module level or inside functions."""
    import ast

    found = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        names = []
        if isinstance(node, ast.ImportFrom) and node.module:
            names = [node.module] + [f"{node.module}.{a.name}" for a in node.names]
        elif isinstance(node, ast.Import):
            names = [a.name for a in node.names]
        for name in names:
            parts = name.split(".")
            if len(parts) >= 3 and parts[0] == "ionicity" and parts[1] in ("scorer", "pipelines"):
                found.add(f"{parts[1]}.{parts[2]}")
    return found


def _import_graph() -> dict[str, set[str]]:
    graph = {}
    for package in ("scorer", "pipelines"):
        for path in (ROOT / package).glob("*.py"):
            graph[f"{package}.{path.stem}"] = _imports(path) - {f"{package}.{path.stem}"}
    # keep only edges to modules (an imported name that is not a module drops out)
    return {m: {n for n in targets if n in graph} for m, targets in graph.items()}


def test_no_import_circles_in_scorer_or_pipelines():
    # every import, module-level or not: a circle hidden in a function is still a circle
    graph = _import_graph()
    assert "pipelines.dask_engine" in graph["pipelines.run"]  # the graph was read
    assert "scorer.grammar" in graph["scorer.formula"]

    def circle_from(start, node, path):
        for nxt in sorted(graph.get(node, ())):
            if nxt == start:
                return path + [nxt]
            if nxt not in path:
                found = circle_from(start, nxt, path + [nxt])
                if found:
                    return found
        return None

    circles = [c for c in (circle_from(m, m, [m]) for m in sorted(graph)) if c]
    assert circles == []


def test_the_science_never_imports_the_pipelines():
    graph = _import_graph()
    offenders = {m: sorted(t) for m, t in graph.items() if m.startswith("scorer.") and any(n.startswith("pipelines.") for n in t)}
    assert offenders == {}
