"""``ionicity fit-melting``: an optional melting-point regression over ionicity's own columns.

What it does
------------
1. **Training set, built at run time.** The ``chemicals`` package (MIT
   licence; install the ``melting`` extra) ships melting points from several
   sources keyed by CAS number, and an identifier table that gives each CAS
   number a formula and names. :func:`build_open_training_set` reads them,
   scores every candidate with :func:`scorer.score_formula`, keeps only
   anhydrous, charge-balanced salts whose name and formula agree
   (:func:`name_agrees_with_ions`), and settles disagreeing sources with
   :func:`consensus_melting_point_K`. Every choice, kept or dropped, is one row
   of the decision log. Nothing from ``chemicals`` is written into the
   repository: the handbook-derived values have no clear licence, so the set is
   rebuilt on each run and written only into the user's output folder.
2. **Users' own data** (a table with a formula column and a melting point in
   K) is scored the same way and can be combined with the open set or used
   alone (:func:`read_user_table`).
3. **The regression** is a scikit-learn pipeline (histogram gradient boosting
   on log melting point) over numeric output columns of ionicity
   (:data:`scorer.melting_model.MODEL_FEATURES`). It is cross-validated with
   :class:`sklearn.model_selection.GroupKFold`, once grouped by anion family
   and once by cation element so near-duplicates (NaCl/NaBr, the K and Rb
   salts of one anion) never sit on both sides of a split, and compared with two
   baselines: predicting the mean, and a straight line on the lattice energy.
4. **Prediction intervals** come from split conformal prediction: the
   model is fitted on one part of the training rows and the absolute log
   residuals on a held-out calibration part set the interval half-width
   (Vovk, Gammerman & Shafer, *Algorithmic Learning in a Random World*, 2005;
   Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116).
   Their coverage is checked on the held-out folds.
5. **The model file** is JSON: the trees as arrays of plain numbers, checked
   against a fixed schema on load (:func:`scorer.melting_model.model_from_dict`).
   No pickle or joblib file is ever written or read, so loading a model
   cannot run code.

Predicted melting points are estimates for screening, not for process
safety: decomposition, hydration and pressure are not modelled. Check
measured data and the safety data sheet before heating anything.
"""
from __future__ import annotations

import csv
import json
import math
import os
import re
import sys
import time
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from ionicity.pipelines.melting_model_file import save_model
from ionicity.scorer import melting, melting_model

from ionicity.pipelines.melting_cli import _OUTPUTS, CAUTION, EXTRA_HINT, TOLERANCE_K, add_fit_melting_parser  # noqa: F401

__all__ = [
    "MissingExtraError",
    "FitConfig",
    "FitReport",
    "TOLERANCE_K",
    "consensus_melting_point_K",
    "name_agrees_with_ions",
    "screen_salt",
    "anion_family",
    "cation_element",
    "build_open_training_set",
    "read_user_table",
    "combine_training_sets",
    "feature_matrix",
    "grouped_cross_validation",
    "fit_melting_model",
    "parity_plot",
    "add_fit_melting_parser",
    "run_fit_melting",
    "CAUTION",
]

# Sources of the chemicals package used as measurements; JOBACK is a
# group-contribution estimate for organics and is never used as a target.
MEASURED_SOURCES = ("CRC_INORG", "CRC_ORG", "WEBBOOK", "WIKIDATA", "COMMON_CHEMISTRY", "OPEN_NTBKM")


class MissingExtraError(RuntimeError):
    """The optional ``melting`` extra is not installed."""


def _require(module: str):
    import importlib

    try:
        return importlib.import_module(module)
    except ImportError as exc:
        raise MissingExtraError(
            f"'{module}' is needed for fit-melting and is not installed: {EXTRA_HINT}"
        ) from exc


# ----------------------------------------------------------------- consensus


def consensus_melting_point_K(values: dict[str, float], tolerance_K: float = TOLERANCE_K) -> tuple[float, str]:
    """One melting point from several sources, or NaN when they disagree.

    Rule (defined here): values within ``tolerance_K`` of each other form a
    cluster. If every value lies within the tolerance of the median, the
    median is kept (``agree``). Otherwise the largest cluster is kept when it
    holds more than half of the sources (``consensus``); else the entry is
    dropped (``disagree``). One source alone is kept (``single``).

    Parameters
    ----------
    values : dict of str to float
        Melting point in K per source name; NaN values are ignored.
    tolerance_K : float, default=20.0
        Largest spread, in K, that counts as agreement (the issue's "about 20 K").

    Returns
    -------
    (float, str)
        The melting point in K (NaN when dropped) and a decision text naming
        the rule and the sources.

    Examples
    --------
    >>> consensus_melting_point_K({"a": 1074.0, "b": 1073.8})
    (1073.9, 'agree: a=1074.0, b=1073.8')
    >>> consensus_melting_point_K({"a": 1000.0, "b": 1005.0, "c": 1300.0})[0]
    1002.5
    >>> consensus_melting_point_K({"a": 1000.0, "b": 1300.0})[1]
    'disagree (spread 300 K > 20 K): a=1000.0, b=1300.0'
    """
    clean = {k: float(v) for k, v in values.items() if v is not None and not math.isnan(float(v))}
    text = ", ".join(f"{k}={v:.1f}" for k, v in clean.items())
    if not clean:
        return math.nan, "no value"
    if len(clean) == 1:
        return round(next(iter(clean.values())), 2), f"single: {text}"
    numbers = np.array(sorted(clean.values()))
    median = float(np.median(numbers))
    if np.all(np.abs(numbers - median) <= tolerance_K / 2 + 1e-9) or numbers[-1] - numbers[0] <= tolerance_K:
        return round(median, 2), f"agree: {text}"
    best: list[float] = []
    for start in range(len(numbers)):
        cluster = [x for x in numbers[start:] if x - numbers[start] <= tolerance_K]
        if len(cluster) > len(best):
            best = cluster
    spread = numbers[-1] - numbers[0]
    if len(best) * 2 > len(numbers):
        value = round(float(np.median(best)), 2)
        return value, f"consensus ({len(best)} of {len(numbers)} within {tolerance_K:g} K): {text}"
    return math.nan, f"disagree (spread {spread:.0f} K > {tolerance_K:g} K): {text}"


