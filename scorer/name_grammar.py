"""The grammar of compound names: words (:mod:`scorer.name_vocabulary`) ->
cations, anions and water (:class:`Reader`) -> formula text (:func:`formula_text`).

Compositional names of the IUPAC Red Book 2005 (IR-5) and coordination names
(IR-9): cations then anions; Stock numbers and Ewens-Bassett charges; classical
``-ous``/``-ic`` names; multiplicative prefixes read literally; acid hydrogen
(``hydrogen``, ``dihydrogen``, ``bi-``); ligands around a central atom. Counts
come from charge balance (:func:`balance`) unless a prefix gives them.
:mod:`scorer.name_reader` is the entry point (trivial names, CAS index styles,
hydrate words, then this grammar).

>>> from ionicity.scorer.name_vocabulary import tokenise
>>> formula_text(Reader(list(tokenise("iron(III) sulfate"))).read())
'Fe2(SO4)3'
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass, field

from ionicity.scorer.caching import once
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.ion_library import ions_by_composition
from ionicity.scorer.name_vocabulary import Word
from ionicity.scorer.tables import table

__all__ = ["Part", "NameReading", "Reader", "formula_text", "balance", "usual_charge", "parts_text", "count_text"]

@dataclass
class Part:
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
    molecule: Part | None = None  # a neutral coordination entity named alone




class Reader:
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
            self._anion(Part(w.symbol, w.charge, self.take_mult(), element=w.symbol))
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
            self.reading.cations.append(Part("Hg2", 2, count, element="Hg", polyatomic=True))
            return True
        self.reading.cations.append(Part(symbol, charge, count, element=symbol))
        return True

    def _anion(self, part: Part) -> None:
        if self.hydrogens:
            # an acid anion: hydrogen + the anion, one charge less per H
            h = self.hydrogens
            self.hydrogens = 0
            body = part.text if not part.polyatomic else part.text
            part = Part(("H" if h == 1 else f"H{count_text(h)}") + body, None if part.charge is None else part.charge + int(h),
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
        before = self.words[self.i - 2] if self.i >= 2 else None  # the word right before this one
        if (self.mults and ion.organic and charge > 0 and word.word.startswith(_ALKYL_STEMS) and before is not None
                and any(w.kind == "multiplier" for w in before.meanings())):
            # "diethylammonium", "triethanolammonium", "dimethylammonium": the prefix belongs to the substituent
            # names of one cation, (C2H5)2NH2(+), not a count of ethylammonium ions; a cation the library does
            # not list is left unread (it had read as two ethylammonium ions, C4H16ClN2); "bis(ethylammonium)"
            # brackets the ion and counts it
            return False
        count = self.take_mult()
        if charge > 0:
            if self.reading.anions:
                return False
            self.reading.cations.append(Part(text, charge, count, polyatomic=True))
            return True
        if word.split and self.reading.cations and _covalent(self.reading.cations):
            mult, element_word = word.split
            self._anion(Part(element_word.symbol, element_word.charge, (count or 1) * mult, element=element_word.symbol))
            return True
        split = (word.split[1].symbol, word.split[0]) if word.split else None
        self._anion(Part(text, charge, count, polyatomic=len(ion.composition) > 1 or ion.composition[0][1] > 1,
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
                oxidation = usual_charge(central)
            if oxidation is None:
                return False
            charge = int(oxidation + ligand_charge)
        inner = "".join(f"({f}){count_text(n)}" if (n != 1 and len(f) > 1 and not f.isalpha()) or (n != 1 and _atoms(f) > 1) else f + count_text(n)
                        for f, _, n in self.ligands)
        self.ligands = []
        text = f"[{central}{inner}]"
        part = Part(text, charge, count, polyatomic=True)
        if anionic and charge >= 0:
            # an -ate name is an anion's (Red Book 2005, IR-9.2.2.3): with no charge left it is no complex but an
            # ester of the oxoacid ("trimethyl borate" is B(OCH3)3, not the trimethylboron [B(CH3)3])
            return False
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


# substituent names an onium cation's name starts with (methylammonium, ethanolammonium, butylpyridinium)
_ALKYL_STEMS = ("meth", "eth", "prop", "but", "pent", "hex", "hept", "oct", "non", "dec", "dodec", "tetradec",
                "hexadec", "octadec", "benz", "phen", "allyl", "vinyl")


def _atoms(formula: str) -> int:
    return len(re.findall(r"[A-Z]", formula))


def count_text(count: float) -> str:
    if count == 1:
        return ""
    return str(int(count)) if count == int(count) else f"{count:g}"


def _ion_formula(ion) -> str:
    """Formula text of a library ion that the formula grammar reads back: a
    complex (its label holds a group) in square brackets."""
    return f"[{ion.label}]" if "(" in ion.label else ion.label


def _covalent(cations: list[Part]) -> bool:
    """A name whose first part is a non-metal element (``carbon disulfide``,
    ``dinitrogen pentoxide``): its prefixes are counts of atoms."""
    first = cations[0]
    return bool(first.element) and not first.polyatomic and not is_metal(first.element)


@once
def _usual_charges() -> dict[str, int]:
    return {row["value"]: int(row["charge"]) for row in table("name_words.csv") if row["kind"] == "usual_charge"}


def usual_charge(symbol: str) -> int | None:
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


def formula_text(reading: NameReading) -> str | None:
    """Formula text from the parts: literal counts where the name gives any
    prefix, else the counts of charge balance."""
    cations, anions = reading.cations, reading.anions
    if reading.molecule is not None:
        return None if cations or anions else reading.molecule.text.strip("[]") + water_text(reading.water)
    if not cations and not anions:
        return None
    if not anions:
        if len(cations) != 1 or not cations[0].element:
            return None
        return parts_text([(cations[0], cations[0].count or 1)], reading.water)
    if not cations:
        return None
    literal = any(p.count is not None for p in cations + anions)
    if literal or _covalent(cations) and any(p.count for p in anions):
        counts = [p.count or 1 for p in cations + anions]
        _acid_hydrogen(cations, anions, counts)
        _unsaid_first_count(cations, anions, counts)
        return parts_text(list(zip(cations + anions, counts)), reading.water)
    if len(anions) == 1 and anions[0].split and any(p.charge is None and _variable_valence(p) for p in cations):
        # "iron disulfide", "chromium trioxide": no oxidation number for a metal of several states, so the prefix
        # counts atoms (FeS2, CrO3), not an ozonide or a disulfide ion; "bismuth trioxide" is Bi2O3 (two atoms
        # where one could not hold the state, _unsaid_first_count); "sodium disulfide" stays Na2S2
        symbol, count = anions[0].split
        counts = [1] * len(cations) + [count]
        _unsaid_first_count(cations, [Part(symbol, -2 if symbol in _CHALCOGENS else -1, count, element=symbol)], counts)
        return parts_text(list(zip(cations + [Part(symbol, None, element=symbol)], counts)), reading.water)
    for part in cations:
        if part.charge is None:
            part.charge = usual_charge(part.element) if part.element else None
    if any(p.charge is None for p in cations) and len(anions) == 1 and anions[0].split:
        # "iron disulfide": no oxidation number, so the prefix counts atoms
        symbol, count = anions[0].split
        return parts_text([(p, 1) for p in cations] + [(Part(symbol, None, element=symbol), count)], reading.water)
    if any(p.charge is None or p.charge == 0 for p in cations + anions):
        return None
    counts = balance([p.charge for p in cations], [p.charge for p in anions])
    if counts is None:
        return None
    return parts_text(list(zip(cations + anions, counts)), reading.water)


_CHALCOGENS = frozenset({"O", "S", "Se", "Te"})


def _variable_valence(part: Part) -> bool:
    """Whether a cation part is an element of more than one positive state (Fe, Cr, Bi; not Na, Ba, Zn)."""
    if not part.element:
        return False
    states = get_element(part.element)
    return len({s for s in (*states.oxidation_states_main, *states.oxidation_states_extra) if s > 0}) > 1


def _unsaid_first_count(cations: list[Part], anions: list[Part], counts: list) -> None:
    """The trade's ``phosphorus pentoxide`` (P2O5), ``nitrogen tetroxide`` (N2O4), ``arsenic trioxide``
    (As2O3), ``chlorine heptoxide`` (Cl2O7): the first element's count is left unsaid where one atom could not
    hold the oxidation state the prefix implies (P(+10)), and two atoms can (common practice; the Red Book's
    names are diphosphorus pentaoxide and the like). ``sulfur trioxide``, ``chromium trioxide`` and
    ``nitrogen dioxide`` are one atom each: S(+6), Cr(+6) and N(+4) are states those elements hold."""
    if len(cations) != 1 or len(anions) != 1 or cations[0].count is not None or not cations[0].element:
        return
    anion = anions[0]
    if anion.charge is None or anion.count is None or anion.polyatomic:
        return
    if (anion.element or anion.text) not in _CHALCOGENS:
        # only oxides and chalcogenides are named so; a boride's, silicide's or carbide's prefix counts atoms of a
        # metallic phase (titanium diboride is TiB2, molybdenum disilicide MoSi2; common practice)
        return
    element = get_element(cations[0].element)
    states = [s for s in (*element.oxidation_states_main, *element.oxidation_states_extra) if s > 0]
    highest = max(states) if states else None
    state = -anion.charge * anion.count
    if highest is not None and state > highest and state % 2 == 0 and 0 < state // 2 <= highest:
        counts[0] = 2


def unsaid_readings(reading: NameReading) -> tuple[str, ...]:
    """The formula texts a name may mean where it gives one element cation without an oxidation number and
    no multiplying prefix (``phosphorus oxychloride``, ``iron chloride``), for the reader to check against the
    compounds the registry knows (:func:`scorer.name_reader.known_reading`); empty for any other name.

    One text per positive state the element takes (mendeleev's main and extra states up to +8), highest
    first, by charge balance with one anion, or, after ``oxy``, one oxide and as many halides as the rest of
    the state (POCl3, VOCl3, BiOCl; common practice).

    >>> from ionicity.scorer.name_reader import read_name_parts
    >>> unsaid_readings(read_name_parts("phosphorusoxychloride"))
    ('POCl3', 'POCl2', 'POCl')
    """
    cations, anions = reading.cations, reading.anions
    if (reading.molecule is not None or len(cations) != 1 or not anions or any(
            p.count is not None or p.split for p in cations + anions) or any(p.charge is None for p in anions)
            or cations[0].charge is not None or not cations[0].element or cations[0].polyatomic):
        return ()
    part = cations[0]
    element = get_element(part.element)
    out: list[str] = []
    for state in sorted({s for s in (*element.oxidation_states_main, *element.oxidation_states_extra)
                         if 0 < s <= 8}, reverse=True):
        if len(anions) == 1:
            counts = balance([state], [anions[0].charge])
        elif len(anions) == 2 and anions[0].element == "O" and anions[1].charge == -1 and state > 2:
            counts = [1, 1, state - 2]
        else:
            continue
        if counts:
            out.append(parts_text(list(zip([Part(part.text, state, element=part.element), *anions], counts)),
                                  reading.water))
    return tuple(dict.fromkeys(out))


def _acid_hydrogen(cations: list[Part], anions: list[Part], counts: list) -> None:
    """The trade's ``disodium phosphate`` (Na2HPO4) and ``monosodium
    phosphate`` (NaH2PO4): prefixes that leave one oxoanion short of positive
    charge mean the acid salt, its hydrogen unnamed (common practice)."""
    if len(anions) != 1 or counts[-1] != 1 or not anions[0].polyatomic or "O" not in anions[0].text:
        return
    charges = [p.charge if p.charge is not None else usual_charge(p.element) if p.element else None for p in cations]
    if any(c is None for c in charges) or anions[0].charge is None or not _covalent(cations) is False:
        return
    net = sum(c * n for c, n in zip(charges, counts)) + anions[0].charge
    if net < 0 and anions[0].text[0] != "[":
        anion = anions[0]
        anions[0] = Part(f"H{count_text(-net)}{anion.text}", 0, anion.count, polyatomic=True)


def balance(cation_charges: list[int], anion_charges: list[int]) -> list[int] | None:
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


def parts_text(parts: list[tuple[Part, float]], water: float | None) -> str:
    """Formula text from parts and counts: polyatomic ions in brackets only
    where a count follows (``Fe2(SO4)3``), complexes in square brackets, and
    every ion bracketed beside an ionic-liquid label (``[C4mim][BF4]``)."""
    shorthand = any(p.text.startswith("[") and "(" not in p.text for p, _ in parts)
    text = ""
    for part, count in parts:
        number = count_text(count)
        body = part.text
        if part.polyatomic and not body.startswith("["):
            if shorthand:
                body = f"[{body}]"
            elif number:
                body = f"({body})"
        text += body + number
    return text + water_text(water)


def water_text(water: float | None) -> str:
    """The lattice water of a name as a formula's tail: ``·5H2O``, ``·H2O``, ``""`` for none, and ``·xH2O`` where
    the name says "hydrate" without a number (water of unstated amount, as a catalogue's xH2O: the row says so and
    its molar mass leaves the water out, rather than reading the salt as anhydrous without a word).

    >>> water_text(5.0), water_text(1.0), water_text(0.0), water_text(None)
    ('·5H2O', '·H2O', '', '·xH2O')
    """
    if water is None:
        return "·xH2O"
    return "·" + ("" if water == 1 else f"{water:g}") + "H2O" if water else ""
