"""Formula grammar: text as people type it -> one immutable :class:`ParsedFormula`.

Accepted, in any combination:

* element symbols with integer or decimal counts (``Fe0.95O``), checked
  against the periodic table, case-sensitively (``Co`` is cobalt, ``CO`` is
  carbon monoxide);
* the hydrogen isotopes ``D`` and ``T`` (IUPAC Red Book 2005, IR-3.3.2),
  read as hydrogen and counted in ``ParsedFormula.isotopes`` (``D2O``,
  ``CuSO4·5D2O``; see :mod:`scorer.isotopes`);
* nested groups in ``()``, ``[]`` and ``{}`` with a count after the closing
  bracket;
* hydrates and adducts joined by ``·``, ``•``, ``∙``, ``⋅``, ``.``, ``*`` or
  ``+`` with a leading multiplier (``CuSO4·5H2O``, ``CaSO4·0.5H2O``,
  ``2CaSO4·H2O``); a top-level ``(H2O)n`` group is lattice water too, so
  ``CaCO3(H2O)6`` equals ``CaCO3·6H2O``;
* explicit ion charges: ``SO4^2-``, ``SO4(2-)``, ``SO4--``, ``Fe+3``,
  ``Fe3+``, ``[Fe(CN)6]4-``, Unicode superscripts ``SO₄²⁻``;
* Unicode subscripts (``Na₂SO₄``), the vulgar fraction ``½``, full-width
  characters, Unicode minus signs and stray whitespace;
* the ionic-liquid bracket shorthand of the trade: ``[C4mim][BF4]``,
  ``[bmim]PF6``, ``[C2mim][NTf2]``, ``[emim]OAc``, ``[N4444]Br``, whose
  abbreviations come from the ion library (``scorer/data/ions.csv``).

Parsing is a hand-written recursive-descent grammar over the text; nothing is
evaluated. Length, nesting depth, single counts and the total atom count are
bounded (see the ``MAX_*`` constants), so a hostile cell costs microseconds.
Anything else raises :class:`FormulaError`, a ``ValueError`` whose message
quotes the bad text and says what would be accepted.
"""
from __future__ import annotations

import dataclasses
import math
import itertools
import re
import unicodedata
from dataclasses import dataclass, field

from ionicity.scorer import ion_library
from ionicity.scorer.abbreviations import expand_abbreviations
from ionicity.scorer.coordination import (
    coordination_hint,
    is_ligand,
    ligand_abbreviation,
    ligand_compositions,
    ligand_spellings,
    written_ligands,
)
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import get_element, is_element_symbol, is_metal, metal_symbols
from ionicity.scorer.grammar import (
    CLOSE_BRACKETS as _CLOSE,
    MAX_COUNT,
    MAX_FORMULA_LENGTH,
    MAX_NESTING_DEPTH,
    MAX_TOTAL_ATOMS,
    NUMBER as _NUMBER,
    OPEN_BRACKETS as _OPEN,
    WATER as _WATER,
    FormulaError,
    format_count,
    hill_formula,
    hill_order,
    parse_element_groups,
)
from ionicity.scorer.model import format_charge
from ionicity.scorer.onium_groups import group_counts, onium_hint, written_onium
from ionicity.scorer.alkoxides import ALKOXIDE_HINT, written_alkoxide
from ionicity.scorer.metal_amides import METAL_AMIDE_HINT, written_metal_amide
from ionicity.scorer.carboxylates import carboxylate_hint, written_carboxylates
from ionicity.scorer.written_ions import written_ion_hints
from ionicity.scorer.tables import table

__all__ = [
    "ParsedFormula",
    "FormulaError",
    "parse_formula",
    "hill_formula",
    "format_count",
    "MAX_FORMULA_LENGTH",
    "MAX_NESTING_DEPTH",
    "MAX_COUNT",
    "MAX_TOTAL_ATOMS",
]

_SUBSCRIPTS = str.maketrans("₀₁₂₃₄₅₆₇₈₉", "0123456789")
_SUPERSCRIPT_CHARS = "⁰¹²³⁴⁵⁶⁷⁸⁹⁺⁻"
_SUPERSCRIPTS = str.maketrans(_SUPERSCRIPT_CHARS, "0123456789+-")
_DOT_SEPARATORS = "·•∙⋅・･×●"
_MINUS_SIGNS = "−–—‐‑"
_SPACED_TIMES = re.compile(r"\s+[xX]\s+(?=\d*(?:\.\d+)?\s?[A-Z(\[])")
# "CoCl2 · x H2O", "CoCl2 xH2O": water of unstated amount typed with spaces (a catalogue's xH2O) after a dot,
# or written on to the salt after a space; read as the unstated-water hydrate (common practice). A lone
# " x " between salt and water stays a multiplication sign ("LiF x H2O" is LiF·H2O, tests/test_properties.py)
_SPACED_X_WATER = re.compile(r"\s*[·.*•∙⋅]\s*[xXn]\s+(?=H2O\s*$)")
_SPACED_UNSTATED_WATER = re.compile(r"(?<=[A-Za-z0-9)\]}])\s+(?=[xn]H2O\s*$)")
# "MgSO4 7H2O": a space typed for the hydrate dot before a counted water at the end; "CuSO4-5H2O": a dash
# (spreadsheets and catalogues; common practice)
_SPACED_WATER = re.compile(r"(?<=[A-Za-z0-9)\]}])(?:\s+(?=\d)|\s*-\s*)(?=\d*(?:\.\d+)?\s*[HDT]2O\s*$)")
# Molecules that follow a dot as an adduct, so "CaCl2.2NH3" is read as an
# adduct and not as the decimal count "2.2"; heavy water (D2O, T2O) too.
_ADDUCT_AFTER_DOT = re.compile(r"\d*(?:\.\d+)?(?:[HDT]2O2|[HDT]2O|NH3|HF|HCl|CH3OH|C2H5OH|CO2)(?![a-z])")
_STARTS_FORMULA = re.compile(r"\d*(?:\.\d+)?[A-Z(\[{]")
_NEUTRAL_ADDUCTS = {(("H", 3.0), ("N", 1.0)): "NH3", (("H", 2.0), ("O", 2.0)): "H2O2"}
# a hydrogen halide joined to a base, as amine salts are written (C6H5NH2·HCl): the structure hint
# "hydrohalide:Cl*1" (halide, how many) tells the solver which acid protonates the base
_HYDROGEN_HALIDES = {(("Cl", 1.0), ("H", 1.0)): "Cl", (("Br", 1.0), ("H", 1.0)): "Br", (("H", 1.0), ("I", 1.0)): "I",
                     (("F", 1.0), ("H", 1.0)): "F"}
HYDROHALIDE_HINT = "hydrohalide:"
# a registry name of an open-chain onium salt ("benzyltrimethylammonium chloride", "tetrabutylphosphonium
# bromide"): no ring cation of the same composition may stand for its cation (scorer.name_reader.parse_as_name)
ONIUM_NAME_HINT = "onium_name"
# a name the registry knows as one organic molecule that is no acid (no carboxylic or sulfonic group: its name
# says no "acid"): no reading of ions at all, not even an acid's (scorer.name_reader, scorer.ions)
NONACID_MOLECULE_HINT = "molecule_not_acid"
_WATER_PART = re.compile(r"(\d+(?:\.\d+)?)?H2O")
# a hydrate whose water count is a letter: "CoCl2*xH2O", "Fe2O3.nH2O", "CuSO4*(H2O)x"
_UNSTATED_WATER = re.compile(r"(?P<salt>.+?)[*.](?P<water>[xnyz]H2O|\(H2O\)[xnyz])")
_ORGANOMETALLIC_GROUPS = re.compile(r"\(CO\)|C5H5|\(Cp\)|Cp2")


@dataclass(frozen=True)
class ParsedFormula:
    """An immutable parsed formula.

    ``counts`` is the flat element count of one formula unit without its
    lattice water, in Hill order; ``hydrate_water`` the molecules of lattice
    water; ``charge`` the net charge written in the text (0 for a compound);
    ``ion_hints`` the ions named explicitly by the ionic-liquid shorthand or by
    a bracketed complex of the ion library, as ``(ion_id, count)`` pairs;
    ``neutral_adducts`` other neutral molecules joined with a dot (``NH3``);
    ``structure_hint`` what the written groups say about bonding that the
    counts cannot (``"amide"`` for ``CO(NH2)2``, ``"organometallic"`` for
    ``Fe(CO)5`` or ``Fe(C5H5)2``, ``"ammonium"`` for ``NH4SCN``, ``"fulminate"`` for ``Hg(CNO)2``), so it takes part in equality.
    ``canonical`` is one string per compound: every accepted spelling of the
    same formula unit gives the same one.
    """

    text: str = field(compare=False)
    counts: tuple[tuple[str, float], ...]
    hydrate_water: float = 0.0
    charge: int = 0
    ion_hints: tuple[tuple[str, float], ...] = ()
    neutral_adducts: tuple[tuple[str, float], ...] = ()
    structure_hint: str = ""
    notes: tuple[str, ...] = field(default=(), compare=False)
    # hydrogens written D or T, lattice water's included (("D", 2.0),); they
    # are also in ``counts`` and ``hydrate_water`` as H, so that D2O is scored
    # as water; D2O and H2O still differ in equality (and in mass)
    isotopes: tuple[tuple[str, float], ...] = ()

    @property
    def elements(self) -> tuple[str, ...]:
        return tuple(s for s, _ in self.counts)

    def as_dict(self) -> dict[str, float]:
        return dict(self.counts)

    def respelled(self, text: str, *, hydrate_water: float | None = None, notes: tuple[str, ...] | None = None):
        """This composition with another text (and lattice water, notes):
        ``dataclasses.replace`` without its field-by-field introspection,
        which the parser's hot path cannot afford."""
        return ParsedFormula(
            text, self.counts, self.hydrate_water if hydrate_water is None else hydrate_water, self.charge,
            self.ion_hints, self.neutral_adducts, self.structure_hint, self.notes if notes is None else notes,
            self.isotopes,
        )

    @property
    def hill(self) -> str:
        return hill_formula(self.counts)

    @property
    def total_counts(self) -> dict[str, float]:
        """Flat counts including lattice water."""
        total = dict(self.counts)
        if self.hydrate_water:
            total["H"] = total.get("H", 0.0) + 2 * self.hydrate_water
            total["O"] = total.get("O", 0.0) + self.hydrate_water
        return total

    @property
    def canonical(self) -> str:
        text = self.hill
        if self.charge:
            text += "^" + format_charge(self.charge)
        if self.hydrate_water:
            water = format_count(self.hydrate_water)
            text += "·" + ("" if water == "1" else water) + "H2O"
        return text


