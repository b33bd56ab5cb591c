"""How a compound behaves in water: does it dissolve, react, and what pH results.

Screening rules for stockroom audits, not a hazard assessment: every row
that reacts, or whose solution is acidic or basic, carries
:data:`scorer.caution.WATER_CAUTION` in its notes.

Rules, in order (the first that applies decides; ``ionicity explain``
names it):

1. ``water``: H2O itself (no value).
2. ``metal alkyl or aryl``: carbon and hydrogen bound to an active metal
   (Li, Na, K, Mg, Zn, Al, ...; halogens allowed, as in Grignard reagents):
   reacts violently, giving the hydrocarbon R-H (CH4 from methyl groups).
3. ``element``: alkali metals and Ca, Sr, Ba react violently (H2, basic);
   Mg reacts slowly (H2); F2 reacts violently, Cl2 reacts (HCl, HOCl);
   Br2 dissolves, I2 is slightly soluble; other elements are insoluble.
4. ``binary water-reactive``: a metal of group 1 or 2 (or Al) with only H
   (saline hydrides), C (carbides: C2H2 from C2(2-), CH4 from C(4-)), N
   (nitrides, NH3), P (phosphides, PH3), As (arsenides, AsH3) or Si
   (silicides, SiH4); complex hydrides (AlH4-; BH4- reacts more slowly);
   amides (NH3); peroxides and superoxides of the alkali metals (O2).
5. ``fuming covalent halide``: a molecular or chain halide or oxyhalide of
   B, Al, Ga, Si, Ge, Sn, Ti, Zr, Hf, V, Nb, Ta, Cr, Mo, W, P, As, Sb, S or
   Se (AlCl3, TiCl4, SiCl4, PCl5, SOCl2, VOCl3), or a molecular halide of a
   d- or f-block metal at +5 or more (MoF6, WF6, UF6, ReCl6, OsF6): reacts
   violently, giving the hydrogen halide.
5c. ``fluoro anion``: salts of PF6- and BF4- keep their solubility but give HF
   as they hydrolyse slowly (acidic); LiPF6 reacts.
5d. ``interhalogen``: interhalogen fluorides (ClF3, BrF3, IF5) react violently (HF);
   ICl, IBr, BrCl react (HX and HOX); xenon and krypton fluorides react (XeF2
   slowly), giving HF, the noble gas and O2.
5e. ``molecular hydride``: boranes (B2H6) and silanes (SiH4) react, giving H2.
5b. ``acyl halide``: an acyl halide written out (CH3COCl, C6H5COCl, COCl2)
   reacts violently, giving the hydrogen halide and the acid.
6. ``acid anhydride``: P4O10, SO3, N2O5, Cl2O7, Mn2O7, SeO3 and oleum react
   violently to their acids; NO2 and N2O3 react; CrO3, Re2O7, SeO2, As2O5,
   I2O5 and Cl2O dissolve as their acids; CO2, As2O3, V2O5, MoO3 are slightly
   soluble and SO2 dissolves, all acidic.
7. ``acid``: strong mineral acids, H3PO4 and the small carboxylic acids are
   miscible; other acids dissolve or follow the molecule rule; acidic.
8. ``molecular base`` (NH3): dissolves, basic; H2O2 and N2H4 are miscible.
9. ``organic molecule``: hydrocarbons and halocarbons insoluble; otherwise
   by carbons per O or N atom (:data:`MISCIBLE_MAX_CARBONS`,
   :data:`CARBON_PER_POLAR_BANDS`).
10. ``ionic liquid``: an organic cation's salt by its anion and chain
    length (:data:`HYDROPHOBIC_ANIONS`, :data:`LONG_CATION_CARBONS`).
11. ``solubility rules``: every cation-anion pair of a salt (a hydrate as
    its salt) by the solubility guidelines of general chemistry (Petrucci
    et al., General Chemistry, 10th ed., 2011, solubility guidelines; from
    memory); the least soluble (or most reactive) pair decides. Hypochlorites
    and chlorites dissolve; cyanides dissolve with group 1 and 2 cations and
    Hg(2+) and as alkali cyano complexes, otherwise not. Zn and Cd phosphides
    and arsenides react slowly (PH3, AsH3). Nitrites, permanganates,
    dichromates, bromates, thiosulfates, selenates, thiocyanates and PF6- salts
    mostly dissolve, iodates are slightly soluble, molybdates and tungstates
    insoluble, each with its exceptions (:data:`_ANION_SOLUBILITY`; CRC
    Handbook solubilities, from memory).
12. ``insoluble solid``: covalent networks, semiconductors, intermetallics,
    alloys: insoluble.

Solution pH (:mod:`scorer.water_ph`; ``acidic`` below pH 6, ``basic`` above 8, else ``neutral``, at
0.1 mol/L): a cation with a tabulated aqua-ion hydrolysis constant (Baes &
Mesmer 1976) or NH4+ is a weak acid, pH = (pKa + 1)/2; an anion of a weak
acid is a weak base, pH = (13 + pKa(HA))/2; both weak, pH = (pKa_cation +
pKa_HA)/2; an amphiprotic anion (HCO3-) pH = (pKa1 + pKa2)/2 (Harris,
Quantitative Chemical Analysis, the weak-acid, weak-base and intermediate-form
approximations; common practice). Insoluble compounds get no pH.

A mixture takes every component's value (:mod:`scorer.mixture_rules`,
rule ``each``).
"""
from __future__ import annotations

import dataclasses

import re
from dataclasses import dataclass

from ionicity.scorer.alkoxides import ALKOXIDE_HINT, alcohol_formula, is_alkoxide_ion
from ionicity.scorer.caution import WATER_CAUTION
from ionicity.scorer.metal_amides import METAL_AMIDE_HINT, amine_of
from ionicity.scorer.descriptor import protocol, result_class, value_lines
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.grammar import iupac_formula
from ionicity.scorer.model import Column, Decomposition, IonTerm
from ionicity.scorer.water_ph import salt_ph

__all__ = [
    "GROUP", "COLUMNS", "BEHAVIOURS", "PH_CLASSES", "RULES", "WaterValues", "analyse", "describe", "explain",
]

#: the --columns group of this module's COLUMNS
GROUP = "water"

BEHAVIOURS = ("dissolves", "slightly_soluble", "insoluble", "reacts", "reacts_violently", "miscible")
PH_CLASSES = ("acidic", "basic", "neutral")
#: most hazardous (or least soluble) first: a salt's pairs and a mixture's components are ranked by it
_RANK = {"reacts_violently": 0, "reacts": 1, "insoluble": 2, "slightly_soluble": 3, "dissolves": 4, "miscible": 5}

