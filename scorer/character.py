"""Bond character: electronegativity difference, Pauling and Hannay-Smyth
ionic character, and the van Arkel-Ketelaar bond-type triangle.

Every value uses Pauling electronegativities from the element snapshot
(:mod:`scorer.elements`; CRC Handbook values via mendeleev).

Which two atoms, and how several ions are weighted, is decided in
:mod:`scorer.contact` (:func:`contact_atom`, :func:`contact_pairs`; both
importable from here too).

Covalent molecules, networks, metals and alloys
-----------------------------------------------
Without ions, ``delta_chi_pauling`` is the largest difference between
elements present (max - min: the most polar bond the composition allows) and
``mean_chi_pauling`` the composition-weighted mean electronegativity. Lattice
water is never counted.

The triangle
------------
van Arkel (1941) and Ketelaar (1947) plot the mean electronegativity (x)
against the difference (y); pure elements lie on the base (metals left,
non-metals right) and the most ionic salts at the apex (Jensen, J. Chem. Educ.
1995, 72, 395). The region boundaries used here are
common practice, chosen for this project on the Pauling scale; see
:func:`van_arkel_ketelaar_bond_type`.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from ionicity.scorer.caching import per_input
from ionicity.scorer.descriptor import fmt, protocol, result_class, value_lines
from ionicity.scorer.contact import contact_atom, contact_pairs, pauling_electronegativity, weighted_mean
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.model import Column, Decomposition

__all__ = [
    "COLUMNS",
    "BOND_TYPES",
    "IONIC_DELTA_CHI",
    "POLAR_DELTA_CHI",
    "BondCharacter",
    "analyse",
    "describe",
    "explain",
    "contact_atom",
    "contact_pairs",
    "pauling_electronegativity",
    "weighted_mean",
    "pauling_ionic_character_pct",
    "hannay_smyth_ionic_character_pct",
    "van_arkel_ketelaar_bond_type",
]

BOND_TYPES = ("ionic", "ionic_covalent", "covalent", "covalent_metallic", "metallic", "metallic_ionic")

# Pauling (1960, p. 98-100): a single bond is 50 % ionic at a difference of
# about 1.7, the usual dividing line between "ionic" and "covalent".
IONIC_DELTA_CHI = 1.7
# Below 0.5 a bond counts as non-polar (6 % ionic by Pauling's equation): common practice.
POLAR_DELTA_CHI = 0.5
# The electropositive partner of an ionic bond must be metal-like; H (2.20) is not.
IONIC_MAX_LOW_CHI = 2.0
# Splits of the base and of the polar band on the Pauling scale (common practice):
# below 1.95 metals (Cu, Ni, Ag, Hg, Bi at 1.90-1.93), 1.95-2.2 metalloids
# (Ge 2.01, B 2.04, Sb 2.05, Te 2.10, As 2.18), 2.2 and up non-metals (H, C, N, O, S, halogens).
METALLIC_MAX_MEAN_CHI = 1.95
COVALENT_MIN_MEAN_CHI = 2.2
NONMETAL_MIN_HIGH_CHI = 2.15

_SOURCE_PAULING = "Pauling, The Nature of the Chemical Bond, 3rd ed., Cornell University Press, 1960, ch. 3"
_SOURCE_HS = "Hannay & Smyth, J. Am. Chem. Soc. 1946, 68, 171"
_SOURCE_CHI = "Pauling electronegativities, CRC Handbook (Haynes 2014) via the mendeleev snapshot"
_SOURCE_VAK = (
    "van Arkel, Molecules and Crystals, 1941 (Dutch ed.); Ketelaar, Chemical Constitution, 1947; "
    "Jensen, J. Chem. Educ. 1995, 72, 395; boundaries common practice"
)
# Each equation's text, written once: the column declarations and the explain
# lines both quote it.
PAULING_EQUATION = "100*(1 - exp(-dchi^2/4))"
HANNAY_SMYTH_EQUATION = "16*|dchi| + 3.5*dchi^2"
_MEAN_CHI_CONTACT = "(chi_cation_contact + chi_anion_contact)/2"
_MEAN_CHI_COMPOSITION = "sum(n_i*chi_i)/sum(n_i)"
_BOND_TYPE_RULE = (
    f"ionic if dchi >= {IONIC_DELTA_CHI} and mean - dchi/2 < {IONIC_MAX_LOW_CHI};"
    f" else if dchi >= {POLAR_DELTA_CHI}: ionic_covalent when mean + dchi/2 >= {NONMETAL_MIN_HIGH_CHI},"
    f" otherwise metallic_ionic; else by mean: < {METALLIC_MAX_MEAN_CHI} metallic,"
    f" < {COVALENT_MIN_MEAN_CHI} covalent_metallic, otherwise covalent"
)
_AGG_PAIRS = (
    "several ions: mean over cation-anion pairs weighted by the product of each ion's stoichiometric "
    "fraction on its own side; no ions: from the composition (see method)"
)

#: the --columns group of this module's COLUMNS
GROUP = "character"

COLUMNS: tuple[Column, ...] = (
    Column(
        "delta_chi_pauling", "float64", "Pauling units",
        "electronegativity difference across the cation-anion contact; for covalent and metallic"
        " substances the largest difference between elements present",
        "|chi(anion contact atom) - chi(cation contact atom)|; contact atoms by ion family"
        " (scorer.character.contact_atom); without ions max(chi) - min(chi) over the composition",
        _SOURCE_CHI, _AGG_PAIRS,
    ),
    Column(
        "ionic_character_pauling_pct", "float64", "%",
        "Pauling's amount of ionic character of the contact bond",
        f"{PAULING_EQUATION} per pair", _SOURCE_PAULING, _AGG_PAIRS,
    ),
    Column(
        "ionic_character_hannay_smyth_pct", "float64", "%",
        "Hannay-Smyth ionic character of the contact bond, capped at 100",
        f"{HANNAY_SMYTH_EQUATION} per pair", _SOURCE_HS, _AGG_PAIRS,
    ),
    Column(
        "ionic_character_pauling_min_pct", "float64", "%",
        "Pauling ionic character of the least ionic cation-anion pair (equals the mean for one pair)",
        f"min over pairs of {PAULING_EQUATION}", _SOURCE_PAULING,
        "extreme pair: the minimum over cation-anion pairs; without ions as ionic_character_pauling_pct",
    ),
    Column(
        "mean_chi_pauling", "float64", "Pauling units",
        "x coordinate of the van Arkel-Ketelaar triangle: mean electronegativity of the contact pair"
        " (salts) or composition-weighted mean (no ions)",
        f"{_MEAN_CHI_CONTACT}; without ions {_MEAN_CHI_COMPOSITION}",
        _SOURCE_VAK, _AGG_PAIRS,
    ),
    Column(
        "bond_type", "string", "",
        "region of the van Arkel-Ketelaar triangle: ionic, ionic_covalent (polar covalent),"
        " covalent, covalent_metallic (metalloid, semiconductor), metallic, metallic_ionic"
        " (Zintl-like, polar intermetallic)",
        f"from (mean_chi_pauling, delta_chi_pauling): {_BOND_TYPE_RULE}",
        _SOURCE_VAK, "several ions: classified from the pair-weighted coordinates",
    ),
)


# ------------------------------------------------------------------ equations


def pauling_ionic_character_pct(delta_chi):
    """Pauling's amount of ionic character of a single bond.

    .. math:: I = 100\\,(1 - e^{-\\Delta\\chi^2/4})

    Parameters
    ----------
    delta_chi : float or array-like
        Electronegativity difference between the two atoms [Pauling units];
        the sign is irrelevant.

    Returns
    -------
    float or numpy.ndarray
        Ionic character [%], from 0 to 100 (NaN stays NaN).

    References
    ----------
    L. Pauling, The Nature of the Chemical Bond, 3rd ed., Cornell University
    Press, 1960, section 3-9, Table 3-10 (from memory).

    Examples
    --------
    Pauling's table gives 22 % at a difference of 1.0 and 63 % at 2.0:

    >>> round(pauling_ionic_character_pct(1.0), 1), round(pauling_ionic_character_pct(2.0), 1)
    (22.1, 63.2)
    """
    d = np.asarray(delta_chi, dtype=float)
    value = 100.0 * (1.0 - np.exp(-(d * d) / 4.0))
    return float(value) if value.ndim == 0 else value


def hannay_smyth_ionic_character_pct(delta_chi):
    """Hannay and Smyth's ionic character, fitted to the dipole moments of the hydrogen halides.

    .. math:: I = 16\\,|\\Delta\\chi| + 3.5\\,\\Delta\\chi^2

    capped at 100 % (the fit exceeds 100 above a difference of about 3.5).

    Parameters
    ----------
    delta_chi : float or array-like
        Electronegativity difference [Pauling units].

    Returns
    -------
    float or numpy.ndarray
        Ionic character [%].

    References
    ----------
    N. B. Hannay, C. P. Smyth, J. Am. Chem. Soc. 1946, 68, 171-173.

    Examples
    --------
    HF with Pauling's 1960 values (F 4.0, H 2.1, difference 1.9) is 43 %
    ionic by this equation:

    >>> round(hannay_smyth_ionic_character_pct(1.9), 1)
    43.0
    """
    d = np.abs(np.asarray(delta_chi, dtype=float))
    value = np.minimum(16.0 * d + 3.5 * d * d, 100.0)
    return float(value) if value.ndim == 0 else value


def van_arkel_ketelaar_bond_type(mean_chi: float, delta_chi: float) -> str | None:
    """Place a point of the van Arkel-Ketelaar triangle in one of its regions.

    The triangle plots the mean electronegativity ``x`` against the difference
    ``y``; ``x - y/2`` and ``x + y/2`` are then the electronegativities of the
    electropositive and electronegative partners, so every boundary below is a
    line parallel to one side of the triangle.

    ================  =====================================================
    region            condition (Pauling units)
    ================  =====================================================
    ionic             y >= 1.7 (Pauling's 50 % ionic character) and
                      x - y/2 < 2.0 (the electropositive partner is a metal)
    ionic_covalent    0.5 <= y, not ionic, and x + y/2 >= 2.15 (polar covalent)
    metallic_ionic    0.5 <= y and x + y/2 < 2.15 (Zintl-like, polar intermetallic)
    metallic          y < 0.5 and x < 1.95
    covalent_metallic y < 0.5 and 1.95 <= x < 2.2 (metalloids, semiconductors)
    covalent          y < 0.5 and x >= 2.2
    ================  =====================================================

    The 1.7 line is Pauling's; the others are common practice, placed on the
    Pauling scale so that the elements fall where the periodic table puts
    them. The Pauling scale overlaps for some elements, so Si (1.90) falls
    among the metals and Mo, Ru, Rh, Pd, Os, Ir, Pt, Au (2.16-2.40) among the
    non-metals; read ``bond_type`` with ``substance_class``.

    Parameters
    ----------
    mean_chi : float
        Mean electronegativity [Pauling units].
    delta_chi : float
        Electronegativity difference, >= 0 [Pauling units].

    Returns
    -------
    str or None
        One of :data:`BOND_TYPES`; None when either input is NaN.

    References
    ----------
    W. B. Jensen, J. Chem. Educ. 1995, 72, 395 (the
    triangle's history and axes); L. Pauling, The Nature of the Chemical
    Bond, 1960 (the 1.7 line).

    Examples
    --------
    >>> van_arkel_ketelaar_bond_type(2.045, 2.23)   # NaCl
    'ionic'
    >>> van_arkel_ketelaar_bond_type(3.09, 1.78)    # HF
    'ionic_covalent'
    >>> van_arkel_ketelaar_bond_type(1.775, 0.25)   # CuZn brass
    'metallic'
    """
    x, y = float(mean_chi), abs(float(delta_chi))
    if math.isnan(x) or math.isnan(y):
        return None
    if y >= IONIC_DELTA_CHI and x - y / 2 < IONIC_MAX_LOW_CHI:
        return "ionic"
    if y >= POLAR_DELTA_CHI:
        return "ionic_covalent" if x + y / 2 >= NONMETAL_MIN_HIGH_CHI else "metallic_ionic"
    if x < METALLIC_MAX_MEAN_CHI:
        return "metallic"
    if x < COVALENT_MIN_MEAN_CHI:
        return "covalent_metallic"
    return "covalent"


# ------------------------------------------------------------------ per compound


BondCharacter = result_class(
    "BondCharacter", COLUMNS, "The bond-character values of one compound (fields named as the columns).",
)


def _pair_rows(dec: Decomposition) -> list[dict]:
    rows = []
    for cation, anion, weight in contact_pairs(dec):
        c_atom, c_why = contact_atom(cation.ion)
        a_atom, a_why = contact_atom(anion.ion)
        chi_c = pauling_electronegativity(c_atom) if c_atom else math.nan
        chi_a = pauling_electronegativity(a_atom) if a_atom else math.nan
        delta = abs(chi_a - chi_c)
        rows.append(
            dict(
                cation=cation.ion.ion_id, anion=anion.ion.ion_id, weight=weight,
                c_atom=c_atom, c_why=c_why, a_atom=a_atom, a_why=a_why,
                chi_c=chi_c, chi_a=chi_a, delta=delta, mean=(chi_c + chi_a) / 2,
                pauling=pauling_ionic_character_pct(delta) if not math.isnan(delta) else math.nan,
                hannay_smyth=hannay_smyth_ionic_character_pct(delta) if not math.isnan(delta) else math.nan,
            )
        )
    return rows


def _composition_chis(dec: Decomposition) -> tuple[list[tuple[str, float, float]], list[str]]:
    rows, missing = [], []
    for symbol, count in dec.composition:
        chi = pauling_electronegativity(symbol)
        if math.isnan(chi):
            missing.append(symbol)
        rows.append((symbol, float(count), chi))
    return rows, missing


def _ionic(dec: Decomposition) -> tuple[dict, list[str], list[str]]:
    values: dict = {}
    notes: list[str] = []
    steps: list[str] = []
    rows = _pair_rows(dec)
    for r in rows:
        if math.isnan(r["delta"]):
            which = [a for a, chi in ((r["c_atom"], r["chi_c"]), (r["a_atom"], r["chi_a"])) if math.isnan(chi)]
            notes.append(
                f"no Pauling electronegativity for {', '.join(str(w) for w in which) or 'a contact atom'}"
                f" ({r['cation']} with {r['anion']}): bond-character values left out for that pair"
            )
    good = [r for r in rows if not math.isnan(r["delta"])]
    if good:
        delta = weighted_mean([(r["delta"], r["weight"]) for r in good])
        mean = weighted_mean([(r["mean"], r["weight"]) for r in good])
        values.update(
            delta_chi_pauling=delta,
            ionic_character_pauling_pct=weighted_mean([(r["pauling"], r["weight"]) for r in good]),
            ionic_character_hannay_smyth_pct=weighted_mean([(r["hannay_smyth"], r["weight"]) for r in good]),
            ionic_character_pauling_min_pct=min(r["pauling"] for r in good),
            mean_chi_pauling=mean,
            bond_type=van_arkel_ketelaar_bond_type(mean, delta),
        )
    for r in rows:
        steps.append(
            f"pair {r['cation']} / {r['anion']} (weight {r['weight']:.3g}): contact atoms"
            f" {r['c_atom']} ({r['c_why']}; chi {fmt(r['chi_c'])}) and {r['a_atom']} ({r['a_why']};"
            f" chi {fmt(r['chi_a'])}); dchi = |{fmt(r['chi_a'])} - {fmt(r['chi_c'])}| = {fmt(r['delta'])};"
            f" Pauling {PAULING_EQUATION} = {fmt(r['pauling'], '.1f')} %;"
            f" Hannay-Smyth {HANNAY_SMYTH_EQUATION} = {fmt(r['hannay_smyth'], '.1f')} %"
        )
    if len(rows) > 1:
        steps.append("several ions: pair values averaged with the weights shown (product of stoichiometric fractions)")
    return values, notes, steps


@per_input(maxsize=4096)
def _characters_pct(delta_chi: float) -> tuple[float, float]:
    """Pauling's and Hannay-Smyth's ionic character of one difference, cached:
    a molecule's difference is that of two elements (a few thousand values), and
    the numpy scalar calls were a sixth of a molecule's bond-character cost."""
    return pauling_ionic_character_pct(delta_chi), hannay_smyth_ionic_character_pct(delta_chi)


def _without_ions(dec: Decomposition) -> tuple[dict, list[str], list[str]]:
    rows, missing = _composition_chis(dec)
    if not rows:
        return {}, ["no composition: bond-character values not computed"], []
    if missing:
        return {}, [f"no Pauling electronegativity for {', '.join(missing)}: bond-character values not computed"], [
            f"composition {_composition_text(rows)}; missing Pauling electronegativity for {', '.join(missing)}"
        ]
    chis = [chi for _, _, chi in rows]
    total = sum(n for _, n, _ in rows)
    mean = sum(n * chi for _, n, chi in rows) / total
    delta = max(chis) - min(chis)
    bond_type = van_arkel_ketelaar_bond_type(mean, delta)
    pauling, hannay_smyth = _characters_pct(delta)  # one bond difference: the mean is the least ionic pair
    values = dict(
        delta_chi_pauling=delta,
        ionic_character_pauling_pct=pauling,
        ionic_character_hannay_smyth_pct=hannay_smyth,
        ionic_character_pauling_min_pct=pauling,
        mean_chi_pauling=mean,
        bond_type=bond_type,
    )
    # written only when explained (scorer.descriptor): a molecule's record does not need it
    steps: list = [_NoIonStep(str(dec.substance_class), tuple(rows), delta, mean)]
    notes = []
    symbols = [s for s, _, _ in rows]
    metal_flags = [is_metal(s) for s in symbols]
    if all(metal_flags) and bond_type not in ("metallic", "metallic_ionic"):
        high = [s for s in symbols if pauling_electronegativity(s) >= METALLIC_MAX_MEAN_CHI]
        notes.append(
            f"bond_type {bond_type}: Pauling's scale puts {', '.join(high)} among the non-metals"
            " although every element here is a metal"
        )
    elif not any(metal_flags) and bond_type == "metallic":
        notes.append(
            f"bond_type metallic: Pauling's scale puts {', '.join(symbols)} among the metals"
            " although no element here is a metal"
        )
    return values, notes, steps


@dataclass(frozen=True)
class _NoIonStep:
    """The explain line of a compound without ions, written when called (a step
    of :class:`scorer.descriptor.Result` may be a callable): about a quarter of a
    molecule's bond-character cost went into formatting it for every one scored."""

    substance_class: str
    rows: tuple[tuple[str, float, float], ...]
    delta: float
    mean: float

    def __call__(self) -> str:
        rows = self.rows
        hi = max(rows, key=lambda r: r[2])
        lo = min(rows, key=lambda r: r[2])
        return (f"no ions ({self.substance_class}): composition {_composition_text(rows)}; dchi = max - min ="
                f" {fmt(hi[2])} ({hi[0]}) - {fmt(lo[2])} ({lo[0]}) = {fmt(self.delta)}; mean chi ="
                f" {_MEAN_CHI_COMPOSITION} = {fmt(self.mean, '.3f')}")


def _composition_text(rows) -> str:
    return " ".join(f"{s}{n:g}(chi {fmt(chi)})" for s, n, chi in rows)


_EXPLAINED = {
    "delta_chi_pauling": (".2f", ""),
    "ionic_character_pauling_pct": (".1f", f"{PAULING_EQUATION}; Pauling 1960"),
    "ionic_character_hannay_smyth_pct": (".1f", f"{HANNAY_SMYTH_EQUATION}, capped at 100; Hannay & Smyth 1946"),
    "ionic_character_pauling_min_pct": (".1f", "least ionic pair"),
    "mean_chi_pauling": (".3f", ""),
    "bond_type": ("", f"van Arkel-Ketelaar triangle: {_BOND_TYPE_RULE}; common practice"),
}


@protocol(
    title="Bond character (Pauling electronegativities, CRC Handbook via mendeleev):",
    columns=COLUMNS, result=BondCharacter, failure="bond character not computed",
    summary=value_lines(_EXPLAINED),
)
def analyse(dec: Decomposition) -> BondCharacter:
    """The bond-character values of one compound, with notes and explain steps.

    Never raises (see :mod:`scorer.descriptor`): odd input gives NaN/None
    values and a note saying why.

    Examples
    --------
    >>> from ionicity.scorer.model import Ion, IonTerm, Decomposition
    >>> na = Ion("Na(+)", "Na", 1, (("Na", 1),), "monatomic", element="Na")
    >>> cl = Ion("Cl(-)", "Cl", -1, (("Cl", 1),), "monatomic", element="Cl")
    >>> r = analyse(Decomposition(cations=(IonTerm(na, 1),), anions=(IonTerm(cl, 1),)))
    >>> round(r.delta_chi_pauling, 2), round(r.ionic_character_pauling_pct, 1), r.bond_type
    (2.23, 71.2, 'ionic')
    """
    values, notes, steps = (_ionic if dec.is_ionic else _without_ions)(dec)
    _class_bond_type(dec, values, notes, steps)
    return BondCharacter(**values, notes=tuple(notes), steps=tuple(steps))


# Allen's configuration energies (eV) in Pauling-like units: Allen, J. Am.
# Chem. Soc. 1989, 111, 9003 (factor 0.169; from memory)
ALLEN_EV_TO_PAULING = 0.169
_METAL_RICH_CLASSES = frozenset({"metallic", "intermetallic", "zintl_phase"})


def _class_bond_type(dec: Decomposition, values: dict, notes: list[str], steps: list[str]) -> None:
    """Keep the bond type on the side of the triangle the substance class puts
    the compound: the Pauling scale places Si (1.90) among the metals and Au
    (2.54) among the non-metals, so without this Si and InSb read "metallic"
    and Cu3Au "ionic_covalent".

    * semiconductor: a point in the metallic region moves to covalent_metallic
      (the triangle's metalloid and semiconductor band);
    * metals, intermetallics and Zintl phases stay on the metallic edge:
      metallic below a difference of 0.5 in Allen electronegativity (which
      puts gold beside copper), metallic_ionic from 0.5 up; Pauling values
      where Allen's are missing (Tl, lanthanides).
    """
    bond_type = values.get("bond_type")
    if bond_type is None:
        return
    cls = dec.substance_class
    if cls == "semiconductor" and bond_type == "metallic":
        values["bond_type"] = "covalent_metallic"
        steps.append("bond_type covalent_metallic: a semiconductor, which the Pauling scale puts among the metals")
        notes[:] = [n for n in notes if not n.startswith("bond_type metallic")]
    elif cls in _METAL_RICH_CLASSES and len(dec.composition) > 1 and bond_type not in ("metallic", "metallic_ionic"):
        chis = []
        for symbol, _ in dec.composition:
            allen = get_element(symbol).electronegativity_allen
            chis.append(allen * ALLEN_EV_TO_PAULING if allen == allen else pauling_electronegativity(symbol))
        spread = max(chis) - min(chis)
        values["bond_type"] = "metallic" if spread < POLAR_DELTA_CHI else "metallic_ionic"
        steps.append(
            f"bond_type {values['bond_type']}: a {cls.replace('_', ' ')} stays on the metallic edge of the triangle;"
            f" Allen electronegativity difference {spread:.2f} (x {ALLEN_EV_TO_PAULING} per eV; Allen 1989)"
            f" {'<' if spread < POLAR_DELTA_CHI else '>='} {POLAR_DELTA_CHI}"
        )
        notes[:] = [n for n in notes if not n.startswith("bond_type ")]


describe = analyse.describe
explain = analyse.explain
