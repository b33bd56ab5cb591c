"""A generated IUPAC-style name for every ionic row (column ``systematic_name``).

Compositional names of the IUPAC Red Book 2005 (IR-5): cation names, then
anion names, each group in alphabetical order (IR-5.4); the oxidation number
in Roman numerals after a metal that has several (Stock names, IR-5.4.2.2:
``iron(III) sulfate``), never after a fixed-valence one (``sodium``,
``aluminium``, ``zinc``); dimercury(2+) as ``mercury(I)``; polyatomic,
complex and ionic-liquid ions by the names of the ion library
(``scorer/data/ions.csv``), monatomic anions by their ``-ide`` names
(``scorer/data/name_words.csv``). Counts follow from charge balance and are
left out, as in Stock names; where they do not (a metal in two oxidation
states, Fe3O4), multiplicative prefixes say them (``iron(II) diiron(III)
tetraoxide``). Every generated name is read back by
:func:`scorer.name_reader.read_name_by_rule` and kept only if it means the same
composition, so a name this column gives can relabel an inventory.
Acids get their classical names (``sulfuric acid``, ``hydrochloric acid``).

Lattice water is added by :mod:`scorer.record` for each hydrate
(:func:`hydrate_words`: ``copper(II) sulfate pentahydrate``), as it adds the
water to ``formula_normalized``: the descriptors see the anhydrous salt.
Non-ionic rows get no name.

>>> from ionicity.scorer.ions import decompose
>>> from ionicity.scorer.formula import parse_formula
>>> [analyse(decompose(parse_formula(f))).systematic_name for f in ("Fe2(SO4)3", "NaCl", "Hg2Cl2", "[C4mim][BF4]")]
['iron(III) sulfate', 'sodium chloride', 'mercury(I) chloride', '1-butyl-3-methylimidazolium tetrafluoridoborate']
>>> hydrate_words(5), hydrate_words(0.5), hydrate_words(18)
('pentahydrate', 'hemihydrate', 'octadecahydrate')
"""
from __future__ import annotations

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.descriptor import protocol, result_class
from ionicity.scorer.elements import get_element
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.model import Column, Decomposition, Ion, IonTerm
from ionicity.scorer.name_reader import read_name_by_rule
from ionicity.scorer.tables import table

__all__ = ["GROUP", "COLUMNS", "SystematicName", "analyse", "describe", "explain", "hydrate_words", "ion_name"]

GROUP = "audit"

COLUMNS: tuple[Column, ...] = (
    Column(
        "systematic_name", "string", "",
        "a generated IUPAC-style compositional name (Stock numbers for metals of several oxidation states,"
        " hydrate words, ionic-liquid ions by the ion library's names); empty for non-ionic rows",
        "cation names then anion names, counts by charge balance, read back to check",
        "IUPAC Red Book 2005, IR-5 (compositional names) and IR-9 (coordination names)",
    ),
)

SystematicName = result_class("SystematicName", COLUMNS, "The generated name of one compound.")

_IONIC = frozenset({"ionic_salt", "ionic_liquid_pair", "base", "ion", "acid"})
# metals named without an oxidation number at their usual charge (Red Book 2005, IR-5.4.2.2: the
# number may be omitted where no ambiguity arises); lanthanides with a common +2 or +4 state keep it
_FIXED_EXTRA = {"Al": 3, "Ga": 3, "In": 3, "Sc": 3, "Y": 3, "La": 3, "Zn": 2, "Cd": 2, "Ag": 1}
_VARIABLE_LANTHANIDES = {"Ce", "Eu", "Sm", "Yb", "Tm"}
_SPELLING = {"aluminum": "aluminium", "cesium": "caesium"}
_ROMAN = ("0", "I", "II", "III", "IV", "V", "VI", "VII", "VIII")
_UNITS = ("", "hen", "di", "tri", "tetra", "penta", "hexa", "hepta", "octa", "nona")
_SMALL = {1: "mono", 2: "di", 3: "tri", 4: "tetra", 5: "penta", 6: "hexa", 7: "hepta", 8: "octa", 9: "nona",
          10: "deca", 11: "undeca", 12: "dodeca", 20: "icosa"}


def multiplier(n: int) -> str:
    """The IUPAC multiplicative prefix of ``n`` (Red Book 2005, Table IV).

    >>> multiplier(2), multiplier(12), multiplier(13), multiplier(24)
    ('di', 'dodeca', 'trideca', 'tetracosa')
    """
    if n in _SMALL:
        return _SMALL[n]
    if 13 <= n <= 19:
        return _UNITS[n - 10] + "deca"
    if 21 <= n <= 29:
        return _UNITS[n - 20] + "cosa"
    return f"{n}-"


def hydrate_words(water: float) -> str:
    """The hydrate word of a lattice-water count: ``hemihydrate``,
    ``monohydrate``, ``sesquihydrate``, ``pentahydrate``; other fractions as
    ``2.5-hydrate``."""
    if water == 0.5:
        return "hemihydrate"
    if water == 1.5:
        return "sesquihydrate"
    if water == int(water) and 1 <= water < 30:
        return multiplier(int(water)) + "hydrate"
    return f"{water:g}-hydrate"


@once
def _anion_words() -> dict[tuple[str, int], str]:
    words: dict[tuple[str, int], str] = {}
    for row in table("name_words.csv"):
        if row["kind"] == "anion_element":
            words.setdefault((row["value"], int(row["charge"])), row["word"])
    return words


