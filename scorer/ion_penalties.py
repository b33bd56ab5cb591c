"""How plausible each ion choice is: the penalties the charge-balance solver ranks readings by.

Penalties (additive; lower is more plausible), common practice:

====================================================  =======
choice                                                penalty
====================================================  =======
an oxidation state outside the element's main list     2
a monatomic cation of a non-metal (C4+, S6+ ...)       5
H+ as a monatomic cation                               1.5
a metal split over two oxidation states                1
  (+0.1 for each state skipped between the two)
peroxide, superoxide, ozonide                          3.5
polysulfide, C2(2-) and other carbides                 1.5
an oxoanion of a mixed oxide (MnO4(3-), ZnO2(2-) ...)   1.5
an uncommon ion (hydrazinium, sulfamate, S2Ox, amide,  0.5
fulminate, ammine and hydroxo complexes, alkoxides ...)
H3O+ or an oxocation (NO2+, UO2(2+), VO(2+) ...)        2
a hydrogen-oxoanion (HSO4-: H2SO4 reads as 2 H+)       0.05
mercury as Hg(+) (mercury(I) is Hg2(2+))               1
Al(2+), Ga(2+), In(2+) (group 13 has no M(2+))         1.5
each distinct ion species                              0.1
====================================================  =======

The solver itself: :mod:`scorer.ions` (a composition -> its reading),
:mod:`scorer.ion_search` (the walk over polyatomic ions) and
:mod:`scorer.charge_balance` (the monatomic knapsack). These names are the
solver's own, shared by those modules; nothing else needs them.
"""
from __future__ import annotations

import itertools

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import is_metal
from ionicity.scorer.model import Ion
from ionicity.scorer.substance import listed_states

_RARE_ANION_FAMILIES = frozenset({"chalcogenide-polyatomic", "carbide"})
_PENALTY_EXTRA_STATE = 2.0
_PENALTY_NONMETAL_CATION = 5.0
_PENALTY_PROTON = 1.5
# metalloid cations of the inert pair that form salts with oxoanions and oxides
# (Sb2(SO4)3, Sb2O3, Te(SO4)2, TeO2; Greenwood & Earnshaw, Chemistry of the
# Elements, 2nd ed., 1997, ch. 13 and 16): cheaper than SbO(+) (2), dearer than a metal;
# and their group states in the oxide networks of corner- and edge-sharing octahedra
# (Sb2O5, TeO3; same chapters; from memory), which otherwise read as Sb(3+) or Te(4+)
# with peroxide
_PBLOCK_CATIONS = frozenset({("Sb", 3), ("Te", 4), ("Sb", 5), ("Te", 6)})
_PENALTY_PBLOCK_CATION = 1.0
_PENALTY_MIXED_VALENCE = 1.0
# Group 13 holds no M(2+) ion: "GaCl2" and "InCl2" are M(I)[M(III)Cl4] (Ga(+)[GaCl4](-)); a formal
# M(II) is always a metal-metal bond (Ga2Cl6(2-), the Ga2(4+) pairs of GaS) (Greenwood & Earnshaw,
# Chemistry of the Elements, 2nd ed., 1997, ch. 7.3.5 and 7.3.6; from memory): dearer than the
# M(I)/M(III) readings. Thallium is left out for now: TlSe (Tl(I)Tl(III)) is a calibration row of the
# melting index read as Tl(2+), and its new reading leaves the training set and moves the fitted
# weights (DEVELOPERS.md, "Group 13 and paired cations")
_NO_DIVALENT_ION = frozenset({("Al", 2), ("Ga", 2), ("In", 2)})
_PENALTY_NO_DIVALENT_ION = 1.5
_PENALTY_RARE_ANION = 1.5
_PENALTY_UNCOMMON_ION = 0.5
# O-O anions only where no mixed valence explains the oxygen (YBa2Cu3O7 is
# Cu(II)/Cu(III), not Cu(I) with peroxide); hydroperoxide is one too: at the uncommon-ion price it made
# chromic acid H2CrO4 Cr(2+) with two HO2(-), tungstic acid W(4+) and HVO3 V(3+)
_PENALTY_PEROXO = 3.5
_PEROXO_IONS = frozenset({"O2(2-)", "O2(-)", "O3(-)", "HO2(-)"})
_PENALTY_HYDROGEN_ANION = 0.05
# Ions real salts seldom contain; they win only where nothing common fits.
_UNCOMMON_FAMILIES = frozenset({
    "ammine-complex", "hydroxo-complex", "polyhalide", "organic-anion", "alkylphosphate", "amidinium",
})
_UNCOMMON_IONS = frozenset({
    "N2H5(+)", "N2H6(2+)", "NH3OH(+)", "NH2SO3(-)", "S2O4(2-)", "S2O5(2-)", "S2O6(2-)",
    "S2O7(2-)", "S2O8(2-)", "PH4(+)", "CNO(-)", "NH2(-)", "NH(2-)", "C3(4-)", "SO5(2-)",
    "FeO4(2-)",
})
# oxoanions that mostly exist as formula units of mixed oxides, where the
# monatomic reading (spinels ZnFe2O4, LiMn2O4) is the usual description
_FORMULA_UNIT_OXOANIONS = frozenset({
    "SbO4(3-)", "SbO3(-)", "MnO4(3-)", "CrO2(-)", "ZnO2(2-)",
    # spinels MgAl2O4, ZnAl2O4, CaAl2O4 and LiAlO2 are oxide-ion lattices with
    # Al(3+) in octahedral or tetrahedral holes, no discrete AlO2 units
    # (Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 13; from memory)
    "AlO2(-)",
    # sheet and framework silicates share every or nearly every O between two Si: Si2O5 and Si3O8 are
    # formula units (Na2Si2O5, NaAlSi3O8) where no discrete ion reading balances; Si4O11 is the double chain
    # of the amphiboles (tremolite Ca2Mg5(Si4O11)2(OH)2)
    "Si2O5(2-)", "Si3O8(4-)", "Si4O11(6-)",
})
_PENALTY_FORMULA_UNIT_OXOANION = 1.5
# actinyl ions are the usual form of U(VI), Np(VI), Pu(VI)
_ACTINYL_IONS = frozenset({"UO2(2+)", "UO2(+)", "NpO2(2+)", "NpO2(+)", "PuO2(2+)"})
# acid anions that keep a proton: H2S reads 2 H+ + S2-, oxalic acid 2 H+ + C2O4(2-)
# (and the protonated edetates: EDTA is 4 H+ with edetate, as sulfuric acid is 2 H+ with sulfate; common practice)
_HYDROGEN_ANIONS = frozenset({"HS(-)", "HSe(-)", "HC2O4(-)", "C10H14N2O8(2-)", "C10H13N2O8(3-)"})
_PENALTY_SPECIES = 0.1
_PENALTY_FRACTIONAL_SPLIT = 1.0
# a bare cation of charge 5 or more is a formal device (U6+ + 2 O2- in uranyl nitrate)
_PENALTY_HIGH_CATION = 1.0
# hydronium only where nothing else fits: H3PO4 is 3 H+ + PO4(3-), not H3O+ + PO3-
# hydrogenperoxomonosulfate above its parent peroxomonosulfate (uncommon) by a hydrogen anion's step, so Caro's
# acid H2SO5 is 2 H+ with SO5(2-) as sulfuric acid is 2 H+ with SO4(2-), and above an uncommon cation beside a
# common anion, so an O-O bond loses a tie with an N-O bond: H5NO5S is hydroxylammonium hydrogensulfate, not
# ammonium hydrogenperoxomonosulfate
_ION_PENALTIES = {"H3O(+)": 2.0, "HSO5(-)": 2 * _PENALTY_UNCOMMON_ION + _PENALTY_HYDROGEN_ANION}
# oxocations (NO2+, UO2 2+, VO 2+) only where nothing else fits: HNO3 is H+ + NO3-
_PENALTY_OXOCATION = 2.0
_IONIC_THRESHOLD = 5.0


