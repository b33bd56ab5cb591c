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

import math
import re
from dataclasses import dataclass, field

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.ion_library import ions_by_composition
from ionicity.scorer.name_vocabulary import MAX_NAME_LENGTH, Word, compact, tokenise
from ionicity.scorer.tables import table

__all__ = ["read_name", "NameReading", "read_name_parts", "parse_as_name"]


@dataclass
class _Part:
    """One ion (or element of a covalent name) of the name being read."""

    text: str  # formula text of one unit
    charge: int | None
    count: float | None = None  # from a multiplicative prefix
    element: str = ""
    polyatomic: bool = False
    split: tuple | None = None  # (element, count): a name such as "disulfide" read as prefix + element


@dataclass
class NameReading:
    """What a name says: cations and anions (formula text, charge, count)
    and the lattice water (``None`` when the name says "hydrate" without a
    number)."""

    cations: list = field(default_factory=list)
    anions: list = field(default_factory=list)
    water: float | None = 0.0
    molecule: _Part | None = None  # a neutral coordination entity named alone


_HYDRATE_WATER = re.compile(r"\s*[\u2014\u2013\-]\s*water\s*\(\s*1\s*/\s*(\d+(?:\.\d+)?)\s*\)\s*$", re.I)
_ACID = re.compile(r"^(?P<stem>.+?)(?P<end>ic|ous)acid$")


@once
def _trivial() -> dict[str, str]:
    return {compact(row["name"]): row["formula"] for row in table("trivial_names.csv")}


def read_name(name) -> str | None:
    """The formula text ``name`` means, or ``None`` when it cannot be read.

    Case-insensitive; extra spaces and hyphens do not matter (the reading is
    cached per compact key, so ``SODIUM CHLORIDE`` costs a lookup once
    ``sodium chloride`` was read). Never raises.
    """
    if not isinstance(name, str) or not name.strip() or len(name) > MAX_NAME_LENGTH:
        return None
    try:
        return _read_text(name)
    except Exception:  # a name must never stop a batch: what cannot be read is unread
        return None


def _read_text(name: str) -> str | None:
    name = _CAS_QUALIFIERS.sub("", name)
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
    return _read_key(compact(name)) or _as_formula(name)


# CAS index additions that say nothing about composition: editions "(8CI,9CI)",
# stereo descriptors "(T-4)-", "(OC-6-11)-"
_CAS_QUALIFIERS = re.compile(r",?\s*\((?:\d+CI,?\s*)+\)|,?\s*\((?:T|OC|SP|TB|SPY|TBPY)-[\d-]+\)-?")
# "hydrate (1:6)": one formula unit to six water
_CAS_HYDRATE = re.compile(r",?\s*hydrate\s*\(1:(\d+(?:\.\d+)?)\)", re.I)
# a formula written in the name: "magnesium chloride (MgCl2)", "iron fluoride (FeF2), tetrahydrate"
_STATED = re.compile(r"(?<=\s)\(([A-Z][A-Za-z0-9().]*)\)")
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
        text = match.group(1)
        if re.fullmatch(r"[IVX]+", text) or not (re.search(r"\d", text) or len(re.findall(r"[A-Z]", text)) > 1):
            continue
        try:
            parse_formula(text)
        except FormulaError:
            continue
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
    charge = cation.charge or (_usual_charge(cation.element) if cation.element else None)
    if not charge or not acid_anion.charge:
        return None
    acids, metals = int(match.group("a")), int(match.group("b"))
    hydrogen = acids * -acid_anion.charge - metals * charge
    if hydrogen < 0:
        return None
    if hydrogen:
        acid_anion = _Part("H" + _n(hydrogen / acids) + acid_anion.text, 0, polyatomic=True) \
            if hydrogen % acids == 0 else acid_anion
        if hydrogen % acids:
            parts = [(cation, metals), (_Part("H", 1, element="H"), hydrogen), (acid_anion, acids)]
            return _text(parts, _split_hydrate_word(compact(rest))[1] or 0.0)
    return _text([(cation, metals), (acid_anion, acids)], _split_hydrate_word(compact(rest))[1] or 0.0)


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
        return None if reading is None else _formula(reading)
    except (ValueError, ZeroDivisionError, KeyError, OverflowError, IndexError):
        return None


