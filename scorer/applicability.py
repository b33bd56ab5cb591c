"""Does the ionic model apply? One decision per compound, with its reasons.

Every value of :mod:`scorer.lattice` (structure type, Born-Lande, Born-Mayer,
Kapustinskii, volume-based lattice energies) treats the compound as point
ions. That is a good description of NaCl and MgO, a usable one of AgI, CuCl
and ZnS, and a wrong one of AlCl3 (a molecular dimer), CrO3 (chains), GaAs (a
covalent semiconductor) or NaTl (a Zintl phase). :func:`settle` decides,
after the ion solver (:mod:`scorer.ions`) has found a reading, which of three
it is:

``applies``
    the ionic model is a fair description; ionic values are given.
``strained``
    the bonding is polar but partly covalent; ionic values are still useful
    and are given, with a value note saying so (AgI, CuCl, ZnS, CdI2).
``not_applicable``
    the compound is molecular, a chain or layer solid, a covalent
    semiconductor, an intermetallic or a Zintl phase; the ionic-only values
    stay empty with a value note saying why.

The criteria, in the order they are tried (the first that decides wins):

1. **Known structural families** (``scorer/data/structural_families.csv``,
   a source per row): molecular halides (Al2Cl6, Ga2Cl6, HgCl2, BiCl3...),
   oxyhalides, chain and layer solids (CrO3, BeCl2, ZnCl2, CdI2), MgB2.
2. **Phillips ionicity** of tetrahedral AB octet compounds
   (``scorer/data/phillips_ionicity.csv``; J. C. Phillips, Rev. Mod. Phys.
   1970, 42, 317): at f_i >= 0.785 (Phillips' critical ionicity) the compound
   takes six-fold coordination and the ionic model applies; below it the
   compound is tetrahedral and covalent. Group IV, III-V and II-VI
   non-oxides are ``semiconductor``; the ionic values are ``strained`` for
   f_i >= 0.6 (II-VI, I-VII: common practice, the point where Phillips'
   cohesive energies of the tetrahedral compounds turn from bond-like to
   ion-like) and ``not_applicable`` below (III-V, group IV).
3. **Oxidation state against electronegativity**: a bare cation of charge
   5 or more with oxide only (CrO3, MoO3, V2O5) would need ionisation
   energies no lattice pays back: a chain or layer solid, model not
   applicable; a bare cation of charge 4 is ``strained`` (TiO2, SnO2;
   common practice, Greenwood & Earnshaw, Chemistry of the Elements, 2nd
   ed., 1997, ch. 21).
4. **van Arkel-Ketelaar triangle** at the cation-anion contact
   (:func:`scorer.character.van_arkel_ketelaar_bond_type`, Pauling scale;
   region boundaries as documented there: Pauling's 1.7 line, the rest common
   practice) together with **Fajans' rules**
   (:func:`scorer.fajans.covalency_risk_level`): the ionic region applies;
   the polar-covalent region applies unless the Fajans covalency risk is high
   (then strained); the metallic-ionic region is a Zintl phase.

Ions are dropped from the reading (the oxidation states stay) where the model
does not apply and the compound is molecular, a chain or layer solid, a
semiconductor or an intermetallic; Zintl phases keep their formal ions (NaTl
is Na(+) Tl(-)).

Before criterion 2, :mod:`scorer.bond_class_rules` takes out two kinds of
balanced readings that are not salts: a single metal in formal oxidation
state 6 or more with halide (and oxide) ligands is molecular (RuF6, ReOCl4),
and the hydride of a p-block or group-12 element is molecular or polymeric
(BiH3, AlH3).

Two further decisions live here because they are about which ions can exist,
not how they are found:

* :func:`metal_rich_reading`: metals with each other or with B, Si, Ge
  (borides, silicides, germanides, alloys). The Zintl-Klemm concept (Zintl,
  Angew. Chem. 1939, 52, 1; Nesper, Angew. Chem. Int. Ed. 1991, 30, 789)
  applies where s-block metals give their valence electrons to one p-block
  element or to gold (NaTl, KGe, Mg2Si, CsAu: Jansen, Chem. Soc. Rev. 2008,
  37, 1826); anything else is an intermetallic without ions. Carbides
  and hydrides of the transition metals and the f block, and
  pnictides of groups 4-11, are read the same way (interstitial and
  metal-rich phases: WC, TiN, ZrH2, Fe2P; :mod:`scorer.bond_class_rules`).
* :func:`redox_conflicts`: a cation that oxidises its anion (Tl(3+) with
  I(-), Fe(3+) with I(-), Cu(2+) with I(-)) from standard reduction
  potentials (``scorer/data/redox_potentials.csv``); the solver then looks
  for a compatible reading (TlI3 = Tl(+) I3(-)) and otherwise warns.
"""
from __future__ import annotations

import math

from ionicity.scorer import character, fajans
from ionicity.scorer.bond_class_rules import (
    covalent_hydride_class, high_valent_halide_reason, interstitial_nitride_reason, interstitial_reason,
    layered_dichalcogenide_reason,
)
from ionicity.scorer.caching import once
from ionicity.scorer.descriptor import protocol, result_class
from ionicity.scorer.elements import get_element, is_metal, metal_symbols
from ionicity.scorer.grammar import hill_text_key, reduced_key  # one composition key, shared with the molecular route
from ionicity.scorer.ion_library import monatomic_ion
from ionicity.scorer.model import Column, Decomposition, IonTerm
from ionicity.scorer.substance import formal_oxidation_states, listed_states
from ionicity.scorer.tables import table