_SOURCE_RULES = (
    "Petrucci et al., General Chemistry, 10th ed., 2011, solubility guidelines (from memory); water-reactive"
    " classes: Bretherick's Handbook of Reactive Chemical Hazards (from memory)"
)
_SOURCE_PH = (
    "Baes & Mesmer, The Hydrolysis of Cations, 1976 (aqua-ion pKa); CRC Handbook dissociation constants;"
    " scorer/data/water_acidity.csv (source per row)"
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "water_behaviour", "string", "",
        "dissolves (> ~10 g/L), slightly_soluble (~0.1-10 g/L), insoluble (< ~0.1 g/L), reacts (hydrolyses:"
        " a gas, heat or a hydroxide/oxide precipitate), reacts_violently, miscible (liquids), or empty where no"
        " rule applies (value_notes says why). Screening rules, not a hazard assessment: a row that reacts or"
        " gives an acidic or basic solution carries a caution in value_notes; follow the safety data sheet (SDS),"
        " local codes and qualified people",
        "first matching rule of scorer.water (water, metal alkyl, element, binary water-reactive, fuming halide,"
        " acid anhydride, acid, molecular base, organic molecule, ionic liquid, solubility rules, insoluble solid)",
        _SOURCE_RULES,
        "several ions: the least soluble or most reactive cation-anion pair",
    ),
    Column(
        "solution_ph", "string", "",
        "acidic (pH < 6), basic (pH > 8) or neutral at 0.1 mol/L; empty for insoluble compounds or where no"
        " constant is known",
        "weak acid pH = (pKa + 1)/2; weak base pH = (13 + pKa(HA))/2; both weak (pKa_cation + pKa_HA)/2;"
        " amphiprotic (pKa1 + pKa2)/2; reacting compounds: the pH of their products",
        _SOURCE_PH,
        "several ions: the most acidic cation with the most basic anion",
    ),
    Column(
        "water_reaction_products", "string", "",
        "the gas or product of the reaction with water where the rule knows it (H2, C2H2, CH4, NH3, PH3, HCl,"
        " H3PO4 ...), ';'-joined; none where the rule finds no reaction; empty where no rule applies",
        "from the rule that fired (scorer.water)", _SOURCE_RULES,
        "several ions: every reacting pair's products",
    ),
)

WaterValues = result_class("WaterValues", COLUMNS, "How one compound behaves in water (fields named as the columns).")


# ------------------------------------------------------------------ rules


@dataclass(frozen=True)
class _Finding:
    behaviour: str | None
    ph: str | None
    products: str | None
    rule: str
    why: str
    # a caution the row carries whatever the behaviour (white phosphorus ignites in air)
    caution: str = ""


_HALOGENS = frozenset({"F", "Cl", "Br", "I"})
# white phosphorus ignites in air near 30 C and is stored under water; red phosphorus does not, but burns and
# ignites with oxidisers (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 12; from memory)
PHOSPHORUS_CAUTION = ("phosphorus: the white form (P4) ignites in air (pyrophoric) and is toxic, and is stored under"
                      " water; the red form burns and ignites with oxidisers: see the safety data sheet")
_ALKALI = frozenset({"Li", "Na", "K", "Rb", "Cs", "Fr"})
_HEAVY_ALKALINE_EARTH = frozenset({"Ca", "Sr", "Ba", "Ra"})
_ORGANOMETAL = frozenset({"Li", "Na", "K", "Rb", "Cs", "Be", "Mg", "Ca", "Zn", "Cd", "Al", "Ga", "In", "B"})
_FUMING_CENTRES = frozenset({
    "B", "Al", "Ga", "Si", "Ge", "Sn", "Ti", "Zr", "Hf", "V", "Nb", "Ta", "Cr", "Mo", "W", "P", "As", "Sb", "S", "Se",
    "Te",
})
# fluorides that fume with water; SF6, SeF6 and the metal fluorides do not
_FUMING_FLUORIDE_CENTRES = frozenset({"B", "Si", "P", "As", "Sb"})
# sulfido anions of P, Si and Ge hydrolyse to their oxoanions and H2S (the moisture sensitivity of sulfide
# solid electrolytes: Muramatsu et al., Solid State Ionics 182 (2011) 116; from memory); thiostannates,
# thioantimonates and thioarsenates dissolve (Schlippe's salt, Na3SbS4.9H2O, is made in water)
_HYDROLYSING_THIOANIONS = frozenset({"PS4(3-)", "P2S7(4-)", "P2S6(4-)", "SiS4(4-)", "GeS4(4-)"})
_BINARY_HYDROLYSIS = {"C": None, "N": "NH3", "P": "PH3", "As": "AsH3", "Si": "SiH4", "H": "H2"}
_ANHYDRIDES = {
    (("O", 10.0), ("P", 4.0)): ("reacts_violently", "H3PO4"), (("O", 5.0), ("P", 2.0)): ("reacts_violently", "H3PO4"),
    (("O", 3.0), ("S", 1.0)): ("reacts_violently", "H2SO4"), (("N", 2.0), ("O", 5.0)): ("reacts_violently", "HNO3"),
    (("Cl", 2.0), ("O", 7.0)): ("reacts_violently", "HClO4"), (("C", 1.0), ("O", 2.0)): ("slightly_soluble", None),
    (("O", 2.0), ("S", 1.0)): ("dissolves", None),
    # oleum written as H2SO4.SO3 (disulfuric acid) takes up water as SO3 does
    (("H", 2.0), ("O", 7.0), ("S", 2.0)): ("reacts_violently", "H2SO4"),
    # oxides of non-metals and of metals in high states that dissolve as their acids (solubilities and reactions:
    # CRC Handbook of Chemistry and Physics, physical constants of inorganic compounds; Greenwood & Earnshaw,
    # Chemistry of the Elements, 2nd ed., 1997, ch. 23.3 (CrO3), 24.3 (Mn2O7, Re2O7), 15.2 and 16.2 (SeO2, SeO3),
    # 13.3 (As2O3, As2O5), 17.2 (I2O5, Cl2O), 11.3 (NO2, N2O3); from memory)
    (("Cr", 1.0), ("O", 3.0)): ("dissolves", "H2CrO4"), (("Mn", 2.0), ("O", 7.0)): ("reacts_violently", "HMnO4"),
    (("O", 7.0), ("Re", 2.0)): ("dissolves", "HReO4"), (("O", 2.0), ("Se", 1.0)): ("dissolves", "H2SeO3"),
    (("O", 3.0), ("Se", 1.0)): ("reacts_violently", "H2SeO4"), (("As", 2.0), ("O", 3.0)): ("slightly_soluble", "H3AsO3"),
    (("As", 2.0), ("O", 5.0)): ("dissolves", "H3AsO4"), (("I", 2.0), ("O", 5.0)): ("dissolves", "HIO3"),
    (("Cl", 2.0), ("O", 1.0)): ("dissolves", "HOCl"), (("N", 1.0), ("O", 2.0)): ("reacts", "HNO3;NO"),
    (("N", 2.0), ("O", 3.0)): ("reacts", "HNO2"), (("O", 5.0), ("V", 2.0)): ("slightly_soluble", None),
    (("Mo", 1.0), ("O", 3.0)): ("slightly_soluble", None),
}
#: acids miscible with water in all proportions (as liquids or their concentrated solutions; common practice)
MISCIBLE_ACIDS = ("HCl", "HBr", "HI", "HF", "HNO3", "H2SO4", "HClO4", "H3PO4", "C2H4O2", "CH2O2")


