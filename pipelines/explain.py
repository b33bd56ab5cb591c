"""Text for people: ``ionicity explain`` and ``ionicity columns``."""
from __future__ import annotations

import argparse
import csv
import io
import math
from pathlib import Path

from ionicity.pipelines.mixture_explain import explain_mixture
from ionicity.scorer.caution import caution_sentence
from ionicity.scorer.columns import column_groups, descriptor_modules, output_columns
from ionicity.scorer.name_check import COLUMNS as NAME_COLUMNS
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.note_codes import notes_table
from ionicity.scorer.name_reader import parse_as_name
from ionicity.scorer.record import score_formula, score_parsed, without_grade_words
from ionicity.scorer.solutions import split_in_solvent, split_solution

__all__ = ["explain_formula", "columns_table"]


def _value_text(value) -> str:
    if value is None:
        return "-"
    if isinstance(value, float):
        return "-" if math.isnan(value) else f"{value:.6g}"
    return str(value) if value != "" else "-"


def _solute(text: str) -> str | None:
    """The solute of a text written as a solution ("HCl 37%", "0.1 M NaCl", "1 M LiPF6 in EC/DMC"), or None."""
    solution = split_in_solvent(text) or split_solution(text)
    return None if solution is None else solution.solute


def explain_formula(text: str) -> str:
    """Every score of one compound with the method and the inputs behind it."""
    # the row as `ionicity score` writes it: a typing slip, a solution's solute or a name decides what is scored
    row = score_formula(text)
    if row["substance_class"] == "mixture":
        mixture = explain_mixture(text, explain_formula)
        if mixture is not None:
            return mixture
    shown = text if len(text) <= 80 else f"{text[:80]}... ({len(text)} characters)"
    lines = [f"formula: {shown}"]
    scored = row["formula_suggested"] or _solute(text) or text
    try:
        comp = parse_formula(scored)
    except FormulaError as exc:
        # a name, or a formula or name with grade and form words after it ("NaCl ACS reagent"), as score reads it
        comp = parse_as_name(scored) or without_grade_words(scored)
        if comp is None and row["status"] == "error":
            return "\n".join(lines + ["status: error", f"message: {row['message'] or exc}"])
    # a reading that scored another composition than the text's own (a doped host, a CAS number, oxygen
    # vacancies, a formula with its name): the composition the row holds is explained
    normalized = _parsed_or_none(row["formula_normalized"]) if row["status"] != "error" else None
    if normalized is not None and (comp is None or comp.total_counts != normalized.total_counts):
        comp, scored = normalized, row["formula_normalized"]
    if comp is None:
        return "\n".join(lines + ["status: error", f"message: {row['message']}"])
    if scored != text:
        lines.append(f"read as: {scored}")
    dec = decompose(comp)
    record = score_parsed(comp)
    lines.append(f"status: {row['status']}")
    if row["message"]:
        lines.append(f"message: {row['message']}")
    lines.append("")
    lines.append("composition")
    for name in ("formula_normalized", "substance_class", "cations", "anions", "oxidation_states",
                 "hydrate_water", "molar_mass_g_mol"):
        lines.append(f"  {name}: {_value_text(record[name])}")
    if dec.alternatives:
        lines.append("  equally plausible: " + " | ".join(dec.alternatives))
    for term in dec.cations + dec.anions:
        ion = term.ion
        if not ion.monatomic:
            lines.append(f"  {ion.ion_id}: {ion.name} ({ion.family}); source: {ion.source}")
    for module in descriptor_modules():
        lines.append("")
        lines.append(module.__name__.rsplit(".", 1)[-1])
        for column in module.COLUMNS:
            lines.append(f"  {column.name}: {_value_text(record[column.name])}")
        for line in module.explain(dec):
            lines.append(f"    {line}")
    lines.append("")
    lines.append(caution_sentence())
    return "\n".join(lines)


