"""The page of ``ionicity report``: one self-contained HTML file.

Figures are inline SVG (:mod:`ionicity.pipelines.report_figures`), the style
sheet is in the page, and nothing is fetched from a network: the file opens
from a file share or an e-mail attachment as it is, and prints (a print
style sheet drops the navigation and keeps figures and tables whole).
"""
from __future__ import annotations

import html
import os
import tempfile
import time
from datetime import datetime, timezone

from ionicity.pipelines.errors import InputError
from ionicity.pipelines.output_paths import check_output_path
from ionicity.pipelines.report_figures import figures
from ionicity.pipelines.report import (
    HUNDRED_C_K, ReportData, aggregate, classes_melting_below, melting_bands,
)
from ionicity.scorer import __version__
from ionicity.scorer.caution import caution_sentence

__all__ = ["SECTIONS", "render_page", "write_report", "report_file"]

#: (element id, heading) of every section, in page order; the browser test checks each
SECTIONS = (
    ("summary", "Run summary"),
    ("attention", "Rows that need a person"),
    ("bond-map", "Bond-type map"),
    ("melting", "Melting"),
    ("hsab", "Hard and soft pairing"),
    ("mixtures", "Mixtures"),
    ("caution", "Safety caution"),
)

_CSS = """
:root { --ink:#1a1a1a; --muted:#555; --rule:#c9ced6; --band:#f4f6f9; --accent:#1f4e9c; --warn:#8a3b00; }
* { box-sizing: border-box; }
body { font-family: system-ui, -apple-system, "Segoe UI", Roboto, "DejaVu Sans", Arial, sans-serif; color: var(--ink);
       margin: 0 auto; max-width: 1120px; padding: 1.2rem 1.6rem 3rem; line-height: 1.45; font-size: 15px; }
h1 { font-size: 1.6rem; margin: 0 0 .2rem; } h2 { font-size: 1.3rem; border-bottom: 2px solid var(--rule);
     padding-bottom: .2rem; margin-top: 2.2rem; } h3 { font-size: 1.05rem; margin: 1.4rem 0 .4rem; }
.sub { color: var(--muted); margin: 0 0 1rem; }
nav { background: var(--band); padding: .5rem .8rem; border-radius: 6px; }
nav a { margin-right: 1rem; color: var(--accent); text-decoration: none; white-space: nowrap; }
.glance { display: grid; grid-template-columns: repeat(auto-fit, minmax(240px, 1fr)); gap: .8rem; margin: 1rem 0; }
.card { border: 1px solid var(--rule); border-radius: 6px; padding: .6rem .8rem; background: #fff; }
.card b.big { font-size: 1.6rem; display: block; }
.caution { border-left: 5px solid var(--warn); background: #fbf3ec; padding: .6rem .9rem; margin: 1rem 0; }
table { border-collapse: collapse; margin: .4rem 0 1rem; font-size: .9rem; }
th, td { border-bottom: 1px solid var(--rule); padding: .25rem .6rem; text-align: left; vertical-align: top; }
th { background: var(--band); } td.n, th.n { text-align: right; font-variant-numeric: tabular-nums; }
td { max-width: 30rem; overflow-wrap: break-word; } td.wrap { min-width: 16rem; }
td.n, td.s { white-space: nowrap; }
code { background: var(--band); padding: 0 .2rem; border-radius: 3px; font-size: .88em; overflow-wrap: anywhere; }
figure { margin: 1rem 0 1.6rem; } figure svg { max-width: 100%; height: auto; display: block; }
figcaption { color: var(--muted); font-size: .88rem; max-width: 60rem; }
.absent { color: var(--muted); font-style: italic; }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; } nav { display: none; }
  h2 { break-after: avoid; } figure, table, .card, .caution { break-inside: avoid; }
  a { color: inherit; text-decoration: none; } @page { margin: 14mm; }
}
"""


def _e(value) -> str:
    return html.escape("" if value is None else str(value))