@once
def _states(symbol: str) -> tuple[tuple[int, float], ...]:
    """Non-zero oxidation states with their penalty (main 0, extra 2)."""
    return tuple((state, _PENALTY_EXTRA_STATE if extra else 0.0) for state, extra in listed_states(symbol))


@per_input(maxsize=4096)
def _monatomic_options(symbol: str, count: float):
    """(kind, payload, penalty) options for one leftover element."""
    metal = is_metal(symbol)
    options = []
    states = _states(symbol)
    most_negative = min((s for s, _ in states if s < 0), default=None)
    for state, penalty in states:
        if metal and state < 0:
            continue
        if state < 0 and state != most_negative:
            # a monatomic anion carries its element's most negative state (N3-, O2-, S2-):
            # N- or O- as free ions read NO2 as NO+ + O-
            continue
        if state >= 5:
            penalty += _PENALTY_HIGH_CATION
        if state > 0 and not metal:
            if symbol == "H":
                penalty += _PENALTY_PROTON
            elif (symbol, state) in _PBLOCK_CATIONS:
                penalty += _PENALTY_PBLOCK_CATION
            else:
                penalty += _PENALTY_NONMETAL_CATION
        if symbol == "Hg" and state == 1:
            penalty += 1.0
        if (symbol, state) in _NO_DIVALENT_ION:
            penalty += _PENALTY_NO_DIVALENT_ION
        options.append(("single", state, penalty))
    options.sort(key=lambda o: o[2])
    if metal:
        positives = [(s, p) for s, p in _states(symbol) if s > 0]
        for (s1, p1), (s2, p2) in itertools.combinations(positives, 2):
            # adjacent states first: YBa2Cu3O7 is Cu(II)/Cu(III) rather than Cu(I)/Cu(III)
            gap = _PENALTY_SPECIES * (s2 - s1 - 1)
            options.append(("mixed", (s1, s2), p1 + p2 + _PENALTY_MIXED_VALENCE + gap))
    return tuple(options)


def _ion_penalty(ion: Ion) -> float:
    if ion.ion_id in _ION_PENALTIES:
        return _ION_PENALTIES[ion.ion_id]
    if ion.ion_id in _PEROXO_IONS:
        return _PENALTY_PEROXO
    if ion.family in _RARE_ANION_FAMILIES:
        return _PENALTY_RARE_ANION
    if ion.ion_id in _FORMULA_UNIT_OXOANIONS:
        return _PENALTY_FORMULA_UNIT_OXOANION
    if ion.ion_id in _ACTINYL_IONS:
        return _PENALTY_UNCOMMON_ION
    if ion.family == "oxocation":
        return _PENALTY_OXOCATION
    if ion.family in _UNCOMMON_FAMILIES or ion.ion_id in _UNCOMMON_IONS:
        return _PENALTY_UNCOMMON_ION
    if ion.family == "hydrogen-oxoanion" or ion.ion_id in _HYDROGEN_ANIONS:
        return _PENALTY_HYDROGEN_ANION
    return 0.0


def _pair_penalty(ion: Ion, counts: dict[str, float]) -> float:
    if not ion.monatomic:
        return _ion_penalty(ion)
    return next(p for kind, state, p in _monatomic_options(ion.element, counts[ion.element])
                if kind == "single" and state == ion.charge)
