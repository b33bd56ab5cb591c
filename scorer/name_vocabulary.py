"""The words of compound names and how a name's text is cut into them.

A name is folded to a compact key (lower case; spaces, hyphens and commas
dropped; ``sulph`` read as ``sulf``; a charge such as ``(3-)`` kept as
``(3m)``), then cut into the fewest known words by dynamic programming over
that key (:func:`tokenise`). Cutting the compact key rather than the
space-separated words is what makes ``hydrogen carbonate``,
``hydrogencarbonate``, ``iron (III)`` and ``1-butyl-3-methyl imidazolium``
read alike.

The words come from data, never from code: element names (the mendeleev
snapshot, plus the IUPAC spellings of ``scorer/data/name_words.csv``),
classical ``-ous``/``-ic`` cation names, element anion names (``-ide``),
ligand names, ``-ate`` names of metals in complex anions and multiplicative
prefixes (all in ``name_words.csv``, a source per row), and every ion name of
the ion library (``scorer/data/ions.csv``: the name and the alternatives in
its brackets, and the longer aliases), so an ion added there is read in
names too.

>>> [t.word for t in tokenise("Copper(II) sulphate penta-hydrate")]
['copper', '(ii)', 'sulfate', 'penta', 'hydrate']
>>> [t.word for t in tokenise("sodium hydrogen carbonate")]
['sodium', 'hydrogencarbonate']
"""
from __future__ import annotations

import re
from dataclasses import dataclass, replace

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.carboxylates import carboxylate_name_words
from ionicity.scorer.elements import element_symbols, get_element
from ionicity.scorer.ion_library import ion_library
from ionicity.scorer.model import Ion
from ionicity.scorer.tables import table

__all__ = ["Word", "compact", "tokenise", "vocabulary", "ROMAN", "MAX_NAME_LENGTH"]

# a name longer than this is not read (a pasted paragraph costs nothing)
MAX_NAME_LENGTH = 300

ROMAN = {"0": 0, "i": 1, "ii": 2, "iii": 3, "iv": 4, "v": 5, "vi": 6, "vii": 7, "viii": 8}


@dataclass(frozen=True)
class Word:
    """One known word of a name.

    ``kind`` is one of ``element``, ``classical``, ``anion_element``,
    ``ion`` (an ion of the library), ``ligand``, ``metal_ate``,
    ``multiplier``, ``stock`` (an oxidation number such as ``(iii)``),
    ``charge`` (``(3-)``), ``hydrate``, ``anhydrous``, ``bi``, ``paren``,
    ``number``. ``symbol`` is an element symbol or a ligand's formula,
    ``charge`` a charge, ``number`` a count or oxidation number, ``ion`` the
    library ion; ``split`` holds (multiplier, element anion word) for an ion
    name such as ``disulfide`` that also reads as a count and an element.
    """

    word: str
    kind: str
    symbol: str = ""
    charge: int | None = None
    number: float | None = None
    ion: Ion | None = None
    split: tuple | None = None
    others: tuple = ()

    def meanings(self) -> tuple:
        """This word and its other meanings (``phosphate``: the ion, and the
        ``-ate`` name of phosphorus in a complex anion)."""
        return (self, *self.others)


_CHARGE_PAREN = re.compile(r"\((\d*)\s*([+-])\)")
_DROP = re.compile(r"[\s\-,'’`\u2010-\u2015\u2212]+")


def compact(text: str) -> str:
    """The compact key of a name or word.

    >>> compact("Iron (III) chloride"), compact("hexacyanidoferrate(3-)")
    ('iron(iii)chloride', 'hexacyanidoferrate(3m)')
    """
    text = text.casefold().replace("sulph", "sulf")
    text = _CHARGE_PAREN.sub(lambda m: f"({m.group(1) or '1'}{'p' if m.group(2) == '+' else 'm'})", text)
    text = text.replace("[", "(").replace("]", ")").replace("{", "(").replace("}", ")")
    return _DROP.sub("", text)


def _library_names(ion: Ion) -> list[str]:
    """The ion's name and the alternatives in its brackets, without comments
    (``; average S oxidation state``)."""
    text = ion.name
    main, _, rest = text.partition(" (")
    names = [main.split(";")[0]]
    if rest:
        depth, item, items = 0, "", []
        for char in rest:
            if char == "(":
                depth += 1
            elif char == ")":
                if depth == 0:
                    break
                depth -= 1
            if depth == 0 and char in ",;":
                items.append(item)
                item = ""
            else:
                item += char
        items.append(item)
        names += [i.strip() for i in items]
    return [n for n in names if n and len(n) > 2]