_WORDLIKE = re.compile(r"[a-z]{3}|[A-Z]{4}")


def parse_as_name(text: str):
    """A formula cell that holds a name (``choline chloride``) parsed as the
    formula the name means, with a note that becomes the row's warning; ``None``
    when the text is not a name either.

    >>> parse_as_name("sodium chloride").notes
    ("the formula cell holds a name: 'sodium chloride' read as NaCl",)
    """
    if not isinstance(text, str) or not _WORDLIKE.search(text):
        return None  # no word of three letters: a broken formula, not a name ("K4[Fe(CN)6")
    formula = read_name(text)
    if formula is None:
        return None
    try:
        parsed = parse_formula(formula)
    except FormulaError:
        return None
    note = f"the formula cell holds a name: {' '.join(text.split())!r} read as {formula}"
    return parsed.respelled(text, notes=(*parsed.notes, note))


_COUNT_BEFORE_HYDRATE = re.compile(r"(\d+(?:\.\d+)?)$")


@once
def _hydrate_prefixes() -> tuple[tuple[str, float], ...]:
    """Multiplicative prefixes a hydrate word may start with, longest first
    (``tetradeca`` before ``deca``); the ``bis``/``tris`` forms never do."""
    rows = [(compact(r["word"]), float(r["number"])) for r in table("name_words.csv")
            if r["kind"] == "multiplier" and not r["word"].endswith(("is", "kis"))]
    return tuple(sorted(rows, key=lambda item: -len(item[0])))


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
    reading = _Reader(list(words)).read()
    if reading is None:
        return None
    if anion_text is not None:
        if reading.cations or len(reading.anions) != 1:
            return None
        reading.cations.append(_Part("H", 1, element="H"))
    elif not reading.cations and len(reading.anions) == 1 and text.startswith("hydrogen"):
        # "hydrogen peroxide", "hydrogen sulfide": an anion name read with its hydrogen is the neutral acid
        reading.cations.append(_Part("H", 1, element="H"))
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