__all__ = [
    "COLUMNS", "GROUP", "IONIC_MODELS", "PHILLIPS_CRITICAL_IONICITY", "STRAINED_MIN_IONICITY",
    "REDOX_MARGIN_V", "analyse", "describe", "explain", "settle", "metal_rich_reading",
    "redox_conflicts", "structural_family", "phillips_ionicity", "reduced_key", "family_decided", "AMBIGUOUS_READINGS_NOTE",
]

GROUP = "character"
IONIC_MODELS = ("applies", "strained", "not_applicable")
# Phillips, Rev. Mod. Phys. 1970, 42, 317: four-fold below, six-fold above
PHILLIPS_CRITICAL_IONICITY = 0.785
# common practice: II-VI and I-VII tetrahedral compounds keep useful ionic values
STRAINED_MIN_IONICITY = 0.6
# a cation must out-oxidise its anion by this much to count as incompatible:
# aqueous standard potentials carry over to solids only roughly (our choice)
REDOX_MARGIN_V = 0.2
# classes whose formal ions are dropped where the model does not apply
_IONLESS_CLASSES = frozenset({
    "covalent_molecular", "chain_layer_solid", "covalent_network", "semiconductor", "intermetallic",
})
# elements that combine with metals into borides, silicides, germanides
# read without anions (Fe2B, FeSi, MoSi2) or as Zintl phases (KGe, Mg2Si)
METAL_RICH_PARTNERS = frozenset({"B", "Si", "Ge"})
_ZINTL_ANION_BLOCK = "p"
_SOURCE_CRITERIA = (
    "structural families (scorer/data/structural_families.csv); Phillips, Rev. Mod. Phys. 1970, 42, 317;"
    " van Arkel 1941 / Ketelaar 1947 triangle; Fajans 1923; Zintl 1939"
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "ionic_model", "string", "",
        "does the ionic (point-charge) model apply: applies; strained (polar, partly covalent: ionic values"
        " given with a note); not_applicable (molecular, chain or layer solid, covalent semiconductor,"
        " intermetallic, Zintl phase: ionic-only values left empty)",
        "scorer.applicability.settle: known structural families, Phillips ionicity (critical 0.785),"
        " oxidation state, van Arkel-Ketelaar triangle with Fajans' rules",
        _SOURCE_CRITERIA,
    ),
)


# --- tables -----------------------------------------------------------------------


@once
def _families() -> dict:
    return {hill_text_key(r["formula"]): r for r in table("structural_families.csv")}


@once
def _phillips() -> dict:
    return {hill_text_key(r["formula"]): (float(r["ionicity_fi"]), r["source"]) for r in table("phillips_ionicity.csv")}


def _solid_solution_ionicity(dec: Decomposition) -> tuple[float, str]:
    """Phillips ionicity of a solid solution of listed binaries on one site (In0.5Ga0.5N, GaAs0.5P0.5, Hg0.5Cd0.5Te):
    the mean of its end members' f_i, weighted by their shares of the mixed site (a Vegard-type interpolation,
    common practice); NaN when a member is not listed or the reading is not such a solution."""
    cations = [(t.ion.element, t.ion.charge, t.count) for t in dec.cations if t.ion.monatomic]
    anions = [(t.ion.element, -t.ion.charge, t.count) for t in dec.anions if t.ion.monatomic]
    if len(cations) != len(dec.cations) or len(anions) != len(dec.anions) or not cations or not anions:
        return math.nan, ""
    if len(cations) > 1 and len(anions) == 1:
        pairs = [(c, anions[0], c[2]) for c in cations]
    elif len(anions) > 1 and len(cations) == 1:
        pairs = [(cations[0], a, a[2]) for a in anions]
    else:
        return math.nan, ""
    total, weighted = 0.0, 0.0
    for (cation, z, _), (anion, q, _), share in pairs:
        g = math.gcd(int(z), int(q)) or 1
        f_i, _ = _phillips().get(reduced_key({cation: q / g, anion: z / g}), (math.nan, ""))
        if math.isnan(f_i):
            return math.nan, ""
        total += share
        weighted += share * f_i
    return weighted / total, ("mean of the end members' Phillips ionicities, weighted by their shares of the mixed"
                              " site (Vegard-type interpolation, common practice; Phillips, Rev. Mod. Phys. 42"
                              " (1970) 317)")


@once
def _redox() -> tuple[dict, dict]:
    oxidants: dict = {}
    reductants: dict = {}
    for r in table("redox_potentials.csv"):
        if r["role"] == "oxidant":
            oxidants.setdefault(r["ion_id"], {})[r["partner_anion_id"]] = (float(r["E0_V"]), r["couple"])
        else:
            reductants[r["ion_id"]] = (float(r["E0_V"]), r["couple"])
    return oxidants, reductants


def structural_family(counts) -> dict | None:
    """The row of ``structural_families.csv`` for a composition, or None.

    >>> structural_family({"Al": 2, "Cl": 6})["substance_class"]
    'covalent_molecular'
    """
    return _families().get(reduced_key(counts))


def phillips_ionicity(counts) -> float:
    """Phillips' spectroscopic ionicity f_i of an AB compound, NaN where the
    table (Phillips, Rev. Mod. Phys. 1970, 42, 317) has none.

    >>> phillips_ionicity({"Ga": 1, "As": 1}), phillips_ionicity({"Na": 1, "Cl": 1})
    (0.31, 0.935)
    """
    return _phillips().get(reduced_key(counts), (math.nan, ""))[0]


