"""Three composition rules that keep metallic and covalent solids out of the ionic-salt class.

The ion solver (:mod:`scorer.ions`) finds a charge-balanced reading for almost
any formula: WC as W(4+) C(4-), BiH3 as Bi(3+) 3 H(-), RuF6 as Ru(6+) 6 F(-).
A balanced reading is not a salt. These rules, applied by
:mod:`scorer.applicability`, say which compositions have no ions, each from
the chemistry of the element pair (found by an audit of registry compounds,
``tests/data/inorganic_audit.csv``, half A; half B is reported only):

* :func:`interstitial_reason`: carbides and hydrides of the
  transition metals and the f-block, and pnictides of groups 4-11, are
  metallic (interstitial or metal-rich phases: TiC, WC, ZrH2, Fe2P,
  NiAs; and hydrides and carbides of intermetallic hosts, LaNi5H6, Fe3AlC;
  Haegg, Z. Phys. Chem. B 1931, 12, 33 for the interstitial phases;
  Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 8.4
  carbides, ch. 11.3 nitrides, ch. 3.5 hydrides; from memory). Saline
  carbides and nitrides (CaC2, Al4C3, Li3N, Ca3N2) have s- or p-block metals
  and stay with the solver; so do the acetylides of group 11.
* :func:`interstitial_nitride_reason`: nitrides of the group 4-10 metals and
  the actinides with at most one N per metal atom (TiN, NbN, CrN, Mo2N, UN)
  are interstitial, metallic conductors (Haegg 1931; Greenwood & Earnshaw
  ch. 11.3.2; from memory), applied after the ion search so that their formal
  ionic reading is kept (``Decomposition.formal_ions``): the salt melting index
  of that reading is what their melting route takes (:mod:`scorer.melting`),
  and TiN and VN stay calibration rows of that index through it
  (:func:`pipelines.melting_weights.salt_rows`). Saline nitrides (Li3N,
  Ca3N2), the lanthanide nitrides and nitrogen-rich insulators (Ta3N5, Zr3N4)
  stay with the solver.
* :func:`layered_dichalcogenide_reason`: MX2 sulfides, selenides and
  tellurides of groups 4-7 (Ti, Zr, Hf, V, Nb, Ta, Mo, W, Tc, Re) and of Pd
  and Pt are layer solids: X-M-X sandwiches held by covalent M-X bonds inside
  the layer and by van der Waals contacts between layers (Wilson & Yoffe, Adv.
  Phys. 1969, 18, 193). The pyrite disulfides (FeS2, MnS2, NiS2: S2(2-) ions)
  are not of this kind. Applied after the ion search, formal reading kept,
  for the same reasons (TiS2 and WTe2 are calibration rows of the salt index).
* :func:`covalent_hydride_class`: H(-) exists only beside electropositive
  metals (Pauling electronegativity of H 2.20). With a p-block or group-12
  element, or beryllium, the E-H bond is nearly non-polar: dchi < 0.5 gives molecular
  hydrides (SnH4, BiH3, Ga2H6), 0.5 <= dchi < 0.75 polymeric ones (AlH3,
  BeH2, ZnH2: the "intermediate" hydrides, Greenwood & Earnshaw ch. 3.5;
  boundaries common practice: Pauling's ionic character is 6 % at dchi 0.5
  and 13 % at 0.75).
* :func:`high_valent_halide_reason`: one metal in formal oxidation state 6
  or more with only halide (and oxide) ligands is a molecule (RuF6, ReCl6,
  ReOCl4, MoOCl4): the ionisation energies of M(6+) are not returned by any
  halide lattice, and six or more monodentate ligands saturate the metal's
  coordination in a discrete unit. At +5 the MX5 or MOX3 unit completes its
  octahedron by bridging, into dimers (NbCl5) or chains and layers (NbOCl3,
  VOF3, UF5, melting at 600-700 K), so +5 is left to the other criteria
  (Greenwood & Earnshaw, ch. 22-25; from memory). The oxides of such metals are frameworks instead
  (:mod:`scorer.applicability`, criterion 3).
"""
from __future__ import annotations

