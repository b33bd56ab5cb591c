"""The melting model's training data: the open set built from ``chemicals`` at run time, users' tables, the decision log.

The ``chemicals`` package (MIT licence; the ``melting`` extra) ships melting
points from several sources keyed by CAS number, and an identifier table
that gives each CAS number a formula and names.
:func:`build_open_training_set` reads them, screens every candidate with the
rules of :mod:`pipelines.melting_screen` and logs every choice, kept or
dropped, as one row of the decision log. Nothing from ``chemicals`` is
written into the repository: the handbook-derived values have no clear
licence, so the set is rebuilt on each run and written only into the user's
output folder. :func:`read_user_table` reads a user's own table the same way;
:func:`combine_training_sets` joins sets, the later one winning.

``chemicals`` is imported where it is used: the module imports without the
extra, so the command can name what to install.
"""
from __future__ import annotations

import json
import math
import re
import time
from dataclasses import dataclass, field
from pathlib import Path

import pandas as pd

from ionicity.pipelines.io import InputError
from ionicity.pipelines.melting_cli import TOLERANCE_K, require_extra
from ionicity.pipelines.melting_screen import (
    anion_family,
    cation_element,
    consensus_melting_point_K,
    screen_salt,
    target_flags,
)
from ionicity.scorer.bond_class_rules import keeps_formal_salt_reading
from ionicity.scorer.melting import formal_salt_reading
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.name_reader import read_name
from ionicity.scorer.record import normalized_formula

__all__ = [
    "MEASURED_SOURCES",
    "TrainingSet",
    "build_open_training_set",
    "reading_from_name",
    "read_user_table",
    "combine_training_sets",
]

# Sources of the chemicals package used as measurements; JOBACK is a
# group-contribution estimate for organics and is never used as a target.
MEASURED_SOURCES = ("CRC_INORG", "CRC_ORG", "WEBBOOK", "WIKIDATA", "COMMON_CHEMISTRY", "OPEN_NTBKM")


# --------------------------------------------------------- open training set

_SMILES_CHARGE = re.compile(r"\[[^\]]*?([+-])(\d*)\]")
_FORMULA_ATOM = re.compile(r"([A-Z][a-z]?)(\d*)")
_MAX_INORGANIC_ATOMS = 30


def _smiles_fragment_charges(smiles: str) -> list[int]:
    charges = []
    for fragment in (smiles or "").split("."):
        q = 0
        for match in _SMILES_CHARGE.finditer(fragment):
            n = int(match.group(2) or 1)
            q += n if match.group(1) == "+" else -n
        charges.append(q)
    return charges


def _looks_like_salt(formula: str, smiles: str) -> bool:
    """A cheap first cut before the ion solver: charged fragments, or a small carbon-free formula.

    The identifier table writes salts as dot-separated charged fragments
    (``[Na+].[Cl-]``) but many oxides and intermetallics as neutral molecules
    (``O=[Ca]``), so carbon-free formulas of up to 30 atoms go to the solver
    too; large organic formulas without charged fragments are molecules.
    """
    charges = _smiles_fragment_charges(smiles)
    if any(q > 0 for q in charges) and any(q < 0 for q in charges) and sum(charges) == 0:
        return True
    atoms = {s: int(n or 1) for s, n in _FORMULA_ATOM.findall(formula or "")}
    return bool(atoms) and "C" not in atoms and sum(atoms.values()) <= _MAX_INORGANIC_ATOMS


def _cas_text(value) -> str:
    if isinstance(value, str):
        return value
    digits = str(int(value))
    return f"{digits[:-3]}-{digits[-3:-1]}-{digits[-1]}"


def _chemicals_tables(sources=MEASURED_SOURCES):
    """Melting points per CAS number and source, and the package version, from ``chemicals``."""
    chemicals = require_extra("chemicals")
    from chemicals import phase_change  # optional extra, checked by require_extra just above

    phase_change._load_phase_change_constants()  # the package loads its tables lazily too
    tables = phase_change.Tm_sources
    values: dict[str, dict[str, float]] = {}
    names: dict[str, list[str]] = {}
    for source in sources:
        if source not in MEASURED_SOURCES:
            raise ValueError(f"unknown melting-point source {source!r}; allowed: {', '.join(MEASURED_SOURCES)}")
        frame = tables.get(source)
        if frame is None:
            continue
        column = frame["Tm"]
        name_col = "Chemical" if "Chemical" in frame.columns else ("Name" if "Name" in frame.columns else None)
        for cas, tm in column.dropna().items():
            key = _cas_text(cas)
            values.setdefault(key, {})[source] = float(tm)
            if name_col is not None and isinstance(frame.at[cas, name_col], str):
                names.setdefault(key, []).append(frame.at[cas, name_col])
    return values, names, getattr(chemicals, "__version__", "unknown")