# --- redox ------------------------------------------------------------------------


def redox_conflicts(cations, anions) -> tuple[str, ...]:
    """Cation-anion pairs that cannot coexist: the cation's reduction potential
    exceeds the anion's oxidation potential by more than :data:`REDOX_MARGIN_V`.

    Applied to halide anions only: solid chalcogenides (CuS, SnS2, Fe2S3) are
    held together by covalency that aqueous potentials do not describe.

    Returns one text per conflicting pair, empty when every pair is compatible.

    >>> from ionicity.scorer.ion_library import monatomic_ion
    >>> tl, i = monatomic_ion("Tl", 3), monatomic_ion("I", -1)
    >>> redox_conflicts((IonTerm(tl, 1),), (IonTerm(i, 3),))[0][:42]
    'Tl(3+) oxidises I(-): E0(Tl3+/Tl+) = 1.252'
    """
    oxidants, reductants = _redox()
    out = []
    for c in cations:
        couples = oxidants.get(c.ion.ion_id)
        if not couples:
            continue
        # a reducing cation beside an oxidising one (Ti(3+) with Fe(3+): ilmenite
        # FeTiO3 is Fe(2+) Ti(4+)) cannot coexist either
        for other in cations:
            if other.ion.ion_id in reductants and other.ion.element != c.ion.element:
                e_other, other_couple = reductants[other.ion.ion_id]
                e_cation, cation_couple = couples.get("") or (math.nan, "")
                if e_cation - e_other > REDOX_MARGIN_V:
                    out.append(
                        f"{c.ion.ion_id} oxidises {other.ion.ion_id}: E0({cation_couple}) = {e_cation:g} V exceeds"
                        f" E0({other_couple}) = {e_other:g} V by more than {REDOX_MARGIN_V:g} V"
                        " (standard potentials, scorer/data/redox_potentials.csv)"
                    )
        for a in anions:
            if a.ion.ion_id not in reductants:
                continue
            e_anion, anion_couple = reductants[a.ion.ion_id]
            e_cation, cation_couple = couples.get(a.ion.ion_id) or couples.get("") or (math.nan, "")
            if e_cation - e_anion > REDOX_MARGIN_V:
                out.append(
                    f"{c.ion.ion_id} oxidises {a.ion.ion_id}: E0({cation_couple}) = {e_cation:g} V exceeds"
                    f" E0({anion_couple}) = {e_anion:g} V by more than {REDOX_MARGIN_V:g} V"
                    " (standard potentials, scorer/data/redox_potentials.csv)"
                )
    return tuple(out)


# --- metals with metals, borides, silicides ----------------------------------------


def _group_valence(symbol: str) -> int | None:
    element = get_element(symbol)
    if element.block == "s" and symbol not in ("H", "He"):
        return int(element.group)
    return None


# pnictogens whose s-block compounds below the -3 of the salts hold chains and pairs (Zintl-Klemm)
_ZINTL_PNICTOGENS = frozenset({"P", "As", "Sb", "Bi"})


def _pnictide_donor_valence(symbol: str) -> int | None:
    """The electrons a metal gives a pnictogen polyanion: the s-block metals their group's, zinc, cadmium and
    mercury their two (ZnP2 and CdAs2 hold P(-) and As(-) chains, ZnSb and CdSb Sb2(4-) pairs, semiconductors
    of the Zintl-Klemm kind; Greenwood & Earnshaw, 2nd ed., 1997, ch. 12.3.4; from memory)."""
    return 2 if symbol in ("Zn", "Cd", "Hg") else _group_valence(symbol)


def _pnictogen_polyanion_charge(counts: dict[str, float]) -> int | None:
    """The charge per atom (-1 or -2) of a pnictogen that takes all the valence electrons of the s-block metals
    beside it, when that is below the -3 of a salt: NaSb and LiAs hold chains of Sb(-) and As(-) (each atom
    with two bonds to its own kind, isoelectronic with Te and Se), CaP and SrAs dumbbells of P(2-), As(2-)
    (8-N rule; Zintl 1939; Schaefer, Eisenmann & Mueller, Angew. Chem. Int. Ed. 1973, 12, 694; from memory).
    None otherwise (K3Sb, Mg3Sb2 are read by the ion solver as salts of Sb(3-)).

    >>> _pnictogen_polyanion_charge({"Na": 1.0, "Sb": 1.0}), _pnictogen_polyanion_charge({"K": 3.0, "Sb": 1.0})
    (-1, None)
    """
    acceptors = [s for s in counts if _pnictide_donor_valence(s) is None]
    if len(acceptors) != 1 or acceptors[0] not in _ZINTL_PNICTOGENS or len(counts) < 2:
        return None
    b = acceptors[0]
    electrons = sum(_pnictide_donor_valence(s) * n for s, n in counts.items() if s != b)
    charge = -electrons / counts[b]
    q = round(charge)
    return q if abs(charge - q) < 1e-9 and q in (-1, -2) else None