import re

from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.substance import formal_oxidation_states

__all__ = [
    "ORGANOMETALLIC_NOTE",
    "interstitial_nitride_reason",
    "metal_rich_phase_reason",
    "layered_dichalcogenide_reason",
    "keeps_formal_salt_reading",
    "organometallic_reason",
    "HYDRIDE_MOLECULAR_MAX_DCHI",
    "HYDRIDE_POLYMERIC_MAX_DCHI",
    "HIGH_VALENT_MIN_STATE",
    "interstitial_reason",
    "covalent_hydride_class",
    "high_valent_halide_reason",
]

HYDRIDE_MOLECULAR_MAX_DCHI = 0.5
HYDRIDE_POLYMERIC_MAX_DCHI = 0.75
HIGH_VALENT_MIN_STATE = 6
_HALOGENS = frozenset({"F", "Cl", "Br", "I"})
_PNICTOGENS = frozenset({"P", "As", "Sb"})
# 5f metals whose mononitrides are metallic (ThN, UN, PuN: rock-salt conductors; from memory)
_ACTINIDE_METALS = frozenset("Th Pa U Np Pu Am".split())


def _d_group(symbol: str) -> int | None:
    element = get_element(symbol)
    return int(element.group) if element.block == "d" and element.group else None


def _hosts(partner: str, symbol: str) -> bool:
    """Whether metal ``symbol`` forms metallic (interstitial or metal-rich) phases with ``partner``."""
    element = get_element(symbol)
    group = _d_group(symbol)
    if partner in ("C", "H"):
        return element.block == "f" or (group is not None and 3 <= group <= 10)
    return group is not None and 4 <= group <= 11  # P, As, Sb


def _intermetallic_host(partner: str, counts: dict[str, float], metals: list[str]) -> bool:
    """Whether two or more metals form an interstitial host for ``partner`` together.

    Hydrides and carbides of intermetallic compounds (LaNi5H6, TiFeH, the
    perovskite carbides Fe3AlC and Mn3AlC) keep the metallic bonding of their
    host: hydrogen or carbon fills holes of a lattice whose metal atoms are
    mostly hosting metals (:func:`_hosts`), at most one partner atom per metal
    atom (Haegg's rule for interstitial phases; Greenwood & Earnshaw,
    Chemistry of the Elements, 2nd ed., 1997, ch. 3.5; from memory). More
    partner atoms than metal atoms read as a complex anion instead (Mg2NiH4 is
    2 Mg(2+) [NiH4](4-)), and a host of mostly s- or p-block metals as a
    saline or complex hydride (LiAlH4), both left to the ion solver.
    """
    if len(metals) < 2:
        return False
    total = sum(counts[m] for m in metals)
    hosting = sum(counts[m] for m in metals if _hosts(partner, m))
    return 2 * hosting >= total and counts[partner] <= total


# the metalloids that join a metal-rich lattice beside carbon (MAX phases, borocarbides)
_LATTICE_PARTNERS = frozenset({"B", "Si", "Ge"})


