"""Which ions the ion terms of the salt melting index count (read through :mod:`scorer.melting`).

Rules on an ion's composition and charge, no weights: framework oxoanions
(chains and frameworks in the solid), anions that carry hydrogen (hydrogen
bonds between the anions), anions that bind through O or F (hard donors,
beside which an 18/18+2-electron cation keeps part of its ionic cohesion),
the crystal-field stabilisation of 3d cations, the s-block cations of the
saline nitrides and the linear pseudohalide anions that 18/18+2-electron
cations bind at both ends (coordination polymers).
The weights of the terms are in :data:`scorer.melting_index.TREND_WEIGHTS`.
"""
from __future__ import annotations

from ionicity.scorer.elements import get_element
from ionicity.scorer.model import Ion

__all__ = [
    "NETWORK_FORMERS",
    "is_framework_oxoanion",
    "is_hydrogen_bonded_anion",
    "is_hard_donor_anion",
    "octahedral_high_spin_cfse_delta_o",
    "is_saline_cation",
    "saline_nitride_fraction",
    "BRIDGING_PSEUDOHALIDES",
    "soft_cation_pseudohalide_fraction",
    "coinage_cation_fraction",
    "AMMONIUM_TYPE_CATIONS",
    "ammonium_polyatomic_salt",
    "ammonium_type_cation_fraction",
    "heavy_halate_fraction",
    "ROTOR_ANIONS",
    "rotor_anion_fraction",
    "coordinating_organic_anion_fraction",
    "polarising_organic_anion_fraction",
    "DECOMPOSING_ANIONS",
    "ENERGETIC_ANIONS",
    "FUEL_CATIONS",
    "OXIDISING_ANIONS",
    "MOLECULAR_OXIDISERS",
]

NETWORK_FORMERS = frozenset({"B", "Al", "Ga", "Si", "Ge", "P", "As", "Ti", "Zr", "V", "Fe"})


def is_framework_oxoanion(ion: Ion) -> bool:
    """An oxoanion of one network-forming element with at most 3 O per central atom (chains, frameworks).

    Metaborate, aluminate, metasilicate, metaphosphate, ferrite, titanate,
    zirconate: in the solid they share oxygen corners (the O:X ratio below 4
    says so), unlike the discrete SO4 2-, NO3- or ClO4- ions (common practice).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_framework_oxoanion(get_ion("AlO2(-)")), is_framework_oxoanion(get_ion("SO4(2-)"))
    (True, False)
    """
    comp = dict(ion.composition)
    others = [e for e in comp if e != "O"]
    return (len(others) == 1 and others[0] in NETWORK_FORMERS and comp.get("O", 0) > 0
            and comp["O"] / comp[others[0]] <= 3)


def is_hydrogen_bonded_anion(ion: Ion) -> bool:
    """An inorganic anion that carries hydrogen (HF2-, HSO4-, H2PO4-, OH-): it donates hydrogen bonds to its neighbours.

    Hydride (H-) and organic anions do not count (common practice).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_hydrogen_bonded_anion(get_ion("HF2(-)")), is_hydrogen_bonded_anion(get_ion("SO4(2-)"))
    (True, False)
    """
    comp = dict(ion.composition)
    return not ion.organic and ion.charge < 0 and "H" in comp and len(comp) > 1


def is_hard_donor_anion(ion: Ion) -> bool:
    """An inorganic anion that binds through oxygen or fluorine: O2-, F- or an oxo/fluoro anion (SO4 2-, BF4-).

    Beside an 18 or 18+2 electron cation (Zn2+, Sn4+, Ag+) the covalency of
    Fajans' third rule goes with soft, polarisable anions (ZnI2, SnCl4 come
    apart low) and much less with hard O and F donors (ZnO, SnO2 are
    refractory): Pearson's hard and soft acids and bases, J. Am. Chem. Soc.
    1963, 85, 3533 (from memory).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> [is_hard_donor_anion(get_ion(i)) for i in ("O(2-)", "SO4(2-)", "Cl(-)")]
    [True, True, False]
    """
    comp = dict(ion.composition)
    return not ion.organic and ion.charge < 0 and ("O" in comp or "F" in comp)


# CFSE of d^n in a weak octahedral field, in units of Delta_o: -0.4 per t2g and +0.6 per eg electron,
# high spin (t2g^3 eg^2 at d5), sign turned to a stabilisation; index n = 0..10.
_HIGH_SPIN_OCTAHEDRAL_CFSE = (0.0, 0.4, 0.8, 1.2, 0.6, 0.0, 0.4, 0.8, 1.2, 0.6, 0.0)


