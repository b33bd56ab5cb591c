"""Read a compound's name and return the formula it means: :func:`read_name`.

The name is cut into known words (:mod:`scorer.name_vocabulary`), then read
by a small grammar of IUPAC compositional nomenclature (IUPAC Red Book 2005,
IR-5) with the older names still on labels:

* cations, then anions: ``sodium chloride``; several cations of a double
  salt (``potassium aluminium sulfate``, ``ammonium iron(II) sulfate``);
* oxidation numbers and charges: ``iron(III) chloride`` (Stock),
  ``iron(3+)``, ``hexacyanidoferrate(3-)`` (Ewens-Bassett); classical
  ``-ous``/``-ic`` names (``ferric``, ``cuprous``, ``mercurous`` = Hg2(2+));
* multiplicative prefixes read literally (``dinitrogen pentoxide``,
  ``disodium hydrogenphosphate``, ``calcium bis(dihydrogenphosphate)``);
  without them the counts follow from charge balance;
* acid salts: ``hydrogen``/``dihydrogen`` before an anion and the ``bi-``
  of the trade (``sodium bicarbonate``, ``potassium bisulfate``);
* every ion name of the ion library (oxoanions, thio-, peroxide, azide,
  amide, ionic-liquid ions...), and coordination entities built from ligand
  names and the central atom (``hexaamminecobalt(III)``,
  ``tetrachloridoplatinate(II)``, ``tris(ethylenediamine)cobalt(III)``);
* hydrate words (``hemihydrate``, ``pentahydrate``, ``sesquihydrate``,
  ``5-hydrate``, ``anhydrous``) and the Red Book's ``—water (1/5)``;
* acids by the classical names (``perchloric acid``, ``nitrous acid``,
  ``hydrobromic acid``), and a table of trivial names with their sources
  (``scorer/data/trivial_names.csv``: ``baking soda``, ``calomel``...).

The result is formula text the scorer parses; :mod:`scorer.name_check`
normalises it as every formula is normalised. :func:`read_name` never raises:
a name it cannot read gives ``None``.

>>> read_name("iron(III) sulfate")
'Fe2(SO4)3'
>>> read_name("Copper(II) sulphate pentahydrate")
'CuSO4·5H2O'
>>> read_name("mercurous chloride"), read_name("dinitrogen pentoxide")
('Hg2Cl2', 'N2O5')
>>> read_name("potassium hexacyanidoferrate(III)"), read_name("sodium bicarbonate")
('K3[Fe(CN)6]', 'NaHCO3')
>>> read_name("1-butyl-3-methylimidazolium tetrafluoroborate")
'[C4mim][BF4]'
>>> read_name("Epsom salt"), read_name("no such thing") is None
('MgSO4·7H2O', True)
"""
from __future__ import annotations

import dataclasses
import re

from ionicity.scorer.alkoxides import alkoxide_name_formula
from ionicity.scorer.metal_amides import metal_amide_name_formula
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.carboxylates import CARBOXYLATE_SOURCE
from ionicity.scorer.elements import is_element_symbol, is_metal
from ionicity.scorer.formula import NONACID_MOLECULE_HINT, ONIUM_NAME_HINT, FormulaError, parse_formula
from ionicity.scorer.onium_groups import GROUP_WORDS, onium_formula_from_groups
from ionicity.scorer.name_grammar import (NameReading, Part, Reader, count_text, formula_text, parts_text, unsaid_readings,
                                         usual_charge)
from ionicity.scorer.name_vocabulary import MAX_NAME_LENGTH, compact, tokenise
from ionicity.scorer.onium_codes import ALKYL_NAMES, canonical_quaternary_code
from ionicity.scorer.registry_formulas import registry_knows
from ionicity.scorer.tables import table

__all__ = ["read_name", "read_name_by_rule", "NameReading", "read_name_parts", "parse_as_name"]


_HYDRATE_WATER = re.compile(r"\s*[\u2014\u2013\-]\s*water\s*\(\s*1\s*/\s*(\d+(?:\.\d+)?)\s*\)\s*$", re.I)
_ACID = re.compile(r"^(?P<stem>.+?)(?P<end>ic|ous)acid$")


@once
def _trivial() -> dict[str, str]:
    out = {compact(row["name"]): row["formula"] for row in table("trivial_names.csv")}
    # an eponymous salt without its possessive s ("Mohr salt", "Glauber salt" for Mohr's, Glauber's salt)
    out.update({key[:-len("ssalt")] + "salt": formula for key, formula in list(out.items())
                if key.endswith("ssalt") and key[:-len("ssalt")] + "salt" not in out})
    return out


def trivial_name_formula(name: str) -> str | None:
    """The formula ``scorer/data/trivial_names.csv`` gives a trivial or trade name, or None.

    >>> trivial_name_formula("Epsom salt"), trivial_name_formula("sodium chloride")
    ('MgSO4·7H2O', None)
    """
    return _trivial().get(compact(name))


def read_name(name) -> str | None:
    """The formula text ``name`` means, or ``None`` when it cannot be read.

    Case-insensitive; extra spaces and hyphens do not matter (the reading is
    cached per compact key, so ``SODIUM CHLORIDE`` costs a lookup once
    ``sodium chloride`` was read). Never raises.
    """
    return _read_name(name)[0]


def read_name_by_rule(name) -> str | None:
    """:func:`read_name` without the registry's table of names: the grammar, the trivial names and the names of
    protonated bases only. The systematic-name check reads back names it generated itself, which that table
    cannot help with (it held one random formula's first read at about 50 ms while the table loaded)."""
    return _read_name(name, registry=False)[0]