def interstitial_reason(counts: dict[str, float]) -> str | None:
    """Why a composition of metals with one of C, N, H, P, As, Sb is metallic; None otherwise.

    >>> interstitial_reason({"W": 1.0, "C": 1.0}) is not None
    True
    >>> interstitial_reason({"Ca": 1.0, "C": 2.0}), interstitial_reason({"Fe": 1.0, "C": 2.0, "N": 2.0})
    (None, None)
    >>> interstitial_reason({"Ti": 1.0, "N": 1.0}) is None  # left to the solver (see the module notes)
    True
    >>> interstitial_reason({"Al": 1.0, "Ni": 3.0, "H": 3.0}) is not None  # a hydride of the host Ni3Al
    True
    >>> interstitial_reason({"Mg": 2.0, "Ni": 1.0, "H": 4.0}) is None  # Mg2NiH4: 2 Mg(2+) [NiH4](4-)
    True
    """
    metals = [s for s in counts if is_metal(s)]
    partners = [s for s in counts if not is_metal(s)]
    if "C" in partners and len(partners) > 1:
        # B, Si and Ge beside carbon join the metal-rich lattice as they do alone with the metals (the MAX phase
        # Ti3SiC2, the borocarbide YNi2B2C; Barsoum, Prog. Solid State Chem. 28 (2000) 201; from memory)
        partners = [s for s in partners if s not in _LATTICE_PARTNERS]
        if set(partners) == {"C", "N"} and counts["C"] + counts["N"] <= sum(counts[m] for m in metals) + 1e-9:
            # and nitrogen beside carbon shares its holes, at most one atom per metal atom: the carbonitrides
            # TiC0.5N0.5 and Ti3CN (cermets, MXenes); a cyanide has two or more per metal (Ni(CN)2)
            partners = ["C"]
    # nitrides are read after the ion search (interstitial_nitride_reason), so that
    # their formal ionic reading stays for the melting route
    if len(partners) != 1 or not metals or partners[0] not in _PNICTOGENS | {"C", "H"}:
        return None
    partner = partners[0]
    if not all(_hosts(partner, m) for m in metals) and not _intermetallic_host(partner, counts, metals):
        return None
    kind = {"C": "carbide", "H": "hydride"}.get(partner, "pnictide")
    return (
        f"a transition-metal {kind}: {partner} sits in the holes of a metal lattice (or in a metal-rich"
        " phase) bonded metallically, not as ions (Haegg, Z. Phys. Chem. B 1931, 12, 33; Greenwood &"
        " Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 3.5, 8.4; from memory)"
    )


# Wilson & Yoffe, Adv. Phys. 1969, 18, 193: the layered MX2 of groups 4-7 and of Pd, Pt
# (NiS2 and the group 7-9 disulfides MnS2, FeS2, CoS2 are pyrites of S2(2-))
_LAYER_DICHALCOGENIDE_METALS = frozenset("Ti Zr Hf V Nb Ta Mo W Tc Re Pd Pt".split())
_CHALCOGENS = frozenset({"S", "Se", "Te"})


def interstitial_nitride_reason(counts: dict[str, float]) -> str | None:
    """Why a nitride of group 4-10 metals or actinides is metallic; None otherwise.

    At most one N per metal atom (nitrogen in the octahedral holes of a metal
    lattice: Haegg's interstitial phases); more nitrogen than metal (Ta3N5,
    Zr3N4) makes insulating nitrides, left to the ion solver, as are the
    saline nitrides of the s- and p-block and the lanthanide nitrides.

    >>> interstitial_nitride_reason({"Ti": 1.0, "N": 1.0}) is not None
    True
    >>> interstitial_nitride_reason({"Ca": 3.0, "N": 2.0}), interstitial_nitride_reason({"Ta": 3.0, "N": 5.0})
    (None, None)
    """
    metals = [s for s in counts if is_metal(s)]
    if not metals or set(counts) != {*metals, "N"} or counts["N"] > sum(counts[m] for m in metals) + 1e-9:
        return None
    if not all((_d_group(m) or 0) in range(4, 11) or get_element(m).symbol in _ACTINIDE_METALS for m in metals):
        return None
    return (
        "a transition-metal (or actinide) nitride: N sits in the octahedral holes of a metal lattice, a"
        " metallic conductor (an interstitial phase), not a salt of N(3-) (Haegg, Z. Phys. Chem. B 1931, 12,"
        " 33; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.3.2; from memory);"
        " its formal ionic reading is kept for the melting index only"
    )


