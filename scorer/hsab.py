"""Hard and soft acids and bases: Pearson's classes, Parr-Pearson absolute
hardness, and how well a salt's cation and anion are matched.

Classes
-------
``scorer/data/hsab_classes.csv`` holds Pearson's classification of Lewis
acids and bases (J. Chem. Educ. 1968, 45, 581, Tables 1 and 2; the lists go
back to J. Am. Chem. Soc. 1963, 85, 3533), one row per ion with its source.
Rows marked ``by extension`` are common practice: ions Pearson did not list
that textbooks class with their listed relatives (Rb+ and Cs+ with the alkali
ions, lanthanide(III) ions with La3+ and Gd3+, O2- with OH-, S2- with RS-,
carboxylates with acetate). Ions in neither (organic cations, BF4-, [NTf2]-)
get no class and a note.

Hardness
--------
Absolute hardness eta = (I - A)/2 (R. G. Parr and R. G. Pearson, J. Am. Chem.
Soc. 1983, 105, 7512), from the element snapshot's ionization energies and
electron affinities (NIST and CRC via mendeleev):

* a cation M^z+ loses its next electron at I = IE_(z+1) and regains one at
  A = IE_z, so eta = (IE_(z+1) - IE_z)/2;
* an anion's own A is negative or unmeasured, so Pearson (Inorg. Chem. 1988,
  27, 734) tabulates the hardness of the parent neutral atom or radical:
  eta(X^n-) = (I(X) - A(X))/2 for monatomic anions (F- from F, O2- from O),
  and for polyatomic anions the radical's I and A from
  ``scorer/data/radical_hardness.csv`` (OH, SH, CN, NH2);
* H+ has no electrons and an infinite hardness (Parr and Pearson 1983): the
  value is left empty with a note; polyatomic cations have no ionization
  data here and are left empty too.

Pairing
-------
Classes are scored by softness s: hard 0, borderline 0.5, soft 1. A pair
scores 1 - |s_acid - s_base|: 1 for hard-hard, soft-soft or
borderline-borderline (matched, Pearson's "hard prefers hard, soft prefers
soft"), 0.5 when one side is borderline, 0 for hard-soft (mismatched).
``hsab_pairing_score`` is the pair-weighted mean; ``hsab_pairing`` is
``matched`` from 0.75, ``mismatched`` up to 0.25, else ``borderline``.

Several ions
------------
Hardness: count-weighted mean over the ions that have a value. Class: the
shared class when every classified ion of that side agrees, ``mixed``
otherwise. Pairing: mean over cation-anion pairs weighted by the product of
stoichiometric fractions (:func:`scorer.contact.contact_pairs`), over the
pairs whose both classes are known; the worst pair is shown by ``explain``.
"""
from __future__ import annotations

import math

import numpy as np
from ionicity.scorer.caching import once
from ionicity.scorer.contact import contact_pairs, weighted_mean
from ionicity.scorer.descriptor import fmt, protocol, result_class, value_lines
from ionicity.scorer.elements import get_element
from ionicity.scorer.model import Column, Decomposition, Ion
from ionicity.scorer.tables import table

__all__ = [
    "COLUMNS",
    "HSAB_CLASSES",
    "HsabValues",
    "analyse",
    "describe",
    "explain",
    "parr_pearson_hardness_eV",
    "cation_hardness_eV",
    "anion_hardness_eV",
    "hsab_class",
    "hsab_pair_score",
    "hsab_pairing_label",
    "hsab_table",
    "radical_hardness_table",
]

HSAB_CLASSES = ("hard", "borderline", "soft")
_SOFTNESS = {"hard": 0.0, "borderline": 0.5, "soft": 1.0}
MATCHED_MIN_SCORE = 0.75
MISMATCHED_MAX_SCORE = 0.25

# Each equation's text, written once: the column declarations and the explain
# lines both quote it.
_SCORE_EQUATION = "1 - |s_acid - s_base|"
_SOFTNESS_TEXT = "softness s = 0 (hard), 0.5 (borderline), 1 (soft)"
_PAIRING_RULE = f">= {MATCHED_MIN_SCORE} matched, <= {MISMATCHED_MAX_SCORE} mismatched, else borderline"

_SOURCE_CLASSES = "Pearson, J. Chem. Educ. 1968, 45, 581, Tables 1-2; Pearson, J. Am. Chem. Soc. 1963, 85, 3533"
_SOURCE_HARDNESS = "Parr & Pearson, J. Am. Chem. Soc. 1983, 105, 7512; ionization energies NIST ASD via mendeleev"
_SOURCE_ANION = (
    "Pearson, Inorg. Chem. 1988, 27, 734 (anion hardness = parent atom or radical); electron affinities CRC via"
    " mendeleev"
)

