"""What kind of substance a reading is, and formal oxidation states.

The ion solver (:mod:`scorer.ions`) finds charge-balanced ions; this module
says what the result is (:func:`classify`, :func:`nonionic_decomposition`)
and gives the oxidation states: from the ions of a reading
(:func:`oxidation_states_of`), by electronegativity for entries without ions
(:func:`formal_oxidation_states`) and for carbonyls and metallocenes
(:func:`organometallic_states`).

``substance_class`` values
--------------------------
``ionic_salt``
    charge-balanced ions with an inorganic (or metal) cation.
``ionic_liquid_pair``
    an organic cation (imidazolium, pyrrolidinium, ammonium, phosphonium...)
    with any anion; whether it melts below 100 C is the melting columns' job.
``acid``
    no metal; H+ with a single inorganic or carboxylate anion (HCl, H2SO4,
    CH3COOH).
``base``
    a hydroxide (every anion OH-) or ammonia/hydrazine.
``covalent_molecular``
    non-metal molecules (CCl4, glucose, nitrobenzene); molecular metal
    halides and oxyhalides of the structural-family table (AlCl3/Al2Cl6,
    AlBr3, AlI3, GaCl3, HgX2, BiCl3, SbX3, VOCl3, CrO2Cl2); high-valent metal halides and oxides
    that are molecular (TiCl4, SnCl4: metal at +4 or more with only halide
    anions; Mn2O7, OsO4: metal at +7 or more with only oxide; common
    practice); organometallics written with CO or C5H5 ligands.
``chain_layer_solid``
    polymeric chains or layers held by polar covalent bonds (CrO3, BeCl2,
    MoO3, V2O5; ZnCl2, CdCl2 and CdI2 keep their ions with the ionic model
    ``strained``); decided in :mod:`scorer.applicability`.
``covalent_network``
    extended covalent solids of B, C, Si, Ge with N, O, C (SiO2, SiC, BN,
    diamond; common practice); frameworks of a bare cation of charge 5 or
    more with oxide (WO3, Nb2O5; :mod:`scorer.applicability`).
``semiconductor``
    tetrahedral polar-covalent AB compounds and elements below Phillips'
    critical ionicity 0.785 (Si, Ge, GaAs, InP, InSb, GaN, AlN, CdTe, ZnS);
    decided in :mod:`scorer.applicability`.
``intermetallic``
    compounds of two or more metals, or of metals with B, Si, Ge, in
    whole-number ratio, where no Zintl reading applies (Cu3Au, Ni3Al, Fe2B,
    MgB2); no ions.
``zintl_phase``
    s-block metals with a p-block element (or gold) that takes their valence
    electrons: NaTl = Na(+) Tl(-), KGe, Mg2Si, CsAu = Cs(+) Au(-); formal
    ions kept, the ionic model not applied.
``metallic``
    elemental metals and metallic solid solutions (every element a metal, no
    compound reading: Cu0.7Zn0.3).
``element``
    a non-metallic element (O2, S8, P4, a noble gas).
``ion``
    a lone ion written with its charge (``SO4^2-``).
``unknown``
    none of these could be established; the message says why.
"""
from __future__ import annotations

import math

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.grammar import format_count
from ionicity.scorer.model import Decomposition, IonTerm
from ionicity.scorer.radii import shannon_radius_pm

__all__ = [
    "classify",
    "organic_candidate",
    "nonionic_decomposition",
    "listed_states",
    "formal_oxidation_states",
    "formal_state_strain",
    "most_electronegative",
    "usual_state",
    "organometallic_states",
    "binary_carbonyl",
    "oxidation_states_of",
    "format_oxidation_states",
]

_TOL = 1e-6
_HALOGENS = frozenset({"F", "Cl", "Br", "I", "At"})
_NETWORK_FORMERS = frozenset({"B", "C", "Si", "Ge"})
# P and As make tetrahedral networks with B, Si and Ge (BP, BAs: zinc blende; SiP2, GeAs2: layers;
# Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 6.7, 9.3; from memory);
# with carbon alone they would make no known network, hence the carbon test in nonionic_decomposition
# S, Se and Te likewise with B, Si and Ge (SiS2 chains, GeS and GeSe layers, GeS2 and B2S3 networks;
# Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 16; from memory)
_NETWORK_PARTNERS = frozenset({"B", "C", "Si", "Ge", "N", "O", "P", "As", "S", "Se", "Te"})
# partners that make networks with B, Si and Ge but not with carbon alone (CS2, COS, CP are molecules or unknown)
_NOT_WITH_CARBON_ALONE = frozenset({"P", "As", "S", "Se", "Te"})
_ACID_ANION_FAMILIES = frozenset({
    "monatomic", "oxoanion", "hydrogen-oxoanion", "carboxylate", "halo-complex", "pseudohalide",
    "sulfonate", "sulfonylimide", "alkylsulfate", "metal-oxoanion", "cyano-anion",
})
# the anions of the metals' acids (scorer.ions reads them whole: _metal_acid_reading)
_METAL_ACID_ANION_FAMILIES = frozenset({"metal-oxoanion", "oxoanion", "halo-complex", "cyano-complex"})
# binary hydrides that are acids in water (HCl, H2S); H2O and NH3 are not
_ACID_FORMING_ELEMENTS = frozenset({"F", "Cl", "Br", "I", "S", "Se", "Te"})