# an acyl halide group written out: CH3COCl, C6H5COCl, COCl2, CH3C(O)Br (not CoCl2: case matters)
# CNO written in that order is fulminate (C-N-O: AgCNO, Hg(CNO)2, HCNO), OCN cyanate (AgOCN):
# the two ions have one composition, so only the text tells them apart
_FULMINATE = re.compile(r"CNO(?![a-z])")
_ACYL_HALIDE = re.compile(r"C(?:O|\(O\)|\(=O\))(?:Cl|Br|I|F)(?![a-z])")
# an isocyanate group written last or closing a group (CH3NCO, C6H5NCO, HNCO; not the N-acyl of
# (CH3)2NCOCH3) and a carboxylic anhydride written as (RCO)2O ((CH3CO)2O, (CF3CO)2O): common practice
_ISOCYANATE = re.compile(r"N=?C=?O(?=$|\))")
_ACID_ANHYDRIDE = re.compile(r"^\([A-Za-z0-9]*CO\)2O$")
# an ester written out: a carboxyl carbon bound through its second oxygen to carbon (CH3COOCH3, CH3CO2C2H5,
# HCOOC2H5): no acidic hydrogen, a molecule, where the Hill formula (C3H6O2) also names the acid (common practice)
_ESTER = re.compile(r"C(?:OO|O2)C(?![a-z])")

# the invisible format characters (Unicode category Cf) that copied text carries: soft hyphen, zero-width
# space to right-to-left mark, word joiner and invisible operators, byte-order mark
_FORMAT_CHARACTERS = re.compile("[\u00ad\u200b-\u200f\u202a-\u202e\u2060-\u2064\ufeff]")


def _normalise_text(text: str) -> str:
    """Map the Unicode and typing variants onto the plain grammar alphabet."""
    text = _SPACED_UNSTATED_WATER.sub("*", _SPACED_X_WATER.sub("*x", text))
    text = _SPACED_WATER.sub("*", _SPACED_TIMES.sub("*", text))
    if text.isascii():
        # no superscripts, subscripts, dots, dashes or compatibility forms
        return "".join(text.split())
    text = text.replace("½", "0.5").replace("¼", "0.25").replace("¾", "0.75")
    # invisible format characters that copying from web pages and spreadsheets leaves (zero-width space,
    # byte-order mark, soft hyphen, word joiner): no part of a formula
    text = _FORMAT_CHARACTERS.sub("", text)
    out = []
    i = 0
    while i < len(text):
        ch = text[i]
        if ch in _SUPERSCRIPT_CHARS:
            j = i
            while j < len(text) and text[j] in _SUPERSCRIPT_CHARS:
                j += 1
            out.append("^" + text[i:j].translate(_SUPERSCRIPTS))
            i = j
            continue
        out.append(ch)
        i += 1
    text = "".join(out).translate(_SUBSCRIPTS)
    for ch in _DOT_SEPARATORS:
        text = text.replace(ch, "*")
    for ch in _MINUS_SIGNS:
        text = text.replace(ch, "-")
    text = unicodedata.normalize("NFKC", text)
    return "".join(text.split())


# Plain formula text: ASCII letters and digits, brackets, the middle dot (U+00B7, the first of
# _DOT_SEPARATORS) and the ASCII dot and star, nothing else (most cells). Each step before the grammar leaves
# such a text as it is but the dot: no comma (_SOLID_SOLUTION_SITE), no sign (_NONSTOICHIOMETRY,
# _HYPHENATED_PAIR), no whitespace (_SPACED_TIMES, _SPACED_WATER, the two words of _shorthand_with_spaces), and
# no other character _normalise_text maps (super- or subscripts, fractions, format characters, other dots,
# minus signs; NFKC leaves ASCII as it is). tests/test_hot_path.py compares the two ways on the benchmark's
# texts, the reference cases and random plain text.
_PLAIN = re.compile(r"[A-Za-z0-9()\[\]\u00b7.*]+")


def _plain_normalised(text: str) -> str:
    """:func:`_normalise_text` and :func:`_shorthand_with_spaces` of a :data:`_PLAIN` text: the middle dot
    written as the adduct star."""
    return text.replace("\u00b7", "*")


_CHARGE_PATTERNS = (
    re.compile(r"\^\(?(?P<digits>\d*)(?P<sign>[+-])\)?$"),
    re.compile(r"\^\(?(?P<sign>[+-])(?P<digits>\d*)\)?$"),
    re.compile(r"(?<=[A-Za-z0-9)\]}])\((?P<digits>\d*)(?P<sign>[+-])\)$"),
    re.compile(r"(?<=[A-Za-z0-9)\]}])\((?P<sign>[+-])(?P<digits>\d*)\)$"),
    re.compile(r"(?<=[A-Za-z)\]}])(?P<sign>[+-])(?P<digits>\d+)$"),
    re.compile(r"(?<=\d)(?P<sign>[+-])(?P<digits>\d+)$"),
)


# the ions of a salt written one by one with their charges: "Na+ Cl-", "Na+Cl-", "Ca2+ 2Cl-", "NH4+ NO3-"
_ION_TOKEN_BREAK = re.compile(r"(?<=[+-])\s*(?=\d*\s*[A-Z\[(])|\s+")
_LEADING_COUNT = re.compile(r"^(\d+)\s*(?=[A-Z\[(])")


def _written_ion_pair(text: str) -> str | None:
    """Formula text of a salt written as its ions with their charges, or None when the text is not that:
    two or more ions, each with a charge, cations and anions balancing ("Ca2+ 2Cl-" is CaCl2).

    >>> _written_ion_pair("Na+ Cl-"), _written_ion_pair("Ca2+ 2Cl-"), _written_ion_pair("SO4^2-")
    ('(Na)(Cl)', '(Ca)(Cl)2', None)
    >>> _written_ion_pair("Ca2+ + 2Cl-")
    '(Ca)(Cl)2'
    """
    if "[" in text:
        return None  # bracketed codes ("[C4mim]+ [BF4]-") are read by the ionic-liquid shorthand
    tokens: list[str] = []
    for token in _ION_TOKEN_BREAK.split(text.strip()):
        if token == "+":
            continue  # a plus between two ions ("Ca2+ + 2Cl-") joins them, as a space does
        if token and tokens and tokens[-1].isdigit():
            tokens[-1] += token  # "3 OH-": a count written apart from its ion
        elif token:
            tokens.append(token)
    if len(tokens) < 2 or not all(t.endswith(("+", "-")) for t in tokens):
        return None
    parts, total, signs = [], 0, set()
    for token in tokens:
        m = _LEADING_COUNT.match(token)
        count = int(m.group(1)) if m else 1
        body, charge, _ = _split_charge(token[m.end():] if m else token)
        if not charge or not body or count < 1:
            return None
        parts.append(f"({body.strip('^')})" + (str(count) if count > 1 else ""))
        total += count * charge
        signs.add(charge > 0)
    return "".join(parts) if total == 0 and signs == {True, False} else None


def _split_charge(text: str) -> tuple[str, int, str | None]:
    """Take a written charge off the end: (body, charge, note)."""
    pair = re.fullmatch(r"\[([^\[\]]+)\]\+?\[([^\[\]]+)\]-", text)
    if pair:
        cation, anion = (ion_library.find_alias(g) for g in pair.groups())
        if cation is not None and anion is not None and cation.charge > 0 > anion.charge:
            return text, 0, None  # "[C4mim]+[BF4]-": the signs restate each ion's charge
    for pattern in _CHARGE_PATTERNS:
        m = pattern.search(text)
        if m:
            magnitude = int(m.group("digits") or 1)
            sign = 1 if m.group("sign") == "+" else -1
            return text[: m.start()], sign * magnitude, None
    m = re.search(r"([+-]+)$", text)
    if not m or m.start() == 0:
        return text, 0, None
    signs = m.group(1)
    if len(set(signs)) != 1:
        raise FormulaError(f"cannot read the charge {signs!r} at the end of {text!r}; write it as ^2- or (2-)")
    body = text[: m.start()]
    sign = 1 if signs[0] == "+" else -1
    digits = re.search(r"(\d+(?:\.\d+)?)$", body)
    if len(signs) > 1 or not digits or "." in digits.group(1):
        return body, sign * len(signs), None
    # "Fe3+" (charge 3+) against "NH4+" (count 4, charge +): one digit before
    # a single sign is ambiguous. A bracket before it makes it a charge
    # ("[Fe(CN)6]4-"); otherwise prefer the reading that names a known ion.
    before = body[: digits.start()]
    charge_digit = digits.group(1)[-1]
    as_charge_body = body[:-1]
    if before.endswith(("]", ")", "}")) and len(digits.group(1)) == 1:
        return as_charge_body, sign * int(charge_digit), None
    as_count_known = _names_known_ion(body, sign)
    as_charge_known = _names_known_ion(as_charge_body, sign * int(charge_digit))
    if as_charge_known and not as_count_known:
        return as_charge_body, sign * int(charge_digit), None
    if as_count_known and not as_charge_known:
        return body, sign, None
    single_element = re.fullmatch(r"[A-Z][a-z]?\d*", body) is not None
    if as_charge_known and as_count_known:
        charge_reading = f"{as_charge_body}^{charge_digit}{signs}"
        count_reading = f"{body}^{signs}"
        chosen, other = (charge_reading, count_reading) if single_element else (count_reading, charge_reading)
        note = f"{text!r} was read as {chosen} (also possible: {other}); write the charge with ^ to choose"
        if single_element:
            return as_charge_body, sign * int(charge_digit), note
        return body, sign, note
    if single_element:
        return as_charge_body, sign * int(charge_digit), None
    return body, sign, None


def _names_known_ion(body: str, charge: int) -> bool:
    try:
        counts, _ = parse_element_groups(body)
    except FormulaError:
        return False
    return ion_library.is_known_ion(counts, charge)


# A salt and its counted lattice water after one star or dot, nothing else (CuSO4*5H2O, KCl.0.5H2O): the
# split _split_components makes of it when the salt's brackets balance (no separator can fall inside the salt,
# which holds no * + or .; the dot before the water is a separator, _ADDUCT_AFTER_DOT matching what follows;
# the water's count is read whole by NUMBER). tests/test_hot_path.py compares it with the loop.
_SALT_AND_WATER = re.compile(r"(?P<salt>[^*+.]+)[*.](?P<water>(?:\d+(?:\.\d+)?)?H2O)")