def _composition_key(formula: str) -> tuple[tuple[str, float], ...]:
    """Element counts of a plain formula (no brackets) as a sorted tuple: ``HNO3`` -> (H 1, N 1, O 3)."""
    counts: dict[str, float] = {}
    for symbol, count in re.findall(r"([A-Z][a-z]?)(\d*)", formula):
        counts[symbol] = counts.get(symbol, 0.0) + float(count or 1)
    return tuple(sorted(counts.items()))


_MISCIBLE_ACID_KEYS = {_composition_key(f): f for f in MISCIBLE_ACIDS}
#: a small molecule with at most this many carbons and at most 3 per O or N atom is miscible (common practice:
#: methanol to propanol, acetone, glycol, glycerol, acetonitrile, DMF)
MISCIBLE_MAX_CARBONS = 3
#: (carbons per O or N atom, class): a molecule dissolves up to 4 carbons per polar atom (butanol, ethyl
#: acetate, glucose), is slightly soluble up to 8 (hexanol, octanol), else insoluble (common practice,
#: the one-polar-group-per-four-carbons rule of organic chemistry textbooks; set here)
CARBON_PER_POLAR_BANDS = ((4.0, "dissolves"), (8.0, "slightly_soluble"))
#: anions that make an ionic liquid immiscible with water (common practice; Huddleston et al., Green Chem.
#: 2001, 3, 156, for [C4mim][PF6] against [C4mim][BF4]; from memory)
HYDROPHOBIC_ANIONS = frozenset({"[NTf2](-)", "PF6(-)", "[BETI](-)", "[FAP](-)", "B(CN)4(-)"})
#: carbons of an organic cation from which its salt is slightly soluble (hydrophilic anion) or insoluble
#: (hydrophobic anion): [P66614]Cl is a water-immiscible liquid (set here, from memory)
LONG_CATION_CARBONS = 16
_ALWAYS_SOLUBLE_ANIONS = frozenset({
    "NO3(-)", "CH3COO(-)", "ClO4(-)", "ClO3(-)", "[NTf2](-)", "BF4(-)", "HCO3(-)", "HSO4(-)", "H2PO4(-)", "HCOO(-)",
    "[OTf](-)", "[FSI](-)", "ClO(-)", "ClO2(-)", "PF6(-)",
})
# further anions by the solubility tables (CRC Handbook of Chemistry and Physics, physical constants of inorganic
# compounds, aqueous solubilities; from memory): the usual behaviour of their salts, then the exceptions by cation.
# Group 1 and ammonium salts dissolve before this table is read.
_ANION_SOLUBILITY: dict[str, tuple[str, dict[str, str]]] = {
    # nitrites, permanganates, dichromates dissolve (AgNO2 about 4 g/L, Ag2Cr2O7 far less)
    "NO2(-)": ("dissolves", {"Ag(+)": "slightly_soluble"}),
    "MnO4(-)": ("dissolves", {}),
    "Cr2O7(2-)": ("dissolves", {"Ag(+)": "insoluble"}),
    # bromates dissolve, Ag and Ba bromates slightly; iodates are sparingly soluble, Ag, Pb, Hg iodates insoluble
    "BrO3(-)": ("dissolves", {"Ag(+)": "slightly_soluble", "Ba(2+)": "slightly_soluble"}),
    "IO3(-)": ("slightly_soluble", {"Ag(+)": "insoluble", "Pb(2+)": "insoluble", "Hg(2+)": "insoluble",
                                    "Hg2(2+)": "insoluble"}),
    # thiosulfates dissolve, Ba and Ag slightly, Pb not
    "S2O3(2-)": ("dissolves", {"Ba(2+)": "slightly_soluble", "Ag(+)": "slightly_soluble", "Pb(2+)": "insoluble"}),
    # selenates as sulfates
    "SeO4(2-)": ("dissolves", {"Ba(2+)": "insoluble", "Pb(2+)": "insoluble", "Sr(2+)": "slightly_soluble",
                               "Ag(+)": "slightly_soluble"}),
    # molybdates and tungstates: only group 1, ammonium and Mg salts dissolve (CaWO4, PbMoO4 are minerals)
    "MoO4(2-)": ("insoluble", {"Mg(2+)": "dissolves"}),
    "WO4(2-)": ("insoluble", {"Mg(2+)": "dissolves"}),
    # cyanates dissolve except those of Ag, Cu(I), Pb; fulminates are sparingly soluble, silver fulminate hardly
    "OCN(-)": ("dissolves", {"Ag(+)": "insoluble", "Cu(+)": "insoluble", "Pb(2+)": "insoluble"}),
    "CNO(-)": ("slightly_soluble", {"Ag(+)": "insoluble"}),
    # thiocyanates dissolve except those of Ag, Cu(I), Hg(I); Pb and Hg(II) slightly
    "SCN(-)": ("dissolves", {"Ag(+)": "insoluble", "Cu(+)": "insoluble", "Hg2(2+)": "insoluble",
                             "Pb(2+)": "slightly_soluble", "Hg(2+)": "slightly_soluble"}),
}
_HALIDES = frozenset({"Cl(-)", "Br(-)", "I(-)"})
_HALIDE_INSOLUBLE = frozenset({"Ag(+)", "Hg2(2+)", "Cu(+)"})
_HALIDE_SLIGHT = frozenset({"Pb(2+)", "Tl(+)"})
_SULFATE_INSOLUBLE = frozenset({"Ba(2+)", "Sr(2+)", "Pb(2+)", "Hg2(2+)"})
_SULFATE_SLIGHT = frozenset({"Ca(2+)", "Ag(+)"})
# metals whose oxide or hydroxide dissolves in alkali as an oxo or hydroxo anion (common practice)
_AMPHOTERIC = frozenset({"Al", "Zn", "Sn", "Pb", "Ga", "Be", "Cr"})
_MOSTLY_INSOLUBLE = frozenset({
    "CO3(2-)", "PO4(3-)", "S(2-)", "OH(-)", "O(2-)", "SO3(2-)", "CrO4(2-)", "SiO3(2-)", "SiO4(4-)", "C2O4(2-)",
    "HPO4(2-)", "AsO4(3-)",
})


def _finding(behaviour, ph, products, rule, why) -> _Finding:
    return _Finding(behaviour, ph, products, rule, why)


def _counts(dec: Decomposition) -> dict[str, float]:
    return dict(dec.composition)


def _water(counts, dec) -> _Finding | None:
    if counts == {"H": 2.0, "O": 1.0}:
        return _finding(None, None, None, "water", "water itself: no value")
    return None


def _metal_alkyl(counts, dec) -> _Finding | None:
    if "C" not in counts or "H" not in counts:
        return None
    metals = [s for s in counts if s in _ORGANOMETAL and s != "B"]
    if not metals:
        return None
    rest = set(counts) - {"C", "H", *metals}
    if not rest <= _HALOGENS:
        return None
    carbons, hydrogens = counts["C"], counts["H"]
    product = "CH4" if hydrogens == 3 * carbons else "C2H6" if hydrogens == 2.5 * carbons else "R-H (hydrocarbon)"
    ph = "basic" if set(metals) & (_ALKALI | {"Mg", "Ca"}) else None
    return _finding("reacts_violently", ph, product, "metal alkyl or aryl",
                    f"carbon and hydrogen bound to {', '.join(metals)} (a metal alkyl or aryl): reacts violently,"
                    f" giving {product}")