def octahedral_high_spin_cfse_delta_o(ion: Ion) -> float:
    """Crystal-field stabilisation energy of a 3d cation in a high-spin octahedral site, in units of Delta_o.

    ``CFSE = (0.4 n_t2g - 0.6 n_eg) Delta_o`` (sign turned: a stabilisation)
    with the d electrons filled high spin, as O2-, F- and the halides (weak
    field ligands) leave them: 0 for d0, d5 and d10, 1.2 for d3 (Cr3+) and
    d8 (Ni2+). The point-ion lattice energy of a volume-based estimate misses
    this term: the measured lattice energies of the MO and MX2 of the first
    transition series lie on a double-humped curve above the line through
    Ca2+, Mn2+ and Zn2+ (d0, d5, d10), by about the CFSE (George and McClure,
    Prog. Inorg. Chem. 1959, 1, 381; Orgel, An Introduction to
    Transition-Metal Chemistry: Ligand-Field Theory, 1960, ch. 6; from
    memory). 4d and 5d cations are left at 0: their larger splitting makes
    them low spin and their bonding covalent, so the ionic correction does
    not carry over (common practice). Monatomic cations of Sc-Zn only.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> [octahedral_high_spin_cfse_delta_o(get_ion(i)) for i in ("Ni(2+)", "Cr(3+)", "Mn(2+)", "Co(2+)", "Na(+)")]
    [1.2, 1.2, 0.0, 0.8, 0.0]
    """
    if not ion.monatomic or ion.charge <= 0 or not ion.element:
        return 0.0
    number = get_element(ion.element).atomic_number
    d_electrons = number - 18 - ion.charge
    if not 21 <= number <= 30 or not 0 <= d_electrons <= 10:
        return 0.0
    return _HIGH_SPIN_OCTAHEDRAL_CFSE[d_electrons]


def is_saline_cation(ion: Ion) -> bool:
    """A monatomic cation of the s block (groups 1 and 2): with N3- it makes a saline (ionic) nitride.

    Greenwood and Earnshaw (Chemistry of the Elements, 2nd ed. 1997, ch. 11.3.2;
    from memory) sort nitrides into saline ones (Li3N, Mg3N2, Ca3N2: ionic,
    hydrolysed by water, decomposing not far above 1,000 K), covalent ones
    and interstitial ones of the transition metals (TiN, ZrN: metallic,
    among the most refractory solids). The volume-based lattice energy of a
    point N3- ion, a free ion that exists only in the Madelung field, treats
    both alike.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_saline_cation(get_ion("Ca(2+)")), is_saline_cation(get_ion("Ti(3+)"))
    (True, False)
    """
    return bool(ion.monatomic and ion.charge > 0 and ion.element and get_element(ion.element).block == "s")


def saline_nitride_fraction(cations, anions) -> float:
    """The share of the anions that are N3- (or another monatomic anion of charge -3 or below) times the s-block share of the cations.

    ``cations``, ``anions``: the ``IonTerm`` tuples of a decomposition.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [saline_nitride_fraction(d.cations, d.anions) for d in map(decompose, map(parse_formula, ("Ca3N2", "TiN", "CaO")))]
    [1.0, 0.0, 0.0]
    """
    anion_total = sum(t.count for t in anions)
    cation_total = sum(t.count for t in cations)
    if not anion_total or not cation_total:
        return 0.0
    nitride = sum(t.count for t in anions if t.ion.monatomic and t.ion.charge <= -3) / anion_total
    return float(nitride * sum(t.count for t in cations if is_saline_cation(t.ion)) / cation_total)


# Linear ambidentate pseudohalides and azide: ligands that bind a metal at either end
# (IUPAC Red Book 2005, IR-9.2.4.2, ambidentate ligands; Greenwood & Earnshaw 1997, ch. 8.3 and 11.3; from memory)
BRIDGING_PSEUDOHALIDES = frozenset({"CN(-)", "SCN(-)", "SeCN(-)", "OCN(-)", "CNO(-)", "N3(-)"})