def _split_components(text: str) -> list[str]:
    """Split at adduct separators outside brackets, keeping decimals whole."""
    m = _SALT_AND_WATER.fullmatch(text)
    if m is not None:
        salt = m.group("salt")
        if (salt.count("(") + salt.count("[") + salt.count("{")
                == salt.count(")") + salt.count("]") + salt.count("}")):
            return [salt, m.group("water")]
    return _split_components_loop(text)


def _split_components_loop(text: str) -> list[str]:
    """:func:`_split_components`, character by character (every text the fast split does not take)."""
    parts: list[str] = []
    depth = 0
    start = 0
    i = 0
    n = len(text)
    while i < n:
        ch = text[i]
        if ch in _OPEN:
            depth += 1
        elif ch in _CLOSE:
            depth -= 1
        elif depth == 0 and i > start:
            rest = text[i + 1:]
            is_separator = False
            if ch == "*":
                is_separator = True
            elif ch == "+" and _STARTS_FORMULA.match(rest):
                is_separator = True
            elif ch == ".":
                after_digit = text[i - 1].isdigit()
                if not after_digit or not rest[:1].isdigit() or _ADDUCT_AFTER_DOT.match(rest):
                    is_separator = True
            if is_separator:
                parts.append(text[start:i])
                start = i + 1
                # the multiplier of the next component is read whole here, so
                # that its own decimal point is not taken for a separator
                m = _NUMBER.match(text, start)
                i = m.end() if m else start
                continue
        i += 1
    parts.append(text[start:])
    return parts


@per_input(maxsize=65536)
def _component(text: str) -> tuple[tuple[tuple[str, float], ...], tuple[tuple[str, float], ...], dict[str, float]]:
    """(element counts, ion references, hydrogens written D or T) of one
    adduct component, cached: the salt part of every hydrate and spelling of
    a salt is read once."""
    counts, parser = parse_element_groups(text, ion_library)
    return tuple(counts.items()), tuple(parser.ion_refs), parser.isotopes


@per_input(maxsize=65536)
def parse_formula(text: str) -> ParsedFormula:
    """Parse formula text into a :class:`ParsedFormula`.

    Parameters
    ----------
    text : str
        A chemical formula as typed, e.g. ``"CuSO4·5H2O"``, ``"Na₂SO₄"``,
        ``"[C4mim][BF4]"`` or ``"SO4^2-"``.

    Returns
    -------
    ParsedFormula

    Raises
    ------
    FormulaError
        For anything the grammar does not accept; the message quotes the bad
        text and the position.

    Examples
    --------
    >>> parse_formula("CuSO4·5H2O").canonical
    'CuO4S·5H2O'
    >>> parse_formula("CaCO3(H2O)6") == parse_formula("CaCO3.6H2O")
    True
    >>> parse_formula("SO4^2-").charge
    -2
    """
    if not isinstance(text, str):
        raise FormulaError(f"expected formula text, got {type(text).__name__}")
    if len(text) > MAX_FORMULA_LENGTH:
        raise FormulaError(
            f"formula is {len(text)} characters long; the limit is {MAX_FORMULA_LENGTH}"
            f" (starts {text[:20]!r})"
        )
    if "\ufffd" in text:
        # what a reader puts for bytes that are not UTF-8: the cell's encoding is wrong, not its chemistry
        raise FormulaError(
            f"{text[:40]!r} holds U+FFFD, the mark of bytes that were not valid UTF-8 text; check the table's encoding"
        )
    notes: list[str] = []
    label = POLYMORPH_LABEL.match(text)
    if label:
        isomer = label.group().strip().rstrip("-").strip().lower() in ("cis", "trans", "fac", "mer")
        notes.append(f"ignored the structure label {label.group().strip()!r}: the composition is scored, not the"
                     + (" isomer" if isomer else " polymorph"))
        text = text[label.end():]
    if _STOCK_NAME.search(text):
        m = _STOCK_NAME.search(text)
        raise FormulaError(
            f"{m.group()!r} in {text!r} is a Stock name (oxidation state in Roman numerals), not a formula;"
            " write the formula, e.g. Fe3O4 or FeCl3"
        )
    m = _ANNOTATION.search(text)
    if m and m.start() > 0 and ion_library.find_alias(m.group().strip()[1:-1], exact_case=True) is None and not \
            is_ligand(m.group().strip()[1:-1]):
        # "(aq)", "(anhydrous)" are notes; "(acac)" in Li(acac) is a ligand the ion library abbreviates
        notes.append(f"ignored the note {m.group().strip()!r}")
        text_to_parse = text[: m.start()]
    else:
        text_to_parse = text
    if text_to_parse.rstrip().endswith(("Tx", "T_x", "Tₓ")):
        mxene = _TERMINATIONS.fullmatch(text_to_parse)
        if mxene is not None:
            # an MXene with its surface terminations (Ti3C2Tx: O, OH and F in varying amounts; Naguib et al., Adv.
            # Mater. 26 (2014) 992; from memory): the carbide or nitride layer is scored, the terminations are not
            notes.append(f"the surface terminations {mxene.group('tx')!r} of the MXene are not counted (O, OH, F in"
                         " unstated amounts): the bare layer is scored")
            text_to_parse = mxene.group("core")
    if "-" in text_to_parse:
        alloy = alloy_designation(text_to_parse)
        if alloy is not None:
            text_to_parse, alloy_note = alloy
            notes.append(alloy_note)
    water_of_code = ""
    if "H2O" in text_to_parse:
        coded = _CODE_WITH_WATER.fullmatch(text_to_parse)
        if coded is not None and _is_code(coded.group("code")):
            # a code with its lattice water ("TBAF·3H2O", "TBAB.H2O"; "TBAF trihydrate" arrives so from the
            # record's hydrate-word reader): the code is read below and the water put back after it
            text_to_parse, water_of_code = coded.group("code"), "·" + coded.group("water")
    salt_of_code = code_hydrohalide(text_to_parse) if ("HCl" in text_to_parse or "HBr" in text_to_parse
                                                        or "HI" in text_to_parse) else None
    if salt_of_code is not None:
        # a buffer base's code with its acid ("Tris-HCl", "Tris HCl"): the base's hydrohalide salt
        notes.append(salt_of_code[1])
        text_to_parse = salt_of_code[0]
    metal_salt = code_metal_salt(text_to_parse) if ("EDTA" in text_to_parse or "EGTA" in text_to_parse) else None
    if metal_salt is not None:
        # a chelating acid's code with metals before or after it ("K2EDTA", "EDTA-Na2"): their salt
        notes.append(metal_salt[1])
        text_to_parse = metal_salt[0]
    solvent = laboratory_code(text_to_parse) if _SOLVENT_CODE.fullmatch(text_to_parse) else None
    if solvent is None and _DEUTERATED_CODE.fullmatch(text_to_parse):
        solvent = deuterated_solvent(text_to_parse)
    if solvent is not None:
        formula, name = solvent
        notes.append(f"read the laboratory code {text_to_parse.strip()!r} as {name}, {formula} (common practice)")
        text_to_parse = formula
    elif _MATERIAL_CODE.fullmatch(text_to_parse):
        material = material_code(text_to_parse)
        if material is not None:
            formula, name = material
            notes.append(f"read the materials code {text_to_parse.strip()!r} as {name}, {formula} (common practice;"
                         " the usual composition, check it against your material's)")
            text_to_parse = formula
            alloy = alloy_designation(formula) if "-" in formula else None
            if alloy is not None:  # a solder's designation (SAC305: Sn-3Ag-0.5Cu in weight percent)
                text_to_parse, alloy_note = alloy
                notes.append(alloy_note)
    if "⁺" in text_to_parse and "⁻" in text_to_parse:
        # ions written with superscript charges ("Ca²⁺ + 2Cl⁻", "Na⁺Cl⁻"): read as their ASCII spelling
        text_to_parse = unicodedata.normalize("NFKC", text_to_parse).replace("\u2212", "-")
    if "+" in text_to_parse and "-" in text_to_parse:
        pair = _written_ion_pair(text_to_parse)
        if pair is not None:
            notes.append(f"read the ions written with their charges ({' '.join(text_to_parse.split())!r}) as one salt")
            text_to_parse = pair
    # most cells are plain (_PLAIN): no comma, sign or space, so no solid-solution site, written
    # non-stoichiometry, spaced or hyphenated ion pair, and nothing for _normalise_text to map but the dot
    plain = _PLAIN.fullmatch(text_to_parse) is not None
    if plain and text_to_parse.isalpha() and len(text_to_parse) <= 14:
        alloy_sites = unsubscripted_alloy(text_to_parse)
        if alloy_sites is not None:
            # a semiconductor alloy by its elements alone ("InGaN", "AlGaAs", "HgCdTe"): a solid solution of
            # unstated proportions on each site, read as one below
            notes.append(f"a solid solution written by its elements alone ({text_to_parse!r}, as for"
                         f" {alloy_sites}): read with equal shares on each site")
            text_to_parse = alloy_sites
            plain = False
    if plain and text_to_parse[:1] in "CA":
        chalcopyrite = _CHALCOPYRITE_ALLOY.fullmatch(text_to_parse)
        if chalcopyrite is not None and chalcopyrite.group("a") != chalcopyrite.group("b"):
            # an I-III-VI2 chalcopyrite alloy written without fractions ("CuInGaSe2" for CIGS, Cu(In,Ga)Se2):
            # literally it balances only as Cu(2+) with In(+) and Ga(+), a reading of no compound (common practice)
            sites = (f"{chalcopyrite.group('m')}({chalcopyrite.group('a')},{chalcopyrite.group('b')})"
                     f"{chalcopyrite.group('x')}2")
            notes.append(f"a chalcopyrite alloy written without fractions ({text_to_parse!r}, as for {sites}):"
                         " read with equal shares of the group-13 site; write them, e.g. Cu(In0.7Ga0.3)Se2")
            text_to_parse = sites
            plain = False
    if not plain and "," in text_to_parse and _SOLID_SOLUTION_SITE.search(text_to_parse):
        shared = _SOLID_SOLUTION_SITE.sub(_equal_shares, text_to_parse)
        notes.append(f"a solid solution of unstated proportions ({text_to_parse.strip()!r}): equal shares of the site"
                     f" assumed, {shared.strip()}; write the fractions, e.g. Cu(In0.7Ga0.3)Se2")
        text_to_parse = shared
    if "x" in text_to_parse and "H2O" in text_to_parse:
        glued = _GLUED_X_WATER.search(text_to_parse)
        if glued is not None:
            # "CuSO4x5H2O": a lower-case x typed for the hydrate dot before a counted water (the x of a
            # variable count stands before an element, LixCoO2)
            read = text_to_parse[:glued.start()] + "·" + text_to_parse[glued.end():]
            notes.append(f"read the x before the water in {text_to_parse.strip()!r} as the hydrate dot, {read.strip()}")
            text_to_parse = read
    variable = variable_counts(text_to_parse) if "x" in text_to_parse and _VARIABLE_COUNT.search(text_to_parse) \
        else None
    if variable is not None:
        fixed, value = variable
        notes.append(f"a variable count written ({text_to_parse.strip()!r}): scored with x = {format_count(value)},"
                     f" {fixed.strip()} ({'equal shares of the site' if value == 0.5 else 'one per formula unit'});"
                     " write the number")
        text_to_parse = fixed
        plain = False
    if not plain and _NONSTOICHIOMETRY.search(text_to_parse):
        exact = nonstoichiometric_text(text_to_parse)
        notes.append(f"non-stoichiometry written ({text_to_parse.strip()!r}): scored as the ideal formula {exact.strip()}"
                     " (x = 0)")
        text_to_parse = exact
    reagent = quaternary_reagent_code(text_to_parse) if _QUATERNARY_REAGENT.fullmatch(text_to_parse) or \
        text_to_parse.strip() in _SALT_CODES else None
    if reagent is not None:
        notes.append(f"read the reagent code {text_to_parse.strip()!r} as {reagent} (common practice)")
        text_to_parse = reagent
        plain = False
    if water_of_code:
        text_to_parse += water_of_code
        plain = False
    if plain:
        cleaned = _plain_normalised(text_to_parse)
    else:
        text_to_parse = _shorthand_with_spaces(text_to_parse)
        cleaned = _normalise_text(text_to_parse)
    ligands, inner = (), ""
    if "(" in cleaned:
        core, ligands, inner = written_ligands(cleaned)
        if ligands and _metal_written(core):
            cleaned = core
        else:
            ligands = ()
    ammines = 0.0
    if not ligands and cleaned.startswith("[") and "(NH3)" in cleaned:
        # a neutral ammine complex written whole in square brackets ([Pt(NH3)2Cl2], cisplatin): one molecule
        cleaned, ammines = _neutral_ammine_complex(cleaned)
    cleaned, abbreviations = expand_abbreviations(cleaned)
    if abbreviations:
        notes.append("read the abbreviations " + ", ".join(abbreviations) + " (common practice)")
    m = _UNSTATED_WATER.fullmatch(cleaned)
    if m:
        # "CoCl2·xH2O", "Fe2O3.nH2O": a hydrate of unstated water, as catalogues and stock
        # lists write it (common practice); the anhydrous salt is scored and the row says so
        notes.append(
            f"water of crystallisation not stated ({m.group('water')!r}): values are for anhydrous"
            f" {m.group('salt')}, and the molar mass leaves the water out"
        )
        cleaned = m.group("salt")
    if not cleaned:
        raise FormulaError("empty formula")
    if len(cleaned) > MAX_FORMULA_LENGTH:
        # checked again once written out: a compatibility character can stand for several (U+216B is XII)
        raise FormulaError(
            f"formula is {len(cleaned)} characters long once normalised ({len(text)} as typed); the limit is"
            f" {MAX_FORMULA_LENGTH} (starts {cleaned[:20]!r})"
        )
    try:
        parsed = _parse_normalised(cleaned)
        if ligands:
            parsed = _with_ligands(parsed, ligands, inner)
        if ammines:
            parsed = _with_ammines(parsed, ammines)
    except FormulaError as exc:
        glued = glued_ionic_liquid(cleaned) if _GLUED.fullmatch(cleaned) else None
        if glued is not None:
            # an ionic liquid's cation code run into its anion ("BMIMBF4", "EMIMCl"), as stock lists write it
            notes.append(f"read {cleaned!r} as the ion codes {glued} run together (common practice)")
            return parse_formula(glued).respelled(text, notes=tuple(notes))
        message = str(exc)
        hint = _suggest(cleaned)
        if hint:
            message += f"; did you mean {hint!r}?"
        elif cleaned != text:
            message += f" (read from {text!r})"
        raise FormulaError(message) from None
    if not notes and not parsed.notes and parsed.text == text:
        return parsed
    if solvent is not None and not parsed.ion_hints:
        # a solvent's or reagent's code names one molecule (TRIS is no propylammonium hydrogencarbonate); an
        # acid's H(+) reading stands (TFA; scorer.ions)
        # (an alkoxide or metal amide the code stands for keeps its written group: TEOS, TTIP, LDA)
        parsed = dataclasses.replace(parsed, structure_hint=parsed.structure_hint if parsed.structure_hint in (
            "ester", ALKOXIDE_HINT, METAL_AMIDE_HINT) else "molecule")
    return parsed.respelled(text, notes=tuple(notes) + parsed.notes)