def metal_rich_phase_reason(counts: dict[str, float]) -> str | None:
    """Why a composition that no ion reading balances is a metal-rich phase; None otherwise.

    Asked only after the ion solver found nothing: a nitride of the group 4-10
    metals (Fe4N, Mn4N: :func:`interstitial_nitride_reason`), or a sulfide,
    selenide or telluride of d-block metals with at least two metal atoms per
    chalcogen atom (Pd4S, Ta2S, Nb21S8), whose metal atoms bond to each other
    in clusters and chains (Franzen, Prog. Solid State Chem. 1978, 12, 53;
    from memory). Oxides and halides are left out: there a formula without a
    reading is far more often a typing slip than a suboxide (Ti3O, Cs11O3).

    >>> metal_rich_phase_reason({"Pd": 4.0, "S": 1.0}) is not None
    True
    >>> metal_rich_phase_reason({"Fe": 4.0, "O": 1.0}), metal_rich_phase_reason({"Na": 3.0, "S": 1.0})
    (None, None)
    """
    nitride = interstitial_nitride_reason(counts)
    if nitride is not None:
        return nitride.split("; its formal ionic reading")[0] + "; no ion reading balances its counts"
    pnictide = _metal_rich_pnictide_reason(counts)
    if pnictide is not None:
        return pnictide
    metals = [s for s in counts if is_metal(s)]
    chalcogens = [s for s in counts if s in _CHALCOGENS]
    if not metals or not chalcogens or len(metals) + len(chalcogens) != len(counts):
        return None
    if not all(_d_group(m) is not None for m in metals):
        return None
    if sum(counts[m] for m in metals) < 2.0 * sum(counts[x] for x in chalcogens) - 1e-9:
        return None
    return (
        "a metal-rich chalcogenide of d-block metals (at least two metal atoms per chalcogen atom, and no ion"
        " reading balances): metal-metal bonds in clusters and chains, a metallic conductor, not a salt"
        " (Franzen, Prog. Solid State Chem. 1978, 12, 53; from memory)"
    )


# the heavier pnictogens, semimetals that alloy with the metals in phases of no ionic reading
_SEMIMETAL_PNICTOGENS = frozenset({"As", "Sb", "Bi"})


def _metal_rich_pnictide_reason(counts: dict[str, float]) -> str | None:
    """Why metals beyond the s-block with As, Sb or Bi, at least one metal atom per pnictogen atom and no ion
    reading, are an intermetallic phase (Zn4Sb3, Cd4Sb3, Cu3Sb, Ag3Sb, Ni3Sb, Mn2Sb, Cu3As: metal-metal and
    metal-semimetal bonds, no ions; Pearson's Handbook of Crystallographic Data, 1991; from memory); None
    otherwise. Fewer metal atoms than pnictogen atoms without a reading (InSb2) stays a formula to check.

    >>> _metal_rich_pnictide_reason({"Zn": 4.0, "Sb": 3.0}) is not None
    True
    >>> _metal_rich_pnictide_reason({"In": 1.0, "Sb": 2.0}), _metal_rich_pnictide_reason({"Na": 4.0, "Sb": 3.0})
    (None, None)
    """
    metals = [s for s in counts if is_metal(s) and s not in _SEMIMETAL_PNICTOGENS]
    pnictogens = [s for s in counts if s in _SEMIMETAL_PNICTOGENS]
    if not metals or not pnictogens or len(metals) + len(pnictogens) != len(counts):
        return None
    if any(get_element(m).block == "s" for m in metals):
        return None
    if sum(counts[m] for m in metals) < sum(counts[p] for p in pnictogens) - 1e-9:
        return None
    return (
        f"metals with {', '.join(sorted(pnictogens))} in a ratio no ion reading balances: an intermetallic phase of"
        " a metal and a semimetal, held by metallic and covalent bonds, not a salt (Zn4Sb3, Cu3Sb, Ni3Sb; from"
        " memory)"
    )