#: the --columns group of this module's COLUMNS
GROUP = "hsab"

COLUMNS: tuple[Column, ...] = (
    Column(
        "cation_hsab_class", "string", "",
        "Pearson class of the cation as a Lewis acid: hard, borderline, soft (mixed when several cations differ)",
        "lookup in scorer/data/hsab_classes.csv", _SOURCE_CLASSES,
        "several cations: the shared class, or mixed",
    ),
    Column(
        "anion_hsab_class", "string", "",
        "Pearson class of the anion as a Lewis base: hard, borderline, soft (mixed when several anions differ)",
        "lookup in scorer/data/hsab_classes.csv", _SOURCE_CLASSES,
        "several anions: the shared class, or mixed",
    ),
    Column(
        "cation_hardness_eV", "float64", "eV",
        "Parr-Pearson absolute hardness of the cation",
        "(IE_(z+1) - IE_z)/2 for M^z+", _SOURCE_HARDNESS,
        "several cations: count-weighted mean over those with a value",
    ),
    Column(
        "anion_hardness_eV", "float64", "eV",
        "absolute hardness of the anion's parent atom or radical (Pearson's convention)",
        "(I - A)/2 of the neutral parent: atom from the element data, radical from"
        " scorer/data/radical_hardness.csv", _SOURCE_ANION,
        "several anions: count-weighted mean over those with a value",
    ),
    Column(
        "hsab_pairing", "string", "",
        "matched, borderline or mismatched: whether the cation and anion follow Pearson's"
        " 'hard with hard, soft with soft'",
        f"from hsab_pairing_score: {_PAIRING_RULE}", f"{_SOURCE_CLASSES}; thresholds defined here",
        "from the pair-weighted score",
    ),
    Column(
        "hsab_pairing_score", "float64", "",
        "1 for a hard-hard, soft-soft or borderline-borderline pair, 0.5 with one borderline side,"
        " 0 for hard-soft",
        f"{_SCORE_EQUATION} with {_SOFTNESS_TEXT}",
        f"{_SOURCE_CLASSES}; score defined here",
        "several ions: mean over classified cation-anion pairs weighted by the product of stoichiometric fractions",
    ),
)


# ------------------------------------------------------------------ equations


def parr_pearson_hardness_eV(ionization_energy_eV, electron_affinity_eV):
    """Parr-Pearson absolute hardness.

    .. math:: \\eta = (I - A)/2

    Parameters
    ----------
    ionization_energy_eV : float or array-like
        Ionization energy I of the species [eV].
    electron_affinity_eV : float or array-like
        Electron affinity A of the species [eV] (for a cation M^z+, the
        ionization energy of M^(z-1)+).

    Returns
    -------
    float or numpy.ndarray
        Hardness [eV].

    References
    ----------
    R. G. Parr, R. G. Pearson, J. Am. Chem. Soc. 1983, 105, 7512-7516.

    Examples
    --------
    Na+: I = IE2(Na) = 47.29 eV, A = IE1(Na) = 5.14 eV; Parr and Pearson
    list 21.1 eV (from memory):

    >>> round(parr_pearson_hardness_eV(47.29, 5.14), 2)
    21.07
    """
    value = (np.asarray(ionization_energy_eV, dtype=float) - np.asarray(electron_affinity_eV, dtype=float)) / 2.0
    return float(value) if value.ndim == 0 else value


def hsab_pair_score(acid_class: str | None, base_class: str | None) -> float:
    """Score one acid-base pair: 1 - |s_acid - s_base|, softness hard 0, borderline 0.5, soft 1.

    Parameters
    ----------
    acid_class, base_class : {"hard", "borderline", "soft"} or None

    Returns
    -------
    float
        1 matched, 0.5 one side borderline, 0 hard-soft; NaN when a class is None.

    Raises
    ------
    ValueError
        For a class name that is not hard, borderline or soft.

    Examples
    --------
    >>> hsab_pair_score("hard", "hard"), hsab_pair_score("soft", "borderline"), hsab_pair_score("hard", "soft")
    (1.0, 0.5, 0.0)
    """
    if acid_class is None or base_class is None:
        return math.nan
    for value in (acid_class, base_class):
        if value not in _SOFTNESS:
            raise ValueError(f"unknown HSAB class {value!r}; allowed: {', '.join(HSAB_CLASSES)}")
    return 1.0 - abs(_SOFTNESS[acid_class] - _SOFTNESS[base_class])