def _metal_written(text: str) -> bool:
    """Whether ``text`` writes a metal's symbol (the ligands of :mod:`scorer.coordination` need one to bind)."""
    return any(m.group() in metal_symbols() for m in re.finditer(r"[A-Z][a-z]?", text))


# an ammine group inside a complex: "(NH3)" and its count
_AMMINE_GROUP = re.compile(r"\(NH3\)(\d*(?:\.\d+)?)")


def _neutral_ammine_complex(cleaned: str) -> tuple[str, float]:
    """(the text without its ammine groups, how many NH3) of a complex written whole in square brackets with no
    charge and nothing outside them, a metal and its anionic ligands inside beside written (NH3) groups
    (``[Pt(NH3)2Cl2]``, ``[Co(NH3)3Cl3]``); (``cleaned``, 0) for any other text. A salt of an ammine complex
    ([Co(NH3)6]Cl3, [Cu(NH3)4]SO4) writes something beside the brackets and is read by the ion library.

    >>> _neutral_ammine_complex("[Pt(NH3)2Cl2]"), _neutral_ammine_complex("[Co(NH3)6]Cl3")
    (('PtCl2', 2.0), ('[Co(NH3)6]Cl3', 0.0))
    """
    if not cleaned.endswith("]") or cleaned.find("]") != len(cleaned) - 1 or cleaned.count("[") != 1:
        return cleaned, 0.0
    inner = cleaned[1:-1]
    count = sum(float(m.group(1) or 1) for m in _AMMINE_GROUP.finditer(inner))
    rest = _AMMINE_GROUP.sub("", inner)
    if not count or not rest or not _metal_written(rest) or "(" in rest and "NH3" in rest:
        return cleaned, 0.0
    return rest, count


def _with_ammines(parsed: ParsedFormula, ammines: float) -> ParsedFormula:
    """``parsed`` (a neutral complex without its ammine ligands) with them as neutral adducts, their atoms counted
    in, and the structure hint of a neutral complex (:mod:`scorer.coordination`)."""
    totals = dict(parsed.counts)
    totals["N"] = totals.get("N", 0.0) + ammines
    totals["H"] = totals.get("H", 0.0) + 3 * ammines
    adducts = dict(parsed.neutral_adducts)
    adducts["NH3"] = adducts.get("NH3", 0.0) + ammines
    return dataclasses.replace(
        parsed, counts=tuple((s, totals[s]) for s in hill_order(totals)), neutral_adducts=tuple(sorted(adducts.items())),
        structure_hint=coordination_hint(None))


def _with_ligands(parsed: ParsedFormula, ligands, inner: str) -> ParsedFormula:
    """``parsed`` (the formula without its written neutral ligands) with the ligands as neutral adducts, their
    atoms counted in, and the structure hint of a neutral complex or of a complex salt
    (:mod:`scorer.coordination`)."""
    totals = dict(parsed.counts)
    for name, n in ligands:
        for symbol, k in ligand_compositions()[name]:
            totals[symbol] = totals.get(symbol, 0.0) + k * n
    total_atoms = sum(totals.values()) + 3 * parsed.hydrate_water
    if total_atoms > MAX_TOTAL_ATOMS:
        raise FormulaError(f"{parsed.text!r} has {total_atoms:g} atoms per formula unit; the limit is {MAX_TOTAL_ATOMS}")
    inner_counts = dict(_parse_normalised(inner).counts) if inner else None
    adducts = dict(parsed.neutral_adducts)
    for name, n in ligands:
        adducts[name] = adducts.get(name, 0.0) + n
    return dataclasses.replace(
        parsed, counts=tuple((s, totals[s]) for s in hill_order(totals)), neutral_adducts=tuple(sorted(adducts.items())),
        structure_hint=coordination_hint(inner_counts))


@per_input(maxsize=65536)
def _parse_normalised(cleaned: str) -> ParsedFormula:
    """Parse text already mapped onto the plain alphabet: spellings that differ
    only in Unicode, separators or spaces share this cache."""
    hydrate = _as_hydrate(cleaned)
    if hydrate is not None:
        return hydrate
    return _parse_cleaned(cleaned, cleaned, [])


def _as_hydrate(cleaned: str) -> ParsedFormula | None:
    """A salt followed only by lattice water (``CuSO4*5H2O``) read as the
    cached salt plus its water, so that the hydrates of one salt parse it
    once; the same ParsedFormula the full reading gives (a test checks this).
    None when the text is anything else, or the salt part alone reads
    differently (a charge, a note, only H and O)."""
    if not cleaned.endswith("H2O"):
        return None
    parts = _split_components(cleaned)
    if len(parts) < 2 or not parts[0]:
        return None
    water = 0.0
    for part in parts[1:]:
        m = _WATER_PART.fullmatch(part)
        if m is None:
            return None
        count = float(m.group(1) or 1.0)
        if not 0 < count <= MAX_COUNT:
            return None
        water += count
    salt_and_atoms = _hydrate_salt(parts[0])
    if salt_and_atoms is None:
        return None
    salt, salt_atoms = salt_and_atoms
    water += salt.hydrate_water
    total_atoms = salt_atoms + 3 * water
    if total_atoms > MAX_TOTAL_ATOMS or not math.isfinite(total_atoms):
        return None
    return salt.respelled(cleaned, hydrate_water=water)


