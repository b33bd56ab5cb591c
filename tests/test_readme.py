"""The README's column table is generated from the registry; it must not drift.

No scientific reference values here: these check a property of our own docs.
"""
from pathlib import Path

from ionicity.pipelines.explain import readme_with_columns

ROOT = Path(__file__).resolve().parent.parent


def test_readme_column_table_matches_registry():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    assert text == readme_with_columns(text), "run: python -m ionicity.pipelines.explain --update-readme"


def test_readme_opens_with_job_and_two_setup_commands():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    blocks = [b.split("```")[0].strip() for b in text.split("```sh")[1:3]]
    assert "ionicity score datasets/demo/inventory.csv" in blocks[0]
    assert "python -m pytest" in blocks[1]
    ci = (ROOT / ".ci" / "run").read_text(encoding="utf-8")
    assert blocks[1] in ci.splitlines()