# States that mendeleev lists only as "extra" but that are common in salts
# (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997; from memory):
# Cu(I) in CuCl and Cu2O, Mn(III) in Mn2O3 and Mn3O4, Ti(III), V(III)/V(IV),
# Cr(II), Au(I), U(IV) in UO2, Os(VIII) and Ru(VIII) in the tetroxides, Re(VII),
# Re(VI) in ReO3 (otherwise read as Re(IV)/Re(VII)).
# metalloids read as cations in salts and oxide networks (scorer.ion_penalties._PBLOCK_CATIONS)
_PBLOCK_CATION_ELEMENTS = frozenset({"Sb", "Te"})
_COMMON_STATES = {
    "Cu": (1,), "Mn": (3,), "Ti": (2, 3), "V": (2, 3, 4), "Cr": (2,), "Au": (1,), "U": (4,),
    "Os": (8,), "Ru": (8,), "Re": (6, 7), "Sm": (2,), "Yb": (2,),
}


@once
def listed_states(symbol: str) -> tuple[tuple[int, bool], ...]:
    """Non-zero oxidation states of an element, ascending, each with whether
    it is only an "extra" state (mendeleev's extended list, less common).

    >>> listed_states("Na"), listed_states("Cu")[1:3]
    (((-1, True), (1, False)), ((1, False), (2, False)))
    """
    element = get_element(symbol)
    seen: dict[int, bool] = {}
    for s in _COMMON_STATES.get(symbol, ()):
        seen[s] = False
    for s in element.oxidation_states_main:
        if s != 0:
            seen.setdefault(int(s), False)
    for s in element.oxidation_states_extra:
        if s != 0:
            seen.setdefault(int(s), True)
    return tuple(sorted(seen.items()))


def format_oxidation_states(states) -> str:
    """``Fe:+3;S:+6;O:-2``; averages of mixed or fractional states to 3 decimals."""
    return ";".join([symbol + ":" + _state_text(value) for symbol, value in states])


@per_input(maxsize=4096)
def _state_text(value: float) -> str:
    # cached: every record writes its states, and most are a few values (+1, -2, -3)
    sign = "+" if value > 0 else ("-" if value < 0 else "")
    return sign + format_count(round(abs(value), 3))


@once
def _electronegativity(symbol: str) -> float:
    value = get_element(symbol).electronegativity_pauling
    return value if value == value else 1.0


@once
def _state_range(symbol: str) -> tuple[int, int]:
    """Lowest and highest listed oxidation state (0, 0 for an element with none)."""
    states = [state for state, _ in listed_states(symbol)] or [0]
    return min(states), max(states)


_DEFAULT_STATES = {"F": -1, "O": -2, "H": 1, "Cl": -1, "Br": -1, "I": -1, "N": -3, "S": -2, "Se": -2, "P": -3}