def _element(counts, dec) -> _Finding | None:
    active = sorted(set(counts) & (_ALKALI | _HEAVY_ALKALINE_EARTH))
    if active and all(is_metal(s) for s in counts):
        return _finding("reacts_violently", "basic", "H2", "element",
                        f"{', '.join(active)}: an alkali or heavy alkaline-earth metal (or its alloy) gives H2 and"
                        " its hydroxide")
    if len(counts) != 1:
        return None
    symbol = next(iter(counts))
    if symbol == "Mg":
        return _finding("reacts", "basic", "H2", "element", "Mg: reacts slowly with cold water, faster hot, giving H2")
    if symbol == "F":
        return _finding("reacts_violently", "acidic", "HF;O2", "element", "F2 oxidises water to O2, giving HF")
    if symbol == "Cl":
        return _finding("reacts", "acidic", "HCl;HOCl", "element", "Cl2 disproportionates in water to HCl and HOCl")
    if symbol == "Br":
        return _finding("dissolves", "acidic", None, "element", "Br2 dissolves (about 34 g/L), slightly acidic")
    if symbol == "I":
        return _finding("slightly_soluble", None, None, "element", "I2 is slightly soluble (about 0.3 g/L)")
    if symbol == "P":
        return dataclasses.replace(
            _finding("insoluble", None, None, "element", "P: insoluble; white phosphorus (P4) is kept under it"),
            caution=PHOSPHORUS_CAUTION)
    if get_element(symbol).series == "Noble gases":
        return _finding(None, None, None, "element", f"{symbol}: a noble gas, no rule")
    return _finding("insoluble", None, None, "element", f"{symbol}: an element that neither dissolves nor reacts")


def _binary(counts, dec) -> _Finding | None:
    anion_ids = {t.ion.ion_id for t in dec.anions}
    cation_elements = {t.ion.element for t in dec.cations}
    if "AlH4(-)" in anion_ids:
        return _finding("reacts_violently", "basic", "H2", "binary water-reactive",
                        "a complex hydride (AlH4-): reacts violently, giving H2")
    if "BH4(-)" in anion_ids:
        return _finding("reacts", "basic", "H2", "binary water-reactive",
                        "a borohydride (BH4-): hydrolyses, giving H2 (slowly in cold alkaline water)")
    if anion_ids & _HYDROLYSING_THIOANIONS:
        return _finding("reacts", None, "H2S", "binary water-reactive",
                        "a thiophosphate, thiosilicate or thiogermanate (Li3PS4, Li6PS5Cl, Li10GeP2S12): hydrolyses in"
                        " water and moist air, giving H2S")
    if "NH2(-)" in anion_ids:
        return _finding("reacts_violently", "basic", "NH3", "binary water-reactive",
                        "an amide (NH2-): reacts violently, giving NH3 and the hydroxide")
    if anion_ids & {"O2(2-)", "O2(-)"} and cation_elements <= _ALKALI | _HEAVY_ALKALINE_EARTH:
        return _finding("reacts_violently", "basic", "O2;H2O2", "binary water-reactive",
                        "a peroxide or superoxide of an alkali or alkaline-earth metal: gives O2, H2O2 and the hydroxide")
    if len(counts) != 2:
        return None
    metal, other = sorted(counts, key=lambda s: s in _BINARY_HYDROLYSIS)
    if other not in _BINARY_HYDROLYSIS or not is_metal(metal):
        return None
    group = get_element(metal).group
    active = group in (1, 2) or metal == "Al"
    if group == 12 and other in ("P", "As") and dec.is_ionic:
        # Zn3P2, Cd3As2: hydrolyse slowly in moist air and fast with acid (zinc phosphide is a rodenticide for
        # the PH3 it gives in the stomach; Greenwood & Earnshaw ch. 12.3; from memory)
        product = _BINARY_HYDROLYSIS[other]
        return _finding("reacts", None, product, "binary water-reactive",
                        f"{metal} {'phosphide' if other == 'P' else 'arsenide'}: hydrolyses slowly (fast with acid),"
                        f" giving {product}")
    if not active or (other == "N" and metal == "Al"):
        # AlN is a ceramic that hydrolyses only slowly: the semiconductor rule calls it insoluble
        return None
    if other == "N" and "N(3-)" not in anion_ids:
        # an azide (NaN3: N3(-)) is no nitride: it dissolves; the solubility rules read it
        return None
    if other == "H" and metal in {"Be", "Mg", "Al"}:
        return _finding("reacts", None, "H2", "binary water-reactive",
                        f"{metal} hydride: hydrolyses (more slowly than the saline hydrides), giving H2")
    if other == "C":
        product = "C2H2" if "C2(2-)" in anion_ids else "C3H4" if "C3(4-)" in anion_ids else "CH4"
    else:
        product = _BINARY_HYDROLYSIS[other]
    kind = {"H": "saline hydride", "C": "ionic carbide", "N": "nitride", "P": "phosphide", "As": "arsenide",
            "Si": "silicide"}[other]
    ph = "basic" if group in (1, 2) and metal != "Be" else None
    return _finding("reacts_violently", ph, product, "binary water-reactive",
                    f"{metal} {kind}: reacts violently, giving {product}")


def _high_valent_molecular_metal(centre: str, dec: Decomposition) -> bool:
    """A d- or f-block metal at +5 or more in a molecular halide (MoF6, WF6, UF6, ReCl6, OsF6, MoCl5):
    such halides hydrolyse violently to the hydrogen halide (UF6 + 2 H2O -> UO2F2 + 4 HF; Greenwood &
    Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 31.3.3 and 23.3.3; from memory), unlike the
    ionic metal fluorides and the molecular halides of group 12 (HgCl2 dissolves)."""
    if dec.substance_class != "covalent_molecular" or not is_metal(centre):
        return False
    if get_element(centre).block not in ("d", "f"):
        return False
    state = dict(dec.oxidation_states).get(centre)
    return state is not None and state >= 5


def _fuming_halide(counts, dec) -> _Finding | None:
    halide = _HALOSULFONIC.get(frozenset(counts.items()))
    if halide is not None:
        # the halosulfonic acids HSO3Cl and HSO3F (read as an acid or a molecule): water attacks the S-X bond
        # violently, giving HX and H2SO4 (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997,
        # ch. 15.2.6; Bretherick; from memory)
        return _finding("reacts_violently", "acidic", f"H{halide};H2SO4", "fuming covalent halide",
                        f"a halosulfonic acid (HSO3{halide}): reacts violently with water (fumes in moist air), giving"
                        f" H{halide} and H2SO4")
    if dec.is_ionic:
        return None
    halogens = [s for s in counts if s in _HALOGENS]
    centres = [s for s in counts if s not in _HALOGENS and s != "O"]
    if not halogens or len(centres) != 1:
        return None
    centre = centres[0]
    if centre not in _FUMING_CENTRES or (halogens == ["F"] and centre not in _FUMING_FLUORIDE_CENTRES):
        if not _high_valent_molecular_metal(centre, dec):
            return None
    products = ";".join(f"H{x}" for x in halogens)
    kind = "oxyhalide" if "O" in counts else "halide"
    return _finding("reacts_violently", "acidic", products, "fuming covalent halide",
                    f"an anhydrous covalent {kind} of {centre}: hydrolyses violently (fumes in moist air), giving"
                    f" {products.replace(';', ' and ')}")