def _element_name(symbol: str) -> str:
    name = get_element(symbol).name.lower()
    return _SPELLING.get(name, name)


def _needs_stock(symbol: str, charge: int) -> bool:
    element = get_element(symbol)
    if element.group == 1 and charge == 1 or element.group == 2 and charge == 2:
        return False
    if _FIXED_EXTRA.get(symbol) == charge:
        return False
    if element.block == "f" and 57 <= element.atomic_number <= 71 and symbol not in _VARIABLE_LANTHANIDES:
        return charge != 3
    return element.is_metal


@per_input(maxsize=4096)
def ion_name(ion: Ion) -> str | None:
    """The name of one ion as a salt name uses it.

    >>> from ionicity.scorer.ion_library import get_ion
    >>> ion_name(get_ion("Fe(3+)")), ion_name(get_ion("Cl(-)")), ion_name(get_ion("HCO3(-)"))
    ('iron(III)', 'chloride', 'hydrogencarbonate')
    """
    if ion.label == "Hg2" and ion.charge == 2:
        return "mercury(I)"
    if ion.monatomic:
        if ion.charge > 0:
            name = _element_name(ion.element)
            if _needs_stock(ion.element, ion.charge) and 0 < ion.charge < len(_ROMAN):
                name += f"({_ROMAN[ion.charge]})"
            return name
        return _anion_words().get((ion.element, ion.charge))
    name = ion.name.partition(" (")[0].split(";")[0].strip()
    return name or None


def _group(terms: tuple[IonTerm, ...], counted: bool) -> list[str] | None:
    names = []
    for term in terms:
        name = ion_name(term.ion)
        if name is None:
            return None
        if counted and term.count != 1:
            if term.count != int(term.count):
                return None
            prefix = multiplier(int(term.count))
            bracket = not term.ion.monatomic or name[0].isdigit()
            prefix = {"di": "bis", "tri": "tris", "tetra": "tetrakis"}.get(prefix, prefix + "kis") if bracket else prefix
            name = f"{prefix}({name})" if bracket else prefix + name
        names.append(name)
    return sorted(names, key=lambda n: n.lstrip("0123456789-,").lower())


def _ion_composition(dec: Decomposition) -> tuple:
    """Element counts of the formula unit summed from its ions."""
    counts: dict[str, float] = {}
    for term in dec.cations + dec.anions:
        for symbol, n in term.ion.composition:
            counts[symbol] = counts.get(symbol, 0.0) + n * term.count
    return tuple(counts.items())


def _same(name: str, composition) -> bool:
    text = read_name_by_rule(name)
    if text is None:
        return False
    try:
        parsed = parse_formula(text)
    except FormulaError:
        return False
    total = {s: round(n, 6) for s, n in parsed.total_counts.items()}
    return total == {s: round(n, 6) for s, n in composition}


def _acid_name(dec: Decomposition) -> str | None:
    if len(dec.anions) != 1:
        return None
    anion = ion_name(dec.anions[0].ion)
    if anion is None:
        return None
    if anion.endswith("ide"):
        return "hydro" + anion[:-3] + "ic acid"
    stem, end = (anion[:-3], "ic") if anion.endswith("ate") else (anion[:-3], "ous") if anion.endswith("ite") else (None, None)
    if stem is None:
        return None
    if stem in ("sulf", "phosph"):
        stem += "ur" if stem == "sulf" else "or"
    return f"{stem}{end} acid"


_NO_NAME = "systematic_name: no generated name reads back as this formula"


@protocol(title="Systematic name (IUPAC Red Book 2005, IR-5 compositional names):", columns=COLUMNS,
          result=SystematicName, failure="systematic name not computed")
def analyse(dec: Decomposition) -> SystematicName:
    """The generated name of an ionic compound (see the module docstring)."""
    if dec.substance_class not in _IONIC or not (dec.cations or dec.anions):
        return SystematicName(steps=("not generated: not an ionic compound",))
    if dec.substance_class == "acid" and all(t.ion.label == "H" for t in dec.cations):
        name = _acid_name(dec)
        if name and _same(name, _ion_composition(dec)):
            return SystematicName(systematic_name=name, steps=(f"{name} (classical acid name, read back)",))
        return SystematicName(notes=(_NO_NAME,), steps=(_NO_NAME,))
    if not dec.cations or not dec.anions:
        if len(dec.cations + dec.anions) == 1:
            name = ion_name((dec.cations + dec.anions)[0].ion)
            return SystematicName(systematic_name=name, steps=(f"{name} (the ion's name)",))
        return SystematicName(notes=(_NO_NAME,), steps=(_NO_NAME,))
    for counted in (False, True):
        cations, anions = _group(dec.cations, counted), _group(dec.anions, counted)
        if cations is None or anions is None:
            return SystematicName(notes=(_NO_NAME,), steps=(_NO_NAME,))
        name = " ".join(cations + anions)
        if _same(name, _ion_composition(dec)):
            how = "counts by multiplicative prefixes" if counted else "counts by charge balance"
            return SystematicName(systematic_name=name, steps=(f"{name} (cations, then anions; {how}; read back)",))
    return SystematicName(notes=(_NO_NAME,), steps=(_NO_NAME,))


describe = analyse.describe
explain = analyse.explain