def formal_oxidation_states(counts: dict[str, float], charge: float = 0.0) -> tuple[tuple[str, float], ...]:
    """Formal oxidation states of a covalent formula by electronegativity.

    Every element but one takes its usual state (F -1, O -2, H +1, halogens
    -1, N -3, S -2 ...; the most electronegative element its most negative
    listed state); the least electronegative element whose resulting state
    lies within its listed range takes the balance, possibly fractional
    (common practice).

    >>> dict(formal_oxidation_states({"C": 1, "Cl": 4}))
    {'C': 4.0, 'Cl': -1.0}
    >>> dict(formal_oxidation_states({"H": 2, "O": 2}))
    {'H': 1.0, 'O': -1.0}
    """
    symbols = tuple(counts)
    if len(symbols) == 1:
        ((symbol, n),) = counts.items()
        return ((symbol, charge / n),)
    defaults, balancers, ranges, partners = _formal_rules(symbols)
    most = most_electronegative(symbols)
    for balancer in balancers:
        # metals of the balancer's group share the balance (Pb0.5Sn0.5Te: Pb and Sn +2 both, not Pb 0 and Sn +4);
        # most formulas (every organic molecule) have no such partners and take the one-element path
        if balancer not in partners:
            sharing = (balancer,)
            rest = sum(defaults[s] * counts[s] for s in symbols if s != balancer)
            value = (charge - rest) / counts[balancer]
            low, high = ranges[balancer]
            if low - _TOL <= value <= high + _TOL and not (balancer == most and value > -_TOL and defaults[most] < 0):
                # the most electronegative element is never the positive (or zero) partner: SO4 had read
                # S -2 with O +0.5, H2SO5 S -2 with O 0
                break
            continue
        sharing = (balancer, *partners[balancer])
        rest = sum(defaults[s] * counts[s] for s in symbols if s not in sharing)
        value = (charge - rest) / sum(counts[s] for s in sharing)
        if all(ranges[s][0] - _TOL <= value <= ranges[s][1] + _TOL for s in sharing):
            break
    else:
        strained = _peroxo_reading(counts, charge, defaults, balancers, ranges, most)
        if strained is not None:
            return strained
        balancer = balancers[0]
        sharing = (balancer,)
        rest = sum(defaults[s] * counts[s] for s in symbols if s != balancer)
        value = (charge - rest) / counts[balancer]
    return tuple((s, round(value if s in sharing else defaults[s], 6)) for s in symbols)


def _peroxo_reading(counts, charge, defaults, balancers, ranges, most) -> tuple[tuple[str, float], ...] | None:
    """Where no element can take the balance within its listed range, the reading that puts the element
    nearest its range at its bound and gives the rest to the most electronegative element, when that stays
    negative and above its default (oxygen between -2 and 0: peroxo groups, H2SO5 S +6 with O -1.6, SO4 O -1.5;
    :func:`formal_state_strain` says so); None otherwise."""
    best = None
    for balancer in balancers:
        if balancer == most or balancer in _DEFAULT_STATES and balancer == "H":
            continue
        rest = sum(defaults[s] * counts[s] for s in counts if s != balancer)
        value = (charge - rest) / counts[balancer]
        low, high = ranges[balancer]
        clamped = float(min(max(value, low), high))
        if best is None or abs(value - clamped) < best[0]:
            best = (abs(value - clamped), balancer, clamped)
    if best is None:
        return None
    _, balancer, clamped = best
    if most == "N" and counts["N"] % 3 == 0 and len(counts) == 2:
        # nitrogen in threes beside one partner: covalent azides (BrN3, IN3, ClN3), the N3 group -1 (IUPAC Red
        # Book 2005, IR-5; from memory), not the partner at its highest state
        azide = (charge + counts["N"] / 3) / counts[balancer]
        if ranges[balancer][0] - _TOL <= azide <= ranges[balancer][1] + _TOL:
            clamped = azide
    rest = sum(defaults[s] * counts[s] for s in counts if s not in (balancer, most)) + clamped * counts[balancer]
    value = (charge - rest) / counts[most]
    if not max(defaults[most], ranges[most][0]) - _TOL <= value < -_TOL or value > ranges[most][1] + _TOL:
        return None  # fluorine has no state but -1 (SF5OF keeps its out-of-range reading)
    return tuple((s, round(clamped if s == balancer else value if s == most else defaults[s], 6)) for s in counts)


@per_input(maxsize=4096)
def most_electronegative(symbols: tuple[str, ...]) -> str:
    """The element :func:`_formal_rules` reads as the negative partner (a non-metal before any metal)."""
    nonmetal = any(not is_metal(s) for s in symbols)
    return max(symbols, key=lambda s: (nonmetal and not is_metal(s), _electronegativity(s)))


def usual_state(symbol: str) -> float | None:
    """The state :func:`formal_oxidation_states` gives an element first beside a more electropositive one (F -1,
    O -2, Cl -1, N -3, S -2 ...; :data:`_DEFAULT_STATES`), or None.

    >>> usual_state("S"), usual_state("B")
    (-2, None)
    """
    return _DEFAULT_STATES.get(symbol)