def metal_rich_reading(counts: dict[str, float], water: float = 0.0, neutral: tuple = ()) -> Decomposition | None:
    """The reading of metals with each other or with B, Si, Ge; None for
    other compositions (which the ion solver reads).

    * A structural family of the table decides first (MgB2 is a metal).
    * Zintl phase: s-block metals and one p-block element (or gold) that
      takes all their valence electrons as an integer charge between -1 and
      -4 (-1 for gold): NaTl = Na(+) Tl(-), KGe = K(+) Ge(-), Mg2Si =
      2 Mg(2+) Si(4-), CsAu = Cs(+) Au(-).
    * Otherwise, with two or more elements in whole-number ratio, an
      intermetallic (Cu3Au, Fe2B, FeSi); non-integer counts are a metallic
      solid solution. Neither has ions; oxidation states are 0.

    >>> d = metal_rich_reading({"Na": 1.0, "Tl": 1.0})
    >>> d.substance_class, [t.ion.ion_id for t in d.cations + d.anions]
    ('zintl_phase', ['Na(+)', 'Tl(-)'])
    >>> metal_rich_reading({"Fe": 2.0, "B": 1.0}).substance_class
    'intermetallic'
    """
    symbols = set(counts)
    if len(symbols) < 2 or not any(is_metal(s) for s in symbols):
        return None
    interstitial = interstitial_reason(counts)
    if interstitial is None and not all(is_metal(s) or s in METAL_RICH_PARTNERS for s in symbols) and \
            _pnictogen_polyanion_charge(counts) is None:
        return None
    base = dict(composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral)
    family = structural_family(counts)
    if family is not None:
        return Decomposition(
            **base, oxidation_states=tuple((s, 0.0) for s in counts), substance_class=family["substance_class"],
            ionic_model=family["ionic_model"],
            ionic_model_reasons=(f"known structure: {family['structure']} ({family['source']})",),
        )
    pnictide = interstitial is None and _pnictogen_polyanion_charge(counts) is not None
    donors = {s: (_pnictide_donor_valence(s) if pnictide else _group_valence(s)) for s in symbols}
    acceptors = [s for s, v in donors.items() if v is None]
    if interstitial is None and len(acceptors) == 1 and len(symbols) >= 2:
        b = acceptors[0]
        element = get_element(b)
        electrons = sum(donors[s] * counts[s] for s in symbols if s != b)
        charge = -electrons / counts[b]
        fits = abs(charge - round(charge)) < 1e-9 and (
            (b == "Au" and round(charge) == -1) or (element.block == _ZINTL_ANION_BLOCK and -4 <= round(charge) <= -1)
        )
        if fits:
            q = int(round(charge))
            cations = tuple(IonTerm(monatomic_ion(s, donors[s]), counts[s]) for s in counts if s != b)
            anions = (IonTerm(monatomic_ion(b, q), counts[b]),)
            return Decomposition(
                **base, cations=cations, anions=anions,
                oxidation_states=tuple((s, float(donors[s]) if s != b else float(q)) for s in counts),
                substance_class="zintl_phase", ionic_model="not_applicable",
                ionic_model_reasons=(
                    f"Zintl-Klemm: the s-block metals give their valence electrons to {b}, which takes"
                    f" {-q} per atom ({b}({-q if q < -1 else ''}-) is isoelectronic with group"
                    f" {element.group - q if element.group and element.group <= 18 else '?'} elements and bonds"
                    " covalently to its own kind); a polar intermetallic, not a point-ion crystal"
                    " (Zintl 1939; Nesper, Angew. Chem. Int. Ed. 1991, 30, 789; Jansen, Chem. Soc. Rev. 2008, 37, 1826"
                    " for aurides)",
                ),
            )
    whole = all(abs(n - round(n)) < 1e-9 for n in counts.values())
    cls = "intermetallic" if whole else "metallic"
    reason = interstitial or (
        "metals (with B, Si or Ge) in whole-number ratio and no Zintl reading: an intermetallic compound"
        " held by metallic bonding, without ions"
        if whole else "metals in non-integer ratio: a metallic solid solution, without ions"
    )
    return Decomposition(
        **base, oxidation_states=tuple((s, 0.0) for s in counts), substance_class=cls,
        ionic_model="not_applicable", ionic_model_reasons=(reason,),
    )


# --- the decision -----------------------------------------------------------------


def _counts(dec: Decomposition) -> dict[str, float]:
    return dict(dec.composition)


def _bare_cation_charge(dec: Decomposition) -> int:
    return max((t.ion.charge for t in dec.cations if t.ion.monatomic), default=0)


_FAMILY_REASON = "known structure: "


# the note of a formula that reads as several sets of ions equally well (its start; scorer.ions adds the readings)
AMBIGUOUS_READINGS_NOTE = "ambiguous: equally plausible readings "


def family_decided(dec: Decomposition) -> bool:
    """Whether the structural-family table made ``dec`` molecular or a chain or
    layer solid (whose hydrates are salts of the aqua ion instead)."""
    return dec.substance_class in ("covalent_molecular", "chain_layer_solid") and any(
        r.startswith(_FAMILY_REASON) for r in dec.ionic_model_reasons
    )


def _assess_salt(dec: Decomposition, hydrated: bool = False) -> tuple[str, str, list[str]]:
    """(substance_class, ionic_model, reasons) of an ionic-salt reading."""
    family = structural_family(_counts(dec))
    if family is None:
        return _criteria(dec)
    if not hydrated:
        return family["substance_class"], family["ionic_model"], [
            f"{_FAMILY_REASON}{family['structure']} ({family['source']})"
        ]
    cls, model, reasons = _criteria(dec)
    return cls, model, [
        f"a hydrate: the anhydrous solid is {family['substance_class'].replace('_', ' ')} ({family['structure']});"
        " its hydrates are salts of the aqua ion, such as [Al(H2O)6]Cl3 (Greenwood & Earnshaw, 2nd ed., 1997;"
        " from memory)",
        *reasons,
    ]