# ------------------------------------------------------------ name agreement

# Latin stems used in trade names (ferric, cuprous, stannic...), common practice.
_LATIN_STEMS = {
    "Fe": ("ferr",), "Cu": ("cupr",), "Sn": ("stann",), "Pb": ("plumb",), "Ag": ("argent",), "Au": ("aur",),
    "Hg": ("mercur",), "Sb": ("stib", "antimon"), "K": ("kal",), "Na": ("natr",), "W": ("tungst", "wolfram"),
}
_ANION_WORDS = {
    "F": ("fluorid", "fluoro"), "Cl": ("chlorid", "chloro"), "Br": ("bromid", "bromo"), "I": ("iodid", "iodo"),
    "O": ("oxid", "oxo"), "S": ("sulfid", "thio"), "Se": ("selenid",), "Te": ("tellurid",), "N": ("nitrid",),
    "H": ("hydrid",),
}
# Monatomic anions that make salts; carbides, silicides, borides, phosphides
# and arsenides of metals are covalent or metallic solids, not salts.
_SALT_ANION_ELEMENTS = frozenset(_ANION_WORDS)
_EXCLUDED_FAMILIES = frozenset({"oxocation"})
_METAL_OXOCATIONS = frozenset({"UO2(2+)", "VO(2+)", "VO2(+)"})


def _fold(text: str) -> str:
    text = text.lower()
    for old, new in (("sulph", "sulf"), ("aluminium", "aluminum"), ("caesium", "cesium"), ("ide", "id")):
        text = text.replace(old, new)
    return re.sub(r"[^a-z0-9]", "", text)


def _element_stems(symbol: str) -> tuple[str, ...]:
    from ionicity.scorer.elements import get_element

    name = _fold(get_element(symbol).name)
    stems = {name}
    for suffix in ("ium", "um", "ese", "on", "en", "ine"):
        if name.endswith(suffix) and len(name) - len(suffix) >= 4:
            stems.add(name[: -len(suffix)])
    stems.update(_LATIN_STEMS.get(symbol, ()))
    return tuple(stems)


def _ion_names(ion) -> tuple[str, ...]:
    """The ion's library name and each alternative in its brackets, folded."""
    parts = re.split(r"[();]|,\s", ion.name)
    names = {_fold(p) for p in parts if len(_fold(p)) >= 4}
    if ion.label.startswith("["):
        names.add(_fold(ion.label))
    return tuple(sorted(names))


def name_agrees_with_ions(name: str, dec) -> tuple[bool, str]:
    """Whether a compound's name mentions every ion the formula was read as.

    A monatomic cation must appear as its element name or stem (``iron``,
    ``ferric``), a monatomic anion as its ``-ide`` word (``chloride``) or,
    for oxide ions, as an ``-ate`` of a cation present (``barium titanate``),
    a polyatomic or organic ion as its library name or one of the names in
    brackets (``tetrafluoroborate``, ``1-ethyl-3-methylimidazolium``).
    Spelling variants (sulph/sulf, aluminium/aluminum, caesium/cesium) are
    folded first.

    Parameters
    ----------
    name : str
        A compound name, e.g. from the ``chemicals`` identifier table.
    dec : Decomposition
        The formula's reading by :func:`scorer.ions.decompose`.

    Returns
    -------
    (bool, str)
        Agreement, and the first ion the name does not mention (empty when it agrees).

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> name_agrees_with_ions("sodium sulphate", decompose(parse_formula("Na2SO4")))
    (True, '')
    >>> name_agrees_with_ions("benzoxonium chloride", decompose(parse_formula("NaCl")))
    (False, 'Na(+) not named')
    """
    folded = _fold(name or "")
    if not folded:
        return False, "no name"
    cation_stems = [s for t in dec.cations if t.ion.monatomic for s in _element_stems(t.ion.element)]
    cation_stems += [n for t in dec.cations if not t.ion.monatomic for n in _ion_names(t.ion)]
    for term in dec.cations + dec.anions:
        ion = term.ion
        if ion.monatomic and ion.charge > 0:
            ok = any(s in folded for s in _element_stems(ion.element))
        elif ion.monatomic:
            ok = any(w in folded for w in _ANION_WORDS.get(ion.element, ()))
            if not ok and ion.element == "O":
                ok = any(s[:5] + "at" in folded for s in cation_stems if len(s) >= 4)
        else:
            ok = any(n in folded for n in _ion_names(ion))
        if not ok:
            return False, f"{ion.ion_id} not named"
    return True, ""