def _short(value, limit: int = 90):
    """A cell's text cut to ``limit`` characters (an overflowed formula cell is 300 of noise)."""
    text = "" if value is None else str(value)
    return text if len(text) <= limit else text[: limit - 1] + "…"


def _n(value) -> str:
    return f"{int(value):,}"


def _pct(part, whole) -> str:
    return f"{100.0 * part / whole:.1f} %" if whole else "-"


def _table(head: list[str], rows: list[list], numeric: set[int] = frozenset(), wrap: set[int] = frozenset()) -> str:
    th = "".join(f'<th{" class=n" if i in numeric else ""}>{_e(h)}</th>' for i, h in enumerate(head))
    body = []
    for row in rows:
        cells = []
        for i, v in enumerate(row):
            short = v is not None and len(str(v)) <= 16
            cls = " class=n" if i in numeric else (" class=s" if short else (" class=wrap" if i in wrap else ""))
            text = _n(v) if i in numeric and isinstance(v, (int, float)) else _e(_short(v, 400 if i in wrap else 90))
            cells.append(f"<td{cls}>{text}</td>")
        body.append("<tr>" + "".join(cells) + "</tr>")
    return f"<table><thead><tr>{th}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def _figure(svg: str, caption: str) -> str:
    return f"<figure>{svg}<figcaption>{caption}</figcaption></figure>"


def _where(data: ReportData, condition: str) -> str:
    return (f"<p>The full list: every row of <code>{_e(data.source)}</code> where {condition} (filter that column in a"
            " spreadsheet, or in pandas).</p>")


def _first_rows_table(data: ReportData, kind: str, detail: str, extra: str | None = None) -> str:
    rows = data.first_rows.get(kind, [])
    if not rows:
        return ""
    head = ["row", data.id_col or "id", data.name_col or "name", data.formula_col or "formula", detail]
    if extra:
        head.append(extra)
    body = [[r["row"], r["id"], r["name"], r["formula"], r["detail"]] + ([r["extra"]] if extra else []) for r in rows]
    shown = len(rows)
    total = data.kind_rows[kind]
    note = f"<p>The first {shown} of {_n(total)} (row = data row number in the scored file, from 1).</p>"
    return note + _table(head, body, numeric={0}, wrap={4, 5})


def _summary(data: ReportData, built_seconds: float, run_seconds: float | None) -> str:
    status = data.counts["status"]
    meta = data.metadata
    opts = meta.get("ionicity.options") if isinstance(meta.get("ionicity.options"), dict) else None
    versions = meta.get("ionicity.data_versions") if isinstance(meta.get("ionicity.data_versions"), dict) else None
    modified = datetime.fromtimestamp(data.file_modified, timezone.utc).strftime("%Y-%m-%d %H:%M UTC") if data.file_modified else "-"
    facts = [
        ["scored table", data.source], ["format", data.fmt.upper()], ["size", f"{data.file_bytes / 1e6:,.2f} MB"],
        ["written", modified], ["rows", f"{data.rows:,}"],
        ["scored by ionicity", meta.get("ionicity.version", "not recorded (only Parquet output carries it)")],
    ]
    if run_seconds is not None:
        facts.append(["scoring time", f"{run_seconds:.2f} s"])
    facts.append(["report built by", f"ionicity {__version__} in {built_seconds:.2f} s"])
    if versions:
        snap = versions.get("elements_snapshot", {})
        facts.append(["element data", f"mendeleev {snap.get('mendeleev_version')} snapshot"])
    out = ["<table><tbody>" + "".join(f"<tr><th>{_e(k)}</th><td class=wrap>{_e(v)}</td></tr>" for k, v in facts)
           + "</tbody></table>"]
    out.append("<h3>Statuses</h3>")
    out.append(_table(["status", "rows", "share"], [[s, n, _pct(n, data.rows)] for s, n in status.items()], numeric={1}))
    out.append("<h3>Substance classes</h3>")
    out.append(_table(["substance_class", "rows", "share"],
                      [[k or "(none)", n, _pct(n, data.rows)] for k, n in data.counts["substance_class"].most_common()],
                      numeric={1}))
    out.append("<h3>Options of the run</h3>")
    if opts:
        out.append(_table(["option", "value"], [[k, "-" if v is None else v] for k, v in sorted(opts.items())], wrap={1}))
    else:
        out.append('<p class=absent>Not recorded: the options travel in the key-value metadata of Parquet output only.</p>')
    return "".join(out)