def soft_cation_pseudohalide_fraction(anions, pseudo_noble_gas: bool) -> float:
    """The share of the anions that are linear pseudohalides (:data:`BRIDGING_PSEUDOHALIDES`) beside an 18/18+2-electron cation.

    ``anions``: the ``IonTerm`` tuple of a decomposition; ``pseudo_noble_gas``:
    whether a cation has an 18 or 18+2 electron shell (Cu+, Ag+, Zn2+, Cd2+,
    Hg2+, Tl+, Pb2+; :mod:`scorer.fajans`). The salt index's covalency terms
    (contact electronegativity, Fajans contact index, the 18/18+2 flag) were
    fitted mostly on halides and oxosalts, where a covalent contact breaks
    the lattice into molecules, chains or layers that melt low (HgCl2,
    CdI2). A linear pseudohalide is bound by such a cation at both ends and
    links the cations into chains or frameworks instead (CuCN, AgCN: -M-C-N-M-
    chains; Zn(CN)2, Cd(CN)2: interpenetrating diamond-like frameworks;
    CuSCN: a three-dimensional net; Wells, Structural Inorganic Chemistry,
    5th ed., 1984, ch. 22; from memory), so the covalency does not lower the
    melting point as the index assumes. 0 without such a cation.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [soft_cation_pseudohalide_fraction(decompose(parse_formula(f)).anions, png)
    ...  for f, png in (("TlN3", True), ("KN3", False), ("AgCl", True))]
    [1.0, 0.0, 0.0]
    """
    anion_total = sum(t.count for t in anions)
    if not pseudo_noble_gas or not anion_total:
        return 0.0
    return float(sum(t.count for t in anions if t.ion.ion_id in BRIDGING_PSEUDOHALIDES) / anion_total)


# the group-11 metals in their +1 state: d10 cations whose salts hold more lattice energy than point ions give
COINAGE_CATIONS = frozenset({"Cu(+)", "Ag(+)", "Au(+)"})


def coinage_cation_fraction(cations) -> float:
    """The share of the cations that are Cu(+), Ag(+) or Au(+) (:data:`COINAGE_CATIONS`).

    ``cations``: the ``IonTerm`` tuple of a decomposition. The lattice energies
    of the copper(I) and silver(I) halides from the Born-Haber cycle exceed the
    point-ion (Born-Mayer, Kapustinskii) values by about 10 % (AgCl 915
    against 833 kJ/mol, AgI 889 against 778 kJ/mol; Waddington, Adv. Inorg.
    Chem. Radiochem. 1959, 1, 157; Greenwood & Earnshaw, Chemistry of the
    Elements, 2nd ed., 1997, ch. 28; from memory): a covalent share of the
    cohesion that the index's volume-based lattice energy misses, while its
    covalency terms (contact electronegativity, the 18/18+2 flag) count such
    a contact as weakening. Their salts come out too low on the calibration
    set (residuals +0.1 to +0.2 in log10: AgCl, CuCl, CuI, Ag2SO4, Ag4P2O7).

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [coinage_cation_fraction(decompose(parse_formula(f)).cations) for f in ("AgCl", "CuCl2", "KAg(CN)2")]
    [1.0, 0.0, 0.0]

    (Ag(+) bound in a complex anion, [Ag(CN)2](-), is not a cation of the lattice.)
    """
    total = sum(t.count for t in cations)
    if not total:
        return 0.0
    return float(sum(t.count for t in cations if t.ion.ion_id in COINAGE_CATIONS) / total)


# the ammonium ion; hydrazinium and hydroxylammonium are left out: their salts melt low (N2H5Cl 362 K, N2H5NO3
# 343 K, NH3OHCl 428 K; CRC Handbook via chemicals), as the index has them without the term
AMMONIUM_TYPE_CATIONS = frozenset({"NH4(+)"})