def screen_salt(dec, name: str) -> tuple[bool, str]:
    """Whether a scored entry may enter the training set, and why not.

    Kept: anhydrous, charge-balanced ``ionic_salt`` or ``ionic_liquid_pair``
    readings without an ambiguity and with whole ion counts, with metal
    cations (a +1 state only where the element has one in common use) or
    polyatomic/organic cations,
    halide, chalcogenide, nitride or hydride monatomic anions, no molecular
    oxocation (NO+, NO2+), and a name that agrees with the ions
    (:func:`name_agrees_with_ions`) and with any formula it writes in brackets
    (``neodymium sulfide (Nd2S3)`` against the formula NdS).

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> screen_salt(decompose(parse_formula("CuSO4.5H2O")), "copper sulfate pentahydrate")
    (False, 'hydrate')
    """
    if dec.substance_class not in ("ionic_salt", "ionic_liquid_pair"):
        return False, f"not a salt ({dec.substance_class})"
    if dec.hydrate_water or "hydrat" in (name or "").lower():
        return False, "hydrate"
    if dec.alternatives:
        return False, "ambiguous ion reading"
    for term in dec.cations + dec.anions:
        if abs(term.count - round(term.count)) > 1e-6:
            return False, f"fractional ion count ({term}): a mixed-valence or non-stoichiometric reading"
    for term in dec.cations:
        ion = term.ion
        if ion.monatomic and not _is_metal(ion.element):
            return False, f"non-metal cation {ion.ion_id}"
        if ion.monatomic and ion.charge == 1 and 1 not in _main_states(ion.element) \
                and ion.element not in _MONOVALENT_OK:
            # identifier formulas that lost their counts (BaOZr for BaZrO3, AgMoO
            # for Ag2MoO4) resolve only through a +1 state of a metal that has none
            return False, f"uncommon oxidation state {ion.ion_id}: formula likely incomplete, or not a simple salt"
    written = _formula_in_name(name)
    if written is not None and written != _ratio(dec.composition):
        return False, "the name gives another formula in brackets"
        if ion.family in _EXCLUDED_FAMILIES and ion.ion_id not in _METAL_OXOCATIONS:
            return False, f"molecular oxocation {ion.ion_id}"
    for term in dec.anions:
        ion = term.ion
        if ion.monatomic and ion.element not in _SALT_ANION_ELEMENTS:
            return False, f"{ion.ion_id}: carbide/silicide/boride/pnictide, not a salt"
    agrees, why = name_agrees_with_ions(name, dec)
    if not agrees:
        return False, f"name and formula disagree: {why}"
    return True, ""


# metals whose +1 salts are real though mendeleev lists +1 as an extra state
# (CuCl, AuCl, InCl, GaCl in Ga[GaCl4]); common practice
_MONOVALENT_OK = frozenset({"Cu", "Ag", "Au", "Ga", "In", "Tl", "Hg"})
_BRACKETED_FORMULA = re.compile(r"\(([A-Z][A-Za-z0-9]*)\)")


def _ratio(composition) -> tuple:
    counts = dict(composition)
    smallest = min(counts.values())
    return tuple(sorted((s, round(n / smallest, 3)) for s, n in counts.items()))


def _formula_in_name(name: str):
    """The element ratio of a formula written in brackets in a name (``neodymium sulfide (Nd2S3)``), or None."""
    from ionicity.scorer.formula import FormulaError, parse_formula

    for token in _BRACKETED_FORMULA.findall(name or ""):
        try:
            comp = parse_formula(token)
        except FormulaError:
            continue
        counts = comp.as_dict()
        if len(counts) >= 2:
            return _ratio(counts.items())
    return None


def _is_metal(symbol: str) -> bool:
    from ionicity.scorer.elements import get_element

    return get_element(symbol).is_metal


def _main_states(symbol: str) -> tuple:
    from ionicity.scorer.elements import get_element

    return tuple(int(s) for s in get_element(symbol).oxidation_states_main)


def anion_family(dec) -> str:
    """The family of a salt's main anion, for grouping and per-family figures.

    Monatomic anions: ``halide``, ``oxide``, ``chalcogenide`` (S, Se, Te),
    ``nitride``, ``hydride``; polyatomic anions: the ion library's family
    (``oxoanion``, ``halo-complex``, ``carboxylate``...), with sulfate and
    nitrate split out of ``oxoanion`` because they are common. The main anion
    is the one carrying most negative charge.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> anion_family(decompose(parse_formula("K2SO4"))), anion_family(decompose(parse_formula("CaF2")))
    ('sulfate', 'halide')
    """
    if not dec.anions:
        return "none"
    main = max(dec.anions, key=lambda t: (abs(t.ion.charge) * t.count, t.ion.ion_id)).ion
    if main.monatomic:
        return {"F": "halide", "Cl": "halide", "Br": "halide", "I": "halide", "O": "oxide", "N": "nitride",
                "H": "hydride"}.get(main.element, "chalcogenide" if main.element in ("S", "Se", "Te") else "other")
    if main.ion_id == "SO4(2-)":
        return "sulfate"
    if main.ion_id in ("NO3(-)", "NO2(-)"):
        return "nitrate"
    if main.ion_id == "CO3(2-)":
        return "carbonate"
    return main.family