def formal_state_strain(counts: dict[str, float], states) -> str | None:
    """Why the formal states of a molecule are strained, or None: an element outside its listed range (no
    reading balances), or the most electronegative element left above its usual state by elements at their
    highest (oxygen between -2 and -1, where no other element can take more: a peroxo compound or a count
    lost).

    >>> formal_state_strain({"S": 1, "O": 4}, formal_oxidation_states({"S": 1, "O": 4}))
    'S at its highest listed state +6 leaves O at -1.5 (a peroxo group, or a count lost)'
    >>> formal_state_strain({"S": 1, "O": 3}, formal_oxidation_states({"S": 1, "O": 3})) is None
    True
    """
    states = dict(states)
    symbols = tuple(counts)
    if len(symbols) < 2:
        return None
    for s, value in states.items():
        low, high = _state_range(s)
        if not low - _TOL <= value <= high + _TOL:
            return f"{s} would be {_state_text(value)}, outside its listed states ({_state_text(low)} to {_state_text(high)})"
    most = most_electronegative(symbols)
    usual = _DEFAULT_STATES.get(most)
    if usual is None or usual >= 0 or states.get(most, usual) <= usual + _TOL:
        return None
    at_top = [s for s in symbols if s not in (most, "H") and abs(states[s] - _state_range(s)[1]) < _TOL]
    if not at_top:
        return None
    top = at_top[0]
    return (f"{top} at its highest listed state {_state_text(states[top])} leaves {most} at"
            f" {_state_text(states[most])} (a peroxo group, or a count lost)")


@per_input(maxsize=4096)
def _formal_rules(symbols: tuple[str, ...]) -> tuple[dict[str, float], list[str], dict[str, tuple[int, int]],
                                                    dict[str, tuple[str, ...]]]:
    """What :func:`formal_oxidation_states` decides from the elements alone, not
    their counts: each element's usual state, the order in which they are tried
    as the balancing element, and their listed ranges. Cached per element set:
    this runs for every molecule scored, and an inventory's molecules share a few
    sets (C, H, N, O); a third of the call's cost before."""
    chi = {s: _electronegativity(s) for s in symbols}
    # beside a non-metal a metal is never the negative partner, whatever the scale says: gold and
    # platinum (Pauling 2.54, 2.28) are the positive partners of tellurium (2.10) in AuTe2 and PtTe2
    # (common practice; the aurides and platinides are compounds of metals alone, CsAu, Cs2Pt)
    nonmetal = any(not is_metal(s) for s in symbols)
    by_chi = sorted(symbols, key=lambda s: (nonmetal and not is_metal(s), chi[s]))
    most = by_chi[-1]
    chi_most = chi[most]
    ranges = {s: _state_range(s) for s in symbols}

    def default(symbol: str) -> float:
        if symbol == "H" and symbol == most:
            return -1.0
        if symbol in _DEFAULT_STATES and (symbol != "H" or chi_most > 2.2):
            state = _DEFAULT_STATES[symbol]
            if state < 0 and symbol != most and chi[symbol] < chi_most - 1.0:
                state = -state if symbol != "N" else 3
            return float(state)
        low, high = ranges[symbol]
        return float(low if symbol == most else high)

    defaults = {s: default(s) for s in symbols}
    group = {s: get_element(s).group for s in symbols}
    metals = [s for s in symbols if is_metal(s)]
    if metals and not is_metal(most):
        # beside a metal, the non-metals and metalloids of the most electronegative element's group are anions
        # as it is (GaAs0.5P0.5: As -3 with P -3, not As +5 and Ga -1; ZnS0.5Se0.5; common practice)
        for s in symbols:
            if s != most and group[s] == group[most] and not is_metal(s) and s not in _DEFAULT_STATES:
                defaults[s] = defaults[most]
    # an element without a usual state (C in organics, Si in SiC) balances first
    balancers = [x for x in by_chi if x not in _DEFAULT_STATES] + [x for x in by_chi if x in _DEFAULT_STATES]
    partners = {m: tuple(s for s in metals if s != m and group[s] == group[m] and s not in _DEFAULT_STATES)
                for m in metals}
    return defaults, balancers, ranges, {m: p for m, p in partners.items() if p}


# the metals of the binary carbonyls M_x(CO)_y (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997,
# ch. 8.4, table of binary carbonyls; from memory)
_CARBONYL_METALS = frozenset("V Cr Mo W Mn Tc Re Fe Ru Os Co Rh Ir Ni".split())
# carbonyls per metal atom: Rh6(CO)16 2.67 to Cr(CO)6 6; an oxalate (C2O4) has twice the oxygens
_CARBONYLS_PER_METAL_MIN = 2.5
# the ligands beside CO of the carbonyl halides (Mn(CO)5Br), each -1
_CARBONYL_LIGANDS = frozenset({"F", "Cl", "Br", "I"})