class _Reader:
    """The grammar over one name's words (one use)."""

    def __init__(self, words: list[Word]):
        self.words = words
        self.i = 0
        self.reading = NameReading()
        self.mults: list[float] = []
        self.ligands: list[tuple[str, int, float]] = []
        self.hydrogens = 0.0  # acid hydrogen waiting for its anion

    def peek(self, offset: int = 0) -> Word | None:
        j = self.i + offset
        return self.words[j] if j < len(self.words) else None

    def take_mult(self) -> float | None:
        if not self.mults:
            return None
        value = math.prod(self.mults)
        self.mults = []
        return value

    def read(self) -> NameReading | None:
        while self.i < len(self.words):
            word = self.words[self.i]
            self.i += 1
            if not self._word(word):
                return None
        if self.ligands and not self.mults and len(self.reading.cations) == 1 and not self.reading.anions \
                and self.reading.cations[0].element and self.reading.cations[0].charge is None:
            # the CAS index's "vanadium, trifluorooxo-": the central atom first, a neutral molecule
            central = self.reading.cations.pop().element
            self.i = len(self.words)
            return self.reading if self._complex(central, anionic=False, neutral=True) else None
        if self.mults or self.ligands or self.hydrogens:
            return None
        return self.reading

    def _word(self, word: Word) -> bool:
        kinds = {w.kind: w for w in word.meanings()}
        if "paren" in kinds:
            return True
        if "multiplier" in kinds:
            self.mults.append(kinds["multiplier"].number)
            return True
        if "number" in kinds:
            nxt = self.peek()
            if nxt is not None and nxt.kind == "hydrate":
                self.mults.append(word.number)
                return True
            return False
        if "hydrate" in kinds:
            self.reading.water = self.take_mult()
            return True
        if "anhydrous" in kinds:
            self.reading.water = 0.0
            return True
        if "bi" in kinds:
            self.hydrogens += 1
            return True
        if "ligand" in kinds and ("ion" not in kinds or self.ligands or self._ligand_follows()):
            ligand = kinds["ligand"]
            self.ligands.append((ligand.symbol, ligand.charge, self.take_mult() or 1))
            return True
        if self.ligands:
            central = kinds.get("metal_ate") or kinds.get("element")
            if central is None:
                return False
            return self._complex(central.symbol, anionic="metal_ate" in kinds)
        if "element" in kinds and kinds["element"].symbol == "H" and self._anion_follows():
            if self.reading.cations:
                self.hydrogens += self.take_mult() or 1
                return True
        if "ion" in kinds:
            return self._ion(kinds["ion"])
        if "classical" in kinds:
            w = kinds["classical"]
            return self._cation(w.symbol, w.charge)
        if "element" in kinds:
            symbol = kinds["element"].symbol
            charge = self._oxidation()
            if self.reading.anions:
                return False
            return self._cation(symbol, charge)
        if "anion_element" in kinds:
            w = kinds["anion_element"]
            self._anion(_Part(w.symbol, w.charge, self.take_mult(), element=w.symbol))
            return True
        return False

    def _ligand_follows(self) -> bool:
        nxt = self.peek()
        return nxt is not None and any(w.kind in ("ligand", "element", "metal_ate", "multiplier") for w in nxt.meanings())

    def _anion_follows(self) -> bool:
        for word in self.words[self.i:]:
            kinds = {w.kind for w in word.meanings()}
            if kinds & {"ion", "anion_element"}:
                return True
            if not kinds & {"multiplier", "paren"}:
                return False
        return False

    def _oxidation(self) -> int | None:
        """A Stock number or a charge right after the current word."""
        nxt = self.peek()
        if nxt is not None and nxt.kind in ("stock", "charge"):
            self.i += 1
            return int(nxt.number) if nxt.kind == "stock" else nxt.charge
        return None

    def _cation(self, symbol: str, charge: int | None) -> bool:
        count = self.take_mult()
        if symbol == "Hg" and charge == 1:
            self.reading.cations.append(_Part("Hg2", 2, count, element="Hg", polyatomic=True))
            return True
        self.reading.cations.append(_Part(symbol, charge, count, element=symbol))
        return True

    def _anion(self, part: _Part) -> None:
        if self.hydrogens:
            # an acid anion: hydrogen + the anion, one charge less per H
            h = self.hydrogens
            self.hydrogens = 0
            body = part.text if not part.polyatomic else part.text
            part = _Part(("H" if h == 1 else f"H{_n(h)}") + body, None if part.charge is None else part.charge + int(h),
                         part.count, polyatomic=True)
        self.reading.anions.append(part)

    def _ion(self, word: Word) -> bool:
        ion = word.ion
        charge = ion.charge
        explicit = self._oxidation()
        if explicit is not None and explicit != charge:
            siblings = ions_by_composition(dict(ion.composition), explicit) if (explicit < 0) == (ion.charge < 0) else []
            if not siblings:
                return False
            ion, charge = siblings[0], explicit
        text = ion.label if ion.label.startswith("[") else _ion_formula(ion)
        count = self.take_mult()
        if charge > 0:
            if self.reading.anions:
                return False
            self.reading.cations.append(_Part(text, charge, count, polyatomic=True))
            return True
        if word.split and self.reading.cations and _covalent(self.reading.cations):
            mult, element_word = word.split
            self._anion(_Part(element_word.symbol, element_word.charge, (count or 1) * mult, element=element_word.symbol))
            return True
        split = (word.split[1].symbol, word.split[0]) if word.split else None
        self._anion(_Part(text, charge, count, polyatomic=len(ion.composition) > 1 or ion.composition[0][1] > 1,
                          split=split))
        return True

    def _complex(self, central: str, anionic: bool, neutral: bool = False) -> bool:
        """A coordination entity: the ligands read so far around ``central``
        (Red Book 2005, IR-9.2): its charge from the oxidation number or the
        charge after the name; a name that is nothing but the entity, with
        neither, is a neutral molecule (``dichloridodioxidochromium``)."""
        count = self.take_mult()
        nxt = self.peek()
        oxidation = charge = None
        if nxt is not None and nxt.kind == "stock":
            oxidation = int(nxt.number)
            self.i += 1
        elif nxt is not None and nxt.kind == "charge":
            charge = nxt.charge
            self.i += 1
        ligand_charge = sum(c * n for _, c, n in self.ligands)
        if charge is None and oxidation is None and not anionic and not self.reading.cations \
                and self.i >= len(self.words):
            neutral = True
        if neutral and charge is None and oxidation is None:
            charge = 0
        if charge is None:
            if oxidation is None:
                oxidation = _usual_charge(central)
            if oxidation is None:
                return False
            charge = int(oxidation + ligand_charge)
        inner = "".join(f"({f}){_n(n)}" if (n != 1 and len(f) > 1 and not f.isalpha()) or (n != 1 and _atoms(f) > 1) else f + _n(n)
                        for f, _, n in self.ligands)
        self.ligands = []
        text = f"[{central}{inner}]"
        part = _Part(text, charge, count, polyatomic=True)
        if charge == 0:
            self.reading.molecule = part
            return not self.reading.cations and not self.reading.anions
        if charge < 0 or anionic:
            self._anion(part)
        else:
            if self.reading.anions:
                return False
            self.reading.cations.append(part)
        return True