def cation_element(dec) -> str:
    """The main cation's element (``Na``), or ``NH4``/``organic`` for others, for grouping."""
    if not dec.cations:
        return "none"
    main = max(dec.cations, key=lambda t: (abs(t.ion.charge) * t.count, t.ion.ion_id)).ion
    if main.monatomic:
        return main.element
    if main.organic:
        return "organic"
    metals = [s for s, _ in main.composition if _is_metal(s)]
    return metals[0] if metals else main.label


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
    chemicals = _require("chemicals")
    from chemicals import phase_change

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
    from chemicals.identifiers import search_chemical

    from ionicity.scorer.formula import FormulaError, parse_formula
    from ionicity.scorer.ions import decompose

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
        dec = decompose(comp)
        verdicts = [screen_salt(dec, n) for n in names] or [(False, "no name")]
        ok = any(v[0] for v in verdicts)
        if not ok:
            decisions.append({**entry, "kept": False, "reason": verdicts[0][1]})
            continue
        value, how = consensus_melting_point_K(values[cas], tolerance_K)
        if math.isnan(value):
            decisions.append({**entry, "kept": False, "reason": how})
            continue
        from ionicity.scorer.record import normalized_formula

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
    import pandas as pd

    from ionicity.pipelines.io import InputError
    from ionicity.scorer.formula import FormulaError, parse_formula
    from ionicity.scorer.ions import decompose
    from ionicity.scorer.record import normalized_formula

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


# ------------------------------------------------------------------- features


def score_for_melting(formula: str) -> dict:
    """``scorer.score_formula`` plus the melting columns when the registry does not list them yet."""
    from ionicity.scorer import score_formula
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose

    record = score_formula(formula)
    if "mp_trend_index" not in record:
        values = {"mp_trend_index": math.nan, "melting_class": None}
        if record.get("status") != "error":
            values, _ = melting.describe(decompose(parse_formula(formula)))
        record = {**record, **values}
    return record


def feature_matrix(rows) -> tuple[np.ndarray, list[dict]]:
    """:data:`scorer.melting_model.MODEL_FEATURES` for training rows, and their scored records."""
    records = [score_for_melting(row["formula_normalized"]) for row in rows]
    x = np.vstack([melting_model.model_features_from_record(r) for r in records]) if records else np.empty((0, len(melting_model.MODEL_FEATURES)))
    return x, records


def _lattice_energy(records) -> np.ndarray:
    vbt = np.array([_float(r.get("lattice_energy_vbt_kJ_mol")) for r in records])
    kap = np.array([_float(r.get("lattice_energy_kapustinskii_kJ_mol")) for r in records])
    return np.where(np.isfinite(vbt), vbt, kap)


def _float(value) -> float:
    try:
        return float(value) if value is not None else math.nan
    except (TypeError, ValueError):
        return math.nan


# ----------------------------------------------------------------- the model


def make_melting_pipeline(seed: int = 0, features=None):
    """The regression: gradient-boosted trees on ln(melting point), as a scikit-learn pipeline.

    ``HistGradientBoostingRegressor`` takes NaN features as they come (an ion
    without a radius, a salt without an HSAB pairing), so no imputation step
    is needed; the target is fitted on a log scale because errors grow with
    the melting point. The hyperparameters were picked among four candidates
    by their grouped cross-validation figures on the open set (chemicals 1.5.2).

    Parameters
    ----------
    seed : int, default=0
    features : sequence of str, optional
        Names of the input columns, in order (default
        :data:`scorer.melting_model.MODEL_FEATURES`); the trend index, when present,
        gets a monotonic (increasing) constraint.
    """
    from sklearn.compose import TransformedTargetRegressor
    from sklearn.ensemble import HistGradientBoostingRegressor
    from sklearn.pipeline import Pipeline

    names = list(melting_model.MODEL_FEATURES if features is None else features)
    # the melting point may only rise with the trend index (its physics says so);
    # small trees and a floor on leaf size because groups of similar salts are few
    monotonic = [1 if name == "mp_trend_index" else 0 for name in names]
    trees = HistGradientBoostingRegressor(
        max_iter=200, learning_rate=0.05, max_leaf_nodes=7, min_samples_leaf=15, l2_regularization=1.0,
        monotonic_cst=monotonic, early_stopping=False, random_state=seed,
    )
    return Pipeline([("regressor", TransformedTargetRegressor(regressor=trees, func=np.log, inverse_func=np.exp,
                                                              check_inverse=False))])


