"""The element grammar: one formula component -> element counts.

A hand-written recursive descent over element symbols, counts and nested
brackets; nothing is evaluated, and length, depth and counts are bounded
(``MAX_*``). It knows elements only; the ion names a formula may contain
(``[C4mim]``, ``OAc``) are resolved by the object passed as ``ions`` (the
ion library), so that the ion library can itself use this grammar to read
the formulas of its ions. :mod:`scorer.formula` builds the whole formula
(adducts, hydrates, charges, shorthand) on top of it.

Also here, because both the formula and the ion library need them: the
Hill order and the way counts are written.
"""
from __future__ import annotations

import math
import re
from typing import Protocol

from ionicity.scorer.elements import is_element_symbol

__all__ = [
    "FormulaError",
    "ElementParser",
    "IonNames",
    "parse_element_groups",
    "hill_order",
    "hill_formula",
    "iupac_order",
    "iupac_formula",
    "IUPAC_ELEMENT_SEQUENCE",
    "format_count",
    "WATER",
    "ISOTOPE_MARKERS",
    "OPEN_BRACKETS",
    "CLOSE_BRACKETS",
    "NUMBER",
    "MAX_FORMULA_LENGTH",
    "MAX_NESTING_DEPTH",
    "MAX_COUNT",
    "MAX_TOTAL_ATOMS",
]

MAX_FORMULA_LENGTH = 200
MAX_NESTING_DEPTH = 6
MAX_COUNT = 10_000
MAX_TOTAL_ATOMS = 100_000


class FormulaError(ValueError):
    """A formula that the grammar does not accept; the message says why."""


OPEN_BRACKETS = {"(": ")", "[": "]", "{": "}"}
CLOSE_BRACKETS = {v: k for k, v in OPEN_BRACKETS.items()}
NUMBER = re.compile(r"\d+(?:\.\d+)?")
# (H2O)n inside a component, also in a complex ([Co(H2O)6]Cl2), is water:
# carried as a pseudo-element so that outer counts multiply it
WATER = "_water"
# D and T (IUPAC Red Book 2005, IR-3.3.2: the symbols of 2H and 3H) are read
# as hydrogen, so every rule and ion of hydrogen applies to them; how many of
# the hydrogens were written D or T rides along in these pseudo-elements,
# which brackets multiply like any count and parse_element_groups takes out
ISOTOPE_MARKERS = {"D": "_2H", "T": "_3H"}
_MARKER_KEYS = frozenset(ISOTOPE_MARKERS.values())
_OPEN, _CLOSE, _NUMBER = OPEN_BRACKETS, CLOSE_BRACKETS, NUMBER


class IonNames(Protocol):
    """What the grammar asks of an ion library."""

    def find_alias(self, text: str, exact_case: bool = False): ...

    def find_abbreviation(self, text: str): ...


def hill_order(counts) -> list[str]:
    """Element symbols in Hill order: carbon, hydrogen, then alphabetical;
    all alphabetical without carbon. The one Hill-order rule of the scorer.

    >>> hill_order({"O": 4, "S": 1, "Cu": 1}), hill_order({"O": 1, "H": 6, "C": 2})
    (['Cu', 'O', 'S'], ['C', 'H', 'O'])
    """
    order = sorted(counts)
    if "C" in counts:
        order = ["C"] + (["H"] if "H" in counts else []) + [s for s in order if s not in ("C", "H")]
    return order


# The element sequence of IUPAC Red Book 2005 (Nomenclature of Inorganic
# Chemistry), Table VI, used by IR-4.4.2.1 to order the constituents of
# binary-type formulae: an element earlier in the sequence (more
# electropositive) is cited first. Written from memory of the table's arrow
# (noble gases, then groups 1 and 2, the f-block, groups 3 to 13 each read
# upwards, then C, the pnictogens, H, the chalcogens and the halogens, F last);
# oxygen stands between the halogens and fluorine (Cl2O, OF2); the elements
# named after 2005 take their groups' places.
IUPAC_ELEMENT_SEQUENCE: tuple[str, ...] = tuple("""
Og Rn Xe Kr Ar Ne He Fr Cs Rb K Na Li Ra Ba Sr Ca Mg Be
Lr No Md Fm Es Cf Bk Cm Am Pu Np U Pa Th Ac Lu Yb Tm Er Ho Dy Tb Gd Eu Sm Pm Nd Pr Ce La Y Sc
Rf Hf Zr Ti Db Ta Nb V Sg W Mo Cr Bh Re Tc Mn Hs Os Ru Fe Mt Ir Rh Co Ds Pt Pd Ni Rg Au Ag Cu
Cn Hg Cd Zn Nh Tl In Ga Al B Fl Pb Sn Ge Si C Mc Bi Sb As P N H Lv Po Te Se S Ts At I Br Cl O F
""".split())
_IUPAC_RANK = {symbol: i for i, symbol in enumerate(IUPAC_ELEMENT_SEQUENCE)}