def binary_carbonyl(counts: dict[str, float]) -> bool:
    """Whether a composition is a metal carbonyl written in Hill order: one carbonyl-forming metal
    (:data:`_CARBONYL_METALS`), carbon and oxygen in equal numbers, at least 2.5 of them per metal atom, or,
    beside halide ligands (at most three per metal atom), at least one. Hydrogen makes none: C4H2FeO4 is ferrous
    fumarate, the stock chemical, before tetracarbonyldihydroiron. C5FeO5 is Fe(CO)5, C4NiO4
    Ni(CO)4 (the squarate Ni(C4O4) has the same formula; the carbonyl is the stock chemical; common practice);
    C5BrMnO5 is Mn(CO)5Br and C4Cl2O4Rh2 [Rh(CO)2Cl]2 (carbonyl halides, IUPAC Red Book 2005, IR-10; from
    memory), which had read as Mn(7+) with hypobromite, a carbide and oxalate.

    >>> binary_carbonyl({"C": 5.0, "Fe": 1.0, "O": 5.0}), binary_carbonyl({"C": 2.0, "Fe": 1.0, "O": 4.0})
    (True, False)
    >>> binary_carbonyl({"Br": 1.0, "C": 5.0, "Mn": 1.0, "O": 5.0}), binary_carbonyl({"C": 2.0, "Cl": 4.0, "Fe": 1.0, "O": 2.0})
    (True, False)
    """
    metals = [s for s in counts if s not in ("C", "O") and s not in _CARBONYL_LIGANDS]
    if len(metals) != 1 or metals[0] not in _CARBONYL_METALS or "C" not in counts or "O" not in counts:
        return False
    metal = counts[metals[0]]
    ligands = sum(n for s, n in counts.items() if s in _CARBONYL_LIGANDS)
    carbon = counts["C"]
    if abs(carbon - counts["O"]) >= _TOL or ligands > 3 * metal + _TOL:
        return False
    return carbon >= (_CARBONYLS_PER_METAL_MIN if not ligands else 1.0) * metal


def organometallic_states(counts: dict[str, float]) -> tuple[tuple[str, float], ...]:
    """Formal states of a homoleptic carbonyl (neutral CO: metal 0, C +2, O -2)
    or metallocene (two C5H5(-): metal +2, C -1.2, H +1); IUPAC Red Book
    2005, IR-10 (organometallic compounds)."""
    metals = [s for s in counts if is_metal(s)]
    if len(metals) != 1:
        return ()
    metal = metals[0]
    rest = {s: n for s, n in counts.items() if s != metal}
    if set(rest) == {"C", "O"} and abs(rest["C"] - rest["O"]) < _TOL:
        return ((metal, 0.0), ("C", 2.0), ("O", -2.0))
    if binary_carbonyl(counts):
        # a carbonyl halide: CO neutral, each halide -1, the metal what balances
        ligands = {s: n for s, n in rest.items() if s not in ("C", "O")}
        state = sum(ligands.values()) / counts[metal]
        return ((metal, state), ("C", 2.0), ("O", -2.0), *((s, -1.0) for s in ligands))
    if set(rest) == {"C", "H"} and abs(rest["C"] - 10 * counts[metal]) < _TOL and abs(rest["H"] - rest["C"]) < _TOL:
        return ((metal, 2.0), ("C", -1.2), ("H", 1.0))
    return ()


def oxidation_states_of(terms: list[IonTerm]) -> tuple[tuple[str, float], ...]:
    totals: dict[str, float] = {}
    weights: dict[str, float] = {}
    for term in terms:
        ion = term.ion
        for symbol, state in ion.oxidation_states:
            k = dict(ion.composition).get(symbol, 1.0) * term.count
            totals[symbol] = totals.get(symbol, 0.0) + state * k
            weights[symbol] = weights.get(symbol, 0.0) + k
    return tuple((s, round(totals[s] / weights[s], 6)) for s in totals)


def organic_candidate(counts: dict[str, float]) -> bool:
    """Whether a formula written without ions or charge has the make-up of an
    organic molecule: carbon with hydrogen and only non-metals.

    Such a formula is read as a molecule unless it is one cation and one
    anion of the ion library with at least one of them inorganic (acetic
    acid H(+) CH3COO(-), ethylammonium nitrate, ammonium stearate): see
    :func:`scorer.ions.decompose`. Nitro compounds, nitriles, alcohols and
    sugars are then molecules at once, with no ion search (common practice:
    an organic formula without a salt-forming group is covalent).

    >>> organic_candidate({"C": 6.0, "H": 5.0, "N": 1.0, "O": 2.0}), organic_candidate({"C": 1.0, "O": 2.0})
    (True, False)
    >>> organic_candidate({"C": 2.0, "H": 3.0, "Na": 1.0, "O": 2.0})
    False
    """
    return "C" in counts and "H" in counts and not any(is_metal(s) for s in counts)