_HALOSULFONIC = {frozenset({("H", 1.0), ("S", 1.0), ("O", 3.0), (x, 1.0)}): x for x in ("F", "Cl")}
_NOBLE_GASES = frozenset({"Kr", "Xe", "Rn"})
# the oxoacid a fluoride's other halogen ends in, as usually written (IF5 + 3 H2O -> HIO3 + 5 HF)
_INTERHALOGEN_FLUORIDE_PRODUCTS = {"Cl": "HF;Cl2;O2", "Br": "HF;HBrO3;Br2;O2", "I": "HF;HIO3"}


def _interhalogen(counts, dec) -> _Finding | None:
    """Interhalogens and noble-gas fluorides (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997,
    ch. 17.2.1 and 18.3; from memory): the fluorides of Cl, Br and I (ClF3, BrF3, BrF5, IF5, IF7) hydrolyse
    violently, ClF3 and BrF3 explosively, giving HF; ICl, IBr, BrCl hydrolyse to the hydrogen halide of the
    more electronegative halogen and the hypohalous acid of the other; XeF2 hydrolyses slowly, XeF4, XeF6 and
    KrF2 violently (XeF6 and XeF4 can give explosive XeO3), giving HF, xenon and oxygen."""
    if dec.is_ionic or not counts or not set(counts) <= _HALOGENS | _NOBLE_GASES | {"O"}:
        return None
    halogens = [s for s in counts if s in _HALOGENS]
    nobles = [s for s in counts if s in _NOBLE_GASES]
    if nobles and halogens == ["F"]:
        noble = nobles[0]
        slow = noble == "Xe" and counts.get("F") == 2 and "O" not in counts
        how = "slowly" if slow else "violently (XeO3, which can form, is explosive)"
        return _finding("reacts" if slow else "reacts_violently", "acidic", f"HF;{noble};O2", "interhalogen",
                        f"a {noble} fluoride: hydrolyses {how}, giving HF, {noble} and O2")
    if nobles or len(halogens) != 2 or "O" in counts:
        return None
    centre, ligand = sorted(halogens, key=lambda x: get_element(x).electronegativity_pauling or 0.0)
    if ligand == "F":
        products = _INTERHALOGEN_FLUORIDE_PRODUCTS.get(centre, "HF")
        return _finding("reacts_violently", "acidic", products, "interhalogen",
                        f"an interhalogen fluoride of {centre}: hydrolyses violently (ClF3 and BrF3 explosively),"
                        f" giving {products.replace(';', ', ')}")
    products = f"H{ligand};HO{centre}"
    return _finding("reacts", "acidic", products, "interhalogen",
                    f"an interhalogen: hydrolyses, giving H{ligand} and HO{centre}")


def _molecular_hydride(counts, dec) -> _Finding | None:
    """Boranes and silanes (Greenwood & Earnshaw ch. 6.3 and 9.3; from memory): B2H6 and the other boranes
    hydrolyse to boric acid and H2; silanes hydrolyse to silica and H2, slowly in neutral water, fast with a
    trace of base (both ignite in air: a matter for the safety data sheet, not this column)."""
    if dec.is_ionic or set(counts) not in ({"B", "H"}, {"Si", "H"}):
        return None
    if "B" in counts:
        return _finding("reacts", "acidic", "H3BO3;H2", "molecular hydride",
                        "a borane: hydrolyses, giving boric acid and H2")
    return _finding("reacts", None, "SiO2;H2", "molecular hydride",
                    "a silane: hydrolyses (slowly in neutral water, fast with base), giving silica and H2")


def _acyl_halide(counts, dec) -> _Finding | None:
    """An acyl halide written out (CH3COCl, C6H5COCl, COCl2): water cleaves the C-X bond, giving the
    hydrogen halide and the carboxylic acid (phosgene: CO2), violently for the small ones (Bretherick's
    Handbook of Reactive Chemical Hazards; Clayden et al., Organic Chemistry, 2nd ed., 2012, ch. 10;
    from memory)."""
    if "acyl_halide" not in dec.written_groups:
        return None
    halogens = [s for s in counts if s in _HALOGENS]
    products = ";".join([*(f"H{x}" for x in halogens), "CO2" if counts.get("C") == 1 else "carboxylic acid"])
    return _finding("reacts_violently", "acidic", products, "acyl halide",
                    f"an acyl halide: water cleaves its C-X bond, giving {products.replace(';', ' and ')}")


def _organic_reactive_group(counts, dec) -> _Finding | None:
    """A carboxylic anhydride or an isocyanate a name says (the registry's SMILES; acetic anhydride, methyl
    isocyanate): water opens the anhydride to the carboxylic acid, and adds to the isocyanate, which gives
    off CO2 and the amine, a gas that builds pressure in a closed container (Clayden et al., Organic
    Chemistry, 2nd ed., 2012, ch. 10; Bretherick's Handbook of Reactive Chemical Hazards; from memory)."""
    if "acid_anhydride" in dec.written_groups:
        return _finding("reacts", "acidic", "carboxylic acid", "acid anhydride",
                        "a carboxylic anhydride: water opens it to the carboxylic acid (exothermic)")
    if "isocyanate" in dec.written_groups:
        return _finding("reacts", None, "amine;CO2", "isocyanate",
                        "an isocyanate: water adds to N=C=O, giving CO2 and the amine (pressure in a closed container)")
    return None


# halo-complex anions of the strongly Lewis-acidic group-13 halides: the chloroaluminate and chlorogallate melts and
# ionic liquids (NaAlCl4, [C2mim][AlCl4], [C4mim][Al2Cl7]) hydrolyse violently with water and moist air, giving the
# hydrogen halide, as AlCl3 does (Wilkes, Levisky, Wilson & Hussey, Inorg. Chem. 21 (1982) 1263; Wasserscheid &
# Welton, Ionic Liquids in Synthesis, 2nd ed., 2008, ch. 2; from memory)
_HYDROLYSING_HALOMETALLATES = {
    "AlCl4(-)": "HCl", "Al2Cl7(-)": "HCl", "AlBr4(-)": "HBr", "Al2Br7(-)": "HBr", "GaCl4(-)": "HCl",
    "Ga2Cl7(-)": "HCl", "AlI4(-)": "HI",
}


