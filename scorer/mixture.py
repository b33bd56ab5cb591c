"""Mixtures in the formula column: one row for a blend, scored from its components.

A cell written as a mixture (:mod:`scorer.mixture_notation`: ``LiCl-KCl
(58.8-41.2 mol%)``, ``ChCl:urea 1:2``, ``0.588 LiCl + 0.412 KCl``, or a blend
name such as ``FLiNaK`` from ``scorer/data/blends.csv`` or a user's
``--aliases`` file) is scored here: each component as the compound it is,
then one record for the mixture, with ``substance_class`` ``mixture``:

* ``mixture_components`` and ``mixture_mole_fractions`` (weight percent
  converted with the components' molar masses);
* each other column formed from the components by its rule
  (:mod:`scorer.mixture_rules`: a mole-fraction average where that means
  something, empty where it does not);
* ``liquidus_estimate_K`` from :mod:`scorer.liquidus`, with the components'
  melting points and enthalpies of fusion from ``scorer/data/fusion.csv``.

For a compound (every other cell) these columns are empty: the module is
listed in ``scorer.columns.RECORD_COLUMN_MODULES`` (columns the record fills),
not among the descriptor modules, which compute per compound.

>>> from ionicity.scorer.record import score_formula
>>> r = score_formula("LiCl-KCl (58.8-41.2 mol%)")
>>> r["substance_class"], r["mixture_components"], r["mixture_mole_fractions"]
('mixture', 'LiCl;KCl', '0.588;0.412')
>>> score_formula("NaCl")["mixture_components"] is None
True
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ionicity.scorer.caching import clear_all, once, per_input
from ionicity.scorer.caution import CAUTION, WATER_CAUTION
from ionicity.scorer.columns import output_columns
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.formula import POLYMORPH_LABEL, FormulaError, alloy_designation, code_hydrohalide, code_metal_salt, parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.melting import fusion_estimate
from ionicity.scorer.liquidus import MeltComponent, MeltIon, liquidus_K, pair_lambda_J_mol
from ionicity.scorer.mixture_notation import MixtureNotationError, MixtureText, blend_key, read_mixture_text
from ionicity.scorer.melting_routes import GAS_CLASS, melting_class_for
from ionicity.scorer.mixing import corrosive_note, mixing_warning, water_reaction_warning
from ionicity.scorer.solutions import split_grade_words
from ionicity.scorer.mixture_rules import mixture_rule
from ionicity.scorer.model import Column
from ionicity.scorer.formula import (
    _DEUTERATED_CODE, _HYPHENATED_PAIR, deuterated_solvent, ionic_liquid_pair_text, nonstoichiometric_text,
)
from ionicity.scorer.name_reader import formula_with_hydrate_word, parse_as_name
from ionicity.scorer.radii import ion_radius_pm
from ionicity.scorer.tables import table
from ionicity.scorer.verdict import Verdict, finalise, with_warnings

__all__ = [
    "GROUP", "COLUMNS", "Mixture", "read_mixture", "mixture_row", "set_user_blends", "names_a_blend",
    "melt_component", "system_components", "published_point", "published_eutectics", "published_liquidus_errors", "compound_note", "fusion_rows",
]

GROUP = "mixture"

_LIQUIDUS_SOURCE = (
    "Schroeder 1893 / van Laar 1903 (ideal liquidus); Temkin, Acta Physicochim. URSS 20 (1945) 411 (ion fractions);"
    " Hersh and Kleppa, J. Chem. Phys. 42 (1965) 1309 (size-mismatch interaction); fusion data scorer/data/fusion.csv"
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "mixture_components", "string", "",
        "for a mixture: its components, written as formulas (or the fusion table's names), joined by ';'",
        "scorer.mixture_notation", "scorer/data/blends.csv for blend names (sources per row)",
    ),
    Column(
        "mixture_mole_fractions", "string", "mol/mol",
        "for a mixture: each component's mole fraction (formula units), in mixture_components order, joined by ';';"
        " weight percent converted with the components' molar masses",
        "amount n_i = w_i / M_i, x_i = n_i / sum n", "IUPAC Green Book (amount fraction)",
    ),
    Column(
        "liquidus_estimate_K", "float64", "K",
        "for a mixture: estimated liquidus temperature at its composition (above it, all liquid); " + CAUTION,
        "Schroeder-van Laar branch of each component, ln a_i = -(dHfus_i/R)(1/T - 1/Tm_i), the highest;"
        " a_i by Temkin ion fractions plus a regular-solution lambda for ionic melts, mole fractions otherwise",
        _LIQUIDUS_SOURCE,
    ),
    Column(
        "liquidus_method", "string", "",
        "for a mixture: how liquidus_estimate_K was formed, and the component whose solid sets it", "", "",
    ),
)

_MOLECULAR_NOTE = "neutral molecule: ion-based values do not apply"


# ---------------------------------------------------------------- the tables

@once
def fusion_rows() -> dict[str, dict]:
    """fusion.csv rows by every name they answer to (case and spacing ignored)."""
    rows: dict[str, dict] = {}
    for row in table("fusion.csv"):
        keys = {row["component"], row["formula"], *(n for n in row["names"].split(";") if n)}
        for key in keys:
            rows[blend_key(key)] = row
    return rows


@once
def _fusion_by_normalized(score_row) -> dict[str, dict]:
    """Ionic fusion.csv rows by the scorer's normalised formula of their component."""
    position = _layout()[1]["formula_normalized"]
    return {score_row(row["formula"])[position]: row for row in table("fusion.csv") if row["kind"] == "ionic"}