@once
def vocabulary() -> tuple[dict[str, Word], int]:
    """Compact word -> the words it can be; and the longest key."""
    words: dict[str, list[Word]] = {}

    def add(key: str, word: Word) -> None:
        entries = words.setdefault(key, [])
        if word not in entries:
            entries.append(word)

    for symbol in element_symbols():
        name = compact(get_element(symbol).name)
        add(name, Word(name, "element", symbol))
    metal_ate_rows = [compact(r["word"]) for r in table("name_words.csv") if r["kind"] == "metal_ate"]
    for symbol in element_symbols():
        # the -ate name of a central atom in a complex anion (Red Book 2005, IR-9.2.2.3):
        # cerium -> cerate, iridium -> iridate; irregular ones (ferrate, cuprate) are rows of name_words.csv
        name = compact(get_element(symbol).name)
        stem = re.sub(r"(ium|um)$", "", name)
        if stem != name and stem + "ate" not in metal_ate_rows:
            add(stem + "ate", Word(stem + "ate", "metal_ate", symbol))
    rows = table("name_words.csv")
    multipliers = {}
    for row in rows:
        key, kind = compact(row["word"]), row["kind"]
        charge = int(row["charge"]) if row["charge"] else None
        number = float(row["number"]) if row["number"] else None
        if kind == "cation_classical":
            add(key, Word(key, "classical", row["value"], charge))
        elif kind in ("anion_element", "ligand", "metal_ate", "element"):
            add(key, Word(key, kind, row["value"], charge))
        elif kind == "multiplier":
            multipliers[key] = number
            add(key, Word(key, "multiplier", number=number))
    anion_elements = {k: w for k, ws in words.items() for w in ws if w.kind == "anion_element"}
    for ion in ion_library():
        names = _library_names(ion)
        for name in names:
            key = compact(name)
            bare = re.sub(r"\((\d+[pm]|[ivx]+)\)$", "", key)
            for variant in {key, bare, *_spellings(key), *_spellings(bare)}:
                if variant == key or variant not in words:
                    add(variant, Word(variant, "ion", ion.label, ion.charge, ion=ion,
                                      split=_split(variant, multipliers, anion_elements)))
    for ion in ion_library():
        # trade aliases (bmim, choline, acetate) and the bracket labels of organic ions
        row_aliases = [a for a in _ALIASES().get(ion.ion_id, ()) if len(a) >= 4 or (len(a) == 3 and a.isalpha())]
        if ion.organic or ion.label.startswith("["):
            row_aliases.append(ion.label.strip("[]"))
        for alias in row_aliases:
            key = compact(alias)
            if key and key not in words:
                add(key, Word(key, "ion", ion.label, ion.charge, ion=ion))
    for name, ion in carboxylate_name_words():
        # carboxylates the library does not list (laurate, 2-ethylhexanoate), built by rule: names of metal soaps
        key = compact(name)
        if key not in words:
            add(key, Word(key, "ion", ion.label, ion.charge, ion=ion))
    for roman, value in ROMAN.items():
        add(f"({roman})", Word(f"({roman})", "stock", number=value))
    for n in range(1, 9):
        for sign, s in (("p", 1), ("m", -1)):
            add(f"({n}{sign})", Word(f"({n}{sign})", "charge", charge=n * s))
    add("hydrate", Word("hydrate", "hydrate"))
    add("hydrated", Word("hydrated", "hydrate"))
    add("anhydrous", Word("anhydrous", "anhydrous"))
    add("bi", Word("bi", "bi"))
    add("(", Word("(", "paren"))
    add(")", Word(")", "paren"))
    merged = {k: replace(v[0], others=tuple(v[1:])) if len(v) > 1 else v[0] for k, v in words.items()}
    return merged, max(len(k) for k in words)


@once
def _word_trie() -> dict:
    """The vocabulary as a trie, one level per character: ``{char: [word
    ending there or None, next level]}``. A character with no entry ends
    every word that could start so, as a prefix missing from the vocabulary's
    prefixes did."""
    root: dict = {}
    for key, word in vocabulary()[0].items():
        level = root
        for position, char in enumerate(key):
            entry = level.get(char)
            if entry is None:
                entry = level[char] = [None, {}]
            if position == len(key) - 1:
                entry[0] = word
            level = entry[1]
    return root


