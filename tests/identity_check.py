"""Are a change's outputs the same as before it? A script, not a test (pytest does not collect it: it
needs the tree before the change and takes about a minute).

Run it once with the interpreter of the tree before the change and once with the tree after, then
compare::

    cd /tmp   # the repository root's ionicity/ folder would shadow the installed package
    BEFORE/.venv/bin/python AFTER/tests/identity_check.py save before.pkl --repo AFTER
    AFTER/.venv/bin/python AFTER/tests/identity_check.py save after.pkl --repo AFTER
    AFTER/.venv/bin/python AFTER/tests/identity_check.py compare before.pkl after.pkl

``save`` records ``repr(score_row(text))`` (every generated column of one text) for the
benchmark's 20,000 distinct texts (``realistic_formulas(20000)``, seed 7), the texts of
``tests/data/formula_cases.csv``, 5,000 further texts (2,500 of ``realistic_formulas`` with seed 8,
2,500 random strings over formula characters) and a dozen odd ones (names, typos, mixtures,
solutions, hostile text), scored after the workers' warm-up (``pool.warm_up``) as a worker scores
them; with ``--table`` also the ``ionicity score`` output of a Parquet table (every column, after
decoding dictionaries). ``compare`` names the texts and columns that differ and exits 1 if any do.
"""
from __future__ import annotations

import argparse
import csv
import pickle
import random
import subprocess
import sys
import tempfile
from pathlib import Path

_ODD = ("sodium chloride", "NaCI", "Fe203", "nh4h2po4", "KNO3.7H2O", "NaCl + KCl", "0.1 M NaCl",
        "NaCl (aq)", "[C4mim][BF4]", "C6H5NO2", "", "(((((", "Xx9", "Cu(NO3)2·2.5H2O")
_ALPHABET = "HCNOClNaKBrFeSOPCuZnMgCaAl()[]·.*0123456789+- xyzIVabcdeghij"


def texts(repo: Path) -> list[str]:
    from ionicity.pipelines.bench import realistic_formulas

    with open(repo / "tests/data/formula_cases.csv", newline="", encoding="utf-8") as f:
        cases = [row["formula"] for row in csv.DictReader(f)]
    rnd = random.Random(11)
    noise = ["".join(rnd.choice(_ALPHABET) for _ in range(rnd.randint(1, 14))) for _ in range(2500)]
    return list(dict.fromkeys(realistic_formulas(20000) + cases + realistic_formulas(2500, seed=8)
                              + noise + list(_ODD)))


def table_columns(path: Path) -> dict[str, list]:
    import pyarrow.parquet as pq

    table = pq.read_table(path)
    return {name: table.column(name).to_pylist() for name in table.column_names}


def save(out: Path, repo: Path, table: Path | None) -> None:
    from ionicity.pipelines import pool
    from ionicity.scorer.record import score_row

    pool.warm_up()
    record = {"rows": {text: repr(score_row(text)) for text in texts(repo)}}
    if table is not None:
        with tempfile.TemporaryDirectory() as tmp:
            scored = Path(tmp) / "scored.parquet"
            subprocess.run([sys.executable, "-m", "ionicity", "score", str(table.resolve()), "-o", str(scored), "--quiet"],
                           check=True, cwd=tmp)
            record["table"] = table_columns(scored)
    with open(out, "wb") as f:
        pickle.dump(record, f)
    print(f"{len(record['rows'])} texts" + (f", {len(record['table'])} table columns" if table else ""))


def compare(before: Path, after: Path) -> int:
    with open(before, "rb") as f:
        old = pickle.load(f)
    with open(after, "rb") as f:
        new = pickle.load(f)
    differ = [t for t in old["rows"] if new["rows"].get(t) != old["rows"][t]]
    differ += [t for t in new["rows"] if t not in old["rows"]]
    for text in differ[:20]:
        print(f"differs: {text!r}")
    columns = []
    if "table" in old or "table" in new:
        a, b = old.get("table", {}), new.get("table", {})
        columns = [c for c in set(a) | set(b) if a.get(c) != b.get(c)]
        for column in columns:
            print(f"table column differs: {column}")
    print(f"{len(old['rows'])} texts compared, {len(differ)} differ; "
          f"{len(old.get('table', {}))} table columns compared, {len(columns)} differ")
    return 1 if differ or columns else 0


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    sub = parser.add_subparsers(dest="command", required=True)
    saving = sub.add_parser("save")
    saving.add_argument("out", type=Path)
    saving.add_argument("--repo", type=Path, default=Path(__file__).resolve().parents[1],
                        help="the checkout whose tests/data/formula_cases.csv is read")
    saving.add_argument("--table", type=Path, help="a Parquet table to score with ionicity score too")
    comparing = sub.add_parser("compare")
    comparing.add_argument("before", type=Path)
    comparing.add_argument("after", type=Path)
    args = parser.parse_args()
    if args.command == "save":
        save(args.out, args.repo, args.table)
        return 0
    return compare(args.before, args.after)


if __name__ == "__main__":
    sys.exit(main())