_USER_BLENDS: dict[str, tuple[str, str]] = {}


def set_user_blends(rows) -> None:
    """Blend names of a user's ``--aliases`` file: ``(name, mixture, source)`` rows.

    They take precedence over ``scorer/data/blends.csv``. The pipelines read
    and check the file (``pipelines/aliases.py``); scoring caches are
    cleared, since a name may now mean another mixture.
    """
    _USER_BLENDS.clear()
    for name, mixture, source in rows:
        _USER_BLENDS[blend_key(name)] = (mixture, source)
    clear_all("per_input")


@once
def _blends() -> dict[str, tuple[str, str]]:
    return {blend_key(r["name"]): (r["mixture"], r["source"]) for r in table("blends.csv")}


# words a blend's trade name is often followed by ("Hitec salt", "FLiNaK eutectic"); common practice
_BLEND_WORDS = (" salt", " salts", " eutectic", " mixture", " blend", " melt")


def _blend(text: str) -> tuple[str, str, str] | None:
    key = blend_key(text)
    found = _USER_BLENDS.get(key) or _blends().get(key)
    # every word of _BLEND_WORDS starts with a space: a key without one (a formula) ends in none of them
    if found is None and " " in key:
        for word in _BLEND_WORDS:
            if key.endswith(word) and key != word.strip():
                stem = key[: -len(word)]
                found = _USER_BLENDS.get(stem) or _blends().get(stem)
                if found is not None:
                    break
    if found is None and " " in key:
        # a blend with a cylinder's or a dewar's words ("compressed air", "air, compressed", "liquid air")
        stem = blend_key(split_grade_words(text)[0])
        if stem != key:
            found = _USER_BLENDS.get(stem) or _blends().get(stem)
    if found is None:
        catalyst = supported_catalyst(text)
        return None if catalyst is None else (text.strip(), *catalyst)
    return text.strip(), found[0], found[1]


# a metal on a support as catalogues write it: "Pd/C 10%", "Pt on carbon (5 wt%)", "Pd/Al2O3 5%"
_SUPPORTED = re.compile(
    r"\s*(?P<metal>[A-Z][a-z]?)\s*(?:/|\s+on\s+)\s*(?P<support>C|carbon|charcoal|Al2O3|alumina|SiO2|silica|CaCO3"
    r"|BaSO4|TiO2)\s*,?\s*\(?\s*(?P<load>\d+(?:\.\d+)?)\s*(?:wt\.?\s*)?%\s*(?:wt\.?)?\s*\)?\s*", re.I)
_SUPPORTS = {"carbon": "C", "charcoal": "C", "alumina": "Al2O3", "silica": "SiO2"}


def supported_catalyst(text: str) -> tuple[str, str] | None:
    """(mixture text, source) of a metal on a support with its loading: ``Pd/C 10%`` is 10 wt% Pd on carbon,
    ``Pd-C (10-90 wt%)``; None for any other text. A metal on carbon carries the ignition caution of the
    mixture notes (:func:`supported_metal_caution`).

    >>> supported_catalyst("Pd/C 10%")[0], supported_catalyst("NaCl") is None
    ('Pd-C (10-90 wt%)', True)
    """
    m = _SUPPORTED.fullmatch(text) if isinstance(text, str) and len(text) < 60 else None
    if m is None or not is_metal(m.group("metal")):
        return None
    load = float(m.group("load"))
    if not 0 < load < 100:
        return None
    support = _SUPPORTS.get(m.group("support").lower(), m.group("support"))
    return (f"{m.group('metal')}-{support} ({load:g}-{100 - load:g} wt%)",
            "a metal on a support, its loading in weight percent (common practice)")