# Pauling's radius-ratio limit of octahedral coordination (J. Am. Chem. Soc. 1929, 51, 1010; from memory)
_OCTAHEDRAL_RADIUS_RATIO = 0.414
# 4d and 5d metals of groups 4-10: their tetrahalides are chains or layers of edge-sharing MX6
# octahedra, not MX4 molecules, even where the radius ratio is below Pauling's limit (ZrCl4, HfCl4:
# zigzag chains, sublime near 600 K; NbCl4, TaCl4, MoCl4, WCl4, ReCl4, PtCl4 polymeric; Greenwood &
# Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 21.3.3, 22.3.3, 23.3.3, 24.3.3, 27.3.3;
# Wells 1984, ch. 9; from memory)
_HEAVY_TRANSITION_METALS = frozenset("Zr Nb Mo Tc Ru Rh Pd Hf Ta W Re Os Ir Pt".split())


def _bridged_tetrahalide(cation, anions) -> bool:
    """Whether a tetrahalide MX4 is a bridged solid rather than a molecule: the M(4+)/X(-) ratio of
    Shannon radii (CN VI) reaches Pauling's octahedral limit 0.414, so M takes six or more halides
    and every halide bridges (UF4, ThF4, ZrF4, SnF4: chains, layers and frameworks melting at
    900-1400 K; ThCl4, UCl4) while a smaller centre keeps four in a molecule (TiCl4, SnCl4, SiF4;
    Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 9; from memory). The 4d and 5d metals of
    groups 4-10 bridge whatever the ratio (:data:`_HEAVY_TRANSITION_METALS`: ZrCl4, HfCl4, ZrI4, NbCl4,
    MoCl4, WCl4, ReCl4, PtCl4 are chains of edge-sharing MX6 octahedra that sublime or melt at 600-800 K)
    where the 3d metals of the same groups keep molecules (TiCl4, VCl4).

    >>> from ionicity.scorer.ion_library import monatomic_ion
    >>> [_bridged_tetrahalide(monatomic_ion(m, 4), [monatomic_ion("Cl", -1)]) for m in ("Zr", "Ti", "Sn")]
    [True, False, False]
    """
    if cation.element in _HEAVY_TRANSITION_METALS:
        return True
    r_m = shannon_radius_pm(cation.element, cation.charge, 6)[0]
    ratios = [r_m / shannon_radius_pm(a.element, a.charge, 6)[0] for a in anions]
    return all(math.isfinite(q) and q >= _OCTAHEDRAL_RADIUS_RATIO for q in ratios)


# chelating anions whose metal compounds are neutral molecular complexes (classify): acetylacetonate and the
# dithiocarbamates (Zn(S2CNMe2)2, ziram; Cd, Ni, Cu, Fe(III) diethyl-, Zn and Ni dibutyldithiocarbamates)
CHELATE_ANIONS = frozenset({"C5H7O2(-)", "C5H10NS2(-)", "C3H6NS2(-)", "C9H18NS2(-)"})
# the alkali metals whose chelate-anion compounds are salts (Li(acac) stays a chelate molecule: the small Li(+)
# binds both O atoms)
_ALKALI_METALS = frozenset({"Na", "K", "Rb", "Cs"})
# the alkoxide anions of the ion library (classify)
ALKOXIDE_ANIONS = frozenset({"CH3O(-)", "C2H5O(-)"})