def _fit_pipeline(x: np.ndarray, y_K: np.ndarray, seed: int):
    """Fit on the columns that hold at least one value; returns the pipeline and those column indices."""
    used = np.array([j for j in range(x.shape[1]) if np.isfinite(x[:, j]).any()], dtype=int)
    if len(used) == 0:
        raise ValueError("no feature holds a value in the training rows")
    names = [melting_model.MODEL_FEATURES[j] for j in used]
    pipe = make_melting_pipeline(seed, names).fit(x[:, used], y_K)
    return pipe, used


def _conformal_halfwidth(residuals: np.ndarray, coverage: float) -> float:
    """Split-conformal quantile: the ceil((n+1) * coverage)-th smallest absolute residual."""
    r = np.sort(np.abs(residuals))
    n = len(r)
    if n == 0:
        return math.inf
    k = math.ceil((n + 1) * coverage)
    return float(r[min(k, n) - 1]) if k <= n else float(r[-1])


def _metrics(y_true: np.ndarray, y_pred: np.ndarray) -> dict:
    from scipy.stats import spearmanr

    ok = np.isfinite(y_pred) & np.isfinite(y_true)
    t, p = y_true[ok], y_pred[ok]
    if len(t) < 3:
        return {"n": int(len(t))}
    resid = t - p
    ss_tot = float(np.sum((t - t.mean()) ** 2))
    rho = spearmanr(t, p).statistic if np.ptp(p) > 0 else math.nan
    return {
        "n": int(len(t)),
        "mae_K": round(float(np.mean(np.abs(resid))), 1),
        "rmse_K": round(float(np.sqrt(np.mean(resid ** 2))), 1),
        "r2": round(1.0 - float(np.sum(resid ** 2)) / ss_tot, 3) if ss_tot > 0 else math.nan,
        "spearman_rho": round(float(rho), 3) if rho == rho else None,
    }


def _split_calibration(n: int, fraction: float, rng: np.random.Generator) -> tuple[np.ndarray, np.ndarray]:
    order = rng.permutation(n)
    n_cal = max(1, int(round(n * fraction)))
    return np.sort(order[n_cal:]), np.sort(order[:n_cal])


def grouped_cross_validation(x, y_K, groups, lattice_energy, *, folds: int = 5, coverage: float = 0.9,
                             calibration_fraction: float = 0.25, seed: int = 0) -> dict:
    """Grouped K-fold cross-validation of the model and the two baselines, with conformal coverage.

    In every fold the training part is split once more: the model is fitted
    on one part and its absolute log residuals on the other (the calibration
    part) set the interval half-width; coverage is then counted on the
    held-out fold.

    Parameters
    ----------
    x : ndarray of shape (n_samples, n_features)
    y_K : ndarray of shape (n_samples,)
        Melting points in K.
    groups : array-like of shape (n_samples,)
        Group label per row; rows of one group never straddle a split.
    lattice_energy : ndarray of shape (n_samples,)
        The single feature of the linear baseline [kJ/mol].
    folds : int, default=5
        Splits of :class:`sklearn.model_selection.GroupKFold` (fewer when
        there are fewer groups).
    coverage : float, default=0.9
        Target coverage of the intervals.
    calibration_fraction : float, default=0.25
    seed : int, default=0

    Returns
    -------
    dict
        ``model``, ``baseline_mean``, ``baseline_lattice_energy``: MAE, RMSE,
        R^2, Spearman rho over the out-of-fold predictions;
        ``interval_coverage`` and ``interval_mean_width_K``; ``folds``;
        ``oof_predictions_K`` (list).
    """
    from sklearn.linear_model import LinearRegression
    from sklearn.model_selection import GroupKFold

    groups = np.asarray(groups)
    n_groups = len(set(groups.tolist()))
    splits = min(folds, n_groups)
    if splits < 2:
        raise ValueError(f"grouped cross-validation needs at least 2 groups, found {n_groups}")
    rng = np.random.default_rng(seed)
    oof = np.full(len(y_K), np.nan)
    oof_mean = np.full(len(y_K), np.nan)
    oof_lin = np.full(len(y_K), np.nan)
    inside = np.zeros(len(y_K), dtype=bool)
    width = np.full(len(y_K), np.nan)
    for train, test in GroupKFold(n_splits=splits).split(x, y_K, groups):
        proper, calib = _split_calibration(len(train), calibration_fraction, rng)
        proper, calib = train[proper], train[calib]
        pipe, used = _fit_pipeline(x[proper], y_K[proper], seed)
        q = _conformal_halfwidth(np.log(y_K[calib]) - np.log(pipe.predict(x[calib][:, used])), coverage)
        pred = pipe.predict(x[test][:, used])
        oof[test] = pred
        inside[test] = np.abs(np.log(y_K[test]) - np.log(pred)) <= q
        width[test] = pred * (math.exp(q) - math.exp(-q))
        oof_mean[test] = float(np.mean(y_K[train]))
        ok = np.isfinite(lattice_energy[train])
        line = LinearRegression().fit(lattice_energy[train][ok].reshape(-1, 1), y_K[train][ok])
        lat = lattice_energy[test]
        oof_lin[test] = np.where(np.isfinite(lat), line.predict(np.nan_to_num(lat).reshape(-1, 1)), np.mean(y_K[train]))
    return {
        "folds": splits,
        "groups": n_groups,
        "model": _metrics(y_K, oof),
        "baseline_mean": _metrics(y_K, oof_mean),
        "baseline_lattice_energy": _metrics(y_K, oof_lin),
        "interval_coverage": round(float(np.mean(inside)), 3),
        "interval_target": coverage,
        "interval_mean_width_K": round(float(np.nanmean(width)), 1),
        "oof_predictions_K": [round(float(v), 2) for v in oof],
    }