def _read_name(name, registry: bool = True) -> tuple[str | None, tuple[str, str, str, str, str] | None]:
    """(:func:`read_name`'s formula, the registry entry it came from or None): the grammar and the trivial
    names first; the registry's names (:func:`registry_entry`) only where they read nothing, so a name the
    grammar reads never loads that table (nor any name, with ``registry`` False)."""
    if not isinstance(name, str) or not name.strip() or len(name) > MAX_NAME_LENGTH:
        return None, None
    try:
        formula = _read_text(name)
    except Exception:  # a name must never stop a batch: what cannot be read is unread
        return None, None
    entry = None
    if formula is None:
        formula = _hydrohalide_name(name)
    if formula is None:
        formula = _protonated_base_name(name)
    if formula is None:
        formula = _tetraalkyl_onium_name(name)
    if formula is None:
        formula = _substituted_onium_name(name)
    if formula is None:
        # metal alkoxides and alkali-metal amides named so (titanium isopropoxide, lithium diisopropylamide):
        # written by their groups, which the parser reads (scorer.alkoxides, scorer.metal_amides)
        formula = alkoxide_name_formula(name) or metal_amide_name_formula(name)
    if formula is None:
        entry = registry_entry(name) if registry else None
        if entry is None:
            return None, None
        formula = entry[0]
    # the elements that are diatomic molecules as substances: "iodine" on a bottle is I2
    # (IUPAC Red Book 2005, IR-3.4.2: dihydrogen, dichlorine; common practice for the bare names)
    return (formula + "2" if formula in _DIATOMIC else formula), entry


_DIATOMIC = frozenset({"H", "N", "O", "F", "Cl", "Br", "I"})

# a tetraalkylammonium or -phosphonium salt named by its four n-alkyl groups ("tributylmethylammonium chloride",
# "trihexyl(tetradecyl)phosphonium bromide", "cetyltrimethylammonium bromide"); the trivial chain names of
# surfactant chemistry (lauryl 12, myristyl 14, cetyl and palmityl 16, stearyl 18; common practice)
_TETRAALKYL_ONIUM_NAME = re.compile(r"^\s*(?P<groups>[a-z()\s-]+?)(?P<kind>ammonium|phosphonium)\s+(?P<anion>\S.*)$",
                                    re.I)
_ALKYL_CHAINS = {name: n for n, name in enumerate(ALKYL_NAMES, start=1)}
_ALKYL_CHAINS.update({"lauryl": 12, "myristyl": 14, "cetyl": 16, "palmityl": 16, "stearyl": 18})
_ALKYL_NAMES = "|".join(sorted(_ALKYL_CHAINS, key=len, reverse=True))
# a chain's own name first: "tetradecyl" is C14 and "tridecyl" C13, not four or three decyl groups
_ALKYL_GROUP = re.compile(rf"\(?(?:(?P<alkyl>{_ALKYL_NAMES})|(?P<n>di|tri|tetra)\(?(?P<multiplied>{_ALKYL_NAMES}))\)?",
                          re.I)
_MULTIPLIER = {None: 1, "di": 2, "tri": 3, "tetra": 4}
_SODIUM_SALT = re.compile(r"Na(\d*)(?P<rest>.+)")


def _tetraalkyl_onium_name(name: str) -> str | None:
    """The formula of a tetraalkylammonium or -phosphonium salt named by its alkyl groups, written with the
    onium code of :mod:`scorer.onium_codes` (``tributylmethylammonium chloride`` -> ``[N1444]Cl``); None for any
    other name, or four chains no code writes (two of ten carbons or more). The anion is read as the sodium
    salt's (``sodium chloride``), so every anion the name grammar reads may follow.

    >>> _tetraalkyl_onium_name("tributylmethylammonium chloride"), _tetraalkyl_onium_name("dimethyl sulfate")
    ('[N1444]Cl', None)
    """
    m = _TETRAALKYL_ONIUM_NAME.match(name)
    if m is None:
        return None
    groups = re.sub(r"[\s-]", "", m.group("groups"))
    chains: list[int] = []
    position = 0
    while position < len(groups):
        g = _ALKYL_GROUP.match(groups, position)
        if g is None or g.end() == position:
            return None
        alkyl = (g.group("alkyl") or g.group("multiplied")).lower()
        chains += [_ALKYL_CHAINS[alkyl]] * _MULTIPLIER[(g.group("n") or "").lower() or None]
        position = g.end()
    if len(chains) != 4:
        return None
    code = canonical_quaternary_code(("N" if m.group("kind").lower() == "ammonium" else "P")
                                     + ",".join(str(c) for c in chains))
    if code is None:
        return None
    sodium_salt, _ = _read_name("sodium " + m.group("anion"), registry=False)
    salt = _SODIUM_SALT.fullmatch(sodium_salt or "")
    if salt is None:
        return None
    return f"[{code}]{salt.group(1)}{salt.group('rest')}"

# any other quaternary onium salt named by its groups ("benzyltriethylammonium chloride",
# "tetraphenylphosphonium bromide", "methyltriphenylphosphonium bromide", "didecyldimethylammonium chloride",
# "trimethylsulfonium iodide"; IUPAC Recommendations 2013, P-73.1.2, substitutive names of onium cations; from
# memory): the salt written by its groups (scorer.onium_groups), which the parser reads as that cation
_ONIUM_WORDS = {"ammonium": "N", "phosphonium": "P", "arsonium": "As", "sulfonium": "S"}
_SUBSTITUENT_ONIUM_NAME = re.compile(
    r"^\s*(?P<groups>[a-z0-9(),\s-]+?)(?P<kind>ammonium|phosphonium|arsonium|sulfonium)\s+(?P<anion>\S.*)$", re.I)