# the cations of the adamantine (diamond-like) compounds, with their valence electrons: d10 and sp elements in
# their group oxidation state (Pamplin, J. Phys. Chem. Solids 1964, 25, 675; Goryunova, The Chemistry of
# Diamond-like Semiconductors, 1965; from memory)
_ADAMANTINE_CATIONS = {("Cu", 1): 1, ("Ag", 1): 1, ("Zn", 2): 2, ("Cd", 2): 2, ("Hg", 2): 2, ("Al", 3): 3,
                       ("Ga", 3): 3, ("In", 3): 3, ("Si", 4): 4, ("Ge", 4): 4, ("Sn", 4): 4, ("P", 5): 5,
                       ("As", 5): 5, ("Sb", 5): 5}
_ADAMANTINE_ANIONS = {("N", -3): 5, ("P", -3): 5, ("As", -3): 5, ("Sb", -3): 5, ("S", -2): 6, ("Se", -2): 6,
                      ("Te", -2): 6}


def adamantine_reason(dec: Decomposition) -> str | None:
    """Why a compound of three or more elements is a tetrahedral (diamond-like) semiconductor; None otherwise.

    The Grimm-Sommerfeld rule as Pamplin extended it to multinary compounds: d10 or sp cations in their group
    oxidation state (Cu+, Ag+, Zn2+, Cd2+, Hg2+, Al3+, Ga3+, In3+, Si4+, Ge4+, Sn4+; P5+, As5+, Sb5+ of the
    enargite family, Cu3AsS4), pnictide or chalcogenide
    anions (not oxide), and four valence electrons per atom on average: every atom tetrahedral, sp3 bonds, as
    in the chalcopyrites CuInSe2 and ZnGeP2 and the kesterite Cu2ZnSnS4 (Pamplin 1964; Goryunova 1965; from
    memory). The binaries are the Phillips table's.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [decompose(parse_formula(f)).substance_class for f in ("CuInSe2", "Cu2ZnSnS4", "CuFeS2", "Ag2S")]
    ['semiconductor', 'semiconductor', 'ionic_salt', 'ionic_salt']
    """
    # by element and oxidation state, whichever ions hold them (Cu2ZnSnS4 reads with the thiostannate SnS4(4-))
    states = dict(dec.oxidation_states)
    counts = [(s, n) for s, n in dec.composition if n > 0]
    if len(counts) < 3 or set(states) != {s for s, _ in counts}:
        return None
    electrons = atoms = 0.0
    for symbol, n in counts:
        state = states[symbol]
        key = (symbol, int(state)) if float(state).is_integer() else None
        valence = _ADAMANTINE_CATIONS.get(key) if state > 0 else _ADAMANTINE_ANIONS.get(key)
        if valence is None:
            return None
        electrons += valence * n
        atoms += n
    if abs(electrons / atoms - 4.0) > 1e-9:
        return None
    return ("an adamantine compound: d10 and sp cations in their group states, pnictide or chalcogenide anions and"
            " four valence electrons per atom (the Grimm-Sommerfeld rule as Pamplin extended it, J. Phys. Chem."
            " Solids 1964, 25, 675; from memory): tetrahedral sp3 bonds, a semiconductor like CuInSe2 and"
            " Cu2ZnSnS4, not a point-ion crystal")