def layered_dichalcogenide_reason(counts: dict[str, float]) -> str | None:
    """Why an MX2 chalcogenide of groups 4-7 or of Pd, Pt is a layer solid; None otherwise.

    >>> layered_dichalcogenide_reason({"Mo": 1.0, "S": 2.0}) is not None
    True
    >>> layered_dichalcogenide_reason({"Fe": 1.0, "S": 2.0}), layered_dichalcogenide_reason({"Mo": 2.0, "S": 3.0})
    (None, None)
    """
    metals = [s for s in counts if is_metal(s)]
    chalcogens = [s for s in counts if s in _CHALCOGENS]
    if len(metals) != 1 or not chalcogens or len(metals) + len(chalcogens) != len(counts):
        return None
    if metals[0] not in _LAYER_DICHALCOGENIDE_METALS:
        return None
    if abs(sum(counts[x] for x in chalcogens) - 2.0 * counts[metals[0]]) > 1e-9:
        return None
    return (
        "a layered dichalcogenide: X-M-X sandwiches of covalent M-X bonds, held to each other by van der"
        " Waals contacts (CdI2 and MoS2 types; Wilson & Yoffe, Adv. Phys. 1969, 18, 193); its formal ionic"
        " reading is kept for the melting index only"
    )


def keeps_formal_salt_reading(counts: dict[str, float]) -> bool:
    """Whether a composition is read without ions by a rule that keeps its formal salt reading
    (:func:`interstitial_nitride_reason`, :func:`layered_dichalcogenide_reason`): the salt melting
    index's calibration keeps such rows through that reading (``pipelines.melting_weights.salt_rows``)."""
    return interstitial_nitride_reason(counts) is not None or layered_dichalcogenide_reason(counts) is not None


def covalent_hydride_class(cation_element: str | None) -> tuple[str, float] | None:
    """(substance_class, dchi) of a covalent hydride of an s-, p-block or group-12 element;
    None for a saline hydride (dchi >= 0.75) or a d- or f-block metal.

    >>> covalent_hydride_class("Bi")[0], covalent_hydride_class("Be")[0], covalent_hydride_class("Na")
    ('covalent_molecular', 'covalent_network', None)
    """
    if cation_element is None:
        return None
    element = get_element(cation_element)
    if element.block == "f" or (element.block == "d" and _d_group(cation_element) != 12):
        return None  # metallic hydrides: interstitial_reason
    dchi = abs(get_element("H").electronegativity_pauling - element.electronegativity_pauling)
    if dchi < HYDRIDE_MOLECULAR_MAX_DCHI:
        return "covalent_molecular", dchi
    if dchi < HYDRIDE_POLYMERIC_MAX_DCHI:
        return "covalent_network", dchi
    return None


def high_valent_halide_reason(counts: dict[str, float]) -> str | None:
    """Why one metal in a high oxidation state with halide (and oxide) is molecular; None otherwise.

    >>> high_valent_halide_reason({"Re": 1.0, "O": 1.0, "Cl": 4.0}) is not None
    True
    >>> high_valent_halide_reason({"V": 1.0, "O": 1.0, "F": 3.0}), high_valent_halide_reason({"K": 1.0, "Re": 1.0, "O": 4.0})
    (None, None)
    >>> high_valent_halide_reason({"Mn": 1.0, "Cl": 2.0, "O": 8.0}) is None  # manganese(II) perchlorate
    True
    """
    metals = [s for s in counts if is_metal(s)]
    others = set(counts) - set(metals)
    if len(metals) != 1 or not others & _HALOGENS or not others <= _HALOGENS | {"O"}:
        return None
    states = dict(formal_oxidation_states(counts))
    if any(states.get(x) != -1 for x in others & _HALOGENS):
        # a halogen in a positive state is the centre of an oxoanion (perchlorate,
        # iodate): Mn(ClO4)2 is a salt, however high the metal would have to be
        # if every chlorine were a chloride ligand
        return None
    state = states.get(metals[0])
    if state is None or state < HIGH_VALENT_MIN_STATE:
        return None
    return (
        f"{metals[0]} in formal oxidation state +{state:g} with halide ligands: no halide lattice returns"
        f" the ionisation energies of {metals[0]}({state:g}+); a discrete molecule (MF6, MOCl4, M2Cl10;"
        " Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 22-25; from memory)"
    )