# the groups of scorer.onium_groups by their names without locants ("2-hydroxyethyl" read as hydroxyethyl after
# its locant), the surfactant chain names and phenethyl
_GROUP_FORMULAS = {**{re.sub(r"^\d+-", "", word): formula for formula, word in GROUP_WORDS.items()},
                   **{name: f"C{n if n > 1 else ''}H{2 * n + 1}" for name, n in _ALKYL_CHAINS.items()},
                   "phenethyl": "C8H9"}
_GROUP_NAMES = "|".join(sorted(_GROUP_FORMULAS, key=len, reverse=True))
_SUBSTITUENT = re.compile(
    rf"\(?(?:\d+-)?(?P<alone>{_GROUP_NAMES})\)?|(?P<n>di|tri|tetra|bis|tris|tetrakis)\(?(?:\d+-)?"
    rf"(?P<group>{_GROUP_NAMES})\)?", re.I)
_GROUP_MULTIPLIER = {None: 1, "di": 2, "bis": 2, "tri": 3, "tris": 3, "tetra": 4, "tetrakis": 4}


def _substituted_onium_name(name: str) -> str | None:
    """The formula, written by its groups (:func:`scorer.onium_groups.onium_formula_from_groups`), of a
    quaternary ammonium, phosphonium or arsonium salt or a sulfonium salt named by its groups; None for any
    other name. Groups: the n-alkyl chains of :data:`_ALKYL_CHAINS` and the groups of
    :data:`scorer.onium_groups.GROUP_WORDS`; the anion is read
    as the sodium salt's and must be monovalent.

    >>> _substituted_onium_name("benzyltriethylammonium chloride"), _substituted_onium_name("tetraphenylphosphonium bromide")
    ('(C7H7)(C2H5)3NCl', '(C6H5)4PBr')
    >>> _substituted_onium_name("tris(2-hydroxyethyl)methylammonium hydroxide"), _substituted_onium_name("dimethyl sulfate")
    ('(C2H5O)3(CH3)NOH', None)
    """
    m = _SUBSTITUENT_ONIUM_NAME.match(name)
    if m is None:
        return None
    text = re.sub(r"\s", "", m.group("groups")).lower()
    groups: list[tuple[str, int]] = []
    position = 0
    while position < len(text):
        g = _SUBSTITUENT.match(text, position)
        if g is None or g.end() == position:
            return None
        # a group's own name first: "tetradecyl" is C14, not four decyl groups ("tridecyl" C13)
        groups.append((_GROUP_FORMULAS[g.group("alone") or g.group("group")], _GROUP_MULTIPLIER[g.group("n")]))
        position = g.end()
        while position < len(text) and text[position] in "-)":
            position += 1
    sodium_salt, _ = _read_name("sodium " + m.group("anion"), registry=False)
    salt = _SODIUM_SALT.fullmatch(sodium_salt or "")
    if salt is None or salt.group(1):
        return None
    return onium_formula_from_groups(groups, _ONIUM_WORDS[m.group("kind").lower()], salt.group("rest"))


# "aniline hydrochloride", "ethylenediamine dihydrochloride", "pyridine hydrobromide": a base and n HX
_HYDROHALIDE_NAME = re.compile(r"^(?P<base>.+?)[\s,]+(?P<n>mono|di|tri|tetra)?hydro(?P<x>chloride|bromide|iodide|fluoride)$",
                               re.I)
_HALIDE_OF = {"chloride": "Cl", "bromide": "Br", "iodide": "I", "fluoride": "F"}
_COUNT_OF = {None: 1, "mono": 1, "di": 2, "tri": 3, "tetra": 4}


def _hydrohalide_name(name: str) -> str | None:
    """The formula of an organic base's hydrohalide named so: the base's formula and n HX, written as the
    adduct (``C6H7N·HCl``) so that the solver protonates the base (``scorer.organic_cations``); None for any
    other name, or a base that is no organic molecule with nitrogen.

    >>> _hydrohalide_name("ethylenediamine dihydrochloride")
    'C2H8N2·2HCl'
    """
    m = _HYDROHALIDE_NAME.match(name.strip())
    if m is None:
        return None
    base, _ = _read_name(m.group("base"))
    if base is None or "·" in base:
        return None
    try:
        counts = dict(parse_formula(base).counts)
    except FormulaError:
        return None
    if "C" not in counts or "N" not in counts or any(is_metal(s) for s in counts):
        return None
    n = _COUNT_OF[(m.group("n") or "").lower() or None]
    return f"{base}·{'' if n == 1 else n}H{_HALIDE_OF[m.group('x').lower()]}"


# "pyridinium chloride", "anilinium bromide", "imidazolium chloride", "diethanolammonium chloride": the base's
# name with -ium (or -ammonium for an -amine) beside a halide, the base protonated (IUPAC Red Book 2005, IR-8.4:
# names of cations formed by adding a hydron; common practice)
_PROTONATED_BASE_NAME = re.compile(r"^(?P<stem>[A-Za-z0-9,()'-]+?)(?P<ium>ammonium|ium)\s+(?P<x>chloride|bromide|iodide"
                                   r"|fluoride)$", re.I)