def _trees_to_json(hgb) -> tuple[float, list[dict]]:
    """The fitted trees of a HistGradientBoostingRegressor as lists of plain numbers."""
    baseline = float(np.ravel(hgb._baseline_prediction)[0])
    trees = []
    for iteration in hgb._predictors:
        for predictor in iteration:
            nodes = predictor.nodes
            if np.any(nodes["is_categorical"]):
                raise ValueError("categorical splits are not supported in the JSON model format")
            leaf = nodes["is_leaf"].astype(int)
            trees.append({
                "feature": [int(v) for v in nodes["feature_idx"]],
                "threshold": [float(t) if not lf and math.isfinite(t) else 0.0
                              for t, lf in zip(nodes["num_threshold"], leaf)],
                "left": [int(v) for v in nodes["left"]],
                "right": [int(v) for v in nodes["right"]],
                "missing_left": [int(v) for v in nodes["missing_go_to_left"]],
                "leaf": [int(v) for v in leaf],
                "value": [float(v) for v in nodes["value"]],
            })
    return baseline, trees


def _finite_minmax(x: np.ndarray) -> tuple[list[float], list[float]]:
    lo, hi = [], []
    for j in range(x.shape[1]):
        col = x[:, j][np.isfinite(x[:, j])]
        lo.append(float(col.min()) if len(col) else 0.0)
        hi.append(float(col.max()) if len(col) else 0.0)
    return lo, hi


def trend_index_report(rows, records) -> dict:
    """Spearman rho of ``mp_trend_index`` against measured melting points, overall and per anion family."""
    from scipy.stats import spearmanr

    index = np.array([_float(r.get("mp_trend_index")) for r in records])
    y = np.array([row["mp_K"] for row in rows])
    ok = np.isfinite(index)
    out = {"overall": {"n": int(ok.sum()), "spearman_rho": round(float(spearmanr(index[ok], y[ok]).statistic), 3)}}
    families: dict[str, list[int]] = {}
    for i, row in enumerate(rows):
        if ok[i]:
            families.setdefault(row["anion_family"], []).append(i)
    out["per_anion_family"] = {}
    for family, idx in sorted(families.items(), key=lambda kv: -len(kv[1])):
        entry = {"n": len(idx)}
        if len(idx) >= 5 and np.ptp(index[idx]) > 0:
            entry["spearman_rho"] = round(float(spearmanr(index[idx], y[idx]).statistic), 3)
        out["per_anion_family"][family] = entry
    return out


@dataclass
class FitReport:
    """What :func:`fit_melting_model` found: the model document, the metrics and the data used."""

    model: dict
    metrics: dict
    rows: list[dict]
    records: list[dict]
    oof_predictions_K: list[float]