# oxo salts of the high-valent early metals and uranium, read as the metal with oxide beside a soluble anion
# (VOSO4, VOCl2, ZrOCl2, TiOSO4, UO2(NO3)2 written UO8N2 and the like): the oxocation (vanadyl VO2+, zirconyl,
# titanyl, uranyl) goes into solution and hydrolyses, an acidic solution, where an oxide beside the metal would
# say "insoluble" (vanadyl sulfate and zirconyl chloride octahydrate are the soluble salts of the trade;
# Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 21.3 and 22.3; from memory). The oxyhalides
# of Bi and Sb (BiOCl, SbOCl) are insoluble and stay with the solubility rules; those of Nb and Mo (NbOCl3,
# MoO2Cl2) fume and hydrolyse, as molecular halides do.
_OXO_SALT_METALS = frozenset({"V", "Ti", "Zr", "Hf", "U", "Np", "Pu"})
_OXO_SALT_ANIONS = frozenset({"SO4(2-)", "Cl(-)", "Br(-)", "NO3(-)", "ClO4(-)"})


def _oxo_salt(counts, dec) -> _Finding | None:
    """A salt read as such a metal with oxide beside a sulfate, halide, nitrate or perchlorate (at most two
    oxides per metal atom): dissolves as the oxocation, acidic."""
    if not dec.is_ionic or not dec.cations:
        return None
    anions = {t.ion.ion_id: t.count for t in dec.anions}
    oxide = anions.pop("O(2-)", 0.0)
    metals = [t for t in dec.cations if t.ion.element in _OXO_SALT_METALS]
    if not oxide or not anions or not set(anions) <= _OXO_SALT_ANIONS or len(metals) != len(dec.cations):
        return None
    if oxide > 2 * sum(t.count for t in metals) + 1e-9:
        return None
    names = ", ".join(sorted({t.ion.element for t in metals}))
    return _finding("dissolves", "acidic", None, "oxo salt",
                    f"an oxo salt of {names} (an oxocation such as vanadyl, zirconyl or titanyl beside"
                    f" {', '.join(sorted(anions))}): dissolves, the oxocation hydrolysing to an acidic solution")


def _halometallate(counts, dec) -> _Finding | None:
    """A salt of a chloroaluminate or chlorogallate anion (the molten-salt and ionic-liquid electrolytes): reacts
    violently with water, giving the hydrogen halide, an acidic solution."""
    found = [t.ion.ion_id for t in dec.anions if t.ion.ion_id in _HYDROLYSING_HALOMETALLATES]
    if not found:
        return None
    products = ";".join(dict.fromkeys(_HYDROLYSING_HALOMETALLATES[a] for a in found))
    return _finding("reacts_violently", "acidic", products, "halometallate",
                    f"{', '.join(found)}: a Lewis-acidic halometallate (a chloroaluminate melt or ionic liquid)"
                    f" that water and moist air hydrolyse violently, giving {products.replace(';', ', ')}")


def _metal_amide(counts, dec) -> _Finding | None:
    """An alkali-metal amide of a secondary amine written by its groups (scorer.metal_amides): water takes it
    at once to the amine and the metal hydroxide, with heat; a strongly basic solution."""
    if METAL_AMIDE_HINT not in dec.written_groups:
        return None
    metal = next(s for s in counts if s not in ("C", "H", "N", "Si"))
    amine = amine_of(counts)
    return _finding("reacts_violently", "basic", f"{metal}OH;{amine}", "metal amide",
                    f"an alkali-metal amide: a stronger base than hydroxide, it reacts violently with water, giving"
                    f" the amine {amine} and {metal}OH with heat")


def _alkoxide(counts, dec) -> _Finding | None:
    """A metal alkoxide written by its groups, or a salt of an alkoxide ion (scorer.alkoxides): water hydrolyses
    the first to the metal's hydroxide or oxide and the alcohol (slowly for Si(OR)4 without acid or base); the
    alkoxide ion takes a proton from water, giving the hydroxide and the alcohol with heat, a strongly basic
    solution (Bradley et al., Alkoxo and Aryloxo Derivatives of Metals, 2001; Clayden et al., Organic
    Chemistry, 2nd ed., 2012, ch. 8; from memory)."""
    if ALKOXIDE_HINT in dec.written_groups:
        centre = next((s for s in counts if s not in ("C", "H", "O")), None)
        if centre is None or not counts.get("O"):
            return None
        c, h = counts["C"] / counts["O"], counts["H"] / counts["O"]
        alcohol = f"C{c:g}H{h:g}OH".replace("C1H", "CH")
        slow = " (slowly without acid or base)" if centre == "Si" else ""
        return _finding("reacts", None, f"{centre} hydroxide or oxide;{alcohol}", "metal alkoxide",
                        f"a metal alkoxide: water and moist air hydrolyse it to the {centre} hydroxide or oxide and"
                        f" {alcohol}{slow}")
    alkoxides = [t.ion for t in dec.anions if is_alkoxide_ion(t.ion)] if dec.is_ionic else []
    if not alkoxides:
        return None
    metals = sorted({t.ion.element for t in dec.cations if t.ion.element})
    alcohols = ";".join(dict.fromkeys(alcohol_formula(ion) for ion in alkoxides))
    hydroxides = ";".join(f"{m}OH" if get_element(m).group == 1 else f"{m}(OH)2" for m in metals
                          if get_element(m).group in (1, 2)) or "hydroxide"
    return _finding("reacts", "basic", f"{hydroxides};{alcohols}", "alkoxide salt",
                    f"{', '.join(ion.ion_id for ion in alkoxides)}: a stronger base than hydroxide, it takes a"
                    f" proton from water, giving {hydroxides.replace(';', ', ')} and {alcohols.replace(';', ', ')}"
                    " with heat (a strongly basic, corrosive solution)")


def _anhydride(counts, dec) -> _Finding | None:
    entry = _ANHYDRIDES.get(tuple(sorted(counts.items())))
    if entry is None:
        return None
    behaviour, acid = entry
    if acid is None:
        return _finding(behaviour, "acidic", None, "acid anhydride",
                        f"an oxide that dissolves to a weak acid ({behaviour.replace('_', ' ')})")
    how = {"reacts_violently": "reacts violently with water", "reacts": "reacts with water"}.get(
        behaviour, behaviour.replace("_", " ") + " in water")
    return _finding(behaviour, "acidic", acid, "acid anhydride", f"an acid anhydride: {how}, giving {acid.replace(';', ' and ')}")


def _acid(counts, dec) -> _Finding | None:
    if dec.substance_class != "acid":
        return None
    formula = _MISCIBLE_ACID_KEYS.get(tuple(sorted(counts.items())))
    if formula is not None:
        return _finding("miscible", "acidic", None, "acid", f"{formula}: an acid miscible with water")
    if "C" in counts:
        molecule = _molecule(counts)
        if molecule is not None:
            return _finding(molecule.behaviour, "acidic" if molecule.behaviour != "insoluble" else None, None,
                            "acid", f"an organic acid; {molecule.why}")
    return _finding("dissolves", "acidic", None, "acid", f"{iupac_formula(counts)}: an acid, dissolves")


#: inorganic molecular liquids miscible with water (common practice), with their pH class
MISCIBLE_INORGANIC = {(("H", 2.0), ("O", 2.0)): ("H2O2", "neutral"), (("H", 4.0), ("N", 2.0)): ("N2H4", "basic")}