def _criteria(dec: Decomposition) -> tuple[str, str, list[str]]:
    """The general criteria of an ionic-salt reading, after the family table."""
    counts = _counts(dec)
    adamantine = adamantine_reason(dec)
    if adamantine is not None:
        # (before the solid-solution ionicity, which calls any compound of a group-11 cation a salt)
        return "semiconductor", "not_applicable", [adamantine]
    f_i, source = _phillips().get(reduced_key(counts), (math.nan, ""))
    if math.isnan(f_i):
        f_i, source = _solid_solution_ionicity(dec)
    if not math.isnan(f_i):
        if f_i >= PHILLIPS_CRITICAL_IONICITY:
            return "ionic_salt", "applies", [
                f"Phillips ionicity f_i = {f_i:g} >= {PHILLIPS_CRITICAL_IONICITY} (critical): six-fold"
                f" coordination, ionic ({source})"
            ]
        anion = dec.anions[0].ion.element if len(dec.anions) == 1 else None
        group_i_vii = any(get_element(t.ion.element).group == 11 for t in dec.cations if t.ion.element)
        cls = "ionic_salt" if group_i_vii or anion == "O" else "semiconductor"
        model = "strained" if f_i >= STRAINED_MIN_IONICITY else "not_applicable"
        return cls, model, [
            f"Phillips ionicity f_i = {f_i:g} < {PHILLIPS_CRITICAL_IONICITY} (critical): tetrahedral, covalent"
            f" sp3 bonds ({source}); ionic values {'strained' if model == 'strained' else 'not meaningful'}"
            f" (f_i {'>=' if model == 'strained' else '<'} {STRAINED_MIN_IONICITY}, common practice)"
        ]
    molecular_halide = high_valent_halide_reason(counts)
    if molecular_halide is not None:
        return "covalent_molecular", "not_applicable", [molecular_halide]
    nitride = interstitial_nitride_reason(counts)
    if nitride is not None:
        return "intermetallic", "not_applicable", [nitride]
    layers = layered_dichalcogenide_reason(counts)
    if layers is not None:
        return "chain_layer_solid", "not_applicable", [layers]
    hydride_of = {t.ion.element for t in dec.cations}
    if len(dec.anions) == 1 and dec.anions[0].ion.ion_id == "H(-)" and len(hydride_of) == 1:
        # one element, perhaps in two states (Sn2H6 read as Sn(2+) and Sn(4+))
        hydride = covalent_hydride_class(hydride_of.pop())
        if hydride is not None:
            cls, dchi = hydride
            return cls, "not_applicable", [
                f"a hydride of a main-group or group-12 element: dchi(E-H) = {dchi:.2f}, a nearly non-polar bond,"
                f" {'molecular' if cls == 'covalent_molecular' else 'polymeric'}; H(-) needs an electropositive"
                " metal (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 3.5; from memory)"
            ]
    charge = _bare_cation_charge(dec)
    anion_elements = {t.ion.element for t in dec.anions}
    if charge >= 5 and anion_elements == {"O"} and all(t.ion.monatomic for t in dec.anions) and len(dec.cations) == 1:
        # the layered and chain oxides (V2O5, MoO3, CrO3) are rows of the family table
        return "covalent_network", "not_applicable", [
            f"a bare {dec.cations[0].ion.ion_id} would need ionisation energies no oxide lattice returns: the"
            " oxide is a framework of polar covalent M-O bonds (WO3 and Nb2O5: corner-sharing MO6 octahedra;"
            " Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 12; from memory)"
        ]
    bond = character.analyse(dec)
    risk = fajans.analyse(dec).covalency_risk
    where = (
        f"van Arkel-Ketelaar triangle at the contact: dchi = {bond.delta_chi_pauling:.2f}, mean chi ="
        f" {bond.mean_chi_pauling:.2f} -> {bond.bond_type}; Fajans covalency risk {risk}"
    )
    if bond.bond_type in _NONPOLAR_BOND_TYPES and anion_elements <= _SEMICONDUCTOR_ANIONS and all(
            t.ion.monatomic for t in dec.anions) and all(t.ion.monatomic and t.ion.element != "H"
                                                         for t in dec.cations):
        # PbTe, SnTe, Bi2Te3, Sb2Te3, Ag2Te, Cd3As2: the chalcogenides and pnictides the Phillips table does
        # not list, whose contact bond is hardly polar
        return "semiconductor", "not_applicable", [
            where + ": a chalcogenide or pnictide with dchi below 0.5, a covalent (narrow-gap) semiconductor or"
            " semimetal, not a point-ion crystal (lead and tin chalcogenides, Bi2Te3, Sb2Te3: Madelung,"
            " Semiconductors: Data Handbook, 3rd ed., Springer 2004; from memory)"
        ]
    if charge == 4:
        return "ionic_salt", "strained", [
            f"a bare 4+ cation ({', '.join(t.ion.ion_id for t in dec.cations if t.ion.charge == 4)}) polarises its"
            " neighbours strongly: considerable covalency (common practice)", where,
        ]
    if bond.bond_type == "ionic":
        return "ionic_salt", "applies", [where + ": ionic region"]
    if bond.bond_type == "ionic_covalent":
        if risk == "high":
            return "ionic_salt", "strained", [where + ": polar covalent region with high polarisation"]
        return "ionic_salt", "applies", [where + ": polar region, polarisation not high"]
    if bond.bond_type == "metallic_ionic":
        groups = {get_element(t.ion.element).group for t in dec.anions if t.ion.monatomic}
        if groups and all(g is not None and 13 <= g <= 15 for g in groups) and len(groups) == len(dec.anions):
            return "zintl_phase", "not_applicable", [
                where + ": metallic-ionic region with a group 13-15 anion (Zintl-like, polar intermetallic)"
            ]
        # chalcogenides and halides of the alkali metals (K2Te) stay salts: the
        # triangle's metallic-ionic band reflects the heavy anion's low chi
        return "ionic_salt", "applies", [where + ": metallic-ionic band, but a chalcogenide or halide anion"]
    if bond.bond_type is None:
        return "ionic_salt", "applies", ["no electronegativity at the contact: ionic reading kept"]
    return "ionic_salt", "strained", [where + ": outside the ionic and polar regions"]


def _assess(dec: Decomposition, hydrated: bool = False) -> tuple[str, str, list[str]]:
    cls = dec.substance_class
    if cls == "ionic_salt":
        return _assess_salt(dec, hydrated)
    if cls == "ionic_liquid_pair":
        return cls, "applies", ["organic cation with an anion: an ionic liquid or organic salt"]
    if cls == "base" and any(t.ion.monatomic and is_metal(t.ion.element) for t in dec.cations):
        return cls, "applies", ["a metal hydroxide: cations and OH(-) ions"]
    if cls == "ion":
        return cls, "not_applicable", ["a lone ion: there is no lattice"]
    if cls == "semiconductor" or (cls == "covalent_network" and len(dec.composition) == 1
                                  and dec.composition[0][0] in ("Si", "Ge")):
        return "semiconductor", "not_applicable", [
            f"Phillips ionicity f_i = 0 (an element: covalent sp3 bonds; Phillips, Rev. Mod. Phys. 1970, 42, 317)"
        ]
    why = {
        "acid": "an acid: a molecular substance, not an ionic crystal",
        "base": "no metal cation: a molecular base",
        "covalent_molecular": "a covalent molecule",
        "covalent_network": "a covalent network",
        "metallic": "a metal",
        "element": "an element",
        "unknown": "no reading was found",
    }.get(cls, cls.replace("_", " "))
    return cls, "not_applicable", [why]