def fit_melting_model(rows, *, folds: int = 5, coverage: float = 0.9, calibration_fraction: float = 0.25,
                      seed: int = 0, progress=None) -> FitReport:
    """Cross-validate and fit the melting-point model on training rows.

    Parameters
    ----------
    rows : list of dict
        Training rows (``formula_normalized``, ``mp_K``, ``anion_family``,
        ``cation_element``), e.g. :attr:`TrainingSet.rows`.
    folds : int, default=5
    coverage : float, default=0.9
        Target coverage of the split-conformal intervals (0 < coverage < 1).
    calibration_fraction : float, default=0.25
        Share of the training rows held back to calibrate the intervals.
    seed : int, default=0
    progress : callable, optional

    Returns
    -------
    FitReport
        ``model`` is the JSON document :func:`save_model` writes.

    Raises
    ------
    ValueError
        Too few usable rows or groups, or a wrong option.
    """
    if not 0.0 < coverage < 1.0:
        raise ValueError(f"coverage must lie between 0 and 1, not {coverage}")
    if not 0.05 <= calibration_fraction <= 0.5:
        raise ValueError(f"calibration_fraction must lie between 0.05 and 0.5, not {calibration_fraction}")
    if folds < 2:
        raise ValueError(f"folds must be at least 2, not {folds}")
    _require("sklearn")
    say = progress or (lambda text: None)
    x, records = feature_matrix(rows)
    usable = [i for i, r in enumerate(records) if math.isfinite(_float(r.get("mp_trend_index")))]
    rows = [rows[i] for i in usable]
    records = [records[i] for i in usable]
    x = x[usable]
    if len(rows) < 20:
        raise ValueError(f"only {len(rows)} training rows have a lattice energy; at least 20 are needed")
    y = np.array([row["mp_K"] for row in rows], dtype=float)
    lattice = _lattice_energy(records)
    say(f"cross-validating on {len(rows)} salts")
    cv = {}
    for scheme in ("anion_family", "cation_element"):
        groups = [row[scheme] for row in rows]
        cv[scheme] = grouped_cross_validation(x, y, groups, lattice, folds=folds, coverage=coverage,
                                              calibration_fraction=calibration_fraction, seed=seed)
    oof = cv["anion_family"].pop("oof_predictions_K")
    cv["cation_element"].pop("oof_predictions_K")
    rng = np.random.default_rng(seed)
    proper, calib = _split_calibration(len(rows), calibration_fraction, rng)
    pipe, used = _fit_pipeline(x[proper], y[proper], seed)
    q = _conformal_halfwidth(np.log(y[calib]) - np.log(pipe.predict(x[calib][:, used])), coverage)
    hgb = pipe.named_steps["regressor"].regressor_
    baseline, trees = _trees_to_json(hgb)
    lo, hi = _finite_minmax(x[:, used])
    metrics = {"cross_validation": cv, "trend_index": trend_index_report(rows, records)}
    document = {
        "format": melting_model.MODEL_FORMAT,
        "format_version": melting_model.MODEL_FORMAT_VERSION,
        "model_type": "gradient_boosted_trees",
        "target": "ln_mp_K",
        "features": [melting_model.MODEL_FEATURES[j] for j in used],
        "baseline": baseline,
        "trees": trees,
        "interval": {"method": "split conformal on absolute ln residuals", "coverage": coverage,
                     "log_halfwidth": q, "calibration_rows": int(len(calib))},
        "domain": {"feature_min": lo, "feature_max": hi,
                   "substance_classes": sorted({r.get("substance_class") or "" for r in records} - {""})},
        "training": {
            "rows": len(rows), "fitted_rows": int(len(proper)), "seed": seed,
            "origins": sorted({row.get("origin", "") for row in rows}),
            "hyperparameters": {k: v for k, v in hgb.get_params().items() if isinstance(v, (int, float, str, bool)) or v is None},
        },
        "metrics": metrics,
        "caution": CAUTION,
    }
    melting_model.model_from_dict(json.loads(json.dumps(document)))  # what we write must load
    return FitReport(model=document, metrics=metrics, rows=rows, records=records, oof_predictions_K=oof)


# ------------------------------------------------------------------ the plot


def parity_plot(y_true_K, y_pred_K, path, *, families=None, title: str = "") -> None:
    """Measured against predicted melting points, log axes, saved as PNG."""
    matplotlib = _require("matplotlib")
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    y_true_K = np.asarray(y_true_K, dtype=float)
    y_pred_K = np.asarray(y_pred_K, dtype=float)
    fig, ax = plt.subplots(figsize=(6.0, 6.0), dpi=120)
    if families is None:
        ax.scatter(y_true_K, y_pred_K, s=10, alpha=0.6)
    else:
        families = np.asarray(families)
        common = [f for f, _ in sorted(((f, int((families == f).sum())) for f in set(families.tolist())),
                                       key=lambda kv: -kv[1])][:8]
        for family in common:
            m = families == family
            ax.scatter(y_true_K[m], y_pred_K[m], s=10, alpha=0.7, label=family)
        rest = ~np.isin(families, common)
        if rest.any():
            ax.scatter(y_true_K[rest], y_pred_K[rest], s=10, alpha=0.5, color="grey", label="other")
        ax.legend(fontsize=7, loc="upper left")
    finite = np.concatenate([y_true_K[np.isfinite(y_true_K)], y_pred_K[np.isfinite(y_pred_K)]])
    lo, hi = float(finite.min()) * 0.8, float(finite.max()) * 1.25
    ax.plot([lo, hi], [lo, hi], color="black", lw=1)
    ax.set_xscale("log")
    ax.set_yscale("log")
    ax.set_xlim(lo, hi)
    ax.set_ylim(lo, hi)
    ax.set_xlabel("measured melting point / K")
    ax.set_ylabel("predicted melting point / K (held-out folds)")
    ax.set_title(title or "melting-point model, grouped cross-validation", fontsize=9)
    fig.text(0.01, 0.005, "Screening estimates only; not for process safety. Check measured data and the SDS.",
             fontsize=6)
    fig.tight_layout()
    path = Path(path)
    tmp = path.with_name(path.name + ".tmp.png")
    fig.savefig(tmp, format="png")
    plt.close(fig)
    os.replace(tmp, path)


# ------------------------------------------------------------------- the CLI


@dataclass
class FitConfig:
    """Options of ``ionicity fit-melting`` (the CLI fills one; a notebook can too)."""

    output_dir: str
    table: str | None = None
    formula_col: str = "formula"
    mp_col: str | None = None
    open_data: bool = True
    tolerance_K: float = TOLERANCE_K
    folds: int = 5
    coverage: float = 0.9
    seed: int = 0
    overwrite: bool = False
    quiet: bool = False




def _config_from_args(args) -> FitConfig:
    return FitConfig(
        output_dir=args.output_dir, table=args.table, formula_col=args.formula_col, mp_col=args.mp_col,
        open_data=not args.no_open_data, tolerance_K=args.tolerance_K, folds=args.folds, coverage=args.coverage,
        seed=args.seed, overwrite=args.overwrite, quiet=args.quiet,
    )