@per_input(maxsize=65536)
def _hydrate_salt(text: str) -> tuple[ParsedFormula, float] | None:
    """The salt part of a hydrate (:func:`_as_hydrate`) parsed, with its number of atoms; None when it does
    not parse or reads differently alone (a charge, a note, only H and O). Once per salt part: every hydrate
    of one salt shares it."""
    try:
        salt = _parse_normalised(text)
    except FormulaError:
        return None
    if salt.charge or salt.notes or all(symbol in ("H", "O") for symbol, _ in salt.counts):
        return None
    return salt, sum(n for _, n in salt.counts)


# the adducts written most often, which are no ligand code (the ligand table is not built for them)
_PLAIN_ADDUCTS = frozenset({"H2O", "D2O", "NH3", "HCl", "HF", "H2O2"})


@once
def _adduct_ligands() -> dict[str, str]:
    """Spelling -> abbreviation of the neutral ligands of ``ligands.csv`` read after an adduct dot, as written
    and as the alkyl and aryl abbreviations are expanded before the dot's parts are read (SMe2 is S(CH3)2 by
    then); carbon monoxide aside, an element formula whose reading stays as it was (CO)."""
    out = {}
    for spelling in ligand_spellings():
        name = ligand_abbreviation(spelling)
        if name == "CO":
            continue
        out[spelling] = name
        out.setdefault(expand_abbreviations(spelling)[0], name)
    return out


AMMONIUM_HINT = "ammonium*"
_NH4_GROUP = re.compile(r"\(NH4\)(\d+(?:\.\d+)?)?|NH4")


def _written_ammonium_groups(component: str) -> float | None:
    """How many NH4 groups one component writes at its top level ("(NH4)2SO4" 2, "NH4Fe(SO4)2" 1); None where one
    sits inside other brackets ("Fe(NH4SO4)2"), whose multiplier the count would miss.

    >>> _written_ammonium_groups("(NH4)2SO4"), _written_ammonium_groups("NH4Fe(SO4)2"), _written_ammonium_groups("Fe(NH4SO4)2")
    (2.0, 1.0, None)
    """
    total = 0.0
    for m in _NH4_GROUP.finditer(component):
        before = component[:m.start()]
        if sum(before.count(o) for o in "([{") != sum(before.count(c) for c in ")]}"):
            return None
        total += float(m.group(1)) if m.group(1) else 1.0
    return total


def _parse_cleaned(text: str, cleaned: str, notes: list[str]) -> ParsedFormula:
    body, charge, charge_note = _split_charge(cleaned)
    if not body:
        raise FormulaError(f"no formula before the charge in {text!r}")
    if charge_note:
        notes.append(charge_note)
    totals: dict[str, float] = {}
    water = 0.0
    hints: dict[str, float] = {}
    adducts: dict[str, float] = {}
    written_ammonium: float | None = 0.0 if "NH4" in body else None
    hydrohalide: dict[str, float] = {}
    isotopes: dict[str, float] = {}
    parts: list[str] = []  # the components other than lattice water, as written ("" with a multiplier)
    for index, component in enumerate(_split_components(body)):
        if not component:
            raise FormulaError(f"an adduct separator with nothing after it in {text!r}")
        m = _NUMBER.match(component)
        multiplier = 1.0
        if m:
            multiplier = float(m.group())
            if multiplier <= 0 or multiplier > MAX_COUNT:
                raise FormulaError(f"multiplier {m.group()} in {text!r} must be between 0 and {MAX_COUNT}")
            component = component[m.end():]
            if not component:
                raise FormulaError(f"multiplier {m.group()} with no formula after it in {text!r}")
        if index > 0 and component not in _PLAIN_ADDUCTS and component in _adduct_ligands():
            # a neutral ligand or solvent after the dot, written by its code ("LiCl·2THF", "CuBr·SMe2",
            # "BH3·THF"): that molecule (THF read as an element formula was tritium, hydrogen and fluorine).
            # Beside a metal salt it is set apart as an adduct, as water is; beside a molecule (BH3·THF,
            # BF3·OEt2) the two are one molecular complex, read as a whole
            name = _adduct_ligands()[component]
            if any(is_metal(symbol) for symbol in totals):
                adducts[name] = adducts.get(name, 0.0) + multiplier
            for symbol, n in ligand_compositions()[name]:
                totals[symbol] = totals.get(symbol, 0.0) + n * multiplier
            continue
        if written_ammonium is not None and "NH4" in component:
            groups = _written_ammonium_groups(component)
            written_ammonium = None if groups is None else written_ammonium + groups * multiplier
        counted, ion_refs, written_heavy = _component(component)
        for symbol, n in written_heavy.items():
            isotopes[symbol] = isotopes.get(symbol, 0.0) + n * multiplier
        counts = dict(counted)
        water += counts.pop(_WATER, 0.0) * multiplier
        if not counts and not ion_refs and not water:
            raise FormulaError(f"no elements in {component!r}")
        if index > 0 and counts == {"H": 2.0, "O": 1.0} and not ion_refs:
            water += multiplier
            continue
        parts.append(component if multiplier == 1.0 else "")
        key = tuple(sorted(counts.items()))
        if index > 0 and not ion_refs and key in _HYDROGEN_HALIDES:
            # an amine salt written with its acid: C6H5NH2·HCl, C2H8N2·2HCl (scorer.ions reads the amine protonated)
            halide = _HYDROGEN_HALIDES[key]
            hydrohalide[halide] = hydrohalide.get(halide, 0.0) + multiplier
        if index > 0 and key in _NEUTRAL_ADDUCTS and not ion_refs:
            name = _NEUTRAL_ADDUCTS[key]
            adducts[name] = adducts.get(name, 0.0) + multiplier
        for ion_id, n in ion_refs:
            hints[ion_id] = hints.get(ion_id, 0.0) + n * multiplier
            for symbol, k in ion_library.get_ion(ion_id).composition:
                totals[symbol] = totals.get(symbol, 0.0) + k * n * multiplier
        for symbol, n in counts.items():
            totals[symbol] = totals.get(symbol, 0.0) + n * multiplier
    if not totals:
        if water:
            totals = {"H": 2.0 * water, "O": water}
            water = 0.0
        else:
            raise FormulaError(f"no elements in {text!r}")
    total_atoms = sum(totals.values()) + 3 * water
    if total_atoms > MAX_TOTAL_ATOMS or not math.isfinite(total_atoms):
        raise FormulaError(f"{text!r} has {total_atoms:g} atoms per formula unit; the limit is {MAX_TOTAL_ATOMS}")
    if not hints and not isotopes and not charge and len(parts) == 1 and parts[0]:
        # an organic or protic salt written as its ions run together (N2H5HCOO, CH3NH3CH3COO): those ions, as their
        # bracketed spelling names them (scorer.written_ions)
        hints = dict(written_ion_hints(parts[0]))
    ordered = tuple((s, totals[s]) for s in hill_order(totals))
    hint = ""
    carboxylates = written_carboxylates(cleaned) if "CO" in cleaned and (
        "NH4" in cleaned or any(is_metal(s) for s in totals)) else ()
    if carboxylates and not hints:
        # carboxylate groups written out beside a metal (Zn(C11H23COO)2, Cu(CH3(CH2)6COO)2): that metal's salt of
        # them, not a molecule with metal-carbon bonds (scorer.carboxylates)
        hint = carboxylate_hint(carboxylates)
    elif len(hydrohalide) == 1 and next(iter(hydrohalide.values())).is_integer():
        (halide, n), = hydrohalide.items()
        hint = f"{HYDROHALIDE_HINT}{halide}*{int(n)}"
    elif "N(" in cleaned and written_metal_amide(cleaned) is not None:
        # an alkali-metal amide of a secondary amine written by its groups (LiN(C3H7)2, NaN(Si(CH3)3)2): a strong
        # base of M-N bonds (scorer.metal_amides)
        hint = METAL_AMIDE_HINT
    elif ("(O" in cleaned or "O)" in cleaned) and written_alkoxide(cleaned) is not None:
        # a metal alkoxide written by its groups (Ti(OC3H7)4, Al(OiPr)3; Ta(C2H5O)5 as a name reads): M-O-C bonds,
        # a molecule, not a salt of the ethoxide ion (scorer.alkoxides)
        hint = ALKOXIDE_HINT
        hints = {}
    elif _ORGANOMETALLIC_GROUPS.search(cleaned):
        hint = "organometallic"
    elif _ACYL_HALIDE.search(cleaned):
        hint = "acyl_halide"
    elif totals.get("C", 0) >= 2 and "H" in totals and _ISOCYANATE.search(cleaned):  # R-NCO, not HNCO
        hint = "isocyanate"
    elif _ACID_ANHYDRIDE.match(cleaned):
        hint = "acid_anhydride"
    elif _ESTER.search(cleaned) and "COOH" not in cleaned and "CO2H" not in cleaned and not hints:
        hint = "ester"
    elif "(NH2)" in cleaned:
        hint = "amide"
    elif _FULMINATE.search(cleaned):
        hint = "fulminate"
    elif written_onium(cleaned) is not None:
        # organic groups written on N, P, As (four) or S (three) before the anion ((C2H5)3(C6H5CH2)NCl,
        # (C6H5)4PBr, (CH3)3SI): that onium cation, which the composition alone does not name (C13H22ClN is
        # also 1-octylpyridinium chloride); scorer.onium_groups
        centre, groups, _ = written_onium(cleaned)
        hint = onium_hint(centre, groups)
        # a bracketed group is one of the cation's groups, not an ion of its own ((HOCH2CH2)3(CH3)NOH holds
        # no ethoxide)
        group_keys = {tuple(sorted((s, float(n)) for s, n in group_counts(g).items())) for g, _ in groups}
        hints = {ion_id: n for ion_id, n in hints.items()
                 if tuple(sorted(ion_library.get_ion(ion_id).composition)) not in group_keys}
    elif ("4N" in cleaned or "N(" in cleaned) and _QUATERNARY_WRITTEN.search(cleaned):
        # four alkyl groups written on nitrogen ((CH3)4NCl, N(CH3)4OH): the quaternary cation, not its protic
        # isomer (C4H12N+ is tetramethylammonium or butylammonium by its composition alone)
        hint = "quaternary"
    elif "NH4" in cleaned.replace("[", "").replace("]", ""):
        # the ammonium ion written out: NH4SCN and NH4OCN are the salts, while CH4N2S and
        # CH4N2O name thiourea and urea (scorer.ions._woehler_isomer); with the number of NH4 groups written
        # where the text says it plainly ("ammonium*2" for (NH4)2SO4), which a reading must keep
        hint = "ammonium" if not written_ammonium else f"{AMMONIUM_HINT}{format_count(written_ammonium)}"
    return ParsedFormula(
        text=text,
        counts=ordered,
        hydrate_water=water,
        charge=charge,
        ion_hints=tuple(sorted(hints.items())),
        neutral_adducts=tuple(sorted(adducts.items())),
        structure_hint=hint,
        notes=tuple(notes),
        isotopes=tuple(sorted(isotopes.items())),
    )