# below Pauling's dchi = 0.5 the van Arkel-Ketelaar triangle has no polar region (scorer.character)
_NONPOLAR_BOND_TYPES = frozenset({"covalent", "covalent_metallic", "metallic"})
# monatomic anions of the salts that can be covalent semiconductors (not O, N or the halogens, whose
# compounds never fall below dchi 0.5 with a metal)
_SEMICONDUCTOR_ANIONS = frozenset({"P", "As", "Sb", "Bi", "S", "Se", "Te"})

# the +1 state of these elements forms salts although their main list starts at +3 (InCl, InBr, InI;
# Ga(+) in Ga[GaCl4]; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 7.3; from memory)
_MONOVALENT_SALT_FORMERS = frozenset({"Ga", "In"})


def subvalent_notes(cations) -> list[str]:
    """A warning for each monatomic cation at +1 of an element whose salts hold it at +2 or more: CaCl, AlCl,
    FeCl or Mg(NO3) balance only with Ca(+), Al(+), Fe(+), Mg(+), which no stable salt has (they exist as
    gas-phase molecules), so a count is most likely missing from the formula as written (common practice).

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> decompose(parse_formula("CaCl")).notes[0][:40], decompose(parse_formula("InCl")).notes
    ('Ca(+) is not a state Ca takes in its sal', ())
    """
    out = []
    for term in cations:
        ion = term.ion
        if ion.monatomic and ion.charge == 2 and ion.element in ("Al", "Ga", "In"):
            # group 13 has no M(2+) ion (GaCl2 is Ga(+)[GaCl4](-), read so by the solver; Greenwood & Earnshaw,
            # ch. 7.3.5; from memory): AlSO4 balances only with Al(2+), a count left out of Al2(SO4)3. Thallium
            # aside: TlS and TlSe are Tl(I)Tl(III) chalcogenides the solver reads as Tl(2+)
            out.append(f"{ion.ion_id} is not a state {ion.element} takes in its salts (group 13 has no M(2+) ion):"
                       " a count may be missing from the formula as written; check it")
            continue
        if not ion.monatomic or ion.charge != 1 or ion.element in _MONOVALENT_SALT_FORMERS:
            continue
        main = [state for state, extra in listed_states(ion.element) if not extra and state > 0]
        if main and min(main) >= 2:
            out.append(f"{ion.ion_id} is not a state {ion.element} takes in its salts (they hold"
                       f" {ion.element}({min(main)}+) or higher): a count may be missing from the formula as written;"
                       " check it")
    return out


# monatomic anions that a cation above its element's highest usual state would oxidise (common practice)
_REDUCING_ANIONS = frozenset({"S(2-)", "Se(2-)", "Te(2-)", "C(4-)", "N(3-)", "P(3-)", "As(3-)", "H(-)", "I(-)", "Br(-)", "Cl(-)"})
_REDUCING_ELEMENTS = frozenset(ion_id.split("(")[0] for ion_id in _REDUCING_ANIONS)


def supervalent_notes(cations, anions) -> list[str]:
    """A warning for each bare cation above the highest state its element takes in its usual compounds, beside
    an anion it would oxidise: FeSO and FeCO balance only as Fe(4+) or Fe(6+) with sulfide or carbide, which
    no solid holds (the cation takes the anion's electrons), so the formula as written most likely lost a
    count or an element (FeSO4, FeCO3; common practice). Fe(4+) with oxide (SrFeO3) is not flagged.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> decompose(parse_formula("FeSO")).notes[0][:48], decompose(parse_formula("FeS")).notes
    ('Fe(4+) beside S(2-): no compound holds Fe above ', ())
    """
    reducing = [t.ion.ion_id for t in anions if t.ion.ion_id in _REDUCING_ANIONS]
    if not reducing:
        return []
    out = []
    for term in cations:
        ion = term.ion
        if not ion.monatomic or ion.charge <= 1:
            continue
        main = [state for state, extra in listed_states(ion.element) if not extra and state > 0]
        if main and ion.charge > max(main):
            out.append(f"{ion.ion_id} beside {reducing[0]}: no compound holds {ion.element} above"
                       f" {ion.element}({max(main)}+) with an anion it would oxidise; a count or an element may be"
                       " missing from the formula as written; check it")
    return out


def supervalent_molecule_notes(dec: Decomposition) -> list[str]:
    """:func:`supervalent_notes` for a compound read without ions (a molecule or a chain solid): its metal's
    formal oxidation state above the highest its element takes in its usual compounds, beside a partner it would
    oxidise. FeCl4 (a typo for FeCl3, or the FeCl4(-) ion without its charge) and CoCl4 balance only as
    Fe(+4) and Co(+4), which no chloride holds; MoCl5, WCl6, UCl6 and VCl4 are within their states.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> supervalent_molecule_notes(decompose(parse_formula("FeCl4")))[0][:46], supervalent_molecule_notes(
    ...     decompose(parse_formula("MoCl5")))
    ('Fe(+4) beside Cl: no compound holds Fe above F', [])
    """
    if dec.cations or not (metal_symbols() & {s for s, _ in dec.oxidation_states}):
        return []  # the common case (an organic molecule) leaves here: no metal at all
    partners = [s for s, z in dec.oxidation_states if z < 0 and s in _REDUCING_ELEMENTS]
    if not partners:
        return []
    out = []
    for symbol, state in dec.oxidation_states:
        if state <= 1 or not is_metal(symbol) or abs(state - round(state)) > 1e-9:
            continue
        main = [z for z, extra in listed_states(symbol) if not extra and z > 0]
        if main and state > max(main):
            out.append(f"{symbol}(+{state:g}) beside {partners[0]}: no compound holds {symbol} above {symbol}"
                       f"({max(main)}+) with a partner it would oxidise; a count, an element or a charge may be missing"
                       " from the formula as written; check it")
    return out