def _atoms(formula: str) -> int:
    return len(re.findall(r"[A-Z]", formula))


def _n(count: float) -> str:
    if count == 1:
        return ""
    return str(int(count)) if count == int(count) else f"{count:g}"


def _ion_formula(ion) -> str:
    """Formula text of a library ion that the formula grammar reads back: a
    complex (its label holds a group) in square brackets."""
    return f"[{ion.label}]" if "(" in ion.label else ion.label


def _covalent(cations: list[_Part]) -> bool:
    """A name whose first part is a non-metal element (``carbon disulfide``,
    ``dinitrogen pentoxide``): its prefixes are counts of atoms."""
    first = cations[0]
    return bool(first.element) and not first.polyatomic and not is_metal(first.element)


@once
def _usual_charges() -> dict[str, int]:
    return {row["value"]: int(row["charge"]) for row in table("name_words.csv") if row["kind"] == "usual_charge"}


def _usual_charge(symbol: str) -> int | None:
    """The charge a name means without an oxidation number: groups 1 and 2,
    and the table's fixed-valence elements and usual salts (common practice)."""
    if symbol in _usual_charges():
        return _usual_charges()[symbol]
    group = get_element(symbol).group
    if group == 1:
        return 1
    if group == 2:
        return 2
    return None


def _formula(reading: NameReading) -> str | None:
    """Formula text from the parts: literal counts where the name gives any
    prefix, else the counts of charge balance."""
    cations, anions = reading.cations, reading.anions
    if reading.molecule is not None:
        return None if cations or anions else reading.molecule.text.strip("[]") + (
            "·" + ("" if reading.water == 1 else f"{reading.water:g}") + "H2O" if reading.water else "")
    if not cations and not anions:
        return None
    if not anions:
        if len(cations) != 1 or not cations[0].element:
            return None
        return _text([(cations[0], cations[0].count or 1)], reading.water)
    if not cations:
        return None
    literal = any(p.count is not None for p in cations + anions)
    if literal or _covalent(cations) and any(p.count for p in anions):
        counts = [p.count or 1 for p in cations + anions]
        _acid_hydrogen(cations, anions, counts)
        return _text(list(zip(cations + anions, counts)), reading.water)
    for part in cations:
        if part.charge is None:
            part.charge = _usual_charge(part.element) if part.element else None
    if any(p.charge is None for p in cations) and len(anions) == 1 and anions[0].split:
        # "iron disulfide": no oxidation number, so the prefix counts atoms
        symbol, count = anions[0].split
        return _text([(p, 1) for p in cations] + [(_Part(symbol, None, element=symbol), count)], reading.water)
    if any(p.charge is None or p.charge == 0 for p in cations + anions):
        return None
    counts = _balance([p.charge for p in cations], [p.charge for p in anions])
    if counts is None:
        return None
    return _text(list(zip(cations + anions, counts)), reading.water)