# four like alkyl groups written on one nitrogen, before or after it
_QUATERNARY_WRITTEN = re.compile(r"\((?:CH3|C2H5|C3H7|C4H9)\)4N(?![a-z])|(?<![A-Za-z])N\((?:CH3|C2H5|C3H7|C4H9)\)4")
# an MXene's layer (M_n+1 X_n, X carbon or nitrogen) and its terminations T_x
_TERMINATIONS = re.compile(r"\s*(?P<core>(?:[A-Z][a-z]?\d*(?:\.\d+)?)+?[CN]\d*(?:\.\d+)?)(?P<tx>T_?[xₓ])\s*")
_STOCK_NAME = re.compile(r"[A-Z][a-z]?\((?:I{1,3}|IV|V|VI{1,3}|IX|X)\)")
# a structure label before the formula: Greek-letter polymorphs (alpha-Al2O3, γ-Fe2O3), the one-letter ones of
# materials data (h-BN hexagonal, c-BN cubic, w- wurtzite, t-/m-/o-/r- tetragonal, monoclinic, orthorhombic,
# rhombohedral, a- amorphous) and Ramsdell's polytypes (2H-MoS2, 1T-TaS2, 4H-SiC); common practice
POLYMORPH_LABEL = re.compile(
    r"^\s*(?:[αβγδεζηθκλω]|(?i:alpha|beta|gamma|delta|epsilon|zeta|eta|theta|kappa|lambda|omega)|[hcwtmora]"
    # and the isomer descriptors of complexes (cis-[Pt(NH3)2Cl2], fac-, mer-; IUPAC Red Book 2005, IR-9.3.4)
    r"|(?i:cis|trans|fac|mer)"
    r"|[1-9]\d?[HTRCOM])\s*-\s*(?=[A-Z(\[])"
    # not the hyphenated prefix of an alkyl group (t-BuLi, t-BuOK: tert-butyl; scorer.abbreviations)
    r"(?!(?<=t-)Bu|(?<=t -)Bu|(?<=t- )Bu)")
# "(s)", "(aq)", "(anhydr.)", "(tech. grade)": lowercase notes after the formula
_ANNOTATION = re.compile(r"\s*\((?=[^)]*[a-z])[a-z .,%0-9-]+\)\s*$")


# quaternary ammonium reagents as catalogues and lab notebooks abbreviate them: tetrabutylammonium bromide
# TBAB, TBAF, TBAHS, TBAPF6, tetraethylammonium tetrafluoroborate TEABF4, tetramethylammonium hydroxide TMAH,
# cetyltrimethylammonium bromide CTAB (common practice); one letter after the cation code is the halide or
# hydroxide (B, C, F, I, H); P is left out (perchlorate or hexafluorophosphate, as the writer meant)
_QUATERNARY_REAGENT = re.compile(r"\s*(TMA|TEA|TPA|TBA|THA|TOA|CTA)(PF6|BF4|ClO4|HSO4|HS|OH|NO3|OAc|Br|Cl|B|C|F|I|H)\s*")
_REAGENT_CATIONS = {"TMA": "[N1111]", "TEA": "[N2222]", "TPA": "[N3333]", "TBA": "[N4444]", "THA": "[N6666]",
                    "TOA": "[N8888]", "CTA": "[N11116]"}
_REAGENT_ANIONS = {"B": "Br", "C": "Cl", "F": "F", "I": "I", "H": "(OH)", "OH": "(OH)", "HS": "[HSO4]",
                   "HSO4": "[HSO4]", "PF6": "[PF6]", "BF4": "[BF4]", "ClO4": "[ClO4]", "NO3": "[NO3]", "OAc": "[OAc]",
                   "Br": "Br", "Cl": "Cl"}


# a whole cell that is a solvent's or reagent's laboratory code (THF, DMSO, EC, DMC: scorer/data/solvent_codes.csv);
# THF would otherwise read as tritium, hydrogen and fluorine, PC as phosphorus carbide
_SOLVENT_CODE = re.compile(r"\s*[A-Za-z]{2,6}\d?\s*")
# a code and its lattice water after a dot: "TBAF·3H2O", "TBAB.H2O", "LiTFSI*xH2O" (common practice)
_CODE_WITH_WATER = re.compile(r"\s*(?P<code>\d?[A-Za-z]{2,6}\d{0,3}|(?:[A-Z][a-z]?\d*){1,3}E[DG]TA)\s*[·.*•]\s*"
                              r"(?P<water>(?:\d+(?:\.\d+)?|[xn])?H2O)\s*")
# "CuSO4x5H2O": a lower-case x glued between a formula and its counted water, for the hydrate dot
_GLUED_X_WATER = re.compile(r"(?<=[A-Za-z0-9)\]])x(?=\d+(?:\.\d+)?H2O\s*$)")


def _is_code(text: str) -> bool:
    """Whether ``text`` is a laboratory, materials or reagent code the readers below know (THF, LFP, TBAF)."""
    return (laboratory_code(text) is not None
            or ("EDTA" in text or "EGTA" in text) and code_metal_salt(text) is not None
            or (_MATERIAL_CODE.fullmatch(text) is not None and material_code(text) is not None)
            or ((_QUATERNARY_REAGENT.fullmatch(text) is not None or text.strip() in _SALT_CODES)
                and quaternary_reagent_code(text) is not None))
# a laboratory code, a hyphen, space or dot, and a hydrogen halide: "Tris-HCl", "Tris HCl", "TEA·HCl"
_CODE_HYDROHALIDE = re.compile(r"\s*(?P<code>[A-Za-z]{2,6}\d?)\s*[-\s·.]\s*(?P<acid>HCl|HBr|HI)\s*")


def code_hydrohalide(text: str) -> tuple[str, str] | None:
    """(formula text, note) of a laboratory code of a base written with a hydrogen halide, read as the base's
    hydrohalide salt ("Tris-HCl" is tris(hydroxymethyl)aminomethane hydrochloride, a buffer salt; common practice);
    None for any other text, or a code whose formula holds no nitrogen to take the proton.

    >>> code_hydrohalide("Tris-HCl")[0], code_hydrohalide("NaCl-HCl")
    ('C4H11NO3·HCl', None)
    """
    m = _CODE_HYDROHALIDE.fullmatch(text) if isinstance(text, str) else None
    if m is None:
        return None
    entry = laboratory_code(m.group("code"))
    if entry is None or "N" not in re.sub(r"N[a-z]", "", entry[0]):
        return None
    formula, name = entry
    return (f"{formula}·{m.group('acid')}",
            f"read {text.strip()!r} as the {m.group('acid')} salt of the laboratory code {m.group('code')!r},"
            f" {name} (common practice)")


# the chelating acids among the laboratory codes and their acidic hydrogens (four carboxylic acid groups each;
# common practice): a metal written before or after the code names its salt, as blood tubes, fertilisers and
# catalogues write them ("K2EDTA", "K3EDTA", "CaNa2EDTA", "NaFeEDTA", "EDTA-Na2")
_POLYPROTIC_CODES = {"EDTA": 4, "EGTA": 4}
_METAL_PREFIX_CODE = re.compile(r"\s*(?P<metals>(?:[A-Z][a-z]?\d*){1,3})\s*[-·]?\s*(?P<code>EDTA|EGTA)\s*")
_CODE_METAL_SUFFIX = re.compile(r"\s*(?P<code>EDTA|EGTA)\s*-\s*(?P<metals>(?:[A-Z][a-z]?\d*){1,3})\s*")


def code_metal_salt(text: str) -> tuple[str, str] | None:
    """(formula text, note) of a metal salt of a chelating acid's laboratory code (:data:`_POLYPROTIC_CODES`):
    the metals' usual charges replace as many of the acid's hydrogens, the rest stay (K2EDTA is K2H2EDTA,
    dipotassium dihydrogen edetate; CaNa2EDTA has none left). Where a metal has several usual charges, the
    reading that replaces every acidic hydrogen is taken, else the one that replaces most (NaFeEDTA: Fe(3+)).
    None for any other text, or metals whose charges exceed the acid's hydrogens.

    >>> code_metal_salt("K2EDTA")[0], code_metal_salt("CaNa2EDTA")[0], code_metal_salt("EDTA-Na2")[0]
    ('K2C10H14N2O8', 'CaNa2C10H12N2O8', 'Na2C10H14N2O8')
    >>> code_metal_salt("NaFeEDTA")[0], code_metal_salt("EDTA"), code_metal_salt("Cl2EDTA")
    ('NaFeC10H12N2O8', None, None)
    """
    m = (_METAL_PREFIX_CODE.fullmatch(text) or _CODE_METAL_SUFFIX.fullmatch(text)) if isinstance(text, str) else None
    if m is None:
        return None
    metals = re.findall(r"([A-Z][a-z]?)(\d*)", m.group("metals"))
    if not metals or not all(is_element_symbol(symbol) and is_metal(symbol) for symbol, _ in metals):
        return None
    code = m.group("code")
    protons = _POLYPROTIC_CODES[code]
    choices = [[(state * int(n or 1)) for state in get_element(symbol).oxidation_states_main if state > 0]
               for symbol, n in metals]
    totals = sorted({sum(c) for c in itertools.product(*choices)}) if all(choices) else []
    fitting = [t for t in totals if t <= protons]
    if not fitting:
        return None
    charge = protons if protons in fitting else max(fitting)
    formula, name = laboratory_code(code)
    counts = {symbol: int(n) for symbol, n in re.findall(r"([A-Z][a-z]?)(\d*)", formula) for n in [n or 1]}
    counts["H"] -= charge
    acid_part = "".join(f"{symbol}{n if n != 1 else ''}" for symbol, n in counts.items() if n)
    written = m.group("metals") + acid_part
    left = f"H{protons - charge}" if protons - charge > 1 else ("H" if protons - charge else "")
    return (written, f"read {text.strip()!r} as a salt of the laboratory code {code!r} ({name}): {m.group('metals')}"
                     f"{left}{code}, {written} (common practice)")


_SOLVENT_CODES: dict[str, tuple[str, str]] = {}
_CODES_AS_WRITTEN: set[str] = set()