def supported_metal_caution(names) -> str:
    """The caution of a fine metal on carbon (Pd/C, Pt/C, Raney-type catalysts): it can ignite solvent vapours
    and hydrogen in air, above all when dry or used (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed.,
    2007; from memory); "" for other mixtures."""
    names = tuple(names)
    if len(names) == 2 and names[1] == "C" and is_metal(names[0]):
        return (f"{names[0]} on carbon can ignite solvent vapours and hydrogen in air, above all when dry or spent:"
                " keep it wet and follow the safety data sheet")
    return ""


def names_a_blend(text: str) -> bool:
    """Whether ``text`` is a blend name (``scorer/data/blends.csv`` or the
    user's ``--aliases``), case and spacing ignored."""
    return _blend(text) is not None


@once
def published_eutectics() -> tuple[dict, ...]:
    """The test set of published eutectics (scorer/data/eutectics.csv), typed."""
    rows = []
    for row in table("eutectics.csv"):
        rows.append({
            "components": tuple(row["system"].split("-")),
            "fractions": tuple(float(v) for v in row["mole_fractions"].split(";")),
            "liquidus_K": float(row["liquidus_K"]),
            "set": row["set"], "kind": row["kind"], "source": row["source"],
        })
    return tuple(rows)


def _published(names: tuple[str, ...]) -> dict | None:
    for row in published_eutectics():
        if sorted(row["components"]) == sorted(names):
            order = [row["components"].index(n) for n in names]
            return {**row, "components": names, "fractions": tuple(row["fractions"][i] for i in order)}
    return None


def published_liquidus_errors(omega=None, k=None, estimated: bool = False) -> tuple[dict, ...]:
    """The estimate against every published point of scorer/data/eutectics.csv.

    Each entry: ``system``, ``set`` (calibration or validation), ``fractions``,
    ``published_K``, ``estimate_K``, ``ideal_K`` (Temkin or molecular ideal
    line, no lambda) and ``error_pct`` (absolute, in % of the published
    kelvin). ``omega`` and ``k`` replace the calibrated coefficients (the
    calibration scan, ``tests/calibrate_liquidus.py``). With ``estimated``, every component's melting point and
    enthalpy of fusion are the melting routes' estimates (:func:`estimated_melt`) instead of fusion.csv's: how
    the fallback for components without measured data does where the answer is known.
    """
    rows = []
    for row in published_eutectics():
        melts = []
        for name in row["components"]:
            fusion = fusion_rows()[blend_key(name)]
            formula = fusion["formula"] if fusion["kind"] == "ionic" else ""
            if estimated:
                melts.append(estimated_melt(fusion["formula"]))
                continue
            melts.append(melt_component(formula, name, float(fusion["melting_point_K"]),
                                        float(fusion["enthalpy_fusion_kJ_mol"]) * 1000.0))
        melts = tuple(melts)
        n = len(melts)
        lambdas = {(j, m): pair_lambda_J_mol(melts[j], melts[m], omega, k)[0] for j in range(n) for m in range(j + 1, n)}
        estimate = liquidus_K(melts, row["fractions"], lambdas).temperature_K
        ideal = liquidus_K(melts, row["fractions"], {}).temperature_K
        published = row["liquidus_K"]
        rows.append({
            "system": "-".join(row["components"]), "set": row["set"], "kind": row["kind"], "fractions": row["fractions"],
            "published_K": published, "estimate_K": estimate, "ideal_K": ideal,
            "error_pct": 100.0 * abs(estimate - published) / published,
            "ideal_error_pct": 100.0 * abs(ideal - published) / published,
        })
    return tuple(rows)


def compound_note(names: tuple[str, ...]) -> str:
    """The value note of a system known to form compounds or complexes ("" if none)."""
    found = []
    for row in table("compound_systems.csv"):
        if row["component_a"] in names and row["component_b"] in names:
            found.append(f"{row['component_a']}-{row['component_b']} forms {row['compounds']} ({row['source']})")
    if not found:
        return ""
    return "; ".join(found) + ": the liquidus near such compounds is not modelled (regular-solution estimate)"


# ---------------------------------------------------------------- components

@dataclass(frozen=True)
class _Component:
    name: str            # as shown in mixture_components
    record: tuple        # its own row (score_row), or a molecular row
    molar_mass_g_mol: float
    fusion: dict | None  # its fusion.csv row
    formula: str


def _holds_metal(formula: str) -> bool:
    """Whether a component's formula holds a metal; False for one that is no formula (a component written by its
    name, "water", keeps that name as its formula)."""
    try:
        return any(is_metal(s) for s, _ in parse_formula(formula).counts)
    except FormulaError:
        return False