def reading_from_name(comp, names):
    """(composition, decomposition) of a salt read from one of its names, or None.

    For carbon-containing entries whose formula the ion solver does not read
    as a salt of whole, unambiguous ions: organic salts written flat, whose cation the
    formula alone cannot tell apart from an isomer (C4H12ClN: tetramethylammonium
    or butylammonium chloride), or whose ion pair the organic reading does not
    split (C7H11F3N2O3S, 1-ethyl-3-methylimidazolium triflate). A name that
    :func:`scorer.name_reader.read_name` reads to the same elements in the same
    counts, and whose reading passes :func:`screen_salt` (name check included),
    settles it; a hydrate name, or a name of another compound, does not.

    >>> from ionicity.scorer.formula import parse_formula
    >>> comp, dec = reading_from_name(parse_formula("C4H12ClN"), ["tetramethylammonium chloride"])
    >>> [t.ion.label for t in dec.cations], dec.substance_class
    (['[N1111]'], 'ionic_liquid_pair')
    >>> reading_from_name(parse_formula("C4H12ClN"), ["butylamine"]) is None
    True
    """
    counts = comp.as_dict()
    if comp.charge or "C" not in counts:
        # inorganic formulas are read well as written; a formula with a net charge
        # (``NaO2+`` in the identifier table) is a bookkeeping slip, not a salt
        return None
    for name in names:
        text = read_name(name)
        if not text:
            continue
        try:
            named = parse_formula(text)
        except FormulaError:
            continue
        if named.as_dict() != counts:
            continue
        dec = decompose(named)
        if screen_salt(dec, name)[0]:
            return named, dec
    return None


@dataclass
class TrainingSet:
    """Rows kept for training (one per distinct normalized formula) and the decision log."""

    rows: list[dict]
    decisions: list[dict]
    info: dict = field(default_factory=dict)