def _acid_hydrogen(cations: list[_Part], anions: list[_Part], counts: list) -> None:
    """The trade's ``disodium phosphate`` (Na2HPO4) and ``monosodium
    phosphate`` (NaH2PO4): prefixes that leave one oxoanion short of positive
    charge mean the acid salt, its hydrogen unnamed (common practice)."""
    if len(anions) != 1 or counts[-1] != 1 or not anions[0].polyatomic or "O" not in anions[0].text:
        return
    charges = [p.charge if p.charge is not None else _usual_charge(p.element) if p.element else None for p in cations]
    if any(c is None for c in charges) or anions[0].charge is None or not _covalent(cations) is False:
        return
    net = sum(c * n for c, n in zip(charges, counts)) + anions[0].charge
    if net < 0 and anions[0].text[0] != "[":
        anion = anions[0]
        anions[0] = _Part(f"H{_n(-net)}{anion.text}", 0, anion.count, polyatomic=True)


def _balance(cation_charges: list[int], anion_charges: list[int]) -> list[int] | None:
    """Smallest whole counts that make the formula neutral, one of each ion
    where possible; in a double salt whose anions do not come out whole, the
    singly charged cations are doubled first (``ammonium iron(II) sulfate`` is
    (NH4)2Fe(SO4)2, a Tutton's salt)."""
    if any(c <= 0 for c in cation_charges) or any(a >= 0 for a in anion_charges):
        return None
    # integer counts throughout (fractions.Fraction would import decimal at start-up)
    cations = [1] * len(cation_charges)
    if len(cation_charges) > 1 and len(anion_charges) == 1:
        total = sum(cation_charges)
        if total % -anion_charges[0] and any(c == 1 for c in cation_charges):
            cations = [2 if c == 1 else 1 for c in cation_charges]
    if len(anion_charges) == 1:
        positive = sum(c * n for c, n in zip(cation_charges, cations))
        scale = -anion_charges[0] // math.gcd(positive, -anion_charges[0])
        return [n * scale for n in cations] + [positive * scale // -anion_charges[0]]
    if len(cation_charges) == 1:
        negative = sum(-a for a in anion_charges)
        scale = cation_charges[0] // math.gcd(negative, cation_charges[0])
        return [negative * scale // cation_charges[0]] + [scale] * len(anion_charges)
    return None


def _text(parts: list[tuple[_Part, float]], water: float | None) -> str:
    """Formula text from parts and counts: polyatomic ions in brackets only
    where a count follows (``Fe2(SO4)3``), complexes in square brackets, and
    every ion bracketed beside an ionic-liquid label (``[C4mim][BF4]``)."""
    shorthand = any(p.text.startswith("[") and "(" not in p.text for p, _ in parts)
    text = ""
    for part, count in parts:
        number = _n(count)
        body = part.text
        if part.polyatomic and not body.startswith("["):
            if shorthand:
                body = f"[{body}]"
            elif number:
                body = f"({body})"
        text += body + number
    if water:
        text += "·" + ("" if water == 1 else f"{water:g}") + "H2O"
    return text