def _resolve(text: str, score_row) -> _Component:
    """One component as written -> its name, own scores and fusion data."""
    names, position, empty, _ = _layout()
    row = fusion_rows().get(blend_key(text))
    if row is not None and row["kind"] == "molecular":
        comp = parse_formula(row["formula"])
        mass = round(sum(get_element(s).atomic_weight * n for s, n in comp.counts), 4)
        values = list(empty)
        verdict = finalise(gaps=[_MOLECULAR_NOTE])
        for name, value in (("status", verdict.status), ("message", ""), ("value_notes", verdict.value_notes),
                            ("formula_normalized", row["formula"]), ("substance_class", "covalent_molecular"),
                            ("hydrate_water", 0.0), ("molar_mass_g_mol", mass)):
            values[position[name]] = value
        return _Component(row["component"], tuple(values), mass, row, row["formula"])
    formula = row["formula"] if row is not None else text
    record = score_row(formula)
    normalized = record[position["formula_normalized"]] or formula
    if row is None:
        row = _fusion_by_normalized(score_row).get(normalized)
    return _Component(normalized, record, record[position["molar_mass_g_mol"]], row, formula)


@per_input(maxsize=1024)
def melt_component(formula: str, name: str, melting_point_K: float, enthalpy_fusion_J_mol: float) -> MeltComponent:
    """A component for :mod:`scorer.liquidus`: fusion data and its ions (Shannon VI radii)."""
    try:
        dec = decompose(parse_formula(formula))
    except FormulaError:
        return MeltComponent(name, melting_point_K, enthalpy_fusion_J_mol)
    if not dec.is_ionic or not dec.cations or not dec.anions:
        return MeltComponent(name, melting_point_K, enthalpy_fusion_J_mol)

    def ions(terms):
        return tuple(
            MeltIon(t.ion.ion_id, float(t.count), t.ion.charge, ion_radius_pm(t.ion, 6 if t.ion.monatomic else None)[0])
            for t in terms
        )

    return MeltComponent(name, melting_point_K, enthalpy_fusion_J_mol, ions(dec.cations), ions(dec.anions))


def _melt(component: _Component, estimate: bool = False) -> MeltComponent | None:
    """The liquidus component of ``component`` from its fusion.csv row; without one, and with ``estimate``,
    from the melting routes' own estimate (:func:`estimated_melt`); else None."""
    row = component.fusion
    if row is None:
        return estimated_melt(component.name) if estimate else None
    formula = row["formula"] if row["kind"] == "ionic" else ""
    return melt_component(formula, component.name, float(row["melting_point_K"]),
                          float(row["enthalpy_fusion_kJ_mol"]) * 1000.0)


@per_input(maxsize=1024)
def estimated_melt(formula: str) -> MeltComponent | None:
    """A liquidus component whose melting point and enthalpy of fusion are the melting routes' estimates
    (:func:`scorer.melting.fusion_estimate`: the trend temperature and ``T dS`` of its route), for a component
    fusion.csv does not hold ([C2mim][NTf2], Ca(NO3)2, LiTFSI); None where no route gives them."""
    try:
        dec = decompose(parse_formula(formula))
    except FormulaError:
        return None
    estimate = fusion_estimate(dec)
    if estimate is None:
        return None
    temperature, enthalpy, route = estimate
    return melt_component(formula if route == "salt" else "", formula, temperature, enthalpy)


def system_components(texts, score_row) -> tuple[MeltComponent, ...]:
    """The liquidus components of a system named by formulas or fusion.csv names.

    Raises
    ------
    ValueError
        Naming the text that is not a component with fusion data.

    Examples
    --------
    >>> from ionicity.scorer.record import score_row
    >>> [c.name for c in system_components(["LiCl", "KCl"], score_row)]
    ['LiCl', 'KCl']
    """
    melts = []
    for text in texts:
        component = _resolve(text, score_row)
        position = _layout()[1]
        if component.record[position["status"]] == "error":
            raise ValueError(f"{text!r} cannot be scored as a compound: {component.record[position['message']]}")
        melt = _melt(component)
        if melt is None:
            known = sorted({r["component"] for r in table("fusion.csv")})
            raise ValueError(
                f"no melting point and enthalpy of fusion for {text!r} in scorer/data/fusion.csv;"
                f" known: {', '.join(known)}"
            )
        melts.append(melt)
    names = [m.name for m in melts]
    if len(set(names)) != len(names):
        raise ValueError(f"a component is named twice: {', '.join(texts)}")
    return tuple(melts)


def published_point(names) -> dict | None:
    """The published liquidus point of a system in scorer/data/eutectics.csv, in ``names`` order."""
    return _published(tuple(names))


# ---------------------------------------------------------------- the record

def compact_text(text: str) -> str:
    """``text`` without spaces, in lower case: how two spellings of one part are compared."""
    return "".join(text.split()).lower()