def iupac_order(counts) -> list[str]:
    """Element symbols for an inorganic formula: electropositive first, by
    the element sequence of IUPAC Red Book 2005, Table VI (IR-4.4.2.1).

    >>> iupac_order({"Cl": 4, "Ti": 1}), iupac_order({"F": 6, "S": 1}), iupac_order({"H": 3, "N": 1})
    (['Ti', 'Cl'], ['S', 'F'], ['N', 'H'])
    """
    return sorted(counts, key=lambda s: (_IUPAC_RANK.get(s, len(_IUPAC_RANK)), s))


def iupac_formula(counts: dict[str, float] | tuple[tuple[str, float], ...]) -> str:
    """A formula in the order of :func:`iupac_order` for compounds without
    carbon, in Hill order (:func:`hill_formula`) for carbon compounds, counts
    of one omitted.

    >>> iupac_formula({"Cl": 4, "Ti": 1}), iupac_formula({"O": 2, "Si": 1}), iupac_formula({"C": 1, "Cl": 4})
    ('TiCl4', 'SiO2', 'CCl4')
    """
    items = dict(counts)
    if "C" in items:
        return hill_formula(items)
    return "".join(s + ("" if abs(items[s] - 1) < 1e-9 else format_count(items[s])) for s in iupac_order(items))


def format_count(value: float) -> str:
    """Write a count the way formulas do: integers bare, decimals trimmed.

    >>> [format_count(v) for v in (1, 2.0, 0.5, 0.95, 1/3)]
    ['1', '2', '0.5', '0.95', '0.333333']
    """
    if value.__class__ is float and value.is_integer():  # most counts: the same text, half the cost
        return str(int(value))
    if abs(value - round(value)) < 1e-9:
        return str(int(round(value)))
    return f"{value:.6f}".rstrip("0").rstrip(".")


def reduced_key(counts) -> tuple[tuple[str, float], ...]:
    """A composition divided by the greatest common divisor of its counts,
    sorted by symbol: Al2Cl6 and AlCl3 share one key (so do Hg2Cl2 and HgCl);
    counts that are not whole stay as they are.

    >>> reduced_key({"Al": 2, "Cl": 6})
    (('Al', 1.0), ('Cl', 3.0))
    """
    items = sorted((s, float(n)) for s, n in dict(counts).items())
    if any(n != int(n) for _, n in items):
        return tuple(items)
    divisor = 0
    for _, n in items:
        divisor = math.gcd(divisor, int(n))
    divisor = divisor or 1
    return tuple((s, n / divisor) for s, n in items)


_HILL_TERM = re.compile(r"([A-Z][a-z]?)(\d*)")


def hill_text_key(formula: str) -> tuple[tuple[str, float], ...]:
    """:func:`reduced_key` of a formula written without brackets (a Hill formula, a data table's ``AlCl3``).

    >>> hill_text_key("Cl2Hg2")
    (('Cl', 1.0), ('Hg', 1.0))
    """
    counts: dict[str, float] = {}
    for symbol, n in _HILL_TERM.findall(formula):
        counts[symbol] = counts.get(symbol, 0.0) + float(n or 1)
    return reduced_key(counts)


def hill_formula(counts: dict[str, float] | tuple[tuple[str, float], ...]) -> str:
    """Hill order (carbon, hydrogen, then alphabetical; all alphabetical
    without carbon), counts of one omitted.

    >>> hill_formula({"O": 4, "S": 1, "Cu": 1})
    'CuO4S'
    >>> hill_formula({"O": 1, "H": 6, "C": 2})
    'C2H6O'
    """
    items = dict(counts)
    return "".join(s + ("" if abs(items[s] - 1) < 1e-9 else format_count(items[s])) for s in hill_order(items))