def build_open_training_set(
    *, tolerance_K: float = TOLERANCE_K, cas_numbers=None, sources=MEASURED_SOURCES, progress=None
) -> TrainingSet:
    """Build the melting-point training set from the installed ``chemicals`` package.

    Parameters
    ----------
    tolerance_K : float, default=20.0
        Spread above which sources count as disagreeing
        (:func:`consensus_melting_point_K`).
    cas_numbers : iterable of str, optional
        Restrict to these CAS numbers (tests, quick looks); default every
        CAS number with a measured melting point.
    sources : tuple of str, default=MEASURED_SOURCES
        Which of the package's melting-point tables to read (``WIKIDATA``
        alone gives the CC0 subset used for the fixture under ``datasets/melting/``).
    progress : callable, optional
        Called with a short text now and then (the CLI prints it to stderr).

    Returns
    -------
    TrainingSet
        ``rows``: formula, formula_normalized, mp_K, name, cas, anion_family,
        cation_element, decision and every scored column; ``decisions``: one
        row per CAS number looked at, with ``kept`` and ``reason``.

    Raises
    ------
    MissingExtraError
        When ``chemicals`` is not installed.
    """
    say = progress or (lambda text: None)
    values, table_names, version = _chemicals_tables(tuple(sources))
    from chemicals.identifiers import search_chemical  # optional extra, checked in _chemicals_tables

    wanted = set(cas_numbers) if cas_numbers is not None else None
    decisions: list[dict] = []
    candidates: dict[str, list[dict]] = {}
    started = time.monotonic()
    keys = sorted(values) if wanted is None else sorted(k for k in values if k in wanted)
    say(f"looking up {len(keys)} CAS numbers with a measured melting point in chemicals {version}")
    for i, cas in enumerate(keys):
        if i and i % 5000 == 0:
            say(f"  {i}/{len(keys)} looked up ({time.monotonic() - started:.0f} s)")
        entry = {"cas": cas, "name": "", "formula": "", "sources": json.dumps(values[cas], sort_keys=True)}
        try:
            chem = search_chemical(cas)
        except Exception:  # noqa: BLE001 - the lookup raises several types for a missing CAS
            decisions.append({**entry, "kept": False, "reason": "no identifier entry (no formula)"})
            continue
        names = [n for n in (chem.common_name, chem.iupac_name, *table_names.get(cas, [])) if n]
        entry.update(name=names[0] if names else "", formula=chem.formula or "")
        if not _looks_like_salt(chem.formula, chem.smiles):
            decisions.append({**entry, "kept": False, "reason": "identifier is not salt-like (no charged fragments)"})
            continue
        try:
            comp = parse_formula(chem.formula)
        except FormulaError as exc:
            decisions.append({**entry, "kept": False, "reason": f"formula not parsed: {exc}"})
            continue
        dec, named = decompose(comp), None
        if not dec.is_ionic and keeps_formal_salt_reading(comp.as_dict()):
            # interstitial nitrides and layered dichalcogenides (TiN, MoS2) have no ions, but the
            # salt index of their formal reading is what their melting route takes: screened as that
            dec = formal_salt_reading(dec) or dec
        verdicts = [screen_salt(dec, n) for n in names] or [(False, "no name")]
        ok = any(v[0] for v in verdicts)
        if not ok:
            named = reading_from_name(comp, names)
            if named is None:
                decisions.append({**entry, "kept": False, "reason": verdicts[0][1]})
                continue
            comp, dec = named
        value, how = consensus_melting_point_K(values[cas], tolerance_K)
        if named is not None and not math.isnan(value):
            how = f"ions read from the name ({verdicts[0][1]} as a formula); {how}"
        if math.isnan(value):
            decisions.append({**entry, "kept": False, "reason": how})
            continue
        if flags := target_flags(names, how, value, dec):
            how = f"{how}; target flagged: {', '.join(flags)}"
        key = normalized_formula(comp, dec)
        candidates.setdefault(key, []).append({**entry, "mp_K": value, "how": how, "dec": dec})
    say(f"{sum(len(v) for v in candidates.values())} salts passed the screen ({time.monotonic() - started:.0f} s)")

    rows = []
    for key, entries in sorted(candidates.items()):
        if len(entries) == 1:
            chosen = entries[0]
            value, how = chosen["mp_K"], chosen["how"]
        else:
            # several CAS numbers for one formula (polymorphs, old registry
            # numbers): the same consensus rule over every source of every entry
            merged = {f"{e['cas']}:{s}": v for e in entries for s, v in json.loads(e["sources"]).items()}
            value, how = consensus_melting_point_K(merged, tolerance_K)
            chosen = entries[0]
            how = f"{len(entries)} CAS entries for {key}; {how}"
        for e in entries:
            kept = not math.isnan(value) and e is chosen
            reason = how if kept else (how if math.isnan(value) else f"duplicate of {chosen['cas']} ({key})")
            decisions.append({k: e[k] for k in ("cas", "name", "formula", "sources")} | {"kept": kept, "reason": reason})
        if math.isnan(value):
            continue
        dec = chosen["dec"]
        rows.append({
            "formula": chosen["formula"], "formula_normalized": key, "mp_K": value, "name": chosen["name"],
            "cas": chosen["cas"], "origin": f"chemicals {version}", "decision": how,
            "anion_family": anion_family(dec), "cation_element": cation_element(dec),
        })
    info = {
        "chemicals_version": version, "cas_numbers_seen": len(keys), "rows_kept": len(rows),
        "tolerance_K": tolerance_K, "seconds": round(time.monotonic() - started, 1),
    }
    say(f"training set: {len(rows)} salts from {len(keys)} CAS numbers")
    return TrainingSet(rows=rows, decisions=decisions, info=info)


# ------------------------------------------------------------- users' tables

_MP_COLUMN_NAMES = ("mp_K", "melting_point_K", "tm_K", "mp_k", "melting_point_k")