@dataclass(frozen=True)
class SameCompound:
    """Two parts of a text that name one compound (a formula and its name): that compound's row."""

    component: object
    text: str


@dataclass(frozen=True)
class Mixture:
    """A mixture as read: components, mole fractions, and what was noticed."""

    components: tuple[_Component, ...]
    fractions: tuple[float, ...]
    warnings: tuple[str, ...]
    notes: tuple[str, ...]
    blend: str = ""


def _fractions(text: MixtureText, components, warnings: list, notes: list) -> tuple[float, ...]:
    names = tuple(c.name for c in components)
    if not text.amounts:
        published = _published(names)
        if published is not None and text.eutectic:
            notes.append(
                "the eutectic: the composition of the published point of scorer/data/eutectics.csv"
                f" ({'-'.join(f'{100 * x:.1f}' for x in published['fractions'])} mol%; {published['source']})"
            )
            return published["fractions"]
        if text.eutectic:
            raise MixtureNotationError(
                f"no published eutectic of {'-'.join(names)} in scorer/data/eutectics.csv; give the proportions,"
                " e.g. (50-50 mol%)"
            )
        if published is not None:
            warnings.append(
                "no proportions given: took the composition of the published liquidus point of scorer/data/eutectics.csv"
                f" ({'-'.join(f'{100 * x:.1f}' for x in published['fractions'])} mol%; {published['source']})"
            )
            return published["fractions"]
        warnings.append("no proportions given: equal moles assumed; write them as e.g. (50-50 mol%) or 1:1")
        return tuple(1.0 / len(names) for _ in names)
    amounts = text.amounts
    if text.basis == "wt":
        masses = [c.molar_mass_g_mol for c in components]
        if any(not (m and m == m) for m in masses):
            raise MixtureNotationError("weight proportions need every component's molar mass")
        amounts = tuple(w / m for w, m in zip(amounts, masses))
        notes.append("weight proportions converted to mole fractions with the components' molar masses")
    total = sum(amounts)
    return tuple(a / total for a in amounts)


def _reads_as_compound(text: str) -> bool:
    try:
        parse_formula(text)
    except FormulaError:
        return False
    return True


# a Greek letter (or its name) and a hyphen opening a text: a locant or anomer label of a name
_GREEK_LOCANT_START = re.compile(r"^\s*(?:[αβγδεζηθκλμω]|(?i:alpha|beta|gamma|delta|epsilon|omega))-(?=[A-Za-z])")


def read_mixture(text: str, score_row) -> Mixture | SameCompound | str | None:
    """The mixture a cell describes, an error message, or None for a compound.

    ``score_row`` scores one component (:func:`scorer.record.score_row`;
    passed in, since the record module calls this one).
    """
    if _GREEK_LOCANT_START.match(text):
        return None  # "β-carotene", "α-cyclodextrin": a name with a Greek-letter locant, no mixture of β and carotene
    blend = _blend(text) if not text[:1].isdigit() else None
    notes: list[str] = []
    if blend is not None:
        shown, written, source = blend
        notes.append(f"{shown} read as {written} ({source})")
        text_to_read = written
    else:
        text_to_read = text
    try:
        mixture_text = read_mixture_text(text_to_read)
    except MixtureNotationError as exc:
        return str(exc)
    if mixture_text is None:
        return None if blend is None else f"the blend {blend[0]!r} is defined as {blend[1]!r}, which is not mixture notation"
    if any(" ".join(part.split()) == " ".join(text_to_read.split()) for part in mixture_text.parts):
        # a component that is the whole text would be scored by asking this reader again, without end
        return None
    components = []
    for part in mixture_text.parts:
        if fusion_rows().get(blend_key(part)) is None:
            try:
                comp = parse_formula(part)
            except FormulaError as exc:
                comp = parse_as_name(part)  # a component named ("sodium chloride + potassium chloride")
                if comp is None:
                    if blend is None and ":" not in text_to_read and not mixture_text.amounts and (
                            _reads_as_compound(text) or parse_as_name(text) is not None):
                        return None  # a dash or plus inside a compound's own notation or name ("γ-butyrolactone")
                    return f"component {part!r} of the mixture: {exc}"
            if comp.charge != 0:
                return None if blend is None else f"component {part!r} of the blend {blend[0]!r} is an ion"
        components.append(_resolve(part, score_row))
    warnings = list(mixture_text.notes)
    position = _layout()[1]
    for component in components:
        status = component.record[position["status"]]
        if status == "error":
            return f"component {component.name!r} of the mixture: {component.record[position['message']]}"
        if status == "warning":
            warnings.append(f"{component.name}: {component.record[position['message']]}")
    if len({c.name for c in components}) != len(components):
        if len(components) == 2 and not mixture_text.amounts and blend is None and \
                compact_text(mixture_text.parts[0]) != compact_text(mixture_text.parts[1]):
            # a formula with its name ("NaCl - Sodium chloride", "Potassium nitrate: KNO3"): one compound
            return SameCompound(components[0], text)
        return f"a component is named twice in {text!r}"
    try:
        fractions = _fractions(mixture_text, components, warnings, notes)
    except MixtureNotationError as exc:
        return str(exc)
    return Mixture(tuple(components), fractions, tuple(warnings), tuple(notes), blend[0] if blend else "")