def _absent(column: str) -> str:
    return f'<p class=absent>Not checked in this run (the table has no <code>{_e(column)}</code> column).</p>'


def _attention(data: ReportData) -> str:
    out = []
    errors = data.counts["status"].get("error", 0)
    out.append(f'<h3 id="errors">Rows that could not be scored (status error): {_n(errors)}</h3>')
    if errors:
        out.append("<p>Why, grouped by reason (quoted text and numbers blanked):</p>")
        out.append(_table(["reason", "rows"], [[r, n] for r, n in data.reasons["error"].most_common(20)], numeric={1}, wrap={0}))
        out.append(_first_rows_table(data, "error", "message"))
        out.append(_where(data, "<code>status</code> is <code>error</code>"))
    else:
        out.append("<p>None.</p>")
    warnings = data.counts["status"].get("warning", 0)
    out.append(f"<h3>Rows scored with a warning: {_n(warnings)}</h3>")
    if warnings:
        out.append(_table(["reason", "rows"], [[r, n] for r, n in data.reasons["warning"].most_common(12)], numeric={1}, wrap={0}))
        out.append(_first_rows_table(data, "warning", "message"))
        out.append(_where(data, "<code>status</code> is <code>warning</code>"))
    out.append(f"<h3>Typing slips with a suggestion: {_n(data.kind_rows['slip']) if data.has('formula_suggested') else '-'}</h3>")
    if data.has("formula_suggested"):
        out.append(_first_rows_table(data, "slip", "formula_suggested") or "<p>None.</p>")
        out.append(_where(data, "<code>formula_suggested</code> is filled"))
    else:
        out.append(_absent("formula_suggested"))
    out.append(f"<h3>Names that disagree with the formula: {_n(data.kind_rows['name_mismatch']) if data.has('name_check') else '-'}</h3>")
    if data.has("name_check"):
        counts = data.counts["name_check"]
        out.append(_table(["name_check", "rows"], [[k, n] for k, n in counts.most_common()], numeric={1}))
        out.append(_first_rows_table(data, "name_mismatch", "name_check", "name_formula" if data.has("name_formula") else None))
        out.append(_where(data, "<code>name_check</code> is <code>mismatch</code> or <code>hydrate_differs</code>"))
    else:
        out.append(_absent("name_check"))
    out.append(f"<h3>Duplicates of an earlier row: {_n(data.kind_rows['duplicate']) if data.has('first_row_same_compound') else '-'}</h3>")
    if data.has("first_row_same_compound"):
        out.append(_first_rows_table(data, "duplicate", "first_row_same_compound") or "<p>None.</p>")
        out.append(_where(data, "<code>first_row_same_compound</code> is filled"))
    else:
        out.append(_absent("first_row_same_compound"))
    return "".join(out)


def _bands_table() -> str:
    rows = []
    for name, lower, upper, description in melting_bands():
        hi = "and above" if upper == float("inf") else f"{upper:,.2f} K ({upper - 273.15:,.0f} C)"
        rows.append([name, f"{lower:,.2f} K", hi, description])
    return _table(["melting_class", "from", "below", "meaning"], rows, wrap={3})


