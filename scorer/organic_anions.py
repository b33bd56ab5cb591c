"""Salts of s-block metals with an organic anion the ion library does not list.

Sodium dodecyl sulfate (C12H25NaO4S), potassium hydrogen phthalate (KHC8H4O4),
potassium sorbate (C6H7KO2) and potassium tert-butoxide (C4H9OK) are salts of an
alkali or alkaline-earth metal with the conjugate base of an organic acid: the
metal gives its valence electrons, and each negative charge sits on an oxygen
atom (carboxylate, alkoxide, phenoxide, alkyl sulfate, sulfonate, phosphate
ester). The library lists the common ones (acetate, citrate, stearate); for the
others the solver finds no reading, or a reading of no chemical sense (a carbide
anion beside hydrogen, or H(+) as a cation beside a metal). This module is the
solver's last resort for them: it reads such a formula as the metal cation with
one organic anion made of everything else, with the metal's group charge
(IUPAC Red Book 2005, IR-5.4 and IR-9.1: a salt of an organic acid is named and
written as cation plus anion; group charges of the s block: Greenwood &
Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 4-5; from memory).

Rule (stated, not fitted): one s-block metal of group 1 or 2, a whole count of
it; the rest holds carbon with hydrogen or a halogen (sodium trichloroacetate,
CCl3COONa), only C, H, O, N, S, P, As and halogens (sodium cacodylate and arsanilate:
arsonates and arsinates), and at least as many oxygen and
sulfur atoms as negative charges (a dithiocarbamate or thiolate carries its
charge on S: sodium methyldithiocarbamate, C2H4NNaS2). One anion carries the whole
charge, except for a group-2 metal whose rest splits into two equal halves (two
monoanions: Mg(C17H35COO)2, Ca(C6H11O7)2), the common case of the alkaline-earth
carboxylates. Polyacid salts of the alkali metals keep one polyanion
(Na2H2EDTA, KHC8H4O4).
"""
from __future__ import annotations

from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.grammar import hill_formula
from ionicity.scorer.ion_library import monatomic_ion
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD, _PENALTY_SPECIES, _PENALTY_UNCOMMON_ION
from ionicity.scorer.model import Ion, format_charge

__all__ = ["ORGANIC_ANION_SOURCE", "built_organic_ion", "organic_anion", "organic_anion_readings",
           "ammonium_organic_anion_readings", "suspect_organic_reading"]

ORGANIC_ANION_SOURCE = (
    "constructed by rule (scorer/organic_anions.py), not from the ion library: the conjugate base of an"
    " organic acid, everything beside the s-block metal, charge from the metal's group"
)
_ALLOWED = frozenset({"C", "H", "O", "N", "S", "P", "As", "F", "Cl", "Br", "I"})
_HALOGENS = frozenset({"F", "Cl", "Br", "I"})
# a built anion costs like an uncommon library ion, as the complex anions built by rule do
_PENALTY_BUILT = _PENALTY_UNCOMMON_ION + _PENALTY_SPECIES


def organic_anion(composition: dict[str, float], charge: int) -> Ion:
    """The organic anion of ``composition`` (element -> count) and ``charge`` (negative).

    >>> ion = organic_anion({"C": 12.0, "H": 25.0, "O": 4.0, "S": 1.0}, -1)
    >>> ion.ion_id, ion.family, ion.organic
    ('C12H25O4S(-)', 'organic-anion', True)
    """
    return built_organic_ion(hill_formula(composition), composition, charge, "organic-anion", "organic anion",
                             ORGANIC_ANION_SOURCE)


def built_organic_ion(label: str, composition: dict[str, float], charge: int, family: str, kind: str,
                      source: str) -> Ion:
    """An organic ion built by rule, not taken from the ion library: ``label`` and ``composition``, named
    "``kind`` LABEL(charge), read from the formula" (this module's anions; the protonated bases of
    :mod:`scorer.organic_cations`)."""
    return Ion(
        ion_id=f"{label}({format_charge(charge)})",
        label=label,
        charge=charge,
        composition=tuple(sorted(composition.items())),
        family=family,
        name=f"{kind} {label}({format_charge(charge)}), read from the formula",
        organic=True,
        element=None,
        oxidation_states=(),
        source=source,
    )