def _protonated_base_name(name: str) -> str | None:
    """The formula of a halide named after its base protonated (``pyridinium chloride`` -> ``C5H5N·HCl``): the
    base's name is the stem with -ine or -e (pyridin-ium: pyridine; imidazol-ium: imidazole), or -amine for
    -ammonium (diethanolammonium: diethanolamine), read as the hydrohalide (:func:`_hydrohalide_name`); None for
    any other name or where no base of that name is an organic molecule with nitrogen.

    >>> _protonated_base_name("pyridinium chloride"), _protonated_base_name("imidazolium chloride")
    ('C5H5N·HCl', 'C3H4N2·HCl')
    """
    m = _PROTONATED_BASE_NAME.match(name.strip()) if isinstance(name, str) else None
    if m is None or len(m.group("stem")) < 4:
        return None
    stem, halide = m.group("stem"), m.group("x").lower()
    bases = [stem + "amine"] if m.group("ium").lower() == "ammonium" else [stem + "ine", stem + "e"]
    for base in bases:
        formula = _hydrohalide_name(f"{base} hydro{halide}")
        if formula is not None:
            return formula
    return None


# the catalogues' acid-salt names (common practice): "sodium phosphate dibasic" is Na2HPO4, "monobasic" NaH2PO4,
# "tribasic" Na3PO4 (the acid's protons replaced by the metal: one, two, three); "sodium citrate tribasic" the
# citrate; also written before the salt ("dibasic sodium phosphate")
_BASIC_AFTER = re.compile(r"\b(phosphate|citrate)\s*,?\s*(mono|di|tri)basic\b", re.I)
_BASIC_BEFORE = re.compile(r"\b(mono|di|tri)basic\s+(.+?)\s+(phosphate|citrate)\b", re.I)
_BASIC_ANION = {("phosphate", "mono"): "dihydrogenphosphate", ("phosphate", "di"): "hydrogenphosphate",
                ("phosphate", "tri"): "phosphate", ("citrate", "tri"): "citrate"}


def _basic_salt_name(name: str) -> str:
    """A catalogue's "sodium phosphate dibasic" written as the name grammar reads it: "sodium hydrogenphosphate"."""
    def after(m: re.Match) -> str:
        return _BASIC_ANION.get((m.group(1).lower(), m.group(2).lower()), m.group(0))

    def before(m: re.Match) -> str:
        anion = _BASIC_ANION.get((m.group(3).lower(), m.group(1).lower()))
        return f"{m.group(2)} {anion}" if anion else m.group(0)

    return _BASIC_BEFORE.sub(before, _BASIC_AFTER.sub(after, name))


# the ring nitrogen's locant written N (N-butyl-N-methylpyrrolidinium) where the library names the cation with
# locant 1 (1-butyl-1-methylpyrrolidinium; IUPAC Blue Book 2013, P-31.1.4: both are in use)
_N_LOCANTS = re.compile(r"\bN-([a-z]+yl)-N-([a-z]+yl)(?=pyrrolidinium|piperidinium|morpholinium|azepanium)", re.I)


def _read_text(name: str) -> str | None:
    name = _CAS_QUALIFIERS.sub("", name)
    if "N-" in name:
        name = _N_LOCANTS.sub(r"1-\1-1-\2", name)
    if "basic" in name.lower():
        name = _basic_salt_name(name)
    name = _CAS_HYDRATE.sub(lambda m: f" {m.group(1)}-hydrate", name)
    inverted = _CAS_SALT.match(name.strip())
    if inverted:
        return _inverted_salt(inverted)
    stated = _stated_formula(name)
    if stated is not None:
        return stated
    match = _HYDRATE_WATER.search(name)
    if match:
        # the Red Book's "copper(II) sulfate—water (1/5)"
        salt = _read_key(compact(name[: match.start()]))
        water = float(match.group(1))
        return None if salt is None or "·" in salt else salt + "·" + ("" if water == 1 else f"{water:g}") + "H2O"
    found = _read_key(compact(name)) or _as_formula(name)
    if found is None and "H2O" in name:
        # a name with its lattice water written as a formula ("Na2EDTA·2H2O", "EDTA disodium salt·2H2O")
        written = _WATER_AFTER_NAME.match(name)
        if written is not None:
            salt = _read_key(compact(written.group("name")))
            if salt is not None and "·" not in salt:
                return f"{salt}·{written.group('n') or ''}H2O"
    return found


# lattice water written after a name as a formula
_WATER_AFTER_NAME = re.compile(r"^(?P<name>.*?\S)\s*[·.*•]\s*(?P<n>\d+(?:\.\d+)?)?\s*H2O\s*$")


@once
def _registry() -> dict[str, tuple[str, str, str, str, str]]:
    """compact name -> (formula, CAS number, name as written, source, kind) of ``registry_names.csv``."""
    return {compact(row["name"]): (row["formula"], row["cas"], row["name"], row["source"], row["kind"])
            for row in table("registry_names.csv")}


# how a row's note names the source of a registry name (scorer/data/registry_names.csv)
_REGISTRY_SOURCES = {
    "CRC organic": "CRC Handbook organic table via the registry package chemicals",
    "CRC inorganic": "CRC Handbook inorganic table via the registry package chemicals",
    "PubChem": "PubChem common-chemical table via the registry package chemicals",
    "common practice": "a common name; formula of the CAS number from the registry package chemicals",
}


# "n-hexane" is the straight-chain isomer the handbook lists as Hexane (common practice)
_NORMAL_PREFIX = re.compile(r"\s*n-(?=[a-z])", re.I)


def registry_entry(name: str) -> tuple[str, str, str, str, str] | None:
    """(formula, CAS number, name as written, source, kind) of a name of the registry's handbook and common-chemical
    tables (``scorer/data/registry_names.csv``: Hexane, acetone, D-Glucose), or ``None``. The name reader takes
    these names last, when neither the name grammar nor the trivial names read the text.

    >>> registry_entry("Acetone")
    ('C3H6O', '67-64-1', 'Acetone', 'CRC organic', 'molecule')
    """
    if not isinstance(name, str):
        return None
    entry = _registry().get(compact(name))
    if entry is None and _NORMAL_PREFIX.match(name):
        entry = _registry().get(compact(_NORMAL_PREFIX.sub("", name, count=1)))
    return entry


