"""What mixing the components of a mixture row can do: an oxidiser beside an acid or a fuel, water beside a
compound that reacts with it.

A mixture row (:mod:`scorer.mixture`) is scored from its components, each a
compound of its own. Some pairs are hazards that no single component shows:

* an **oxidiser** (a component with an oxidising anion, ``OXIDISING_ANIONS``
  of :mod:`scorer.melting_anions` with hypochlorite, hypobromite, iodate,
  peroxodisulfate and peroxide; or hydrogen peroxide, ozone or a halogen)
  beside an **acid**: aqua regia (HCl with HNO3) gives chlorine and nitrosyl
  chloride, bleach with an acid gives chlorine, piranha (H2SO4 with H2O2)
  attacks organic matter violently;
* an oxidiser beside a **fuel** (carbon compounds, ammonia and the ammonium-like
  cations, the metals, carbon, sulfur, phosphorus): bleach with ammonia gives
  chloramines; nitrates, chlorates and perchlorates with fuels burn or explode.

* **water** beside a compound whose own row says it reacts with water
  (``water_behaviour`` ``reacts`` or ``reacts_violently``: AlCl3, SOCl2, Na,
  NaH, CaC2, P4O10): the blend is a reaction, and its liquidus is left out.

The row gets a warning naming the pair, and a row with an acid or a base among
its components the corrosion note that solutions of acids and bases carry. A
rule of thumb (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed.,
2007; Urben; from memory), not a compatibility table: the safety data sheets,
local codes and qualified people decide.

>>> mixing_warning([("HCl", "acid", "H(+)*1", "Cl(-)*1"), ("HNO3", "acid", "H(+)*1", "NO3(-)*1")])[:60]
'mixing hazard: HNO3 is an oxidiser and HCl an acid: such mix'
>>> mixing_warning([("NaNO3", "ionic_salt", "Na(+)*1", "NO3(-)*1"), ("KNO3", "ionic_salt", "K(+)*1", "NO3(-)*1")])
''
"""
from __future__ import annotations

from ionicity.scorer.elements import is_metal
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.melting_anions import FUEL_CATIONS, MOLECULAR_OXIDISERS, OXIDISING_ANIONS

__all__ = ["mixing_warning", "corrosive_note", "water_reaction_warning"]

_OXIDISING_IONS = OXIDISING_ANIONS | frozenset({"ClO(-)", "BrO(-)", "IO3(-)", "S2O8(2-)", "O2(2-)", "IO4(-)",
                                                 "SO5(2-)", "HSO5(-)"})
# molecules and elements that oxidise (common practice; melting_anions.MOLECULAR_OXIDISERS, and bromine)
_OXIDISING_FORMULAS = MOLECULAR_OXIDISERS | frozenset({"Br2"})
# elements that burn: the metals, and C, S, P, B, Si (black powder is KNO3 with S and C; common practice)
_FUEL_ELEMENTS = frozenset({"C", "S", "P", "B", "Si", "H"})
_FUEL_FORMULAS = frozenset({"NH3", "N2H4"})


def _ion_ids(text: str | None) -> set[str]:
    return {part.rsplit("*", 1)[0] for part in (text or "").split(";") if part}


def _elements(formula: str) -> set[str]:
    try:
        return {s for s, _ in parse_formula(formula).counts}
    except FormulaError:
        return set()


def _oxidiser(name: str, anions: str | None) -> bool:
    return name in _OXIDISING_FORMULAS or bool(_ion_ids(anions) & _OXIDISING_IONS)


def _fuel(name: str, substance_class: str, cations: str | None) -> bool:
    if name in _FUEL_FORMULAS or _ion_ids(cations) & FUEL_CATIONS:
        return True
    if any(ion.startswith("[") or ion[:1] == "C" and ion[1:2].isupper() for ion in _ion_ids(cations)):
        return True  # an organic cation ([C4mim](+), choline): a fuel
    elements = _elements(name)
    if substance_class in ("element", "metallic", "intermetallic"):
        return any(is_metal(s) or s in _FUEL_ELEMENTS for s in elements)
    # a carbon compound that is not a salt of an inorganic carbon anion (carbonate, cyanide): a fuel
    return substance_class in ("covalent_molecular", "ionic_liquid_pair", "acid", "base") and {"C", "H"} <= elements