def ammonium_type_cation_fraction(cations, anions) -> float:
    """The share of the cations that are NH4(+), times the share of the anions that are inorganic.

    ``cations``, ``anions``: the ``IonTerm`` tuples of a decomposition. NH4(+)
    meets its anions through its four hydrogen atoms: N-H...O, N-H...N and
    N-H...X hydrogen bonds (ammonium nitrate, dihydrogen phosphate,
    thiocyanate: a three-dimensional hydrogen-bonded network; Greenwood &
    Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.2.6; from
    memory). The index reads that contact through hydrogen's electronegativity
    as covalency (contact electronegativity 2.8 for NH4NO3 against 2.1 for
    KNO3), which lowers it; a hydrogen bond adds cohesion instead. The
    ammonium salts of the open set come out too low (log10 residuals +0.08 on
    average on the calibration half: NH4H2PO4, NH4SCN, NH4NO3), which the
    weight corrects. Beside an organic anion (ammonium acetate) the binding of
    the cation by the anion's O donors is what
    :func:`coordinating_organic_anion_fraction` counts already, so that share
    of the anions is left out. The alkylammonium cations of protic ionic
    liquids are organic and carry their own term (``protic``).

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def share(f):
    ...     d = decompose(parse_formula(f))
    ...     return ammonium_type_cation_fraction(d.cations, d.anions)
    >>> [share(f) for f in ("NH4NO3", "KNO3", "NH4MgPO4", "[EtNH3][NO3]", "NH4CH3COO", "N2H5Cl")]
    [1.0, 0.0, 0.5, 0.0, 0.0, 0.0]
    """
    total = sum(t.count for t in cations)
    anion_total = sum(t.count for t in anions)
    if not total or not anion_total:
        return 0.0
    nh4 = sum(t.count for t in cations if t.ion.ion_id in AMMONIUM_TYPE_CATIONS) / total
    return float(nh4 * sum(t.count for t in anions if not t.ion.organic) / anion_total)


def ammonium_polyatomic_salt(cations, anions) -> bool:
    """Whether every cation is NH4(+) and no anion is monatomic (an ammonium salt that decomposes by proton transfer).

    ``cations``, ``anions``: the ``IonTerm`` tuples of a decomposition. These
    salts take :func:`scorer.melting_index.ammonium_salt_decomposition_index`;
    the halides and the sulfide keep the lattice index, and so do double salts
    (NH4MgPO4, the alums), whose metal cation holds the lattice.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def salt(f):
    ...     d = decompose(parse_formula(f))
    ...     return ammonium_polyatomic_salt(d.cations, d.anions)
    >>> [salt(f) for f in ("NH4NO3", "NH4CH3COO", "(NH4)2SO4", "NH4Cl", "NH4MgPO4", "KNO3", "[EtNH3][NO3]")]
    [True, True, True, False, False, False, False]
    """
    return (bool(cations) and bool(anions) and all(t.ion.ion_id in AMMONIUM_TYPE_CATIONS for t in cations)
            and not any(t.ion.monatomic for t in anions))


# the halate anions of the heavier halogens, X(V) with a lone pair: bromate and iodate
HEAVY_HALATES = frozenset({"BrO3(-)", "IO3(-)"})


def heavy_halate_fraction(anions) -> float:
    """The share of the anions that are bromate or iodate (:data:`HEAVY_HALATES`).

    ``anions``: the ``IonTerm`` tuple of a decomposition. The pyramidal XO3(-)
    anion of a heavy halogen in its +5 state keeps a lone pair and reaches,
    opposite its three short X-O bonds, for the oxygen atoms of neighbouring
    anions: three long X...O secondary bonds that join the anions into a
    network (the iodates' distorted octahedral IO3+3 coordination; Alcock's
    secondary bonds, N. W. Alcock, Adv. Inorg. Chem. Radiochem. 1972, 15, 1;
    Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 10; from
    memory). Strongest for iodine, weaker for bromine, absent in the
    chlorates of the small chlorine. The point-ion lattice energy counts none
    of it: the calibration iodates come out 0.14-0.19 low in log10 (KIO3,
    NaIO3, LiIO3, Ca(IO3)2, NH4IO3) and the bromates 0.05-0.11 (KBrO3,
    NaBrO3, Al(BrO3)3), the chlorates about right.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [heavy_halate_fraction(decompose(parse_formula(f)).anions) for f in ("KIO3", "Ca(BrO3)2", "KClO3")]
    [1.0, 1.0, 0.0]
    """
    total = sum(t.count for t in anions)
    if not total:
        return 0.0
    return float(sum(t.count for t in anions if t.ion.ion_id in HEAVY_HALATES) / total)


# heteronuclear diatomic anions that turn freely in the solid below the melting point (rotator phases)
ROTOR_ANIONS = frozenset({"OH(-)", "HS(-)", "CN(-)"})