@once
def _layout():
    columns = output_columns()
    names = tuple(c.name for c in columns)
    empty = tuple(math.nan if c.dtype == "float64" else None for c in columns)
    return names, {n: i for i, n in enumerate(names)}, empty, columns


def _combine(rule: str, values, fractions, dtype: str):
    present = [(v, x) for v, x in zip(values, fractions) if v is not None and not (isinstance(v, float) and math.isnan(v))]
    if rule == "mean":
        weight = sum(x for _, x in present)
        return sum(v * x for v, x in present) / weight if present and weight > 0 else math.nan
    if rule == "min":
        return min((v for v, _ in present), default=math.nan)
    if rule == "max":
        return max((v for v, _ in present), default=math.nan)
    if rule == "any":
        return any(bool(v) for v, _ in present) if present else None
    if rule == "each":
        return ";".join(dict.fromkeys(str(v) for v, _ in present)) or None
    if rule == "shared":
        distinct = {v for v, _ in present}
        if not distinct:
            return None
        return distinct.pop() if len(distinct) == 1 else "mixed"
    return math.nan if dtype == "float64" else None


def _ions_text(values, fractions) -> str | None:
    totals: dict[str, float] = {}
    for text, x in zip(values, fractions):
        for term in (text or "").split(";"):
            if not term:
                continue
            ion, _, count = term.partition("*")
            totals[ion] = totals.get(ion, 0.0) + float(count or 1) * x
    return ";".join(f"{ion}*{n:.4g}" for ion, n in totals.items()) or None


def _states_text(values) -> str | None:
    seen: dict[str, None] = {}
    for text in values:
        for term in (text or "").split(";"):
            if term:
                seen.setdefault(term, None)
    return ";".join(seen) or None


# components whose melt is no simple-ion liquid: chains and layers (ZnCl2, BeCl2), molecules (AlCl3 as Al2Cl6)
NETWORK_MELT_CLASSES = frozenset({"chain_layer_solid", "covalent_molecular", "covalent_network"})


def network_melt_warning(names) -> str:
    """The warning of a liquidus estimate from the simple-ion model where components (``names``) form networks
    or complex ions in the melt (ZnCl4(2-) with a partner's chloride): the estimate can be far off
    (``ZnCl2:ChCl 2:1`` reads 110 K; it freezes near 297 K, Abbott et al., Inorg. Chem. 2004, 43, 3447, from
    memory). The mixture rows and ``ionicity eutectic`` say it."""
    return (f"liquidus estimate: {', '.join(names)} is not a simple-ion salt (its melt forms complex ions or"
            " networks with the other components), so the estimate can be far off; check measured data")


def _liquidus(mixture: Mixture) -> tuple[float, str, list[str]]:
    names = tuple(c.name for c in mixture.components)
    notes: list[str] = []
    melts = [_melt(c, estimate=True) for c in mixture.components]
    missing = [c.name for c, m in zip(mixture.components, melts) if m is None]
    if missing:
        return math.nan, "", [f"no melting point and enthalpy of fusion for {', '.join(missing)} in scorer/data/fusion.csv,"
                              " nor an estimate from its melting trend: liquidus not estimated"]
    estimated = [c.name for c in mixture.components if c.fusion is None]
    result = liquidus_K(tuple(melts), mixture.fractions)
    rules = sorted({pair_lambda_J_mol(a, b)[1] for i, a in enumerate(melts) for b in melts[i + 1:]})
    rules_text = f" ({', '.join(rules)})" if all(m.ionic for m in melts) else ""
    method = f"{result.method}{rules_text}; primary phase {result.primary_phase}"
    if estimated:
        method += f"; fusion data estimated for {', '.join(estimated)}"
        notes.append(f"liquidus estimate: no measured melting point and enthalpy of fusion for {', '.join(estimated)}"
                     " in scorer/data/fusion.csv; the melting trend's estimates are used (its trend temperature and"
                     " T dS of its route, scatter a factor 1.5), so the liquidus is rougher than one from measured"
                     " data")
    note = compound_note(names)
    if note:
        notes.append(note)
    if not all(m.ionic for m in melts):
        published = _published(names)
        text = "deep eutectic or molecular mixture: the ideal line is the reference; measured eutectics lie below it"
        if published is not None:
            depression = result.temperature_K - published["liquidus_K"]
            text += (f"; published eutectic {published['liquidus_K']:.0f} K ({published['source']}),"
                     f" {depression:.0f} K below the ideal line")
        notes.append(text)
    return result.temperature_K, method, notes