# spellings of the same ligand or group that names use interchangeably: the
# Red Book 2005 -ido ligand endings and the older -o ones (IR-9.2.2.3), the
# -ane-/-yl- forms of sulfonyl groups and azanide/imide
_SWAPS = (
    ("cyanido", "cyano"), ("fluorido", "fluoro"), ("chlorido", "chloro"), ("bromido", "bromo"), ("iodido", "iodo"),
    ("hydroxido", "hydroxo"), ("oxido", "oxo"), ("methanesulfonyl", "methylsulfonyl"),
    ("ethanesulfonyl", "ethylsulfonyl"), ("azanide", "imide"),
)


def _spellings(key: str) -> set[str]:
    """Other spellings of a compact ion name (each swap one way or the other,
    and without the brackets of a substituent: ``trihexyltetradecylphosphonium``)."""
    out = {key}
    for a, b in _SWAPS:
        # a swap whose two spellings are in no key so far leaves the set as it is; skipping it
        # halves this function's share of the vocabulary's build (once per process, in the warm-up)
        if any(a in k or b in k for k in out):
            out |= {k.replace(a, b) for k in out} | {k.replace(b, a) for k in out if a not in k}
    if not re.search(r"\((\d+[pm]|[ivx]+)\)$", key):
        out |= {k.replace("(", "").replace(")", "") for k in out}
    return out


def _split(key: str, multipliers: dict, anion_elements: dict) -> tuple | None:
    """(count, element anion word) when an ion name is also a multiplier and
    an element anion name (``disulfide``, ``dioxide``), else ``None``."""
    for mult, value in multipliers.items():
        if key.startswith(mult):
            rest = key[len(mult):]
            if rest in anion_elements and value == int(value):
                return value, anion_elements[rest]
    return None


@once
def _ALIASES() -> dict[str, tuple[str, ...]]:
    return {
        row["ion_id"]: tuple(a.strip() for a in row.get("aliases", "").split(";") if a.strip())
        for row in table("ions.csv")
    }


_ELIDED = {"mon": 1, "tetr": 4, "pent": 5, "hex": 6, "hept": 7, "oct": 8, "non": 9, "dec": 10}
_NUMBER = re.compile(r"\d+(?:\.\d+)?")
# the stems above by their first letter, in the same order: a position whose letter starts none is skipped
_ELIDED_BY_FIRST: dict[str, tuple[tuple[str, int], ...]] = {
    first: tuple((stem, value) for stem, value in _ELIDED.items() if stem[0] == first)
    for first in {stem[0] for stem in _ELIDED}
}


@per_input(maxsize=16384)
def tokenise(name: str) -> tuple[Word, ...] | None:
    """The fewest known words that spell ``name``'s compact key, or ``None``
    when no cut exists. A multiplier may drop its last vowel before a vowel
    (``pentoxide``, ``monoxide``, ``tetroxide``), and digits stand alone
    (``5-hydrate``)."""
    key = compact(name)
    if not key or len(key) > MAX_NAME_LENGTH:
        return None
    trie = _word_trie()
    n = len(key)
    best: list[tuple[int, tuple[Word, ...]] | None] = [None] * (n + 1)
    best[0] = (0, ())
    for i in range(n):
        if best[i] is None:
            continue
        cost, path = best[i]
        options: list[tuple[int, Word]] = []
        # the known words starting at i, shortest first, by walking the trie
        level, j = trie, i
        while j < n:
            entry = level.get(key[j])
            if entry is None:
                break
            j += 1
            if entry[0] is not None:
                options.append((j, entry[0]))
            level = entry[1]
        for stem, value in _ELIDED_BY_FIRST.get(key[i], ()):
            j = i + len(stem)
            if key.startswith(stem, i) and j < n and key[j] in "aeiou":
                options.append((j, Word(stem, "multiplier", number=value)))
        # \d is a Unicode decimal digit, as str.isdecimal: the test skips only what cannot match
        digits = _NUMBER.match(key, i) if key[i].isdecimal() else None
        if digits:
            options.append((digits.end(), Word(digits.group(), "number", number=float(digits.group()))))
        for j, word in options:
            if best[j] is None or best[j][0] > cost + 1:
                best[j] = (cost + 1, path + (word,))
    return best[n][1] if best[n] else None