def _solvent_codes() -> dict[str, tuple[str, str]]:
    """Upper-cased code -> (formula, name) of ``solvent_codes.csv``, read once (the parser then reads the module
    global, so an ordinary formula pays no call for the check)."""
    if not _SOLVENT_CODES:
        rows = table("solvent_codes.csv")
        _CODES_AS_WRITTEN.update(row["code"] for row in rows)
        _SOLVENT_CODES.update({row["code"].upper(): (row["formula"], row["name"]) for row in rows})
    return _SOLVENT_CODES


# a materials code of scorer/data/material_codes.csv: letters, a leading digit (8YSZ) or up to three after (NMC811)
_MATERIAL_CODE = re.compile(r"\s*\d?[A-Za-z]{2,7}\d{0,3}\s*")
_MATERIAL_CODES: dict[str, tuple[str, str, str]] = {}


def material_code(text: str) -> tuple[str, str] | None:
    """(formula, name) of a whole cell that is a materials code of ``material_codes.csv`` (a battery, ceramic,
    laser-host or thin-film material by its usual acronym); None otherwise. The code as listed, or all in capitals
    or all in lower case; any other mixed case is a formula's (YAg is no YAG).

    >>> material_code("LFP"), material_code("nmc811")[0], material_code("YAg"), material_code("NaCl")
    (('LiFePO4', 'lithium iron phosphate'), 'LiNi0.8Mn0.1Co0.1O2', None, None)
    """
    if not isinstance(text, str) or not _MATERIAL_CODE.fullmatch(text):
        return None
    if not _MATERIAL_CODES:
        _MATERIAL_CODES.update({row["code"].upper(): (row["formula"], row["name"], row["code"])
                                for row in table("material_codes.csv")})
    code = text.strip()
    entry = _MATERIAL_CODES.get(code.upper())
    if entry is None or not (code == entry[2] or code.isupper() or code.islower()):
        return None
    return entry[0], entry[1]


# an alloy as metallurgy designates it: the base metal, then each addition's weight percent before its symbol
# (Ti-6Al-4V, Fe-18Cr-8Ni, Al-12Si, Fe-0.8C; common practice, ASTM and ISO alloy designations)
_ALLOY = re.compile(r"\s*([A-Z][a-z]?)((?:\s*-\s*\d+(?:\.\d+)?\s*[A-Z][a-z]?)+)\s*")
_ALLOY_ADDITION = re.compile(r"-\s*(\d+(?:\.\d+)?)\s*([A-Z][a-z]?)")
# non-metals an alloy takes as additions (carbon and nitrogen steels, silicon and phosphorus bronzes, boron)
_ALLOY_NON_METALS = frozenset({"B", "C", "N", "Si", "P", "S"})


def alloy_designation(text: str) -> tuple[str, str] | None:
    """(formula in atom fractions, note) of an alloy designation, or None for any other text: ``Ti-6Al-4V``
    is 6 wt% Al and 4 wt% V, the balance Ti, which is Ti0.862Al0.102V0.036 in atoms (4 significant digits).

    >>> alloy_designation("Ti-6Al-4V")[0], alloy_designation("LiCl-KCl")
    ('Ti0.862Al0.102V0.036', None)
    """
    m = _ALLOY.fullmatch(text) if isinstance(text, str) else None
    if m is None or not is_element_symbol(m.group(1)) or not is_metal(m.group(1)):
        return None
    additions = [(symbol, float(wt)) for wt, symbol in _ALLOY_ADDITION.findall(m.group(2))]
    symbols = [m.group(1)] + [s for s, _ in additions]
    if len(set(symbols)) != len(symbols) or not all(
            is_element_symbol(s) and (is_metal(s) or s in _ALLOY_NON_METALS) for s, _ in additions):
        return None
    balance = 100.0 - sum(wt for _, wt in additions)
    if balance <= 0 or any(wt <= 0 for _, wt in additions):
        return None
    moles = [(m.group(1), balance / get_element(m.group(1)).atomic_weight)] + [
        (s, wt / get_element(s).atomic_weight) for s, wt in additions]
    total = sum(n for _, n in moles)
    formula = "".join(f"{s}{n / total:.4g}" for s, n in moles)
    return formula, (f"alloy designation {text.strip()!r} read as weight percent of each addition with the balance"
                     f" {m.group(1)} (common practice): in atom fractions {formula}")


def laboratory_code(text: str) -> tuple[str, str] | None:
    """(formula, name) of a whole cell that is a laboratory code of ``solvent_codes.csv``; None otherwise.

    >>> laboratory_code(" thf "), laboratory_code("NaCl"), laboratory_code("NiS")
    (('C4H8O', 'tetrahydrofuran (oxolane)'), None, None)
    """
    if not isinstance(text, str) or not _SOLVENT_CODE.fullmatch(text):
        return None
    code = text.strip()
    entry = (_SOLVENT_CODES or _solvent_codes()).get(code.upper())
    if entry is None or code.isupper() or code.islower() or code == code.capitalize() or code in _CODES_AS_WRITTEN:
        return entry
    # other mixed case than the code's own is a formula's (NiS is nickel sulfide, not NIS; NbS not NBS)
    return None


# a deuterated solvent as NMR labs write it: "DMSO-d6", "THF-d8" (every hydrogen a deuterium)
_DEUTERATED_CODE = re.compile(r"\s*([A-Za-z]{2,6})-d(\d{1,2})\s*")


def deuterated_solvent(text: str) -> tuple[str, str] | None:
    """(formula, name) of a solvent code with every hydrogen written as deuterium: ``DMSO-d6`` ->
    ``C2D6OS``; None where the code is unknown or the count is not the molecule's hydrogen count.

    >>> deuterated_solvent("DMSO-d6"), deuterated_solvent("DMSO-d5")
    (('C2D6OS', 'dimethyl sulfoxide, fully deuterated'), None)
    """
    m = _DEUTERATED_CODE.fullmatch(text) if isinstance(text, str) else None
    entry = (_SOLVENT_CODES or _solvent_codes()).get(m.group(1).upper()) if m else None
    if entry is None:
        return None
    formula, name = entry
    hydrogens = re.search(r"H(\d*)(?![a-z])", formula)
    if hydrogens is None or int(hydrogens.group(1) or 1) != int(m.group(2)):
        return None
    return formula[:hydrogens.start()] + "D" + formula[hydrogens.start() + 1:], f"{name}, fully deuterated"


# a variable deviation from stoichiometry written on a count: TiO2-x, CeO2-δ, YBa2Cu3O7-δ, Fe1-xO, Li1+xMn2O4
# (common practice in solid-state chemistry); a count of 1 may be left unwritten before it (TiO2-x has 2); a
# plain "d" stands for delta right after a written count (YBa2Cu3O7-d, as ASCII tables write it; Chloroform-d and
# DMSO-d6 are deuterated solvents)
_NONSTOICHIOMETRY = re.compile(
    r"(?<=[A-Za-z0-9)\]])(\d+(?:\.\d+)?)?\s*[-+±]\s*(?:[xδyz]|(?<=\d[-+±])d)(?=[A-Z(\[·.*\s]|$)")


# a variable as a whole count after an element or a bracket ("LixCoO2", "AlxGa1-xN", "Zn1-xMgxO")
_VARIABLE_COUNT = re.compile(r"(?<=[A-Za-z)\]])x(?=[A-Z(\[·.*\s]|$)")
_VARIABLE_TERM = re.compile(r"(?<=[A-Za-z)\]])(\d+(?:\.\d+)?)\s*([-+])\s*x(?=[A-Z(\[·.*\s]|$)")


# the element symbol that ends a text (compiled once: a hostile cell pays no compilation)
_SYMBOL_AT_END = re.compile(r"[A-Z][a-z]?$")


def variable_counts(text: str) -> tuple[str, float] | None:
    """(the text with its variable count x given a value, the value): x = 0.5 where x shares a site with 1 - x
    (``AlxGa1-xN`` -> ``Al0.5Ga0.5N``, a solid solution of unstated proportions), x = 1 where x stands alone
    (``LixCoO2`` -> ``Li1CoO2``, the full formula unit; common practice in the battery literature). Only a metal
    takes a variable count so; None otherwise (``CxHy``, ``TlCxN``: not read).

    >>> variable_counts("AlxGa1-xN"), variable_counts("LixCoO2"), variable_counts("Zn1-xMgxO")
    (('Al0.5Ga0.5N', 0.5), ('Li1CoO2', 1.0), ('Zn0.5Mg0.5O', 0.5))
    >>> variable_counts("TlCxN") is None
    True
    """
    for m in _VARIABLE_COUNT.finditer(text):
        symbol = _SYMBOL_AT_END.search(text[:m.start()])
        if symbol is None or not is_element_symbol(symbol.group()) or not is_metal(symbol.group()):
            return None
    value = 0.5 if _VARIABLE_TERM.search(text) else 1.0

    def term(m: re.Match) -> str:
        base = float(m.group(1))
        result = base - value if m.group(2) == "-" else base + value
        return format_count(result) if result > 0 else "0"

    fixed = _VARIABLE_TERM.sub(term, text)
    return _VARIABLE_COUNT.sub(format_count(value), fixed), value


def _ideal_count(m: re.Match) -> str:
    return m.group(1) or ""


# elements sharing one site, as solid-state chemistry writes them: Cu(In,Ga)Se2, (Ba,Sr)TiO3
# the usual charge of the cations and anions of the compound-semiconductor alloys: groups 2 and 12 (2+), 13 (3+),
# Sn and Pb beside chalcogens (2+); pnictogens (3-), chalcogens (2-) (common practice: III-V, II-VI, IV-VI alloys)
_ALLOY_CATION_CHARGE = {2: 2, 12: 2, 13: 3}
_ALLOY_ANION_CHARGE = {15: 3, 16: 2}
_ALLOY_IV_VI_CATIONS = frozenset({"Sn", "Pb", "Ge"})
_SYMBOL_RUN = re.compile(r"[A-Z][a-z]?")
# the metals of the rock-salt nitride coatings written by their elements (TiAlN, AlCrN, TiZrN: (Ti,Al)N; PalDey &
# Deevi, Mater. Sci. Eng. A 342 (2003) 58; from memory), one nitride ion per metal as in TiN and AlN
_ROCK_SALT_NITRIDE_METALS = frozenset("Sc Y Ti Zr Hf V Nb Ta Cr Al Ga In".split())