def hsab_pairing_label(score: float) -> str | None:
    """``matched`` (score >= 0.75), ``mismatched`` (<= 0.25) or ``borderline``; None for NaN.

    >>> hsab_pairing_label(1.0), hsab_pairing_label(0.5), hsab_pairing_label(0.0)
    ('matched', 'borderline', 'mismatched')
    """
    if score is None or math.isnan(score):
        return None
    if score >= MATCHED_MIN_SCORE:
        return "matched"
    if score <= MISMATCHED_MAX_SCORE:
        return "mismatched"
    return "borderline"


# ------------------------------------------------------------------ data


@once
def hsab_table() -> dict[str, dict[str, str]]:
    """ion_id -> row of ``scorer/data/hsab_classes.csv`` (hsab_class, role, source, note), read once."""
    return {row["ion_id"]: row for row in table("hsab_classes.csv")}


@once
def radical_hardness_table() -> dict[str, dict]:
    """anion ion_id -> parent radical with its I and A in eV, from ``scorer/data/radical_hardness.csv``."""
    return {
        row["anion_id"]: dict(
            radical=row["radical"],
            ionization_energy_eV=float(row["ionization_energy_eV"]),
            electron_affinity_eV=float(row["electron_affinity_eV"]),
            source=row["source"],
        )
        for row in table("radical_hardness.csv")
    }


def hsab_class(ion: Ion) -> tuple[str | None, str]:
    """Pearson class of an ion and where it comes from.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> hsab_class(Ion("Ag(+)", "Ag", 1, (("Ag", 1),), "monatomic", element="Ag"))[0]
    'soft'
    """
    row = hsab_table().get(ion.ion_id)
    if row is None:
        kind = "organic ion" if ion.organic else "ion"
        return None, f"{kind} not in Pearson's lists"
    why = f"{row['hsab_class']} {row['role']} ({row['source']})"
    return row["hsab_class"], why


def cation_hardness_eV(ion: Ion) -> tuple[float, str]:
    """Hardness of a cation, (IE_(z+1) - IE_z)/2, with the inputs used.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> round(cation_hardness_eV(Ion("Al(3+)", "Al", 3, (("Al", 1),), "monatomic", element="Al"))[0], 2)
    45.77
    """
    if ion.element is None:
        return math.nan, "polyatomic cation: no ionization energies to apply (I - A)/2"
    z = int(ion.charge)
    if z <= 0:
        return math.nan, "not a cation"
    try:
        element = get_element(ion.element)
    except KeyError as exc:
        return math.nan, str(exc.args[0])
    if ion.element == "H" and z == 1:
        return math.nan, "H+ has no electrons: its hardness is infinite (Parr & Pearson 1983)"
    i_next, i_this = element.ionization_energy_eV(z + 1), element.ionization_energy_eV(z)
    if math.isnan(i_next) or math.isnan(i_this):
        return math.nan, f"ionization energy IE{z} or IE{z + 1} of {ion.element} missing"
    eta = parr_pearson_hardness_eV(i_next, i_this)
    return eta, f"(IE{z + 1} - IE{z})/2 = ({i_next:.3f} - {i_this:.3f})/2 = {eta:.2f} eV"


def anion_hardness_eV(ion: Ion) -> tuple[float, str]:
    """Hardness assigned to an anion: that of its parent neutral atom or radical.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion
    >>> round(anion_hardness_eV(Ion("F(-)", "F", -1, (("F", 1),), "monatomic", element="F"))[0], 2)
    7.01
    """
    if ion.element is not None:
        try:
            element = get_element(ion.element)
        except KeyError as exc:
            return math.nan, str(exc.args[0])
        i1, a = element.ionization_energy_eV(1), element.electron_affinity_eV
        if math.isnan(i1) or math.isnan(a):
            return math.nan, f"no ionization energy or electron affinity for the parent atom {ion.element}"
        eta = parr_pearson_hardness_eV(i1, a)
        return eta, (
            f"parent atom {ion.element}, (I - A)/2 = ({i1:.3f} - {a:.3f})/2 = {eta:.2f} eV"
            " (Pearson's convention)"
        )
    row = radical_hardness_table().get(ion.ion_id)
    if row is None:
        return math.nan, "no I and A tabulated here for its parent radical"
    eta = parr_pearson_hardness_eV(row["ionization_energy_eV"], row["electron_affinity_eV"])
    return eta, (
        f"parent radical {row['radical']}, (I - A)/2 = ({row['ionization_energy_eV']:.2f} -"
        f" {row['electron_affinity_eV']:.2f})/2 = {eta:.2f} eV ({row['source']})"
    )