# the two kinds of active-chlorine pool chemical that must never meet: a hypochlorite and a chloroisocyanurate
# (trichloroisocyanuric acid, dichloroisocyanurate); mixed they heat, can ignite and give off nitrogen trichloride
# (common practice; Bretherick's Handbook of Reactive Chemical Hazards, 7th ed., 2007; from memory)
_HYPOCHLORITES = frozenset({"ClO(-)"})
_CHLOROISOCYANURATES = frozenset({"C3Cl3N3O3", "C3Cl2N3O3(-)"})


def _chloroisocyanurate(name: str, anions: str | None) -> bool:
    return name in _CHLOROISOCYANURATES or bool(_ion_ids(anions) & _CHLOROISOCYANURATES)


def mixing_warning(components) -> str:
    """The warning of a mixture whose components include an oxidiser and an acid or a fuel, or a hypochlorite
    and a chloroisocyanurate; "" otherwise.

    ``components``: (name, substance_class, cations, anions) per component, the columns of its row.

    >>> mixing_warning([("Ca(ClO)2", "ionic_salt", "Ca(2+)*1", "ClO(-)*2"), ("C3Cl3N3O3", "covalent_molecular", "", "")])[:70]
    'mixing hazard: Ca(ClO)2 (a hypochlorite) and C3Cl3N3O3 (a chloroisocya'
    """
    hypochlorite = next((name for name, _, _, anions in components if _ion_ids(anions) & _HYPOCHLORITES), None)
    isocyanurate = next((name for name, _, _, anions in components if _chloroisocyanurate(name, anions)), None)
    if hypochlorite and isocyanurate:
        return (f"mixing hazard: {hypochlorite} (a hypochlorite) and {isocyanurate} (a chloroisocyanurate) must never"
                " be mixed: together they heat, can ignite and give off nitrogen trichloride and chlorine; keep them"
                " apart in storage and follow the safety data sheets, local codes and qualified people"
                " (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed., 2007; from memory)")
    for i, (name, _, _, anions) in enumerate(components):
        if not _oxidiser(name, anions):
            continue
        for j, (other, cls, cations, other_anions) in enumerate(components):
            if j == i:
                continue
            if cls == "acid":
                kind = "an acid"
            elif _fuel(other, cls, cations):
                kind = "a fuel"
            else:
                continue
            return (
                f"mixing hazard: {name} is an oxidiser and {other} {kind}: such mixtures can release toxic gases"
                " (chlorine, nitrogen oxides, chloramines) or react violently; make them only under a written"
                " procedure, never keep them closed, and follow the safety data sheets, local codes and qualified"
                " people (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed., 2007; from memory)"
            )
    return ""


def corrosive_note(components) -> str:
    """The note of a mixture with an acid or a base among its components; "" otherwise."""
    corrosive = [name for name, cls, _, _ in components if cls in ("acid", "base")]
    if not corrosive:
        return ""
    return (f"{', '.join(corrosive)} make the mixture corrosive: read the safety data sheets before handling,"
            " diluting or mixing it")


def water_reaction_warning(components) -> str:
    """The warning of a mixture of water with a compound that reacts with water; "" otherwise.

    ``components``: (name, formula_normalized, water_behaviour, water_reaction_products) per component.

    >>> water_reaction_warning([("AlCl3", "AlCl3", "reacts_violently", "HCl"), ("H2O", "H2O", "miscible", None)])[:58]
    'mixing hazard: AlCl3 reacts violently with water, giving H'
    >>> water_reaction_warning([("NaCl", "NaCl", "dissolves", None), ("H2O", "H2O", "miscible", None)])
    ''
    """
    if not any(formula == "H2O" for _, formula, _, _ in components):
        return ""
    for name, formula, behaviour, products in components:
        if formula != "H2O" and behaviour in ("reacts", "reacts_violently"):
            how = "reacts violently" if behaviour == "reacts_violently" else "reacts"
            giving = f", giving {products.replace(';', ', ')}" if products else ""
            return (f"mixing hazard: {name} {how} with water{giving}: put together they react rather than mix, so no"
                    " liquidus is estimated; add such a compound to water only under a written procedure, in small"
                    " portions with cooling and ventilation, following its safety data sheet, local codes and"
                    " qualified people (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed., 2007; from"
                    " memory)")
    return ""