def classify(counts: dict[str, float], cations: list[IonTerm], anions: list[IonTerm]) -> str:
    has_metal = any(is_metal(s) for s in counts)
    cation_ions = [t.ion for t in cations]
    if any(ion.organic for ion in cation_ions):
        return "ionic_liquid_pair"
    if has_metal and cation_ions and all(ion.ion_id == "H(+)" for ion in cation_ions) and len(anions) == 1 \
            and anions[0].ion.family in _METAL_ACID_ANION_FAMILIES:
        # a metal's acid: its only cation the proton, the metal inside the anion (HMnO4, H2CrO4, HAuCl4,
        # H2PtCl6, H3PW12O40; common practice)
        return "acid"
    if not has_metal and all(ion.element == "H" for ion in cation_ions):
        anion = anions[0].ion if len(anions) == 1 and anions[0].count == 1 else None
        if anion is not None and anion.family in _ACID_ANION_FAMILIES and (
            not anion.monatomic or anion.element in _ACID_FORMING_ELEMENTS
        ):
            return "acid"
        return "unknown"
    if not has_metal and "C" in counts and "H" in counts and any(
        ion.family == "oxocation" or (ion.monatomic and ion.element != "H") for ion in cation_ions
    ):
        # an organic molecule read as NO(+) or NO2(+) with an organic anion
        # (nitrobenzene C6H5NO2): carbon with hydrogen and no salt-forming
        # cation is a molecule; "unknown" sends it to the molecular reading
        return "unknown"
    if not has_metal and cation_ions and all(ion.family == "oxocation" for ion in cation_ions) and all(
        t.ion.atom_count <= 2 for t in anions
    ):
        # nitrosyl and nitryl halides (NOCl, NO2F) and their like (ONCN) are volatile
        # molecules X-NO and X-NO2: NO(+) and NO2(+) are cations only beside large
        # weakly coordinating anions (NOBF4, NOClO4, NO2(+)NO3(-) in solid N2O5)
        # (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.3.6;
        # the two-atom bound is common practice)
        return "covalent_molecular"
    if has_metal and any(t.ion.ion_id in CHELATE_ANIONS for t in anions) and not all(
            ion.monatomic and ion.element in _ALKALI_METALS for ion in cation_ions):
        # a metal acetylacetonate (Cu(acac)2, Fe(acac)3, VO(acac)2) or dithiocarbamate (Zn(S2CNMe2)2) is a
        # neutral chelate complex, each ligand bound by both O or both S atoms: a molecule that melts low,
        # sublimes and dissolves in organic solvents, not a salt (IUPAC Red Book 2005, IR-9.2; Greenwood &
        # Earnshaw, 2nd ed., 1997, ch. 7.3, 8.6 and 25.3; from memory); those of Na, K, Rb, Cs are salts (sodium
        # diethyldithiocarbamate, sodium acetylacetonate dissolve in water as ions)
        return "covalent_molecular"
    if anions and all(t.ion.ion_id in ALKOXIDE_ANIONS for t in anions) and any(
            ion.monatomic and ion.charge >= 3 for ion in cation_ions):
        # the alkoxides of metals at +3 or more (Al(OEt)3, Ti(OEt)4, Nb(OEt)5) are molecules and oligomers that
        # distil, not salts; those of the alkali and alkaline-earth metals (NaOMe, KOtBu) are ionic (Bradley,
        # Mehrotra & Gaur, Metal Alkoxides, 1978; Greenwood & Earnshaw, 2nd ed., 1997, ch. 21; from memory)
        return "covalent_molecular"
    if all(t.ion.ion_id == "OH(-)" for t in anions):
        return "base"
    # Sb and Te count with the metals here: their cations (Sb(3+), Te(4+), and Sb(5+), Te(6+) of the oxide
    # networks; scorer.ion_penalties) give halides that are molecules as the metals' do (SbCl5, TeF6, TeCl4)
    metal_states = [ion.charge for ion in cation_ions
                    if ion.monatomic and (is_metal(ion.element) or ion.element in _PBLOCK_CATION_ELEMENTS)]
    if (metal_states and len(cation_ions) == 2 and len({ion.element for ion in cation_ions}) == 1
            and all(t.ion.monatomic and t.ion.element in _HALOGENS for t in anions)):
        # one metal split over two states because its mean state is no listed ion (MoCl5 read as
        # Mo(4+)/Mo(6+), ReCl5, WBr5, OsF5): the halide of the mean state, molecular from +4 as below
        # (MoCl5 and WCl5 are Mo2Cl10 and W2Cl10 dimers; Greenwood & Earnshaw, ch. 23.3; from memory)
        total = sum(t.count for t in cations)
        if sum(t.count * t.ion.charge for t in cations) / total >= 4 - _TOL:
            return "covalent_molecular"
    if metal_states and len(cation_ions) == 1 and all(t.ion.monatomic for t in anions):
        anion_elements = {t.ion.element for t in anions}
        if max(metal_states) >= 4 and anion_elements <= _HALOGENS:
            if max(metal_states) == 4 and _bridged_tetrahalide(cation_ions[0], [t.ion for t in anions]):
                return "chain_layer_solid"
            return "covalent_molecular"
        if max(metal_states) >= 7 and anion_elements == {"O"}:
            return "covalent_molecular"  # Mn2O7, OsO4, RuO4
    return "ionic_salt"