def _melting(data: ReportData, figs: dict) -> str:
    below = classes_melting_below()
    low = sorted(data.low_melting.items(), key=lambda kv: kv[1]["first_row"])
    out = [f'<h3 id="below-100">Predicted to melt below 100 C: {_n(data.low_melting_rows)} rows,'
           f" {len(data.low_melting):,}{'+' if len(data.low_melting) >= 500 else ''} distinct compounds</h3>",
           f"<p>Rows whose <code>melting_class</code> is {', '.join(f'<code>{_e(c)}</code>' for c in below)}"
           f" (a trend temperature below {HUNDRED_C_K} K = 100 C). This is a ranking by the trend index, not a"
           " measured melting point.</p>"]
    if low:
        out.append(_table(["formula_normalized", data.name_col or "name (first row)", "rows", "first row"],
                          [[f, v["name"], v["rows"], v["first_row"]] for f, v in low[:60]], numeric={2, 3}, wrap={1}))
        if len(low) > 60:
            out.append(f"<p>The first 60 of {len(low):,} listed.</p>")
        out.append(_where(data, "<code>melting_class</code> is " + " or ".join(f"<code>{_e(c)}</code>" for c in below)))
    out.append('<h3 id="melting-figures">Melting classes</h3>' + _bands_table())
    out.append(_figure(figs["melting"], "Method: <code>mp_trend_index</code> is the melting trend index of"
                       " <code>scorer.melting</code> (log10 of a trend temperature in K, built from lattice energy,"
                       " ion count and the flexibility of organic ions); <code>melting_class</code> cuts it at the"
                       " dashed lines. Colours and hatching mark the class. A ranking aid, not a melting point."))
    out.append(_figure(figs["lattice"], "Method: lattice energy by the volume-based equation of Glasser and Jenkins"
                       " (<code>lattice_energy_vbt_kJ_mol</code>) against the trend index; rows without either value"
                       " are left out."))
    return "".join(out)


def _mixtures(data: ReportData, figs: dict) -> str:
    if not data.has("liquidus_estimate_K"):
        return _absent("liquidus_estimate_K") + "<p>Mixtures are estimated only when the scorer writes their liquidus.</p>"
    n = data.kind_rows["mixture"]
    out = [f"<p>Rows with a liquidus estimate: {_n(n)}.</p>"]
    if "liquidus" in figs:
        method = ", ".join(f"{k} ({v:,})" for k, v in data.counts["liquidus_method"].most_common()) or "see liquidus_method"
        out.append(_figure(figs["liquidus"], f"Method: <code>liquidus_estimate_K</code> as the scorer wrote it; methods: {_e(method)}."))
    out.append(_first_rows_table(data, "mixture", "liquidus_estimate_K", "mixture_components" if data.has("mixture_components") else None))
    return "".join(out)


def _glance(data: ReportData) -> str:
    errors = data.counts["status"].get("error", 0)
    top = data.reasons["error"].most_common(1)
    why = f"most often: {_e(top[0][0])}" if top else "none failed"
    return (
        '<div class="glance">'
        f'<div class="card">Rows<b class="big">{_n(data.rows)}</b>ok {_n(data.counts["status"].get("ok", 0))},'
        f' warning {_n(data.counts["status"].get("warning", 0))}</div>'
        f'<div class="card">Rows that failed (status error)<b class="big">{_n(errors)}</b>{why};'
        f' <a href="#errors">all reasons</a></div>'
        f'<div class="card">Predicted to melt below 100 C<b class="big">{_n(data.low_melting_rows)}</b>'
        f'rows, {len(data.low_melting):,} distinct compounds; <a href="#below-100">the list</a></div>'
        "</div>"
    )