# Cu or Ag, two group-13 metals without counts and a chalcogen with count 2: the I-III-VI2 chalcopyrite alloys
# written without fractions (CuInGaSe2, CuInGaS2, AgInGaSe2; common practice)
_CHALCOPYRITE_ALLOY = re.compile(r"(?P<m>Cu|Ag)(?P<a>Al|Ga|In)(?P<b>Al|Ga|In)(?P<x>S|Se|Te)2")


@per_input(maxsize=4096)
def unsubscripted_alloy(text: str) -> str | None:
    """The sites of a compound-semiconductor alloy written as its elements alone, cations then anions, each
    site of one charge and the two charges equal (``InGaN`` -> ``(In,Ga)N``, ``AlInGaP`` -> ``(Al,In,Ga)P``,
    ``GaAsP`` -> ``Ga(As,P)``, ``HgCdTe`` -> ``(Hg,Cd)Te``); None for any other text (``NaCl``, ``KSCN``,
    ``GaAs``, ``BiSbTe``). Vegard-type alloys are written so in
    the semiconductor literature when the fractions vary or are not the point (common practice).

    >>> unsubscripted_alloy("InGaN"), unsubscripted_alloy("GaInAsP")
    ('(In,Ga)N', '(Ga,In)(As,P)')
    >>> unsubscripted_alloy("GaAs"), unsubscripted_alloy("KSCN"), unsubscripted_alloy("BiSbTe"), unsubscripted_alloy("ZnSO")
    (None, None, None, None)
    """
    symbols = _SYMBOL_RUN.findall(text)
    if "".join(symbols) != text or len(set(symbols)) != len(symbols) or not all(is_element_symbol(s) for s in symbols):
        return None
    if len(symbols) < 3:
        return None
    group = {s: get_element(s).group for s in symbols}
    split = next((i for i, s in enumerate(symbols) if group[s] in _ALLOY_ANION_CHARGE), None)
    if split is None or split == 0:
        return None
    cations, anions = symbols[:split], symbols[split:]
    if not all(group[s] in _ALLOY_ANION_CHARGE for s in anions):
        return None
    if len(anions) > 1 and "O" in anions:
        return None  # oxygen beside another anion is an oxoanion that lost its count (ZnSO for ZnSO4), no alloy
    anion_charges = {_ALLOY_ANION_CHARGE[group[s]] for s in anions}
    cation_charges = {2 if (s in _ALLOY_IV_VI_CATIONS and anion_charges == {2}) else
                      3 if (s in _ROCK_SALT_NITRIDE_METALS and anions == ["N"]) else
                      _ALLOY_CATION_CHARGE.get(group[s]) for s in cations}
    if len(anion_charges) != 1 or cation_charges != anion_charges:
        return None
    if len(cations) == 1 and len(anions) == 1:
        return None
    site = lambda run: run[0] if len(run) == 1 else f"({','.join(run)})"  # noqa: E731
    return site(cations) + site(anions)


_SOLID_SOLUTION_SITE = re.compile(r"\(\s*([A-Z][a-z]?(?:\s*,\s*[A-Z][a-z]?)+)\s*\)")


def _equal_shares(m: re.Match) -> str:
    symbols = [x.strip() for x in m.group(1).split(",")]
    share = round(1.0 / len(symbols), 4)
    # the last takes the rest, so that the site holds one atom (thirds: 0.3333, 0.3333, 0.3334)
    shares = [share] * (len(symbols) - 1) + [round(1.0 - share * (len(symbols) - 1), 4)]
    return "(" + "".join(f"{x}{format_count(n)}" for x, n in zip(symbols, shares)) + ")"


def nonstoichiometric_text(text: str) -> str | None:
    """The ideal formula of a text written with a variable deviation (``TiO2-x`` -> ``TiO2``), or None.

    >>> nonstoichiometric_text("CeO2-δ"), nonstoichiometric_text("Fe1-xO"), nonstoichiometric_text("LiCl-KCl")
    ('CeO2', 'Fe1O', None)
    """
    if not isinstance(text, str) or not _NONSTOICHIOMETRY.search(text):
        return None
    return _NONSTOICHIOMETRY.sub(_ideal_count, text)


def quaternary_reagent_code(text: str) -> str | None:
    """``TBAB`` -> ``[N4444]Br``: a quaternary ammonium reagent's code as a formula; None for any other text.

    >>> quaternary_reagent_code("TBAB"), quaternary_reagent_code("TEABF4"), quaternary_reagent_code("TMAH")
    ('[N4444]Br', '[N2222][BF4]', '[N1111](OH)')
    >>> quaternary_reagent_code("TBA") is None, quaternary_reagent_code("NaCl") is None
    (True, True)
    >>> quaternary_reagent_code("EAN")
    '[EtNH3][NO3]'
    """
    if isinstance(text, str) and text.strip() in _SALT_CODES:
        return _SALT_CODES[text.strip()]
    m = _QUATERNARY_REAGENT.fullmatch(text) if isinstance(text, str) else None
    if m is None:
        return None
    return _REAGENT_CATIONS[m.group(1)] + _REAGENT_ANIONS[m.group(2)]


# protic ionic liquids by their codes, written as the literature writes them (Greaves & Drummond, Chem. Rev. 108
# (2008) 206; from memory); matched in capitals only. PAN (propylammonium nitrate) is left out: it is also
# polyacrylonitrile, and PaN a formula. The chloroaluminate literature's imidazolium chlorides: EMIC and BMIC
# (1-ethyl- and 1-butyl-3-methylimidazolium chloride, the base of EMIC-AlCl3 electrolytes; common practice)
_SALT_CODES = {"EAN": "[EtNH3][NO3]", "EMIC": "[C2mim]Cl", "BMIC": "[C4mim]Cl"}


# "EMIM-BF4", "BMIM - PF6": an ionic liquid's two codes joined by a hyphen or a dash, as catalogues write them
_HYPHENATED_PAIR = re.compile(r"\s*([A-Za-z][A-Za-z0-9]*)\s*[-–]\s*([A-Za-z][A-Za-z0-9]*)\s*")


def ionic_liquid_pair_text(text: str) -> str | None:
    """``EMIM-BF4`` -> ``[EMIM][BF4]`` when the first code is an organic cation of the library (or one built by
    rule) and the second an anion; None for any other text (``LiCl-KCl`` is a mixture).

    >>> ionic_liquid_pair_text("EMIM-BF4"), ionic_liquid_pair_text("BMIM-Cl"), ionic_liquid_pair_text("LiCl-KCl")
    ('[EMIM][BF4]', '[BMIM]Cl', None)
    """
    m = _HYPHENATED_PAIR.fullmatch(text) if isinstance(text, str) else None
    if m is None:
        return None
    first, second = (ion_library.find_alias(g) for g in m.groups())
    if first is None or first.charge <= 0 or not first.organic:
        return None
    if second is None and m.group(2) in ("F", "Cl", "Br", "I"):
        return f"[{m.group(1)}]{m.group(2)}"  # a halide written as its symbol ("BMIM-Cl")
    if second is None or second.charge >= 0:
        return None
    return f"[{m.group(1)}][{m.group(2)}]"


# a cation code (letters, or C with the chain length: C4mim) run into an anion's code that starts with a capital
_GLUED = re.compile(r"(?:[A-Za-z]{3,}|C\d{1,2}[a-z]{2,})[A-Za-z0-9]*[A-Z][A-Za-z0-9]*")


def glued_ionic_liquid(text: str) -> str | None:
    """``BMIMBF4`` -> ``[BMIM][BF4]``, ``EMIMCl`` -> ``[EMIM]Cl``: an organic cation's code of the library (three
    letters or more) followed directly by an anion's code or a halide symbol; None for any other text.

    >>> glued_ionic_liquid("BMIMBF4"), glued_ionic_liquid("EMIMCl"), glued_ionic_liquid("NaCl")
    ('[BMIM][BF4]', '[EMIM]Cl', None)
    """
    for cut in range(len(text) - 1, 2, -1):
        if not text[cut].isupper():
            continue  # an anion's code starts with a capital (BF4, Cl, NTf2)
        first = ion_library.find_alias(text[:cut])
        if first is None or first.charge <= 0 or not first.organic:
            continue
        rest = text[cut:]
        if rest in ("F", "Cl", "Br", "I"):
            return f"[{text[:cut]}]{rest}"
        second = ion_library.find_alias(rest, exact_case=True)
        if second is not None and second.charge < 0:
            return f"[{text[:cut]}][{rest}]"
    return None


def _shorthand_with_spaces(text: str) -> str:
    """``bmim BF4`` -> ``[bmim][BF4]`` when both words are ions of the library; ``EMIM-BF4`` likewise."""
    pair = ionic_liquid_pair_text(text) if _HYPHENATED_PAIR.fullmatch(text) else None
    if pair is not None:
        return pair
    words = text.split()
    if len(words) != 2 or any(ch in text for ch in "[]"):
        return text
    first = ion_library.find_alias(words[0])
    if first is None or first.charge <= 0 or not first.organic:
        return text
    second = ion_library.find_alias(words[1])
    return f"[{words[0]}][{words[1]}]" if second is not None else f"[{words[0]}]{words[1]}"


# symbols never suggested for two capitals in mixed-case text (LiHMDS is no mendelevium
# compound): short-lived and synthetic elements (common practice; scorer.slips keeps the same list)
_RARE_FOR_SUGGESTIONS = frozenset(
    "Tc Pm Po At Rn Fr Ra Ac Pa Np Pu Am Cm Bk Cf Es Fm Md No Lr Rf Db Sg Bh Hs Mt Ds Rg Cn Nh Fl Mc Lv Ts Og".split()
)


# three to six capitals alone: as often an abbreviation (PAN, AMP) as a formula in capitals, so no rare symbol is
# suggested for it either (PaN, AmP)
_LETTER_CODE = re.compile(r"[A-Z]{3,6}")


def _suggest(cleaned: str) -> str | None:
    """A corrected spelling for a mis-cased symbol ("NaCL" -> "NaCl")."""
    for i in range(len(cleaned) - 1):
        pair = cleaned[i:i + 2]
        if pair.isupper() and pair.isalpha() and is_element_symbol(pair[0] + pair[1].lower()) \
                and (pair[0] + pair[1].lower() not in _RARE_FOR_SUGGESTIONS
                     or cleaned.isupper() and not _LETTER_CODE.fullmatch(cleaned)):
            candidate = cleaned[:i] + pair[0] + pair[1].lower() + cleaned[i + 2:]
            try:
                _parse_cleaned(candidate, candidate, [])
            except FormulaError:
                continue
            return candidate
    return None