def _parsed_or_none(text):
    if not text:
        return None
    try:
        return parse_formula(text)
    except FormulaError:
        return None


def _type_text(c) -> str:
    return f"{c.dtype}, {c.digits} significant digits" if c.digits else c.dtype


def _two_column_listing(fmt: str, header: tuple[str, str], listing, footnote: str) -> str:
    """A listing of (key, text) pairs as CSV, a Markdown table, or text lines with a footnote."""
    if fmt == "csv":
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        writer.writerow(list(header))
        writer.writerows(listing)
        return buffer.getvalue().rstrip("\n")
    if fmt == "markdown":
        return "\n".join([f"| {header[0]} | {header[1]} |", "| --- | --- |"] + [f"| `{k}` | {v} |" for k, v in listing])
    return "\n".join(f"{k}: {v}" for k, v in listing) + "\n" + footnote


def columns_table(fmt: str = "text", groups: bool = False, notes: bool = False) -> str:
    """Every generated column with its type (and, for floats, the significant
    digits written), unit, group, method and source; with ``groups``, the
    groups ``--columns`` takes and their columns instead; with ``notes``, the
    short codes of ``value_notes`` and what each means."""
    if notes:
        return _two_column_listing(fmt, ("code", "meaning"), notes_table(),
                                   "(CODE(ION) names the ion concerned; a note without a code is written in full)")
    group_of = {name: g for g, names in column_groups().items() for name in names}
    if groups:
        listing = [(g, ", ".join(names)) for g, names in column_groups().items()]
        return _two_column_listing(fmt, ("group", "columns"), listing,
                                   "(status and message are always written; --columns takes groups and column names)")
    # the name check's two columns last: they are written only with a name column
    columns = output_columns() + NAME_COLUMNS
    if fmt == "csv":
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        writer.writerow(["name", "type", "unit", "description", "method", "source", "aggregation", "group", "digits"])
        for c in columns:
            writer.writerow([c.name, c.dtype, c.unit, c.description, c.method, c.source, c.aggregation,
                             group_of.get(c.name, ""), c.digits or ""])
        return buffer.getvalue().rstrip("\n")
    if fmt == "markdown":
        rows = ["| column | type | unit | meaning | method and source |", "| --- | --- | --- | --- | --- |"]
        for c in columns:
            method = "; ".join(x for x in (c.method, c.source, c.aggregation) if x)
            rows.append(f"| `{c.name}` | {_type_text(c)} | {c.unit} | {c.description} | {method} |".replace("\n", " "))
        return "\n".join(rows)
    blocks = []
    for c in columns:
        block = [f"{c.name}  ({_type_text(c)}{', ' + c.unit if c.unit else ''}; group {group_of.get(c.name, '')})",
                 f"    {c.description}"]
        if c.method:
            block.append(f"    method: {c.method}")
        if c.source:
            block.append(f"    source: {c.source}")
        if c.aggregation:
            block.append(f"    several ions: {c.aggregation}")
        blocks.append("\n".join(block))
    return "\n".join(blocks)


_START = "<!-- columns:start -->"
_END = "<!-- columns:end -->"


def readme_with_columns(text: str) -> str:
    """``text`` with the generated column table between the README markers."""
    head, _, rest = text.partition(_START)
    _, _, tail = rest.partition(_END)
    return f"{head}{_START}\n{columns_table('markdown')}\n{_END}{tail}"


def _main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m ionicity.pipelines.explain")
    parser.add_argument("--update-readme", action="store_true", help="rewrite the column table in README.md")
    parser.add_argument("--readme", default=str(Path(__file__).resolve().parent.parent / "README.md"))
    args = parser.parse_args(argv)
    if not args.update_readme:
        print(columns_table("markdown"))
        return 0
    path = Path(args.readme)
    path.write_text(readme_with_columns(path.read_text(encoding="utf-8")), encoding="utf-8")
    return 0


if __name__ == "__main__":
    raise SystemExit(_main())