def _cyanocarbon(counts: dict[str, float]) -> bool:
    """Carbon and nitrogen with no more N than C: the molecules of the nitrile groups (cyanogen NC-CN,
    dicyanoacetylene C4N2, tetracyanoethylene C6N4; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed.,
    1997, ch. 8.6; from memory), not the carbon nitride networks richer in N (C3N4).

    >>> _cyanocarbon({"C": 2.0, "N": 2.0}), _cyanocarbon({"C": 3.0, "N": 4.0})
    (True, False)
    """
    return set(counts) == {"C", "N"} and counts["N"] <= counts["C"]


def _carbon_nitrogen_molecule(counts: dict[str, float]) -> bool:
    """Whether carbon, the only network former, with nitrogen and oxygen or with more nitrogen than the carbon
    nitride C3N4 holds, is a molecule: nitro compounds and azides without hydrogen (tetranitromethane CN4O8,
    trinitroacetonitrile C2N4O6, cyanuric triazide C3N12) are molecular liquids and solids, no refractory
    network; carbon's networks with nitrogen alone stop at C3N4 (Greenwood & Earnshaw, Chemistry of the
    Elements, 2nd ed., 1997, ch. 8.7 and 11.3; from memory).

    >>> _carbon_nitrogen_molecule({"C": 1.0, "N": 4.0, "O": 8.0}), _carbon_nitrogen_molecule({"C": 3.0, "N": 4.0})
    (True, False)
    """
    if set(counts) & _NETWORK_FORMERS != {"C"} or "N" not in counts or not set(counts) <= {"C", "N", "O"}:
        return False
    return "O" in counts or counts["N"] > 4 * counts["C"] / 3 + _TOL


def _alloy_of_one_group(symbols) -> bool:
    """Whether ``symbols`` are two or more elements of one group whose Pauling electronegativities differ by less
    than 0.5 (the van Arkel-Ketelaar threshold of a polar bond; SiGe 0.11, SiC 0.65).

    >>> _alloy_of_one_group({"Si", "Ge"}), _alloy_of_one_group({"Si", "C"})
    (True, False)
    """
    elements = [get_element(s) for s in symbols]
    chis = [e.electronegativity_pauling for e in elements]
    return (len(elements) > 1 and len({e.group for e in elements}) == 1 and all(math.isfinite(c) for c in chis)
            and max(chis) - min(chis) < 0.5)


def nonionic_decomposition(
    charge: float, counts: dict[str, float], notes: list[str], water: float, neutral: tuple[str, ...]
) -> Decomposition:
    """The decomposition of an entry read without ions: metallic, element,
    base (ammonia, hydrazine), covalent network or molecule, or unknown (a
    metal no ions balance), with formal oxidation states."""
    symbols = set(counts)
    states = formal_oxidation_states(counts, charge)
    if all(is_metal(s) for s in symbols):
        cls = "metallic"
        states = tuple((s, 0.0) for s in counts)
    elif len(symbols) == 1:
        cls = "covalent_network" if symbols <= _NETWORK_FORMERS else "element"
        states = tuple((s, 0.0) for s in counts)
    elif symbols in ({"N", "H"},) and counts["N"] in (1.0, 2.0) and counts["H"] == 2 * counts["N"] + (1 if counts["N"] == 1 else 0):
        cls = "base"
    elif symbols & _NETWORK_FORMERS and symbols <= _NETWORK_PARTNERS and not (symbols == {"C", "O"}) and not (
            symbols & _NOT_WITH_CARBON_ALONE and not symbols & {"B", "Si", "Ge"}) and not _cyanocarbon(counts) \
            and not _carbon_nitrogen_molecule(counts):
        cls = "covalent_network"
        if _alloy_of_one_group(symbols):
            # elements of one group with nearly equal electronegativities (SiGe, Si0.8Ge0.2): a solid solution of
            # the elements, no charge transfer (it read Ge -4 and Si +4); SiC keeps its formal Si +4, C -4
            states = tuple((s, 0.0) for s in counts)
    elif any(is_metal(s) for s in symbols):
        cls = "unknown"
        states = ()
        notes.append("no charge-balanced set of ions found: check the formula (counts, charges, a missing element)")
    else:
        cls = "covalent_molecular"
    return Decomposition(
        composition=tuple(counts.items()),
        hydrate_water=water,
        neutral_parts=neutral,
        oxidation_states=states,
        substance_class=cls,
        notes=tuple(notes),
    )