def organic_anion_readings(remaining: dict[str, float]) -> tuple[list, list[str]]:
    """The reading of ``remaining`` as an s-block metal salt of an organic anion, and its note.

    Returns ``([(penalty, [(Ion, count), ...])], [note])``, or two empty lists when the rule
    does not apply.

    >>> readings, notes = organic_anion_readings({"C": 8.0, "H": 5.0, "K": 1.0, "O": 4.0})
    >>> sorted(f"{ion.ion_id}*{n:g}" for ion, n in readings[0][1])
    ['C8H5O4(-)*1', 'K(+)*1']
    >>> organic_anion_readings({"C": 2.0, "H": 5.0, "Mg": 1.0, "Cl": 1.0})  # a Grignard reagent: no O
    ([], [])
    """
    metals = [s for s in remaining if is_metal(s)]
    if len(metals) != 1:
        return [], []
    metal = metals[0]
    element = get_element(metal)
    if element.block != "s" or element.group not in (1, 2):
        return [], []
    n_metal = remaining[metal]
    if abs(n_metal - round(n_metal)) > 1e-9 or not 1 <= round(n_metal) <= 4:
        return [], []
    n_metal = int(round(n_metal))
    rest = {s: n for s, n in remaining.items() if s != metal}
    z = int(element.group)
    charge = n_metal * z
    if not _acid_rest(rest, charge):
        return [], []
    if z == 2 and n_metal == 1 and all(round(n) % 2 == 0 for n in rest.values()):
        anion, n_anions = organic_anion({s: n / 2 for s, n in rest.items()}, -1), 2
    else:
        anion, n_anions = organic_anion(rest, -charge), 1
    if not _plausible_conjugate_base(dict(anion.composition), -anion.charge):
        return [], [NO_CONJUGATE_BASE]
    cation = monatomic_ion(metal, z)
    penalty = _PENALTY_BUILT
    if penalty >= _IONIC_THRESHOLD:
        return [], []
    note = (f"{anion.ion_id}: an organic anion the ion library does not list, read from the formula as the"
            f" conjugate base beside {cation.ion_id} (scorer/organic_anions.py)")
    return [(penalty, [(cation, float(n_metal)), (anion, float(n_anions))])], [note]


def _acid_rest(rest: dict[str, float], charge: int) -> bool:
    """Whether ``rest`` (element -> count) can be an organic acid's conjugate base of ``charge`` negative charges:
    carbon with hydrogen or a halogen (trichloroacetate CCl3COO(-) has no hydrogen), only the elements of
    :data:`_ALLOWED`, whole counts, one oxygen or sulfur atom or more per charge (the S donors of
    dithiocarbamates and thiolates carry the charge as O donors do)."""
    return ("C" in rest and ("H" in rest or rest.keys() & _HALOGENS) and set(rest) <= _ALLOWED
            and rest.get("O", 0.0) + rest.get("S", 0.0) >= charge
            and all(abs(n - round(n)) <= 1e-9 for n in rest.values()))