def _molecular_base(counts, dec) -> _Finding | None:
    liquid = MISCIBLE_INORGANIC.get(tuple(sorted(counts.items())))
    if liquid is not None:
        return _finding("miscible", liquid[1], None, "molecular base",
                        f"{liquid[0]}: a small inorganic molecular liquid, miscible")
    if dec.substance_class != "base" or dec.cations:
        return None
    return _finding("dissolves", "basic", None, "molecular base", "a molecular base (NH3, amines): dissolves, basic")


def _organic(counts, dec) -> _Finding | None:
    if "C" not in counts or dec.is_ionic or any(is_metal(s) for s in counts):
        return None
    if set(counts) <= {"C", "O", "N", "S", "Se", "Te"} and "H" not in counts:
        # carbon with only O, N and chalcogens (CO, CS2, COS, C3O2, cyanogen) is no organic molecule: the
        # carbon-per-polar-atom rule read CO as miscible (it dissolves about 0.03 g/L; from memory)
        return None
    return _molecule(counts)


def _molecule(counts) -> _Finding | None:
    if set(counts) <= {"C", "H"} | _HALOGENS:
        return _finding("insoluble", None, None, "organic molecule", "a hydrocarbon or halocarbon: insoluble")
    polar = counts.get("O", 0.0) + counts.get("N", 0.0)
    if not polar:
        return None
    carbons = counts["C"]
    ratio = carbons / polar
    ph = "neutral" if set(counts) <= {"C", "H", "O"} else None
    if carbons <= MISCIBLE_MAX_CARBONS and 1.0 <= ratio <= 3.0:
        return _finding("miscible", ph, None, "organic molecule",
                        f"a small molecule ({carbons:g} C, {ratio:.2g} C per O or N atom): miscible")
    for upper, behaviour in CARBON_PER_POLAR_BANDS:
        if ratio <= upper:
            return _finding(behaviour, ph, None, "organic molecule",
                            f"{ratio:.2g} carbons per O or N atom (<= {upper:g}): {behaviour.replace('_', ' ')}")
    return _finding("insoluble", None, None, "organic molecule",
                    f"{ratio:.2g} carbons per O or N atom (> {CARBON_PER_POLAR_BANDS[-1][0]:g}): insoluble")


def _carbons(term: IonTerm) -> float:
    return dict(term.ion.composition).get("C", 0.0)


def _ionic_liquid(counts, dec) -> _Finding | None:
    organic = [t for t in dec.cations if t.ion.organic]
    if not organic or not dec.anions:
        return None
    carbons = max(_carbons(t) for t in organic)
    hydrophobic = [t.ion.ion_id for t in dec.anions if t.ion.ion_id in HYDROPHOBIC_ANIONS]
    long_chain = carbons >= LONG_CATION_CARBONS
    if hydrophobic:
        behaviour = "insoluble" if long_chain else "slightly_soluble"
        why = f"organic cation ({carbons:g} C) with the hydrophobic anion {hydrophobic[0]}"
    else:
        behaviour = "slightly_soluble" if long_chain else "dissolves"
        why = f"organic cation ({carbons:g} C) with a hydrophilic anion"
    ph = salt_ph(dec.cations, dec.anions) if behaviour != "insoluble" else (None, "")
    return _finding(behaviour, ph[0], None, "ionic liquid", f"{why}: {behaviour.replace('_', ' ')}{ph[1]}")


# the lithium exception to "alkali salts dissolve"
_LITHIUM_SLIGHT = frozenset({"F(-)", "CO3(2-)", "PO4(3-)"})


def _pair(cation: str, element: str | None, anion: str, mixed: bool = False,
          alkali: bool = False) -> tuple[str | None, str | None, str]:
    """(behaviour, products, why) of one cation-anion pair by the solubility guidelines;
    ``mixed``: the salt has several cations (a mixed oxide such as LiCoO2 is not Li2O); ``alkali``: one
    of them is of group 1 or ammonium (NaAlO2 is sodium aluminate)."""
    group = get_element(element).group if element else None
    soluble_cation = group == 1 or cation == "NH4(+)"
    if anion in ("O(2-)", "OH(-)") and mixed and element in _AMPHOTERIC and alkali:
        return "dissolves", None, f"{cation} with an alkali metal: an aluminate, zincate or stannate, dissolves"
    if anion == "O(2-)" and mixed and not soluble_cation:
        return "insoluble", None, "mixed-metal oxides are insoluble"
    if anion == "O(2-)" and not mixed and (group == 1 or element in _HEAVY_ALKALINE_EARTH):
        return "reacts", "hydroxide (heat)", f"{cation} oxide reacts with water to the hydroxide, with heat"
    if anion == "S(2-)" and (group == 2 or element in {"Al", "Cr"}):
        return "reacts", "H2S", f"{cation} sulfide hydrolyses, giving H2S"
    if soluble_cation:
        if cation == "Li(+)" and anion in _LITHIUM_SLIGHT:
            # LiF 0.13, Li2CO3 1.3, Li3PO4 0.04 g per 100 g water (CRC Handbook, aqueous solubility of inorganic
            # compounds; from memory): the small lithium ion's lattices with small, highly charged anions
            return "slightly_soluble", None, f"lithium with {anion}: slightly soluble (the lithium exception)"
        return "dissolves", None, f"{cation} salts dissolve"
    if anion in _ALWAYS_SOLUBLE_ANIONS:
        return "dissolves", None, f"{anion} salts dissolve"
    if anion in _HALIDES:
        if cation in _HALIDE_INSOLUBLE:
            return "insoluble", None, f"halides of {cation} are insoluble"
        if cation in _HALIDE_SLIGHT:
            return "slightly_soluble", None, f"halides of {cation} are slightly soluble"
        return "dissolves", None, "chlorides, bromides and iodides dissolve"
    if anion == "F(-)":
        # rare earths and actinides (LaF3, CeF3, UF4, ThF4, PuF4: insoluble; CRC Handbook, from memory)
        rare_earth = element is not None and (group == 3 or get_element(element).series in ("Lanthanides", "Actinides"))
        if group == 2 and element != "Be" or cation == "Pb(2+)" or rare_earth:
            return "insoluble", None, f"fluorides of {cation} are insoluble"
        return "dissolves", None, "fluorides other than those of group 2, Pb and the rare earths dissolve"
    if anion == "SO4(2-)":
        if cation in _SULFATE_INSOLUBLE:
            return "insoluble", None, f"sulfate of {cation} is insoluble"
        if cation in _SULFATE_SLIGHT:
            return "slightly_soluble", None, f"sulfate of {cation} is slightly soluble"
        return "dissolves", None, "sulfates dissolve"
    if anion in _ANION_SOLUBILITY:
        usual, exceptions = _ANION_SOLUBILITY[anion]
        behaviour = exceptions.get(cation, usual)
        return behaviour, None, f"{anion} salts of {cation}: {behaviour.replace('_', ' ')} (solubility tables)"
    if anion == "CN(-)":
        # cyanides: those of group 2 and mercury(II) dissolve, the others (AgCN, CuCN, Zn(CN)2, Ni(CN)2) do not
        # (CRC Handbook, physical constants of inorganic compounds; from memory)
        if group == 2 or cation == "Hg(2+)":
            return "dissolves", None, f"cyanide of {cation} dissolves"
        if mixed and alkali:
            # beside an alkali metal the cyanide is a cyano complex (Na4[Co(CN)6], K[Au(CN)2]): it dissolves
            return "dissolves", None, "an alkali cyano complex dissolves"
        if cation == "Tl(+)":
            return None, None, f"no solubility guideline for {cation} with {anion}"
        return "insoluble", None, "cyanides other than those of groups 1 and 2 and Hg(2+) are insoluble"
    if anion == "OH(-)" and element in _HEAVY_ALKALINE_EARTH:
        return "slightly_soluble", None, f"hydroxide of {cation} is slightly soluble"
    if anion in _MOSTLY_INSOLUBLE:
        return "insoluble", None, f"{anion} salts are insoluble except those of group 1 and ammonium"
    return None, None, f"no solubility guideline for {cation} with {anion}"