def rotor_anion_fraction(cations, anions) -> float:
    """The share of the anions that are OH(-), HS(-) or CN(-) (:data:`ROTOR_ANIONS`) in a salt of s-block
    cations only (0 beside any other cation).

    ``cations``, ``anions``: the ``IonTerm`` tuples of a decomposition. These
    small diatomic anions are nearly spherical; beside the s-block cations
    they turn freely in a cubic high-temperature solid phase (NaCN and KCN
    from about 290 and 170 K, NaOH and KOH from about 570 and 520 K, NaSH),
    so much of the entropy a polyatomic anion gains at melting is gained in
    the solid, the entropy of fusion is small and the salt melts higher than
    a polyatomic anion's salt of the same lattice energy (Timmermans, J.
    Phys. Chem. Solids 1961, 18, 1; Parsonage & Staveley, Disorder in
    Crystals, 1978, ch. 7; from memory). Beside Zn(2+), Cd(2+), Cu(+) or
    Ag(+) cyanide bridges the cations instead
    (:func:`soft_cation_pseudohalide_fraction`), and transition-metal
    hydroxides give off water before they melt, so only salts whose every
    cation is a lone s-block cation count.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def share(f):
    ...     d = decompose(parse_formula(f))
    ...     return rotor_anion_fraction(d.cations, d.anions)
    >>> [share(f) for f in ("NaOH", "KCN", "Ba(OH)2", "Zn(CN)2", "NaNO3", "K2Cd(CN)4")]
    [1.0, 1.0, 1.0, 0.0, 0.0, 0.0]
    """
    total = sum(t.count for t in anions)
    if not total or not cations or not all(is_saline_cation(t.ion) for t in cations):
        return 0.0
    return float(sum(t.count for t in anions if t.ion.ion_id in ROTOR_ANIONS) / total)


def coordinating_organic_anion_fraction(cations, anions) -> float:
    """The share of the anions that are organic when every cation is inorganic (metal carboxylates,
    alkoxides, phenoxides, sulfonates: NaOAc, Zn(OAc)2, LiOMe, Ag[OTs]); 0 beside any organic cation.

    ``cations``, ``anions``: the ``IonTerm`` tuples of a decomposition. The volume-based lattice energy
    spreads an organic anion's charge over its whole volume, but a carboxylate, alkoxide or sulfonate
    carries it on its oxygen donors, which bind the metal cations at short range, chelating and bridging
    them into chains and layers (the acetates of Cu, Zn and Pb are coordination polymers; Greenwood &
    Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 8.7 and 28; Wells, Structural Inorganic
    Chemistry, 5th ed., 1984; from memory): a cohesion the point-ion model of the whole anion misses.
    Beside organic cations (ionic liquids) the same anions bind nothing so strongly and the organic
    terms fitted on those salts apply alone. The calibration half of such salts in the open set comes
    out about 0.13 low in log10 without it (pipelines.melting_weights.fit_organic_anion_weights, which fits it with
    :func:`polarising_organic_anion_fraction`'s weight).

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def share(f):
    ...     d = decompose(parse_formula(f))
    ...     return coordinating_organic_anion_fraction(d.cations, d.anions)
    >>> [share(f) for f in ("Zn(CH3COO)2", "NaCl", "[C4mim][CH3COO]")]
    [1.0, 0.0, 0.0]
    """
    total = sum(t.count for t in anions)
    if not total or any(t.ion.organic for t in cations):
        return 0.0
    return float(sum(t.count for t in anions if t.ion.organic) / total)


def polarising_organic_anion_fraction(cations, anions) -> float:
    """:func:`coordinating_organic_anion_fraction` times the share of the cations that are monatomic d-, p- or
    f-block metals (by count): the organic anions bound to polarising cations.

    A carboxylate, alkoxide or sulfonate bridges a polarising cation (Cu, Zn, Pb, Sn, Hg, Ag, Bi) through covalent
    M-O bonds into the chains and layers of a coordination polymer, while beside the s-block cations it makes
    ionic layers (soaps) that hold less (Fajans' rules; Greenwood & Earnshaw, Chemistry of the Elements, 2nd
    ed., 1997, ch. 8.7; from memory). With one weight for both, the open set's calibration half of such salts
    came out 0.065 low in log10 beside d- and p-block cations and 0.077 high beside the s-block ones
    (pipelines.melting_weights.fit_organic_anion_weights).

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> def share(f):
    ...     d = decompose(parse_formula(f))
    ...     return polarising_organic_anion_fraction(d.cations, d.anions)
    >>> [share(f) for f in ("Zn(CH3COO)2", "NaCH3COO", "KZn(CH3COO)3", "[C4mim][CH3COO]")]
    [1.0, 0.0, 0.5, 0.0]
    """
    organic = coordinating_organic_anion_fraction(cations, anions)
    total = sum(t.count for t in cations)
    if not organic or not total:
        return 0.0
    polarising = sum(t.count for t in cations
                     if t.ion.monatomic and get_element(t.ion.element).block in ("d", "p", "f"))
    return float(organic * polarising / total)