def _record(mixture: Mixture) -> tuple:
    names, position, empty, columns = _layout()
    row = list(empty)
    records = [c.record for c in mixture.components]
    x = mixture.fractions
    for column in columns:
        rule = mixture_rule(column.name)
        if rule == "own":
            continue
        values = [r[position[column.name]] for r in records]
        if rule == "ions":
            row[position[column.name]] = _ions_text(values, x)
        elif rule == "states":
            row[position[column.name]] = _states_text(values)
        else:
            row[position[column.name]] = _combine(rule, values, x, column.dtype)
    component_names = tuple(c.name for c in mixture.components)
    row[position["substance_class"]] = "mixture"
    row[position["formula_normalized"]] = (
        "-".join(component_names) + " (" + "-".join(f"{100 * f:.4g}" for f in x) + " mol%)"
    )
    row[position["mixture_components"]] = ";".join(component_names)
    row[position["mixture_mole_fractions"]] = ";".join(f"{f:.4g}" for f in x)
    liquidus, method, liquidus_notes = _liquidus(mixture)
    row[position["liquidus_estimate_K"]] = round(liquidus, 1) if liquidus == liquidus else math.nan
    row[position["liquidus_method"]] = method or None
    gaps = [*mixture.notes, "a mixture: each column formed from its components as its method says"
            " (lattice energies, structure type and melting trend per component: ionicity explain)", *liquidus_notes]
    for component in mixture.components:
        if component.fusion is not None and component.fusion["kind"] == "molecular":
            gaps.append(f"{component.name}: {_MOLECULAR_NOTE}")
    if any(WATER_CAUTION in (r[position["value_notes"]] or "") for r in records):
        gaps.append(WATER_CAUTION)
    warnings = list(mixture.warnings)
    parts = [(c.name, r[position["substance_class"]] or "", r[position["cations"]], r[position["anions"]])
             for c, r in zip(mixture.components, records)]
    hazard = mixing_warning(parts)
    if hazard:
        warnings.append(hazard)
    reaction = water_reaction_warning(
        [(c.name, r[position["formula_normalized"]], r[position["water_behaviour"]], r[position["water_reaction_products"]])
         for c, r in zip(mixture.components, records)])
    if reaction:
        warnings.append(reaction)
        liquidus = math.nan
        row[position["liquidus_estimate_K"]], row[position["liquidus_method"]] = math.nan, None
    corrosive = corrosive_note(parts)
    if corrosive:
        gaps.append(corrosive)
    ignition = supported_metal_caution(c.name for c in mixture.components)
    if ignition:
        warnings.append(ignition)
    networks = [c.name for c, r in zip(mixture.components, records)
                if r[position["substance_class"]] in NETWORK_MELT_CLASSES]
    # a metal halide that is molecular or a chain solid beside a salt (AlCl3 or ZnCl2 with [C2mim]Cl or KCl)
    # takes the salt's halide into complex anions (AlCl4(-), Al2Cl7(-), ZnCl4(2-)) in the melt
    lewis_acid = any(r[position["substance_class"]] in NETWORK_MELT_CLASSES and _holds_metal(c.formula)
                     for c, r in zip(mixture.components, records)
                     if c.fusion is None or c.fusion["kind"] == "ionic") and any(
        r[position["mp_route"]] == "salt" for r in records)
    if networks and liquidus == liquidus and (lewis_acid or all(
            m is not None and m.ionic for m in (_melt(c, estimate=True) for c in mixture.components))):
        # the Temkin and regular-solution model counts simple ions (network_melt_warning)
        warnings.append(network_melt_warning(networks))
    elif liquidus == liquidus:
        # the band of the liquidus, as a compound's class is the band of its trend temperature: a salt blend
        # keeps the trade's names (molten_salt, ionic_liquid), a blend with a molecular component the others
        row[position["melting_class"]] = melting_class_for(
            liquidus, salt=all(r[position["mp_route"]] == "salt" for r in records))
    elif all(r[position["melting_class"]] == GAS_CLASS for r in records):
        # a mixture of gases (air) is a gas: no liquidus is needed to say so
        row[position["melting_class"]] = GAS_CLASS
    verdict = finalise(warnings=warnings, gaps=gaps)
    row[position["status"]] = verdict.status
    row[position["message"]] = verdict.message
    row[position["value_notes"]] = verdict.value_notes
    return tuple(row)