def _salt_ions(dec: Decomposition):
    if dec.is_ionic:
        return dec.cations, dec.anions
    # a molecular or chain halide of a metal (HgCl2, ZnCl2) dissolves as its ions
    cations, anions = dec.formal_ions or ((), ())
    if anions and all(t.ion.ion_id in _HALIDES or t.ion.ion_id == "F(-)" for t in anions):
        return cations, anions
    return (), ()


def _salt(counts, dec) -> _Finding | None:
    cations, anions = _salt_ions(dec)
    if not cations or not anions:
        return None
    results, unknown = [], []
    alkali = any(t.ion.ion_id == "NH4(+)" or t.ion.element in _ALKALI for t in cations)
    for cation in cations:
        for anion in anions:
            behaviour, products, why = _pair(cation.ion.ion_id, cation.ion.element, anion.ion.ion_id,
                                             len(cations) > 1, alkali)
            (results if behaviour else unknown).append((behaviour, products, why))
    if unknown:
        return _finding(None, None, None, "solubility rules", "; ".join(w for _, _, w in unknown))
    results.sort(key=lambda r: _RANK[r[0]])
    behaviour = results[0][0]
    products = ";".join(dict.fromkeys(p for _, p, _ in results if p)) or None
    why = "; ".join(dict.fromkeys(w for _, _, w in results))
    if behaviour == "insoluble":
        return _finding(behaviour, None, None, "solubility rules", why)
    if behaviour == "reacts":
        return _finding(behaviour, "basic" if "hydroxide (heat)" in (products or "") or "H2S" in (products or "")
                        else None, products, "solubility rules", why)
    ph, ph_why = salt_ph(cations, anions)
    return _finding(behaviour, ph, products, "solubility rules", why + ph_why)


_INSOLUBLE_CLASSES = frozenset({"covalent_network", "semiconductor", "intermetallic", "metallic"})


def _insoluble_solid(counts, dec) -> _Finding | None:
    if dec.substance_class in _INSOLUBLE_CLASSES:
        return _finding("insoluble", None, None, "insoluble solid",
                        f"{dec.substance_class.replace('_', ' ')}: insoluble")
    return None


# fluoro anions that water hydrolyses to HF, slowly at room temperature and faster with acid, heat or
# a Lewis-acidic cation (PF6-: Swatloski, Holbrey and Rogers, Green Chem. 2003, 5, 361, on [C4mim][PF6];
# Kawamura et al., J. Power Sources 2006, 156, 547, on LiPF6; BF4-: Freire et al., J. Phys. Chem. A
# 2010, 114, 3744; from memory)
HF_RELEASING_ANIONS = frozenset({"PF6(-)", "BF4(-)"})


def _fluoro_anion(counts, dec) -> _Finding | None:
    """A salt of PF6- or BF4-: its solubility as the ionic-liquid or salt rule gives it, with HF as the
    product of its slow hydrolysis and an acidic solution; LiPF6, which moist air already decomposes,
    reacts."""
    found = [t.ion.ion_id for t in dec.anions if t.ion.ion_id in HF_RELEASING_ANIONS]
    if not found:
        return None
    base = _ionic_liquid(counts, dec) or _salt(counts, dec)
    if base is None:
        return None
    if "PF6(-)" in found and any(t.ion.ion_id == "Li(+)" for t in dec.cations):
        return _finding("reacts", "acidic", "HF;POF3", "fluoro anion",
                        "LiPF6 hydrolyses in water and in moist air to LiF, POF3 and HF (Kawamura et al. 2006)")
    return _finding(base.behaviour, "acidic", "HF", "fluoro anion",
                    f"{base.why}; {', '.join(found)} hydrolyses slowly to HF, faster with acid or heat")


#: the rules in order; the first that returns a finding decides
RULES = (_water, _metal_alkyl, _element, _binary, _fuming_halide, _interhalogen, _molecular_hydride, _acyl_halide,
         _organic_reactive_group, _metal_amide, _alkoxide, _halometallate, _oxo_salt, _anhydride, _acid, _molecular_base, _organic,
         _fluoro_anion, _ionic_liquid, _salt, _insoluble_solid)


@protocol(
    title="Behaviour in water (screening rules, not a hazard assessment):",
    columns=COLUMNS, result=WaterValues, failure="water behaviour not computed",
    summary=value_lines({name: ("", "") for name in ("water_behaviour", "solution_ph", "water_reaction_products")}),
)
def analyse(dec: Decomposition) -> WaterValues:
    """How one compound behaves in water, by the first rule that applies.

    Examples
    --------
    >>> from ionicity.scorer.model import Decomposition
    >>> r = analyse(Decomposition(composition=(("Na", 1.0),), substance_class="metallic"))
    >>> r.water_behaviour, r.solution_ph, r.water_reaction_products
    ('reacts_violently', 'basic', 'H2')
    """
    counts = _counts(dec)
    found = None
    for rule in RULES:
        found = rule(counts, dec)
        if found is not None:
            break
    if found is None:
        return WaterValues(notes=("water_behaviour: no rule of scorer.water applies",),
                           steps=("no rule applies: values left empty",))
    notes = []
    products = found.products
    if found.behaviour is None:
        notes.append(f"water_behaviour: {found.why}")
    elif products is None:
        products = "none"
    if found.behaviour is not None and found.ph is None:
        notes.append("solution_ph empty: " + (
            "insoluble, no solution to take the pH of" if found.behaviour == "insoluble"
            else "no hydrolysis constant or rule here gives the pH"))
    if found.caution:
        notes.append(found.caution)
    if found.behaviour in ("reacts", "reacts_violently") or found.ph in ("acidic", "basic"):
        notes.append(WATER_CAUTION)
    return WaterValues(
        water_behaviour=found.behaviour, solution_ph=found.ph, water_reaction_products=products,
        notes=tuple(notes), steps=(f"rule '{found.rule}': {found.why}",),
    )


describe = analyse.describe
explain = analyse.explain