def _write_csv(rows: list[dict], path: Path, columns: list[str]) -> None:
    tmp = path.with_name(path.name + ".tmp")
    with tmp.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.DictWriter(handle, fieldnames=columns, extrasaction="ignore")
        writer.writeheader()
        writer.writerows(rows)
    os.replace(tmp, path)


def summary_text(report: FitReport) -> str:
    """The closing summary for people: metrics against the baselines, coverage, trend index per family."""
    lines = []
    cv = report.metrics["cross_validation"]
    for scheme, result in cv.items():
        lines.append(f"grouped {result['folds']}-fold CV by {scheme.replace('_', ' ')} ({result['groups']} groups):")
        for name in ("model", "baseline_mean", "baseline_lattice_energy"):
            m = result[name]
            lines.append(f"  {name:<24} MAE {m.get('mae_K')} K  RMSE {m.get('rmse_K')} K  R^2 {m.get('r2')}"
                         f"  Spearman {m.get('spearman_rho')}  (n={m.get('n')})")
        lines.append(f"  {int(result['interval_target'] * 100)} % conformal intervals: held-out coverage"
                     f" {result['interval_coverage']:.3f}, mean width {result['interval_mean_width_K']} K")
    trend = report.metrics["trend_index"]
    lines.append(f"mp_trend_index alone: Spearman {trend['overall']['spearman_rho']} (n={trend['overall']['n']})")
    for family, entry in trend["per_anion_family"].items():
        if "spearman_rho" in entry:
            lines.append(f"  {family:<24} Spearman {entry['spearman_rho']:+.3f}  (n={entry['n']})")
    ionic_liquids = sum(1 for r in report.records if r.get("substance_class") == "ionic_liquid_pair")
    lines.append(f"organic-cation salts in the training set: {ionic_liquids} (open data hold few ionic liquids;"
                 " for them the trend index and melting_class carry more weight than the regression)")
    lines.append("caution: " + CAUTION)
    return "\n".join(lines)


def fit_melting(config: FitConfig) -> FitReport:
    """Run ``fit-melting``: build the data, cross-validate, fit, write every output; the Python API of the CLI."""
    from ionicity.pipelines.io import InputError

    say = (lambda text: None) if config.quiet else (lambda text: print(f"ionicity fit-melting: {text}", file=sys.stderr))
    out = Path(config.output_dir)
    if out.exists() and not out.is_dir():
        raise InputError(f"{out} exists and is not a folder")
    existing = [name for name in _OUTPUTS if (out / name).exists()]
    if existing and not config.overwrite:
        raise InputError(f"{out} already holds {', '.join(existing)}; pass --overwrite to replace them")
    if not config.open_data and not config.table:
        raise InputError("--no-open-data needs --table")
    _require("sklearn")
    _require("matplotlib")
    sets = []
    if config.open_data:
        sets.append(build_open_training_set(tolerance_K=config.tolerance_K, progress=say))
    if config.table:
        sets.append(read_user_table(config.table, formula_col=config.formula_col, mp_col=config.mp_col))
    data = combine_training_sets(*sets)
    report = fit_melting_model(data.rows, folds=config.folds, coverage=config.coverage, seed=config.seed, progress=say)
    out.mkdir(parents=True, exist_ok=True)
    save_model(report.model, out / "melting_model.json")
    columns = ["formula", "formula_normalized", "mp_K", "name", "cas", "origin", "decision", "anion_family",
               "cation_element", "mp_trend_index", "melting_class", "mp_oof_predicted_K"]
    table = [{**row, "mp_trend_index": rec.get("mp_trend_index"), "melting_class": rec.get("melting_class"),
              "mp_oof_predicted_K": oof}
             for row, rec, oof in zip(report.rows, report.records, report.oof_predictions_K)]
    _write_csv(table, out / "training_set.csv", columns)
    _write_csv(data.decisions, out / "decisions.csv", ["cas", "name", "formula", "sources", "kept", "reason"])
    payload = {"data": data.info, "metrics": report.metrics, "caution": CAUTION}
    (out / "report.json").write_text(json.dumps(payload, indent=2, allow_nan=False, default=str), encoding="utf-8")
    parity_plot([r["mp_K"] for r in report.rows], report.oof_predictions_K, out / "parity.png",
                families=[r["anion_family"] for r in report.rows],
                title=f"{len(report.rows)} salts, held-out folds grouped by anion family")
    say("wrote " + ", ".join(str(out / name) for name in _OUTPUTS))
    return report


def run_fit_melting(args) -> int:
    """The ``fit-melting`` command: 0 done, 2 missing extra or bad input, 3 internal error."""
    from ionicity.pipelines.io import InputError

    config = _config_from_args(args)
    try:
        report = fit_melting(config)
    except MissingExtraError as exc:
        print(f"ionicity fit-melting: {exc}", file=sys.stderr)
        return 2
    except (InputError, ValueError) as exc:
        print(f"ionicity fit-melting: error: {exc}", file=sys.stderr)
        return 2
    print(summary_text(report))
    return 0