# CAS index additions that say nothing about composition: editions "(8CI,9CI)",
# stereo descriptors "(T-4)-", "(OC-6-11)-"
_CAS_QUALIFIERS = re.compile(r",?\s*\((?:\d+CI,?\s*)+\)|,?\s*\((?:T|OC|SP|TB|SPY|TBPY)-[\d-]+\)-?")
# "hydrate (1:6)": one formula unit to six water
_CAS_HYDRATE = re.compile(r",?\s*hydrate\s*\(1:(\d+(?:\.\d+)?)\)", re.I)
# a formula written in the name: "magnesium chloride (MgCl2)", "iron fluoride (FeF2), tetrahydrate", and after a
# comma as stock lists write it: "Potassium nitrate, KNO3"
_WORD_TOKEN = re.compile(r"(?<![A-Za-z0-9])[A-Z][A-Za-z0-9]*")


def _holds_a_formula(text: str) -> bool:
    """Whether ``text`` holds a word that is a formula of two or more element symbols or with a count (NaCl,
    KCl, H2O), not a name's capitalised word ("Iron"), a Stock numeral ("III") or a grade code ("ACS").

    >>> _holds_a_formula("NaCl,, LiCl (30-20-50 mol%)"), _holds_a_formula("Iron(III) chloride, ACS")
    (True, False)
    """
    for token in _WORD_TOKEN.findall(text):
        if re.fullmatch(r"[IVX]+", token) or not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", token):
            continue
        symbols = re.findall(r"[A-Z][a-z]?", token)
        if (len(symbols) > 1 or re.search(r"\d", token)) and all(is_element_symbol(x) for x in symbols):
            return True
    return False


_STATED = re.compile(r"(?<=\s)\(([A-Z][A-Za-z0-9().]*)\)|(?<=,)\s*([A-Z][A-Za-z0-9().·]*)\s*(?=,|$)")
# the CAS index's inverted names: "nitric acid, manganese(2+) salt, tetrahydrate",
# "sulfuric acid, europium(3+) salt (3:2)" (acid to metal)
_CAS_SALT = re.compile(
    r"^(?P<acid>[a-z ]+? acid)(?:\s*\([^)]*\))?,\s*(?P<metal>[^,]+?)\s+salt"
    r"(?:\s*\((?P<a>\d+):(?P<b>\d+)\))?(?P<rest>.*)$", re.I)


def _stated_formula(name: str) -> str | None:
    """The formula a name states in brackets (a CAS index habit), with the
    lattice water of the hydrate word after it; ``None`` if there is none.
    Stock numerals (``(III)``) are not formulas."""
    if not re.search(r"[a-z]{3}", _STATED.sub("", name)):
        return None  # a formula, not a name that states one
    for match in _STATED.finditer(name):
        text = match.group(1) or match.group(2)
        if re.fullmatch(r"[IVX]+", text) or not (re.search(r"\d", text) or len(re.findall(r"[A-Z]", text)) > 1):
            continue
        try:
            parse_formula(text)
        except FormulaError:
            continue
        if _holds_a_formula(name[: match.start()] + " " + name[match.end():]):
            # another formula beside it: a list of compounds ("NaCl, KCl, LiCl (30-20-50 mol%)"), not a name
            # that states its own
            return None
        rest = compact(name[: match.start()] + " " + name[match.end():])
        _, water = _split_hydrate_word(rest)
        if water is None and rest.endswith("hydrate"):
            return None  # a hydrate of unknown water
        return text + ("·" + ("" if water == 1 else f"{water:g}") + "H2O" if water else "")
    return None


def _inverted_salt(match) -> str | None:
    """``selenious acid, cadmium salt (1:1)`` read as ``cadmium selenite``; a
    stated acid-to-metal ratio must be that of the neutral salt."""
    anion = _acid_anion(compact(match.group("acid")))
    if anion is None:
        return None
    rest = match.group("rest").strip(" ,")
    text = read_name(f"{match.group('metal')} {anion} {rest}")
    if text is None or not match.group("a"):
        return text
    # "sulfuric acid, sodium salt (3:2)": three acid molecules to two metal ions; the
    # acid hydrogen the metal does not replace stays (Na2H4(SO4)3)
    reading = read_name_parts(compact(f"{match.group('metal')} {anion}"))
    if reading is None or len(reading.cations) != 1 or len(reading.anions) != 1:
        return None
    cation, acid_anion = reading.cations[0], reading.anions[0]
    charge = cation.charge or (usual_charge(cation.element) if cation.element else None)
    if not charge or not acid_anion.charge:
        return None
    acids, metals = int(match.group("a")), int(match.group("b"))
    hydrogen = acids * -acid_anion.charge - metals * charge
    if hydrogen < 0:
        return None
    if hydrogen:
        acid_anion = Part("H" + count_text(hydrogen / acids) + acid_anion.text, 0, polyatomic=True) \
            if hydrogen % acids == 0 else acid_anion
        if hydrogen % acids:
            parts = [(cation, metals), (Part("H", 1, element="H"), hydrogen), (acid_anion, acids)]
            return parts_text(parts, _split_hydrate_word(compact(rest))[1] or 0.0)
    return parts_text([(cation, metals), (acid_anion, acids)], _split_hydrate_word(compact(rest))[1] or 0.0)


def _as_formula(name: str) -> str | None:
    """A formula typed where a name was expected (``K2S5``): read as itself."""
    text = name.strip()
    if " " in text or not re.search(r"\d|[A-Z].*[A-Z]", text):
        return None
    try:
        parse_formula(text)
    except FormulaError:
        return None
    return text