def settle(dec: Decomposition, hydrated: bool = False) -> Decomposition:
    """The decomposition with its ``ionic_model``, its reasons and, where the
    criteria say so, its substance class; ions dropped where the compound
    has none (see the module docstring). ``hydrated``: the formula carries
    lattice water, so a molecular anhydrous solid of the family table is read
    as the salt of the aqua ion its hydrate is.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [(decompose(parse_formula(f)).substance_class, decompose(parse_formula(f)).ionic_model)
    ...  for f in ("NaCl", "AgI", "GaAs", "Al2Cl6")]
    [('ionic_salt', 'applies'), ('ionic_salt', 'strained'), ('semiconductor', 'not_applicable'), ('covalent_molecular', 'not_applicable')]
    """
    if dec.substance_class in ("zintl_phase", "intermetallic") or (
        dec.substance_class == "metallic" and dec.ionic_model_reasons
    ):
        return dec  # decided by metal_rich_reading
    cls, model, reasons = _assess(dec, hydrated)
    # reasons given while reading (a redox conflict resolved) come first
    reasons = list(dec.ionic_model_reasons) + reasons
    changes: dict = dict(substance_class=cls, ionic_model=model, ionic_model_reasons=tuple(reasons))
    if model == "not_applicable" and cls in _IONLESS_CLASSES and dec.is_ionic:
        counts = _counts(dec)
        # a semiconductor of monatomic ions keeps its reading's states (AgSbTe2: Ag +1, Sb +3, Te -2, the states
        # of its formal ions; by electronegativity alone Sb took its highest state and Ag -1)
        kept = cls == "semiconductor" and all(t.ion.monatomic for t in (*dec.cations, *dec.anions))
        changes.update(
            cations=(), anions=(), alternatives=(), formal_ions=(dec.cations, dec.anions),
            oxidation_states=_in_order(formal_oxidation_states(counts), dec.oxidation_states)
            if len(counts) > 1 and not kept else dec.oxidation_states,
        )
        reasons.append("formal ions dropped; oxidation states of the formal ions" if kept else
                       "formal ions dropped; oxidation states by electronegativity")
        changes["ionic_model_reasons"] = tuple(reasons)
        if not kept:
            # with no ions kept, which ionic reading ties with which says nothing about the compound (N2O4 read
            # as NO+ NO3- or NO2+ NO2-, a molecule either way)
            changes["notes"] = tuple(n for n in dec.notes if not n.startswith(AMBIGUOUS_READINGS_NOTE))
        # a molecule's formal reading too: FeCl4 (a typo for FeCl3, or the FeCl4(-) ion without its charge) balances
        # only as Fe(4+), which no chloride holds
        supervalent = supervalent_notes(dec.cations, dec.anions)
        if supervalent:
            changes["notes"] = tuple(changes.get("notes", dec.notes)) + tuple(supervalent)
    else:
        subvalent = subvalent_notes(dec.cations) + supervalent_notes(dec.cations, dec.anions)
        if not dec.cations and cls in ("covalent_molecular", "chain_layer_solid"):
            subvalent += supervalent_molecule_notes(dec)
        if subvalent:
            changes["notes"] = tuple(dec.notes) + tuple(subvalent)
    return dec.with_fields(**changes)


def _in_order(states, previous):
    """``states`` in the element order of ``previous`` (cations first, as the ions were)."""
    order = {symbol: i for i, (symbol, _) in enumerate(previous)}
    return tuple(sorted(states, key=lambda item: order.get(item[0], len(order))))


# --- the descriptor ---------------------------------------------------------------

ApplicabilityValues = result_class("ApplicabilityValues", COLUMNS, "Whether the ionic model applies.")


@protocol(title="Ionic model:", columns=COLUMNS, result=ApplicabilityValues, failure="ionic model not computed")
def analyse(dec: Decomposition) -> ApplicabilityValues:
    """The ``ionic_model`` column with its reasons as explain steps; a strained
    compound gets a value note (the values are given, with this caveat)."""
    model, reasons = dec.ionic_model, tuple(dec.ionic_model_reasons)
    if not reasons:
        # a decomposition built by hand, not by the solver: decide here
        _, model, assessed = _assess(dec)
        reasons = tuple(assessed)
    notes: tuple[str, ...] = ()
    if model == "strained":
        notes = ("ionic model strained (" + "; ".join(reasons)
                 + "): ionic values are estimates for a partly covalent solid",)
    steps = reasons + (f"ionic_model = {model} ({dec.substance_class})",)
    return ApplicabilityValues(ionic_model=model, notes=notes, steps=steps)


describe = analyse.describe
explain = analyse.explain