def render_page(data: ReportData, figs: dict, built_seconds: float = 0.0, run_seconds: float | None = None) -> str:
    """The whole page as text."""
    caution = (f"{_e(caution_sentence())} Descriptors are estimates for screening and data work. They are not"
               " safety data: check the safety data sheet, local codes and a qualified person before storing,"
               " mixing, heating or wetting any chemical.")
    counts = data.counts["bond_type"]
    sections = {
        "summary": _summary(data, built_seconds, run_seconds),
        "attention": _attention(data),
        "bond-map": _figure(figs["bond_map"], "Method: van Arkel-Ketelaar triangle (Jensen, J. Chem. Educ. 1995, 72, 395):"
                            " mean against difference of Pauling electronegativity across the cation-anion contact"
                            " (<code>mean_chi_pauling</code>, <code>delta_chi_pauling</code>); regions as"
                            " <code>bond_type</code> assigns them (the 1.7 line is Pauling's, the others common"
                            " practice). Marker shape and colour both give the substance class.")
        + _table(["bond_type", "rows"], [[k, n] for k, n in counts.most_common()], numeric={1}),
        "melting": _melting(data, figs),
        "hsab": _figure(figs["hsab"], "Method: Pearson's hard and soft acids and bases; classes of the cation and the"
                        " anion as the scorer assigns them (<code>cation_hsab_class</code>, <code>anion_hsab_class</code>)."
                        " Hard-hard and soft-soft pairs are the favoured ones; rows without both classes are left out."),
        "mixtures": _mixtures(data, figs),
        "caution": f'<div class="caution">{caution}</div>',
    }
    nav = "".join(f'<a href="#{sid}">{_e(title)}</a>' for sid, title in SECTIONS)
    body = "".join(f'<section id="{sid}"><h2>{_e(title)}</h2>{sections[sid]}</section>' for sid, title in SECTIONS)
    title = f"ionicity report: {os.path.basename(data.source)}"
    return (
        "<!DOCTYPE html>\n<html lang=en><head><meta charset=utf-8>"
        '<meta name=viewport content="width=device-width, initial-scale=1">'
        f"<title>{_e(title)}</title><style>{_CSS}</style></head><body>"
        f"<header><h1>{_e(title)}</h1><p class=sub>{_n(data.rows)} rows scored by ionicity; report written"
        f" {datetime.now(timezone.utc).strftime('%Y-%m-%d %H:%M UTC')}.</p>"
        f'<div class="caution"><b>Caution.</b> {caution}</div>'
        f"<nav>{nav}</nav></header>{_glance(data)}<main>{body}</main></body></html>\n"
    )


def write_report(text: str, output: str, overwrite: bool = False, inputs: tuple[str, ...] = ()) -> None:
    """Write the page beside ``output`` and move it into place (never half-written)."""
    if not output.lower().endswith((".html", ".htm")):
        raise InputError(f"report output {output!r} must end in .html or .htm")
    directory = check_output_path(output, overwrite, inputs)
    fd, tmp = tempfile.mkstemp(prefix=".ionicity-report-", suffix=".html", dir=directory)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as f:
            f.write(text)
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, 0o666 & ~umask)  # mkstemp's 0600 would hide the page from the colleagues it is for
        if overwrite:
            os.replace(tmp, output)
        else:
            os.link(tmp, output)  # fails if the path appeared meanwhile: nothing is replaced
            os.unlink(tmp)
    except FileExistsError:
        os.unlink(tmp)
        raise InputError(f"output {output!r} exists; pass --overwrite to replace it") from None
    except BaseException:
        if os.path.exists(tmp):
            os.unlink(tmp)
        raise


def report_file(scored: str, output: str, *, overwrite: bool = False, id_col: str | None = None,
                name_col: str | None = None, run_seconds: float | None = None) -> ReportData:
    """Aggregate ``scored`` and write its report to ``output``; the Python API
    of ``ionicity report``."""
    began = time.perf_counter()
    if not output.lower().endswith((".html", ".htm")):
        raise InputError(f"report output {output!r} must end in .html or .htm")
    data = aggregate(scored, id_col=id_col, name_col=name_col)
    figs = figures(data)
    page = render_page(data, figs, time.perf_counter() - began, run_seconds)
    write_report(page, output, overwrite, inputs=(scored,))
    return data