@per_input(maxsize=32768)
def _read_key(key: str) -> str | None:
    try:
        trivial = _trivial().get(key)
        if trivial:
            return trivial
        salt, water = _split_hydrate_word(key)
        if water is not None:
            # the salt part alone: every hydrate of one salt shares its reading
            anhydrous = _read_key(salt) if salt else None
            if anhydrous is None or "·" in anhydrous:
                return None
            return anhydrous + ("·" + ("" if water == 1 else f"{water:g}") + "H2O" if water else "")
        reading = read_name_parts(key)
        if reading is None:
            return None
        if _metal_cation(reading):
            # a metal's usual charge stands (known_reading): the candidates of an unsaid state are not needed
            return formula_text(reading)
        unsaid = unsaid_readings(reading)  # before formula_text, which fills in usual charges
        return known_reading(formula_text(reading), unsaid, False)[0]
    except (ValueError, ZeroDivisionError, KeyError, OverflowError, IndexError):
        return None


def known_reading(default: str | None, candidates, metal: bool) -> tuple[str | None, tuple[str, ...]]:
    """(the formula a name is read as, the known compounds a name left unread could mean).

    ``default`` is the grammar's reading (usual charges; None when the name leaves an oxidation state unsaid
    that no usual charge fills); ``candidates`` are the texts of :func:`scorer.name_grammar.unsaid_readings`
    for the element, a ``metal`` or not. Only a non-metal's usual charge gives way: where its reading is not a
    compound the registry knows and exactly one candidate is, that one is taken (``phosphorus oxychloride``:
    POCl3, not the usual-charge POCl); a metal's usual charge stands (``neodymium sulfide`` is Nd2S3 though the
    registry holds NdS and not Nd2S3). A name that no usual charge reads (``iron chloride``, ``platinum
    chloride``) stays unread, never guessed, and its known candidates come back for the row's error (FeCl3,
    FeCl2). Known: the formulas of ``registry_names.csv`` (CRC Handbook and PubChem tables of the registry
    package ``chemicals``), compared as reduced compositions (HgCl is Hg2Cl2).

    >>> known_reading("POCl", ("POCl3", "POCl2", "POCl"), metal=False)
    ('POCl3', ())
    >>> known_reading(None, ("FeCl3", "FeCl2"), metal=True)
    (None, ('FeCl3', 'FeCl2'))
    """
    if not candidates or default is not None and (metal or _known(default)):
        return default, ()
    known = tuple(text for text in candidates if _known(text))
    if default is None:
        return None, known
    return (known[0] if len(known) == 1 else default), ()


def ambiguous_name(text: str) -> tuple[str, ...]:
    """The known compounds a name could mean when it leaves an oxidation state unsaid and reads as none of them
    alone (``iron chloride``: FeCl2, FeCl3); empty otherwise. For the error of an unread cell."""
    if not isinstance(text, str) or not text.strip() or len(text) > MAX_NAME_LENGTH:
        return ()
    try:
        salt, water = _split_hydrate_word(compact(text))
        reading = read_name_parts(salt) if salt else None
        if reading is None:
            return ()
        unsaid = unsaid_readings(reading)
        return known_reading(formula_text(reading), unsaid, _metal_cation(reading))[1]
    except (ValueError, ZeroDivisionError, KeyError, OverflowError, IndexError):
        return ()


def _metal_cation(reading: NameReading) -> bool:
    return bool(reading.cations) and bool(reading.cations[0].element) and is_metal(reading.cations[0].element)


def _known(text: str) -> bool:
    try:
        parsed = parse_formula(text)
    except FormulaError:
        return False
    return registry_knows(parsed.counts)


_WORDLIKE = re.compile(r"[a-z]{3}|[A-Z]{4}")


def known_word_name(text: str):
    """``text`` parsed as the name it is, when it is one word that the vocabulary or the registry's names hold as a
    name (``tin``, ``Tin``, ``TIN``, ``iron``, ``arsine``); ``None`` otherwise (``SN``, ``nacl``: no such word).
    The slip audit asks it before taking a re-cased or re-lettered formula (TiN, TlN, IrON)."""
    word = text.strip() if isinstance(text, str) else ""
    if len(word) < 3 or not word.isalpha():
        return None
    # the registry's names only from six letters (arsine): the shorter words a slip reads (nacl, kscn, naoh)
    # are formulas, and the element names among them (tin, iron, lead, zinc) are the vocabulary's; so the
    # registry's table is not loaded for them
    if _read_key(compact(word)) is None and (len(word) < _REGISTRY_WORD_MIN or registry_entry(word) is None):
        return None
    return parse_as_name(word, any_word=True)


_REGISTRY_WORD_MIN = 6