# ------------------------------------------------------------------ per compound


def _side_class(classes: list[str | None]) -> str | None:
    known = {c for c in classes if c is not None}
    if not known:
        return None
    return known.pop() if len(known) == 1 else "mixed"


HsabValues = result_class(
    "HsabValues", COLUMNS, "Pearson's classes and hardnesses of one compound (fields named as the columns).",
)


_EXPLAINED = {
    "cation_hsab_class": ("", ""),
    "anion_hsab_class": ("", ""),
    "cation_hardness_eV": (".2f", "count-weighted mean"),
    "anion_hardness_eV": (".2f", "count-weighted mean"),
    "hsab_pairing_score": (".2f", f"{_SOFTNESS_TEXT}; pair score {_SCORE_EQUATION}; pair-weighted mean"),
    "hsab_pairing": ("", _PAIRING_RULE),
}


@protocol(
    title="Hard and soft acids and bases (Pearson's lists; hardness (I - A)/2, Parr & Pearson 1983):",
    columns=COLUMNS, result=HsabValues, failure="HSAB values not computed",
    summary=value_lines(_EXPLAINED),
)
def analyse(dec: Decomposition) -> HsabValues:
    """Pearson's classes and hardnesses of one compound, with notes and explain steps.

    Never raises (see :mod:`scorer.descriptor`); odd input gives NaN/None and a note.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion, IonTerm, Decomposition
    >>> ag = Ion("Ag(+)", "Ag", 1, (("Ag", 1),), "monatomic", element="Ag")
    >>> f = Ion("F(-)", "F", -1, (("F", 1),), "monatomic", element="F")
    >>> r = analyse(Decomposition(cations=(IonTerm(ag, 1),), anions=(IonTerm(f, 1),)))
    >>> r.cation_hsab_class, r.anion_hsab_class, r.hsab_pairing
    ('soft', 'hard', 'mismatched')
    """
    notes: list[str] = []
    steps: list[str] = []
    if not dec.is_ionic:
        steps.append(f"no ions ({dec.substance_class}): HSAB pairing applies to cation-anion pairs; values left empty")
        return HsabValues(steps=tuple(steps))
    values: dict = {}
    info = {}
    for side, terms, hardness in (("cation", dec.cations, cation_hardness_eV), ("anion", dec.anions, anion_hardness_eV)):
        classes, etas = [], []
        for term in terms:
            ion = term.ion
            cls, cwhy = hsab_class(ion)
            eta, ewhy = hardness(ion)
            info[ion.ion_id] = cls
            classes.append(cls)
            etas.append((eta, term.count))
            # None or NaN (v != v): no class or no hardness
            missing = [what for what, v in (("class", cls), ("hardness", eta)) if v is None or v != v]
            if missing:
                reasons = "; ".join(dict.fromkeys(w for w, v in ((cwhy, cls), (ewhy, eta)) if v is None or v != v))
                notes.append(f"no HSAB {' or '.join(missing)} for {ion.ion_id}: {reasons}")
            steps.append(f"{side} {ion.ion_id} x{term.count:g}: class {cls} [{cwhy}]; hardness {fmt(eta)} eV [{ewhy}]")
        values[f"{side}_hsab_class"] = _side_class(classes)
        values[f"{side}_hardness_eV"] = weighted_mean(etas)
    scores = []
    worst = None
    for cation, anion, weight in contact_pairs(dec):
        score = hsab_pair_score(info[cation.ion.ion_id], info[anion.ion.ion_id])
        if not math.isnan(score):
            scores.append((score, weight))
            if worst is None or score < worst[0]:
                worst = (score, cation.ion.ion_id, anion.ion.ion_id)
        steps.append(
            f"pair {cation.ion.ion_id} ({info[cation.ion.ion_id]}) / {anion.ion.ion_id} ({info[anion.ion.ion_id]}),"
            f" weight {weight:.3g}: score {_SCORE_EQUATION} = {fmt(score)}"
        )
    score = weighted_mean(scores)
    if math.isnan(score):
        notes.append("hsab_pairing not assessed: no cation-anion pair has both classes in Pearson's lists")
    if worst is not None and len(scores) > 1:
        steps.append(f"worst pair: {worst[1]} / {worst[2]}, score {worst[0]:.2f}")
    return HsabValues(
        **values, hsab_pairing_score=score, hsab_pairing=hsab_pairing_label(score), notes=tuple(notes), steps=tuple(steps)
    )


describe = analyse.describe
explain = analyse.explain