ORGANOMETALLIC_NOTE = (
    "organometallic or metal-organic: metal-carbon bonds of alkyl, aryl or arene groups (CH3Li, Zn(C2H5)2,"
    " Cr(C6H6)2), or alkoxide groups written without a library ion (Al(OC3H7)3); a molecule or molecular"
    " aggregate, not a salt of carbide ions beside H(+) (carbon bonded to hydrogen is no carbide); formal oxidation states not"
    " assigned (IUPAC Red Book 2005, IR-10; Elschenbroich, Organometallics, 3rd ed., 2006, ch. 5-6; from"
    " memory). Metal alkyls and aryls are air- and water-reactive, many pyrophoric: this is a reading of the"
    " formula, not a hazard assessment; follow the safety data sheet"
)
_CARBON_ANION_PARTNERS = _HALOGENS
# heavy p-block metals and mercury, whose alkyls and aryls keep their M-C bonds beside oxygen (R3SnOH,
# (R3Sn)2O, RHgOH; Elschenbroich, Organometallics, 3rd ed., 2006, ch. 5-6; from memory)
_ORGANO_OXO_METALS = frozenset({"Sn", "Pb", "Hg", "Ge", "Tl", "Bi", "Sb"})


def organometallic_reason(counts: dict[str, float], anion_ids, carbide_only: bool = False) -> str | None:
    """Why a formula of a metal with carbon and hydrogen is an organometallic
    molecule; None otherwise.

    ``anion_ids`` are the anions of the best ionic reading (``None`` when no
    reading balances). Carbon bonded to hydrogen is never a carbide anion, so
    a reading that needs one (C(4-), C2(2-)) beside hydrogen is no reading; and
    a metal with only carbon, hydrogen and halogens that no ions balance
    (Zn(C2H5)2, C2H5MgCl) is a metal alkyl or aryl. ``carbide_only`` says the
    walks found no reading but one with a carbide (:func:`scorer.ion_search.carbide_balances`):
    the same as a best reading that holds one.

    >>> organometallic_reason({"C": 1.0, "H": 3.0, "Li": 1.0}, ("C(4-)",)) is not None
    True
    >>> organometallic_reason({"C": 4.0, "H": 10.0, "Zn": 1.0}, None) is not None
    True
    >>> organometallic_reason({"C": 2.0, "Ca": 1.0}, ("C2(2-)",)), organometallic_reason({"C": 2.0, "H": 3.0, "Na": 1.0, "O": 2.0}, ("CH3COO(-)",))
    (None, None)
    """
    if "C" not in counts or "H" not in counts or not any(is_metal(s) for s in counts):
        return None
    if anion_ids is None and carbide_only:
        return ORGANOMETALLIC_NOTE
    if anion_ids is None:
        others = {s for s in counts if not is_metal(s)} - {"C", "H"}
        if others <= _CARBON_ANION_PARTNERS:
            return ORGANOMETALLIC_NOTE
        # organotin, organolead and organomercury oxides, hydroxides and alkoxides (bis(tributyltin) oxide
        # C24H54OSn2, cyhexatin C18H35OSn) that no ions balance: molecules of M-C and M-O bonds, not a typo
        # of a salt (for these metals; the s-block and the d-block keep the "check the formula" error)
        metals = {s for s in counts if is_metal(s)}
        if metals <= _ORGANO_OXO_METALS and others <= _CARBON_ANION_PARTNERS | {"O"}:
            return ORGANOMETALLIC_NOTE
        return None
    if any(_CARBIDE_ANION.fullmatch(ion_id) for ion_id in anion_ids):
        return ORGANOMETALLIC_NOTE
    return None


_CARBIDE_ANION = re.compile(r"C\d*\(\d*-\)")