class ElementParser:
    """Recursive descent over one adduct component.

    ``ions`` resolves the ion names a formula may hold (``[C4mim]``, ``OAc``):
    an object with ``find_alias(text, exact_case=False)`` and
    ``find_abbreviation(text)`` returning an ion or None (the ion library);
    None reads element symbols only.
    """

    def __init__(self, text: str, ions: IonNames | None = None):
        self.text = text
        self.pos = 0
        self.ions = ions
        self.allow_ion_refs = ions is not None
        self.ion_refs: list[tuple[str, float]] = []
        # inside a square-bracketed complex at the top level ([Fe(C2O4)3]): its organic ligand anions are named
        self.in_complex = False
        # hydrogens written D or T (parse_element_groups fills it): {"D": 4.0}
        self.isotopes: dict[str, float] = {}

    def error(self, what: str) -> FormulaError:
        return FormulaError(f"{what} at position {self.pos + 1} of {self.text!r}")

    def number(self) -> float | None:
        m = _NUMBER.match(self.text, self.pos)
        if not m:
            return None
        self.pos = m.end()
        value = float(m.group())
        if self.text.startswith("/", self.pos) and self.pos + 1 < len(self.text) and self.text[self.pos + 1].isdigit():
            # a fraction as battery and ceramic formulas write it: LiNi1/3Mn1/3Co1/3O2
            d = _NUMBER.match(self.text, self.pos + 1)
            denominator = float(d.group())
            if denominator <= 0:
                raise self.error(f"count {m.group()}/{d.group()} divides by zero")
            self.pos = d.end()
            value /= denominator
        if value <= 0:
            raise self.error(f"count {m.group()!r} must be positive")
        if value > MAX_COUNT:
            raise FormulaError(
                f"count {m.group()} in {self.text!r} is larger than {MAX_COUNT}; formulas are written per formula unit"
            )
        return value

    def sequence(self, depth: int, closer: str | None) -> dict[str, float]:
        counts: dict[str, float] = {}
        text = self.text
        while self.pos < len(text):
            ch = text[self.pos]
            if closer is not None and ch == closer:
                return counts
            if ch in _CLOSE:
                raise self.error(f"unbalanced {ch!r}: no matching {_CLOSE[ch]!r} before it")
            if ch in _OPEN:
                if depth + 1 > MAX_NESTING_DEPTH:
                    raise self.error(f"brackets nested deeper than {MAX_NESTING_DEPTH}")
                if depth == 0 and self.allow_ion_refs and (
                        ch == "[" or self.abbreviation_group() or self.organic_anion_group()):
                    ref = self.ion_reference()
                    if ref is not None:
                        continue
                elif depth == 1 and self.in_complex and self.allow_ion_refs and self.organic_anion_group(anion=True):
                    # an organic anion written out as a ligand of a bracketed complex ("(NH4)3[Fe(C2O4)3]"): named
                    # for the solver as it is outside brackets, so that the complex reads as the metal and its
                    # ligand anions (K3[Fe(C2O4)3] likewise), not recombined with the counter-ions' atoms
                    if self.ion_reference() is not None:
                        continue
                opened_at = self.pos
                self.pos += 1
                complex_refs = len(self.ion_refs)
                outer_complex, self.in_complex = self.in_complex, depth == 0 and ch == "["
                inner = self.sequence(depth + 1, _OPEN[ch])
                self.in_complex = outer_complex
                if self.pos >= len(text):
                    self.pos = opened_at
                    raise self.error(f"unbalanced {ch!r}: no closing {_OPEN[ch]!r}")
                if not inner and len(self.ion_refs) == complex_refs:
                    raise self.error("empty brackets")
                self.pos += 1
                multiplier = self.number() or 1.0
                if len(self.ion_refs) > complex_refs and multiplier != 1.0:
                    # the ligand anions named inside count once per complex: [Fe(C2O4)3]2 holds six
                    self.ion_refs[complex_refs:] = [(i, n * multiplier) for i, n in self.ion_refs[complex_refs:]]
                if inner == {"H": 2.0, "O": 1.0}:
                    # (H2O)n, also inside a complex ([Co(H2O)6]Cl2), is water:
                    # carried as a pseudo-element so outer counts multiply it
                    inner = {WATER: 1.0}
                elif _MARKER_KEYS.intersection(inner) and _without_markers(inner) == {"H": 2.0, "O": 1.0}:
                    # (D2O)n is water too; its markers keep the isotope count
                    inner = {WATER: 1.0, **{k: v for k, v in inner.items() if k in _MARKER_KEYS}}
                for symbol, n in inner.items():
                    counts[symbol] = counts.get(symbol, 0.0) + n * multiplier
                continue
            if "A" <= ch <= "Z" and depth == 0 and self.pos > 0 and self.allow_ion_refs and self.abbreviation_tail():
                continue
            if "A" <= ch <= "Z":
                two = text[self.pos:self.pos + 2]
                if len(two) == 2 and two[1].islower() and is_element_symbol(two):
                    symbol = two
                elif is_element_symbol(ch):
                    symbol = ch
                elif ch in ISOTOPE_MARKERS:
                    self.pos += 1
                    n = self.number() or 1.0
                    counts["H"] = counts.get("H", 0.0) + n
                    marker = ISOTOPE_MARKERS[ch]
                    counts[marker] = counts.get(marker, 0.0) + n
                    continue
                else:
                    m = re.match(r"[A-Z][a-z]*", text[self.pos:])
                    raise self.error(f"unknown element {m.group()!r}")
                self.pos += len(symbol)
                n = self.number() or 1.0
                counts[symbol] = counts.get(symbol, 0.0) + n
                continue
            if ch.isdigit():
                raise self.error(f"a count {ch!r} with nothing before it to count")
            if "a" <= ch <= "z":
                raise self.error(f"unexpected {ch!r}: element symbols start with a capital letter")
            if ch in "+-^":
                raise self.error(f"unexpected {ch!r}: a charge goes at the end, e.g. SO4^2-")
            raise self.error(f"unexpected character {ch!r}")
        if closer is not None:
            raise FormulaError(f"unbalanced {_CLOSE[closer]!r}: no closing {closer!r} in {self.text!r}")
        return counts

    def abbreviation_group(self) -> bool:
        """``(OAc)2``: a bracket holding an abbreviation that is not a formula."""
        closer = _OPEN[self.text[self.pos]]
        end = self.text.find(closer, self.pos)
        return end > 0 and self.ions.find_abbreviation(self.text[self.pos + 1:end]) is not None

    def organic_anion_group(self, anion: bool = False) -> bool:
        """``UO2(CH3COO)2``, ``VO(CH3CO2)2``: a round bracket holding, exactly as written, an organic anion of the
        library (acetate, formate, benzoate...): the formula writes that ion out, as ``(OAc)2`` names it, and
        the solver takes it as given rather than recombining its atoms with the cation's (uranyl acetate was
        read as U(4+) with hydroxide and succinate). Likewise an alkylammonium cation written with its NH3
        (``(C4H9NH3)2PbI4``, ``(CH3NH3)PbI3``)."""
        if self.text[self.pos] != "(":
            return False
        end = self.text.find(")", self.pos)
        content = self.text[self.pos + 1:end] if end > 0 else ""
        if not content or "(" in content:
            return False
        ion = self.ions.find_alias(content, exact_case=True)
        # and an alkylammonium written out with its NH3 ("(C4H9NH3)2PbI4"): butylammonium, not its isomer
        # tetramethylammonium, which the composition alone also fits
        return ion is not None and ion.organic and (ion.charge < 0 or (not anion and content.endswith("NH3")))

    def abbreviation_tail(self) -> bool:
        """``LiNTf2``, ``NaOTf``: the rest of the text is an abbreviation, not a formula."""
        ion = self.ions.find_abbreviation(self.text[self.pos:])
        if ion is None or ion.charge > 0:
            # only an anion ends a formula so (LiNTf2); a cation's code after a symbol is no salt: "TEA" is
            # not tritium with ethylammonium
            return False
        self.ion_refs.append((ion.ion_id, 1.0))
        self.pos = len(self.text)
        return True

    def ion_reference(self) -> bool | None:
        """``[C4mim]``, ``(OAc)``: a bracket whose content names a library ion."""
        end = self.text.find(_OPEN[self.text[self.pos]], self.pos)
        if end < 0:
            return None
        content = self.text[self.pos + 1:end]
        ion = self.ions.find_alias(content)
        if ion is None:
            return None
        self.pos = end + 1
        count = self.number() or 1.0
        # an explicit sign after the bracket ("[C4mim]+[BF4]-") restates the charge
        if self.pos < len(self.text) and self.text[self.pos] in "+-":
            if (self.text[self.pos] == "+") == (ion.charge > 0):
                self.pos += 1
        self.ion_refs.append((ion.ion_id, count))
        rest = self.text[self.pos:]
        if rest and not rest.startswith("["):
            tail = self.ions.find_alias(rest.rstrip("+-"), exact_case=True)
            if tail is not None:
                self.ion_refs.append((tail.ion_id, 1.0))
                self.pos = len(self.text)
        return True


def parse_element_groups(text: str, ions: IonNames | None = None) -> tuple[dict[str, float], ElementParser]:
    """Element counts of one adduct component (no dots, no charge), and the
    parser, whose ``ion_refs`` lists the ions named through ``ions``.

    >>> parse_element_groups("K4[Fe(CN)6]")[0]
    {'K': 4.0, 'Fe': 1.0, 'C': 6.0, 'N': 6.0}
    """
    parser = ElementParser(text, ions)
    counts = parser.sequence(0, None)
    if _MARKER_KEYS.intersection(counts):
        parser.isotopes = {k: counts.pop(m) for k, m in ISOTOPE_MARKERS.items() if m in counts}
    return counts, parser


def _without_markers(counts: dict[str, float]) -> dict[str, float]:
    return {k: v for k, v in counts.items() if k not in _MARKER_KEYS}