# a hyphen between two lower-case letters, as inside a chemical name (tert-butoxide, n-butyllithium)
_HYPHEN_IN_WORD = re.compile(r"(?:^|[\s(])[a-z]+-[a-z]{2,}")


# the joiners of a list ("NaCl, KCl", "NaCl and KCl"), which scorer.mixture_notation reads as components
_LIST_ONLY = re.compile(r"[,;&]|\s(?:and|with)\s", re.IGNORECASE)
# a hyphen before a lower-case word: where a crystal form may follow a formula ("TiO2-anatase")
_FORM_AFTER_HYPHEN = re.compile(r"[\w)\]]-[a-zα-ω]")


def mixture_row(text: str, score_row) -> tuple | None:
    """The output row of a cell written as a mixture, or None for a compound.

    Called by :func:`scorer.record.score_row` before the compound is parsed,
    once per distinct text (that function's cache). A mixture that cannot be
    read gives an error row saying why; the row is never dropped.
    """
    ideal = nonstoichiometric_text(text)
    if ideal is not None and not any(j in ideal for j in "-–:/+"):
        return None  # a non-stoichiometric compound ("TiO2-x", "YBa2Cu3O7-δ"), not a mixture
    if _DEUTERATED_CODE.fullmatch(text) and deuterated_solvent(text) is not None:
        return None  # a deuterated solvent ("DMSO-d6"), not a mixture
    if _HYPHENATED_PAIR.fullmatch(text) and ionic_liquid_pair_text(text) is not None:
        return None  # an ionic liquid's codes joined by a hyphen ("EMIM-BF4"), not a mixture
    if formula_with_hydrate_word(text) is not None:
        return None  # a formula with its hydrate word ("NiCl2 6-hydrate"), not a mixture
    if code_hydrohalide(text) is not None:
        return None  # a buffer base's code with its acid ("Tris-HCl"): the base's hydrochloride
    if ("EDTA" in text or "EGTA" in text) and code_metal_salt(text) is not None:
        return None  # a chelating acid's metal salt ("EDTA-Na2"), not a mixture of a metal and an acid
    if alloy_designation(text) is not None:
        return None  # an alloy designation ("Ti-6Al-4V"): one metallic solid, read by the formula grammar
    label = POLYMORPH_LABEL.match(text)
    if label and not any(j in text[label.end():] for j in "-–:/+"):
        return None  # a structure label ("α-Al2O3", "2H-MoS2", "h-BN"), not a mixture
    if _FORM_AFTER_HYPHEN.search(text):
        body, words = split_grade_words(text)
        if words is not None and not any(j in body for j in "-–:/+"):
            return None  # a crystal form after a hyphen ("TiO2-anatase", "ZrO2-monoclinic"), not a mixture
    if " -" in text or " –" in text:
        body, words = split_grade_words(text)
        if words is not None and not any(j in body for j in "-–:/+") and any(j in text[len(body):] for j in "-–"):
            return None  # a package size or mesh after a hyphen ("NaCl - 2 bottles", "Al powder -325 mesh")
    found = read_mixture(text, score_row)
    if found is None:
        return None
    if parse_as_name(text) is not None:
        # a name with hyphens ("1-ethyl-3-methylimidazolium chloride"), not a mixture; also where the parts
        # would read ("N-pentane" is pentane, not nitrogen and pentane)
        return None
    if isinstance(found, str) and _LIST_ONLY.search(text) and not any(j in text for j in "-–:/+"):
        return None  # a list that does not read as components ("Tin, Sn"): the other readers may read it
    if isinstance(found, SameCompound):
        row = list(found.component.record)
        _, position, _, _ = _layout()
        verdict = with_warnings(Verdict(row[position["status"]], row[position["message"]] or "",
                                        row[position["value_notes"]] or ""),
                                [f"{text.strip()!r} names one compound twice (a formula and its name): read as"
                                 f" {row[position['formula_normalized']]}"])
        row[position["status"]], row[position["message"]] = verdict.status, verdict.message
        return tuple(row)
    if isinstance(found, str) and _HYPHEN_IN_WORD.search(text):
        # a hyphen inside a word of a name the reader does not know ("potassium tert-butoxide"): the name's
        # own error says more than "component 'potassium tert' of the mixture"
        return None
    if isinstance(found, str):
        _, position, empty, _ = _layout()
        row = list(empty)
        verdict = finalise(error=found)
        row[position["status"]] = verdict.status
        row[position["message"]] = verdict.message
        row[position["substance_class"]] = "mixture"
        return tuple(row)
    return _record(found)