# anions that give off a gas or disproportionate on heating, below or at the salt's melting point: the
# melting trend of their salts carries a note and a caution (scorer.melting.melting_terms); a second-stage
# weight for them was tried and not kept (datasets/melting/README.md)
# (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997: peroxides and superoxides lose O2,
# ch. 14.2; hydrogencarbonates lose CO2 and water, ch. 8.6; hydrogensulfites, disulfites and dithionites
# lose SO2, ch. 15.2; hypochlorites, chlorites and bromites disproportionate, ch. 17.2; from memory)
# the peroxosulfates lose O2 too, from about 100 C (K2S2O8, potassium peroxymonosulfate; ch. 15.2.7, from memory)
DECOMPOSING_ANIONS = frozenset({
    "O2(2-)", "O2(-)", "O3(-)", "HO2(-)", "ClO(-)", "ClO2(-)", "BrO2(-)", "HCO3(-)", "HSO3(-)", "S2O4(2-)",
    "S2O5(2-)", "S2O8(2-)", "SO5(2-)", "HSO5(-)",
})

# anions whose salts decompose violently on heating, shock or friction: azides lose N2 (sodium azide near
# 548 K; lead, silver, copper and mercury azides detonate) and fulminates detonate (mercury and silver
# fulminate are primary explosives), as do dinitramides (ammonium dinitramide is a rocket oxidiser)
# (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.3.4 and 8.5; from memory): the melting trend of their salts carries a note and the caution,
# never a weight
ENERGETIC_ANIONS = frozenset({"N3(-)", "CNO(-)", "N(NO2)2(-)"})

# molecules and elements that are strong oxidisers, by Hill formula (Bretherick's Handbook of Reactive Chemical
# Hazards, 7th ed., 2007; Greenwood & Earnshaw, 2nd ed., 1997; from memory): the salts of oxidising anions carry
# their own note (OXIDISING_ANIONS); trichloroisocyanuric acid is the pool chlorine that gives NCl3 with ammonium
# compounds and burns with hypochlorite
MOLECULAR_OXIDISERS = frozenset({
    "H2O2", "O3", "F2", "Cl2", "ClO2", "Cl2O", "Cl2O7", "OF2", "NO2", "N2O4", "ClF3", "ClF5", "BrF3", "BrF5", "IF5",
    "IF7", "XeF2", "XeF4", "XeF6", "XeO3", "OsO4", "RuO4", "Mn2O7", "CrO2Cl2", "C3Cl3N3O3",
})

# fuel and oxidiser in one salt: an ammonium-like cation (NH4+, hydrazinium, hydroxylammonium) beside an
# oxidising anion decomposes exothermically on heating and can deflagrate or explode (ammonium nitrate,
# perchlorate, chlorate, nitrite, permanganate, dichromate; Greenwood & Earnshaw, Chemistry of the Elements,
# 2nd ed., 1997, ch. 11.3.7 and 17.2.5; Bretherick's Handbook of Reactive Chemical Hazards; from memory): a
# note and the caution on the melting trend, never a weight
OXIDISING_ANIONS = frozenset({
    "NO3(-)", "NO2(-)", "ClO4(-)", "ClO3(-)", "ClO2(-)", "BrO2(-)", "BrO3(-)", "IO4(-)", "MnO4(-)", "Cr2O7(2-)",
    "CrO4(2-)",
    "N(NO2)2(-)",
    # hypochlorite and hypobromite (bleach, calcium hypochlorite), and dichloroisocyanurate (pool chlorine; the
    # anion built by rule from its sodium salt, scorer.organic_anions): active-chlorine oxidisers (common practice)
    "ClO(-)", "BrO(-)", "C3Cl2N3O3(-)",
    # the peroxosulfates (ammonium persulfate is sold as an oxidiser and decomposes exothermically; ch. 15.2.7)
    "S2O8(2-)", "SO5(2-)", "HSO5(-)",
})
FUEL_CATIONS = frozenset({"NH4(+)", "N2H5(+)", "N2H6(2+)", "NH3OH(+)"})