def ammonium_organic_anion_readings(remaining: dict[str, float], ammonium: float) -> tuple[list, list[str]]:
    """The reading of ``remaining`` as ``ammonium`` written NH4(+) ions with the rest as one organic anion.

    The text writes the ammonium ion (``NH4C7H15COO``, ``CH3(CH2)6COONH4``: ammonium octanoate) and no library
    anion balances it: the rest is the conjugate base of an organic acid, as for the s-block metals above
    (:func:`_acid_rest`). Returns ``([(penalty, [(Ion,
    count), ...])], [note])`` or two empty lists.

    >>> readings, _ = ammonium_organic_anion_readings({"C": 8.0, "H": 19.0, "N": 1.0, "O": 2.0}, 1.0)
    >>> sorted(f"{ion.ion_id}*{n:g}" for ion, n in readings[0][1])
    ['C8H15O2(-)*1', 'NH4(+)*1']
    """
    from ionicity.scorer.ion_library import get_ion

    if abs(ammonium - round(ammonium)) > 1e-9 or not 1 <= round(ammonium) <= 4:
        return [], []
    n = int(round(ammonium))
    rest = dict(remaining)
    rest["N"] = rest.get("N", 0.0) - n
    rest["H"] = rest.get("H", 0.0) - 4 * n
    if rest["N"] < -1e-9 or rest["H"] < -1e-9:
        return [], []
    rest = {s: c for s, c in rest.items() if c > 1e-9}
    if not _acid_rest(rest, n):
        return [], []
    anion = organic_anion(rest, -n)
    if not _plausible_conjugate_base(dict(anion.composition), n):
        return [], [NO_CONJUGATE_BASE]
    note = (f"{anion.ion_id}: an organic anion the ion library does not list, read from the formula as the"
            " conjugate base beside the NH4(+) written (scorer/organic_anions.py)")
    return [(_PENALTY_BUILT, [(get_ion("NH4(+)"), float(n)), (anion, 1.0)])], [note]


# what organic_anion_readings says when the rest would be no acid's conjugate base (CHO(-), C2H3O(-)): the
# caller then drops a walk's reading of the atoms too, so that the error stands
NO_CONJUGATE_BASE = "no conjugate base of an acid"


def _plausible_conjugate_base(composition: dict[str, float], charge: int) -> bool:
    """Whether an anion of carbon, hydrogen and one oxygen per charge (the conjugate base of an alcohol or a
    phenol: methoxide, tert-butoxide, phenoxide) has such a parent: with the protons back, a saturated alcohol
    (no ring or double bond) or a phenol (six carbons or more). CHO(-) (NaHCO, a truncated NaHCO3) would be
    deprotonated formaldehyde, a carbonyl compound and no acid (common practice). Anions with more oxygen, or
    with N, S or P, are not judged here.

    >>> _plausible_conjugate_base({"C": 4.0, "H": 9.0, "O": 1.0}, 1), _plausible_conjugate_base({"C": 1.0, "H": 1.0, "O": 1.0}, 1)
    (True, False)
    """
    if set(composition) != {"C", "H", "O"} or composition["O"] != charge:
        return True
    carbons, hydrogens = composition["C"], composition["H"] + charge
    rings_and_double_bonds = carbons - hydrogens / 2 + 1
    return abs(rings_and_double_bonds) < 1e-9 or (rings_and_double_bonds >= 4 and carbons >= 6)


def suspect_organic_reading(cations, anions) -> bool:
    """Whether a reading of a metal with carbon and hydrogen makes no chemical sense:
    a carbide anion beside hydrogen (carbon bonded to H is no carbide), H(+) as a cation
    beside a metal cation (an acid salt holds its hydrogen in the anion: KHSO4 is K(+) HSO4(-)),
    or an organic cation beside a metal cation (the caller asks only for unbracketed formulas).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> from ionicity.scorer.model import IonTerm
    >>> suspect_organic_reading((IonTerm(get_ion("H(+)"), 1.0), IonTerm(get_ion("K(+)"), 1.0)), ())
    True
    """
    ids = [t.ion.ion_id for t in cations]
    metal_cation = any(t.ion.monatomic and is_metal(t.ion.element) for t in cations)
    if metal_cation and ("H(+)" in ids or any(t.ion.organic for t in cations)):
        # an organic cation of the library beside a metal in a formula written without brackets is a
        # walk's fit of the atoms (Na2H2EDTA read as [C1mim](+) with formate and tartrate), not a salt
        return True
    return any(t.ion.family == "carbide" or (t.ion.monatomic and t.ion.element == "C") for t in anions)