def parse_as_name(text: str, any_word: bool = False):
    """A formula cell that holds a name (``choline chloride``) parsed as the
    formula the name means, with a note that becomes the row's warning; ``None``
    when the text is not a name either. Without ``any_word`` only a text with a
    word of three lower-case or four capital letters is tried (``Tin`` and ``TIN``
    are tried by the slip audit, which asks with it).

    >>> parse_as_name("sodium chloride").notes
    ("the formula cell holds a name: 'sodium chloride' read as NaCl",)
    """
    if not isinstance(text, str) or not (any_word or _WORDLIKE.search(text)):
        return None  # no word of three letters: a broken formula, not a name ("K4[Fe(CN)6")
    formula, entry = _read_name(text)
    if formula is None and ("-" in text or not text.isascii()):
        # stereo descriptors and optical rotation ("D-(+)-Glucose", "sodium L-lactate", "(R)-(+)-Limonene") name
        # one isomer of the same formula: the name is read without the rotation sign, then without any descriptor
        for bare in without_stereo_descriptors(text):
            formula, entry = _read_name(bare)
            if formula is not None:
                break
    if formula is None:
        return None
    try:
        parsed = parse_formula(formula)
    except FormulaError:
        return None
    note = f"the formula cell holds a name: {' '.join(text.split())!r} read as {formula}"
    if entry is not None:
        # a formula may stand for several compounds (C3H6O: acetone, propanal): say which one the name is
        note += f" ({entry[2]}, CAS {entry[1]}; {_REGISTRY_SOURCES.get(entry[3], entry[3])})"
        if entry[4] in _MOLECULE_KINDS and _organic_molecule(parsed):
            # the registry knows it as one molecule: no ion pair of the formula's atoms (tris, C4H11NO3, is no
            # propylammonium hydrogencarbonate; lysine no choline cyanate); an acid's H(+) reading stands; an
            # acyl halide (acetyl chloride, C2H3ClO) is marked as its written CH3COCl is, and an acid anhydride
            # or an isocyanate likewise, for the water rules; an amino acid or another inner salt as a
            # zwitterion, for the melting route
            hint = entry[4]
            if hint == "molecule" and not _ACID_WORD.search(entry[2]) and not _ACID_WORD.search(text) and \
                    dict(parsed.counts).get("C", 0.0) >= 2:
                # a molecule whose name says no acid (nor hydrogen, as ethyl hydrogen sulfate and hydrogen cyanide
                # do) is none: 2,3-dihydroxybenzaldehyde (C7H6O3) is not read as
                # salicylic acid, 1,3,5-trioxane (C3H6O3) not as lactic acid; one-carbon names keep the acid's
                # reading (methanenitrile is HCN, methyl sulfate CH3OSO3H)
                hint = NONACID_MOLECULE_HINT
            parsed = dataclasses.replace(parsed, structure_hint=hint)
        elif entry[4] == "salt" and not parsed.structure_hint and _OPEN_CHAIN_ONIUM_NAME.search(entry[2]) and \
                not _RING_ONIUM_NAME.search(entry[2]):
            # the name says an ammonium or phosphonium ion: its Hill formula must not be read as a ring cation of
            # the same composition (benzyltrimethylammonium chloride, C10H16ClN, had read as
            # 1-butyl-3-methylpyridinium chloride)
            parsed = dataclasses.replace(parsed, structure_hint=ONIUM_NAME_HINT)
    return parsed.respelled(text, notes=(*parsed.notes, note))


_OPEN_CHAIN_ONIUM_NAME = re.compile(r"(?:ammonium|phosphonium)", re.I)
_ACID_WORD = re.compile(r"acid\b|hydrogen", re.I)
_RING_ONIUM_NAME = re.compile(r"(?:pyridinium|imidazolium|pyrrolidinium|piperidinium|morpholinium|quinolinium"
                              r"|pyrazolium|triazolium|thiazolium|azepanium|oxazolidinium)", re.I)


# the sign of optical rotation before a name ("(+)-", "(-)-", "(±)-"), and the stereo descriptors of IUPAC
# (Fischer D and L, CIP R and S, E and Z, rac, meso; IUPAC Recommendations 2013, P-9 and P-93; common practice)
_ROTATION_SIGN = re.compile(r"\(\s*(?:[+\-−]|±|\+/[\-−])\s*\)-")
_STEREO_DESCRIPTOR = re.compile(
    r"(?<![A-Za-z0-9])(?:\(\s*(?:[RSEZ]|RS|SR|[RS]\*)(?:\s*,\s*(?:\d+[RSEZ]|[RSEZ]))*\s*\)-"
    r"|(?:D|L|DL|rac|meso)-(?=[A-Za-z(]))")


# Greek letters as names spell them in ASCII (the registry's names are ASCII: "gamma-butyrolactone"), and a
# Greek-letter locant or anomer label before a name ("beta-alanine", "alpha-D-glucose": IUPAC Recommendations
# 2013, P-14.3 and P-93; common practice), which names one isomer of the same formula
_GREEK_LETTERS = {"α": "alpha", "β": "beta", "γ": "gamma", "δ": "delta", "ε": "epsilon", "ζ": "zeta", "η": "eta",
                  "θ": "theta", "κ": "kappa", "λ": "lambda", "μ": "mu", "ω": "omega"}
_GREEK_LOCANT = re.compile(r"(?<![A-Za-z0-9])(?:alpha|beta|gamma|delta|epsilon|omega)-(?=[A-Za-z(])", re.I)


def ascii_greek(text: str) -> str:
    """``text`` with its Greek letters spelt out.

    >>> ascii_greek("γ-butyrolactone"), ascii_greek("NaCl")
    ('gamma-butyrolactone', 'NaCl')
    """
    return "".join(_GREEK_LETTERS.get(c, c) for c in text) if not text.isascii() else text


def without_stereo_descriptors(text: str) -> tuple[str, ...]:
    """``text`` with its Greek letters spelt out, then without the sign of optical rotation, then without every
    stereo descriptor as well, then without Greek-letter locants; the variants that differ from ``text``, in
    that order. Isomers share one formula, so the name's formula is read from the bare name.

    >>> without_stereo_descriptors("D-(+)-Glucose"), without_stereo_descriptors("sodium L-lactate")
    (('D-Glucose', 'Glucose'), ('sodium lactate',))
    >>> without_stereo_descriptors("(R)-(+)-Limonene"), without_stereo_descriptors("tert-butanol")
    (('(R)-Limonene', 'Limonene'), ())
    >>> without_stereo_descriptors("β-alanine"), without_stereo_descriptors("α-D-glucose")
    (('beta-alanine', 'alanine'), ('alpha-D-glucose', 'alpha-glucose', 'glucose'))
    """
    spelt = ascii_greek(text)
    unsigned = _ROTATION_SIGN.sub("", spelt)
    bare = _STEREO_DESCRIPTOR.sub("", unsigned)
    plain = _GREEK_LOCANT.sub("", bare)
    return tuple(dict.fromkeys(v for v in (spelt, unsigned, bare, plain) if v != text and v.strip()))