def read_user_table(path, *, formula_col: str = "formula", mp_col: str | None = None) -> TrainingSet:
    """Read a user's melting-point table (CSV, TSV or Parquet) into training rows.

    Parameters
    ----------
    path : str or Path
        The table; one row per compound.
    formula_col : str, default="formula"
        Column of formulas.
    mp_col : str, optional
        Column of melting points **in K**; default the first of ``mp_K``,
        ``melting_point_K``, ``tm_K`` present.

    Returns
    -------
    TrainingSet
        Kept rows (anhydrous salts with a melting point between 1 and 5000 K;
        duplicates of one formula settled by :func:`consensus_melting_point_K`)
        and a decision per input row.

    Raises
    ------
    pipelines.io.InputError
        The file cannot be read or lacks the columns.
    """
    path = Path(path)
    try:
        if path.suffix.lower() == ".parquet":
            frame = pd.read_parquet(path)
        else:
            frame = pd.read_csv(path, sep="\t" if path.suffix.lower() == ".tsv" else ",", dtype=str,
                                keep_default_na=False)
    except (OSError, ValueError) as exc:
        raise InputError(f"cannot read melting-point table {path}: {exc}") from exc
    if formula_col not in frame.columns:
        raise InputError(f"melting-point table {path} has no column {formula_col!r}; columns: {list(frame.columns)}")
    if mp_col is None:
        mp_col = next((c for c in _MP_COLUMN_NAMES if c in frame.columns), None)
        if mp_col is None:
            raise InputError(f"melting-point table {path}: no melting-point column (in K) among {list(frame.columns)};"
                             f" name it mp_K or pass --mp-col")
    elif mp_col not in frame.columns:
        raise InputError(f"melting-point table {path} has no column {mp_col!r}; columns: {list(frame.columns)}")
    decisions, grouped = [], {}
    for i, (formula, raw) in enumerate(zip(frame[formula_col], frame[mp_col])):
        entry = {"cas": "", "name": f"{path.name} row {i + 1}", "formula": str(formula), "sources": json.dumps({"user": raw})}
        try:
            value = float(raw)
        except (TypeError, ValueError):
            decisions.append({**entry, "kept": False, "reason": f"melting point {raw!r} is not a number"})
            continue
        if not 1.0 <= value <= 5000.0:
            decisions.append({**entry, "kept": False, "reason": f"melting point {value} K outside 1-5000 K (is it in C?)"})
            continue
        try:
            comp = parse_formula(str(formula))
        except FormulaError as exc:
            decisions.append({**entry, "kept": False, "reason": f"formula not parsed: {exc}"})
            continue
        dec = decompose(comp)
        if dec.substance_class not in ("ionic_salt", "ionic_liquid_pair"):
            decisions.append({**entry, "kept": False, "reason": f"not a salt ({dec.substance_class})"})
            continue
        if dec.hydrate_water:
            decisions.append({**entry, "kept": False, "reason": "hydrate"})
            continue
        key = normalized_formula(comp, dec)
        grouped.setdefault(key, []).append((entry, value, dec))
    rows = []
    for key, items in sorted(grouped.items()):
        values = {f"user{j + 1}": v for j, (_, v, _) in enumerate(items)}
        value, how = consensus_melting_point_K(values)
        for j, (entry, _, _) in enumerate(items):
            kept = j == 0 and not math.isnan(value)
            decisions.append({**entry, "kept": kept, "reason": how if (kept or math.isnan(value)) else f"duplicate of {key}"})
        if math.isnan(value):
            continue
        entry, _, dec = items[0]
        rows.append({
            "formula": entry["formula"], "formula_normalized": key, "mp_K": value, "name": entry["name"], "cas": "",
            "origin": f"user table {path.name}", "decision": how,
            "anion_family": anion_family(dec), "cation_element": cation_element(dec),
        })
    return TrainingSet(rows=rows, decisions=decisions, info={"user_table": str(path), "rows_kept": len(rows)})


def combine_training_sets(*sets: TrainingSet) -> TrainingSet:
    """Join training sets; where a formula appears in several, the later set's value wins (logged).

    Pass the open set first and the user's table last, so a user's measured
    value replaces the open one for the same compound.
    """
    by_formula: dict[str, dict] = {}
    decisions: list[dict] = []
    info: dict = {}
    for ts in sets:
        decisions.extend(ts.decisions)
        info.update(ts.info)
        for row in ts.rows:
            key = row["formula_normalized"]
            if key in by_formula:
                old = by_formula[key]
                decisions.append({"cas": old.get("cas", ""), "name": old.get("name", ""), "formula": old["formula"],
                                  "sources": json.dumps({"replaced": old["mp_K"]}), "kept": False,
                                  "reason": f"replaced by {row['origin']} ({row['mp_K']:.1f} K)"})
            by_formula[key] = row
    info["rows_kept"] = len(by_formula)
    return TrainingSet(rows=list(by_formula.values()), decisions=decisions, info=info)