# the registry's kinds of one molecule (scorer/data/registry_names.csv): the parse's structure hint
_MOLECULE_KINDS = frozenset({"molecule", "acyl_halide", "acid_anhydride", "isocyanate", "zwitterion"})


def _organic_molecule(parsed) -> bool:
    """Carbon with only non-metals, as written (no charge, no written ions)."""
    symbols = [s for s, _ in parsed.counts]
    return "C" in symbols and not parsed.charge and not parsed.ion_hints and not any(is_metal(s) for s in symbols)


_COUNT_BEFORE_HYDRATE = re.compile(r"(\d+(?:\.\d+)?)$")


@once
def _hydrate_prefixes() -> tuple[tuple[str, float], ...]:
    """Multiplicative prefixes a hydrate word may start with, longest first
    (``tetradeca`` before ``deca``); the ``bis``/``tris`` forms never do."""
    rows = [(compact(r["word"]), float(r["number"])) for r in table("name_words.csv")
            if r["kind"] == "multiplier" and not r["word"].endswith(("is", "kis"))]
    return tuple(sorted(rows, key=lambda item: -len(item[0])))


# a formula with its hydrate word after it, as stock lists write it: "CuCl2 dihydrate", "Zn(NO3)2 hexahydrate",
# "CaSO4 hemihydrate", "MgSO4 7-hydrate" (common practice)
_FORMULA_THEN_HYDRATE_WORD = re.compile(r"^(?P<formula>\S+?)[\s,]+(?P<word>[A-Za-z0-9-]*hydrate)\s*$", re.I)


def formula_with_hydrate_word(text: str) -> str | None:
    """A formula followed by a hydrate word, written with its water: ``CuCl2 dihydrate`` ->
    ``CuCl2·2H2O``; None for any other text (the name grammar reads names with hydrate words).

    >>> formula_with_hydrate_word("Zn(NO3)2 hexahydrate"), formula_with_hydrate_word("CaSO4 hemihydrate")
    ('Zn(NO3)2·6H2O', 'CaSO4·0.5H2O')
    >>> formula_with_hydrate_word("sodium chloride") is None
    True
    """
    m = _FORMULA_THEN_HYDRATE_WORD.match(text) if isinstance(text, str) and len(text) <= 200 else None
    if m is None:
        return None
    word = compact(m.group("word")).replace("-", "")
    if word == "hydrate":
        return f"{m.group('formula')}·xH2O"  # water of unstated amount, as a catalogue's xH2O
    rest, water = _split_hydrate_word(word)
    if water is None or rest or water <= 0:
        return None
    return f"{m.group('formula')}·{water:g}H2O"


def _split_hydrate_word(key: str) -> tuple[str, float | None]:
    """A compact key ``copper(ii)sulfatepentahydrate`` -> (``copper(ii)sulfate``,
    5.0); (key, None) when it does not end in a hydrate word of known count."""
    if key.endswith("anhydrous"):
        return key[: -len("anhydrous")], 0.0
    if not key.endswith("hydrate"):
        return key, None
    body = key[: -len("hydrate")]
    number = _COUNT_BEFORE_HYDRATE.search(body)
    if number:
        return body[: number.start()], float(number.group(1))
    for prefix, value in _hydrate_prefixes():
        if body.endswith(prefix):
            return body[: -len(prefix)], value
    return key, None


def read_name_parts(name: str) -> NameReading | None:
    """The cations, anions and water a name states, or ``None``."""
    text = compact(name)
    anion_text = _acid_anion(text)
    words = tokenise(anion_text or text)
    if not words:
        return None
    reading = Reader(list(words)).read()
    if reading is None:
        return None
    if anion_text is not None:
        if reading.cations or len(reading.anions) != 1:
            return None
        if any(w.kind == "ion" and w.ion is not None and w.ion.source == CARBOXYLATE_SOURCE for w in words):
            # "lauric acid": a carboxylic acid is a molecule, read by its registry entry, not as H+ beside the
            # carboxylate that names its salts (scorer.carboxylates)
            return None
        reading.cations.append(Part("H", 1, element="H"))
    elif not reading.cations and len(reading.anions) == 1 and text.startswith("hydrogen"):
        # "hydrogen peroxide", "hydrogen sulfide": an anion name read with its hydrogen is the neutral acid
        reading.cations.append(Part("H", 1, element="H"))
    return reading


def _acid_anion(text: str) -> str | None:
    """The anion of a classical acid name: ``perchloric acid`` ->
    ``perchlorate``, ``nitrous acid`` -> ``nitrite``, ``hydrobromic acid`` ->
    ``bromide`` (Red Book 2005, IR-8.3); ``None`` for other names."""
    match = _ACID.match(text)
    if not match:
        return None
    stem, end = match.group("stem"), match.group("end")
    if end == "ic" and stem.startswith("hydro") and len(stem) > 5:
        return stem[5:] + "ide"
    if stem.endswith(("sulfur", "sulphur", "phosphor")):
        stem = stem[:-2]
    elif end == "ous" and stem.endswith("i"):
        stem = stem[:-1]  # selenious -> selenite
    return stem + ("ite" if end == "ous" else "ate")
