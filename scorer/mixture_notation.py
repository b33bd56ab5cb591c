"""Mixture notation: text in the formula column -> the components and their proportions.

Accepted (components are formulas, or names of ``scorer/data/fusion.csv``
such as ``ChCl`` and ``urea``; blend names of ``scorer/data/blends.csv`` and
of a user's ``--aliases`` file stand for a whole mixture):

* components joined by ``-``, an en dash ``–``, ``:``, ``+`` or ``/`` (spaced or
  not): ``LiCl-KCl``, ``NaNO3–KNO3``, ``ChCl:urea``, ``LiCl + KCl``, ``NaNO3/KNO3``;
* proportions after them: ``58.8:41.2``, ``(46.5-11.5-42 mol%)``,
  ``60:40 wt%``, a molar ratio ``1:2``;
* leading amounts: ``0.588 LiCl + 0.412 KCl``, ``60 wt% NaNO3 + 40 wt% KNO3``,
  ``0.588LiCl·0.412KCl`` (a dot joins a mixture only when every part has a
  decimal amount, so ``CuSO4·5H2O`` and the alum ``K2SO4·Al2(SO4)3·24H2O``
  stay compounds). Where the amounts are percentages, one component may go
  without: it is the balance to 100 (``[C4mim][BF4] + 10 wt% H2O``), and
  the row says so.

Readings that could be either a mixture or one compound are taken as a
mixture with a warning that says so (``KNO3+NaNO3``: the double salt is
written ``KNa(NO3)2``). Text with none of these separators is not looked at
further, so ordinary formulas pay one character scan.

>>> m = read_mixture_text("LiCl-KCl (58.8-41.2 mol%)")
>>> m.parts, m.amounts, m.basis
(('LiCl', 'KCl'), (58.8, 41.2), 'mol')
>>> read_mixture_text("CuSO4·5H2O") is None
True
"""
from __future__ import annotations

import re
from dataclasses import dataclass

from ionicity.scorer.elements import is_element_symbol
from ionicity.scorer.solutions import split_in_solvent

__all__ = ["MixtureText", "MixtureNotationError", "read_mixture_text", "blend_key"]

_NUMBER = r"\d+(?:\.\d+)?"
_BASIS = (r"(?:\s*(?P<basis>mol/mol|mol|wt|mass|w/w|molar|moles?|weight|by\s+(?:moles?|mol|weight|wt|mass))?\.?"
          r"\s*(?:%|percent|pct)?)")
# proportions in brackets at the end: "(46.5-11.5-42 mol%)", "(1:2)"
_BRACKETED = re.compile(
    rf"\s*\(\s*(?P<numbers>{_NUMBER}(?:\s*[-–:/]\s*{_NUMBER})+){_BASIS}\s*\)\s*$", re.IGNORECASE
)
# proportions after a space at the end: "58.8:41.2", "60:40 wt%", "1:2"
_TRAILING = re.compile(
    rf"\s+(?P<numbers>{_NUMBER}(?:\s*[-–:/]\s*{_NUMBER})+){_BASIS}\s*$", re.IGNORECASE
)
_LEADING_AMOUNT = re.compile(
    rf"^\s*(?P<amount>{_NUMBER})\s*(?P<unit>(?:(?P<basis>mol|wt|mass)\s*%|%\s*(?P<after>w/w|mol/mol)?))?\s*(?=[A-Za-z(\[])",
    re.IGNORECASE,
)
_DOTS = "·•∙⋅*"
# an amount written after a component: "KNO3 53 / NaNO2 40 / NaNO3 7 wt%"
_TRAILING_AMOUNT = re.compile(
    rf"^(?P<name>.*?[A-Za-z0-9)\]])\s+\(?\s*(?P<amount>{_NUMBER})\s*\(?\s*"
    rf"(?P<unit>(?:(?P<basis>mol|wt|mass)\s*%|%\s*(?P<after>w/w|mol/mol)?))?\s*\)?\s*$",
    re.IGNORECASE,
)
# a percentage before a component, and two or more of them joined by spaces only: "60% NaNO3 40% KNO3"
_PERCENT_COMPONENT = re.compile(rf"\s*{_NUMBER}\s*(?:(?:mol|wt|mass)\s*)?%\s*[A-Z\[(][A-Za-z0-9()\[\]·.]*")
_SPACED_PERCENTAGES = re.compile(rf"(?:{_PERCENT_COMPONENT.pattern}){{2,}}\s*")
# the same with each percentage after its component: "LiCl 44wt% KCl 56wt%", "NaNO3 60 % KNO3 40 %"
_COMPONENT_PERCENT = re.compile(rf"\s*[A-Z\[(][A-Za-z0-9()\[\]·.]*\s+{_NUMBER}\s*(?:(?:mol|wt|mass)\s*)?%")
_SPACED_TRAILING_PERCENTAGES = re.compile(rf"(?:{_COMPONENT_PERCENT.pattern}){{2,}}\s*")
_QUICK = frozenset("-–—:+·•∙⋅* /")
# proportions by volume: "1:1 v/v", "50 vol%", "by volume" (common practice)
_BY_VOLUME = re.compile(r"(?<![A-Za-z])(?:v\s*/\s*v|vol\.?\s*%|volume\s*%|%\s*v/v|by\s+volume)(?![A-Za-z])", re.I)
_JOINERS = frozenset("-–—:+ /")
_ADDUCT = re.compile(r"^(?:\d+(?:\.\d+)?)?\s*(?:H2O2|H2O|NH3|HF|HCl|CH3OH|C2H5OH|CO2)$")
# an organic base written by its groups (C6H5NH2, (CH3)3N, C5H5N): beside HCl it is the amine salt
_AMINE = re.compile(r"C\d*H.*N|N.*C\d*H")


class MixtureNotationError(ValueError):
    """Text that is clearly a mixture but cannot be read (the message says why)."""


@dataclass(frozen=True)
class MixtureText:
    """What the notation says: component texts, amounts as written and their basis.

    ``amounts`` is empty when no proportion was given; ``basis`` is ``"mol"``
    or ``"wt"``; ``notes`` are the ambiguity warnings of this spelling.
    """

    parts: tuple[str, ...]
    amounts: tuple[float, ...] = ()
    basis: str = "mol"
    notes: tuple[str, ...] = ()
    eutectic: bool = False  # the text asks for the eutectic ("LiF-NaF-KF eutectic")


def blend_key(name: str) -> str:
    """How a blend name is looked up: case and spacing ignored.

    >>> blend_key("  Solar   SALT ")
    'solar salt'
    """
    return " ".join(name.lower().split())


def _split_outside_brackets(text: str, splits_here) -> list[str]:
    """Split ``text`` at each position ``i`` outside brackets where ``splits_here(text, i)`` holds."""
    parts, depth, start = [], 0, 0
    for i, ch in enumerate(text):
        if ch in "([{":
            depth += 1
        elif ch in ")]}":
            depth -= 1
        elif depth == 0 and splits_here(text, i):
            parts.append(text[start:i])
            start = i + 1
    parts.append(text[start:])
    return parts


def _split_top(text: str, separators: str) -> list[str]:
    """Split at any of ``separators`` outside brackets."""
    return _split_outside_brackets(text, lambda t, i: t[i] in separators)


def _joining_dash(text: str, i: int) -> bool:
    # a dash at the end, or after ^, + or another dash, is a charge
    if text[i] not in "-–—" or not 0 < i < len(text) - 1:
        return False
    before, after = text[i - 1], text[i + 1]
    return before not in "^+-" and (after.isalpha() or after in "([ " or after.isdigit())


# the words around a slash in a unit (mol/L, % w/v, mg/kg): no mixture there
_UNIT_WORDS = frozenset("mol mmol umol µmol g mg ug µg kg w v l L ml mL dm3 cm3 m3".split())
_WORD_BEFORE = re.compile(r"[A-Za-zµ0-9]*$")
_WORD_AFTER = re.compile(r"^[A-Za-zµ0-9]*")


def _joining_slash(text: str, i: int) -> bool:
    if text[i] != "/":
        return False
    if 0 < i < len(text) - 1 and text[i - 1].isdigit() and text[i + 1].isdigit():
        return False  # a fractional count inside a formula (LiNi1/3Mn1/3Co1/3O2), not two formulas
    left, right = text[:i].rstrip(), text[i + 1:].lstrip()
    before = _WORD_BEFORE.search(left).group()
    after = _WORD_AFTER.match(right).group()
    # a bracketed ion on either side ends or starts a formula: [C4mim][BF4] / water
    before = before or ("[]" if left.endswith(("]", ")")) else "")
    after = after or ("[]" if right.startswith(("[", "(")) else "")
    # single letters around a slash are a placeholder (N/A, n/a, N/D), not two formulas
    return len(before) > 1 and len(after) > 1 and before not in _UNIT_WORDS and after not in _UNIT_WORDS


def _dash_split(text: str) -> list[str]:
    """Split at dashes that join two formulas (a dash at the end, or after ^, is a charge)."""
    return _split_outside_brackets(text, _joining_dash)


def _basis(word: str | None) -> str:
    if word is None:
        return "mol"
    return "wt" if word.lower().split()[-1] in ("wt", "mass", "w/w", "weight") else "mol"


# a list of components joined by commas, semicolons, "&", "and" or "with" (NaCl, KCl; NaCl and KCl;
# "50 mol% NaCl, 50 mol% KCl"; "[EMIM][TFSI] with 0.5 M LiTFSI"), each a formula with or without its amount
_LIST_JOINER = re.compile(r"\s*[,;&]\s*|\s+(?:and|with)\s+", re.IGNORECASE)
_FORMULA_LIKE = re.compile(r"[\[(]?[A-Z][A-Za-z0-9()\[\]·.]*")
_BARE_AMOUNT = re.compile(rf"^\s*{_NUMBER}\s*(?:(?:mol|wt|mass)\s*%|%|M|mol/L)?\s*(?:{_NUMBER}\s*)?"
                          r"(?=[\[(A-Z])|\s+\(?\s*\d+(?:\.\d+)?\s*(?:(?:mol|wt|mass)\s*%|%)?\s*\)?\s*$", re.IGNORECASE)
# "A/B = 60/40 (wt)", "A:B = 1:1": the ratio after an equals sign; a basis in brackets of its own
_EQUALS_RATIO = re.compile(r"\s*=\s*(?=\d)")
_BRACKETED_BASIS = re.compile(r"\s*\(\s*(wt|mol|w/w|molar|mole|weight|mass)\.?\s*\)\s*$", re.IGNORECASE)


def _listed_components(text: str) -> str:
    """``text`` with a list's joiners written as " + " where every item is a formula (with its amount or not);
    ``text`` unchanged otherwise (a name followed by grade words, "Sodium chloride, ACS reagent", stays)."""
    body, ratio = text.strip(), ""
    for pattern in (_BRACKETED, _TRAILING):
        m = pattern.search(body)
        if m and m.start() > 0:
            # the proportions after the list ("NaCl, KCl (1:1)", "NaCl and KCl 60:40 wt%") stay after it
            body, ratio = body[: m.start()], body[m.start():]
            break
    items = _LIST_JOINER.split(body.strip())
    if len(items) < 2:
        return text
    for item in items:
        core = _BARE_AMOUNT.sub("", item).strip()
        if not core or not _FORMULA_LIKE.fullmatch(core) or re.search(r"[a-z]{3}", core) or not all(
                is_element_symbol(s) for s in re.findall(r"[A-Z][a-z]?", re.sub(r"\[[^\]]*\]", "", core))):
            return text  # a word or unit that is no formula ("2.5L", "ACS reagent")
    return " + ".join(item.strip() for item in items) + ratio


def normalised_list(text: str) -> str:
    """The spellings of a mixture this module reads written as those it reads first.

    >>> normalised_list("NaCl and KCl"), normalised_list("50 mol% NaCl, 50 mol% KCl")
    ('NaCl + KCl', '50 mol% NaCl + 50 mol% KCl')
    >>> normalised_list("NaCl, KCl (1:1)"), normalised_list("NaNO3; KNO3 60:40 wt%")
    ('NaCl + KCl (1:1)', 'NaNO3 + KNO3 60:40 wt%')
    >>> normalised_list("NaNO3/KNO3 = 60/40 (wt)"), normalised_list("Sodium chloride, ACS reagent")
    ('NaNO3/KNO3 60/40 wt%', 'Sodium chloride, ACS reagent')
    """
    if "=" in text:
        text = _EQUALS_RATIO.sub(" ", text)
    if text.rstrip().endswith(")") and _BRACKETED_BASIS.search(text):
        text = _BRACKETED_BASIS.sub(lambda m: f" {m.group(1)}%", text)
    if _LIST_JOINER.search(text):
        text = _listed_components(text)
    return text


def _proportions(text: str) -> tuple[str, tuple[float, ...], str]:
    """(body, amounts, basis) with a trailing proportion taken off."""
    for pattern in (_BRACKETED, _TRAILING):
        m = pattern.search(text)
        if m and m.start() > 0:
            numbers = tuple(float(n) for n in re.findall(_NUMBER, m.group("numbers")))
            return text[: m.start()].strip(), numbers, _basis(m.group("basis"))
    return text.strip(), (), "mol"


def _leading_amounts(parts: list[str]) -> tuple[list[str], tuple[float, ...], str | None, str | None]:
    """(names, amounts, basis, note): amounts written before the components.

    ``basis`` is None when no amount carries a unit; a percentage may be left
    off one component, which then takes the balance to 100 (``note`` says so).
    """
    names: list[str] = []
    amounts: list[float | None] = []
    bases = set()
    percent = False
    trailing = [_TRAILING_AMOUNT.match(part) for part in parts]
    if (len(parts) > 1 and sum(1 for m in trailing if m) == len(parts) - 1
            and all(m.group("unit") for m in trailing if m)
            and not any(_LEADING_AMOUNT.match(part) for part in parts)):
        # percentages after all components but one ("[C4mim][BF4] + H2O (10 wt%)"): that one takes the balance
        for part, m in zip(parts, trailing):
            amounts.append(float(m.group("amount")) if m else None)
            names.append((m.group("name") if m else part).strip())
            if m:
                percent = True
                bases.add(_basis(m.group("basis") or m.group("after")))
        trailing = [True]
    elif all(trailing) and not any(_LEADING_AMOUNT.match(part) for part in parts):
        # every component followed by its amount; a unit on any of them is the basis of all
        for m in trailing:
            amounts.append(float(m.group("amount")))
            names.append(m.group("name").strip())
            if m.group("unit"):
                percent = True
                bases.add(_basis(m.group("basis") or m.group("after")))
    else:
        trailing = []
    for part in parts if not trailing else ():
        m = _LEADING_AMOUNT.match(part)
        if m:
            amounts.append(float(m.group("amount")))
            names.append(part[m.end():].strip())
            if m.group("unit"):
                percent = True
                bases.add(_basis(m.group("basis") or m.group("after")))
        else:
            amounts.append(None)
            names.append(part.strip())
    if len(bases) > 1:
        raise MixtureNotationError(
            f"{' + '.join(parts)!r} mixes mol% and wt%; give every amount on one basis"
        )
    basis = bases.pop() if bases else None
    given = [a for a in amounts if a is not None]
    note = None
    if given and len(given) == len(parts) - 1 and percent and sum(given) < 100:
        missing = amounts.index(None)
        amounts[missing] = 100.0 - sum(given)
        note = (
            f"{names[missing]} was given no amount: it was taken as the balance,"
            f" {amounts[missing]:g} {basis or 'mol'}%"
        )
    elif given and len(given) != len(parts) and not percent and all(a == int(a) >= 1 for a in given):
        # whole-number coefficients on some components, as molten-salt formulas write them (2LiF-BeF2,
        # 3NaF-AlF3): a component without one counts once (common practice)
        missing = [names[i] for i, a in enumerate(amounts) if a is None]
        amounts = [1.0 if a is None else a for a in amounts]
        note = f"{', '.join(missing)} written without a coefficient: counted once (mole ratio " + \
            ":".join(f"{a:g}" for a in amounts) + ")"
    elif given and len(given) != len(parts):
        raise MixtureNotationError(
            f"amounts given for {len(given)} of {len(parts)} components in {' + '.join(parts)!r};"
            " give one for every component, none, or percentages for all but one (the balance)"
        )
    return names, tuple(a for a in amounts if a is not None) if given else (), basis, note


# "eutectic LiF-NaF-KF", "LiCl-KCl eutectic mixture", "eutectic of NaNO3 and KNO3" is not matched (no joiner)
_EUTECTIC_WORD = re.compile(r"^\s*eutectic\s+(?:of\s+)?|\s+eutectic(?:\s+(?:mixture|salt|melt))?\s*$", re.I)


def _without_eutectic_word(text: str) -> tuple[str, bool]:
    """The text without a leading or trailing word "eutectic", and whether it had one."""
    stripped = _EUTECTIC_WORD.sub("", text)
    return (stripped, True) if stripped != text and stripped.strip() else (text, False)


def read_mixture_text(text: str) -> MixtureText | None:
    """Read mixture notation; None when ``text`` is not written as a mixture.

    Parameters
    ----------
    text : str
        A cell of the formula column.

    Returns
    -------
    MixtureText or None
        The components as written (not yet resolved or checked as formulas).

    Raises
    ------
    MixtureNotationError
        When the text is plainly a mixture but its proportions do not fit
        (more numbers than components, amounts on only some components).

    Examples
    --------
    >>> read_mixture_text("ChCl:urea 1:2").parts
    ('ChCl', 'urea')
    >>> read_mixture_text("0.588 LiCl + 0.412 KCl").amounts
    (0.588, 0.412)
    >>> read_mixture_text("NaNO3-KNO3 60:40 wt%").basis
    'wt'
    >>> read_mixture_text("KNO3+NaNO3").notes[0][:45]
    "'KNO3+NaNO3' was read as a mixture of KNO3 an"
    >>> read_mixture_text("LiCl 44wt% KCl 56wt%").amounts
    (44.0, 56.0)
    >>> read_mixture_text("SO4^2-") is None, read_mixture_text("[Fe(CN)6]4-") is None
    (True, True)
    """
    spaced = _SPACED_PERCENTAGES.fullmatch(text)
    if spaced:
        # "60% NaNO3 40% KNO3": percentages before components joined by spaces alone (common practice)
        text = " + ".join(m.group(0).strip() for m in _PERCENT_COMPONENT.finditer(text))
    elif "%" in text and _SPACED_TRAILING_PERCENTAGES.fullmatch(text):
        text = " + ".join(m.group(0).strip() for m in _COMPONENT_PERCENT.finditer(text))
    if _QUICK.isdisjoint(text) and not _LIST_JOINER.search(text):
        return None
    if any(c in text for c in ",;&=") or " and " in text or " with " in text or text.rstrip().endswith(")"):
        text = normalised_list(text)
    if split_in_solvent(text) is not None:
        return None  # a solute in a solvent ("1 M LiPF6 in EC/DMC"): scorer.solutions reads it
    if ("v" in text or "V" in text) and _BY_VOLUME.search(text) and not _JOINERS.isdisjoint(
            _BY_VOLUME.sub("", text).strip().replace(" ", "")):
        # (a single solute with a volume percentage, "10% H2SO4 v/v", is a solution: scorer.solutions)
        raise MixtureNotationError(
            f"proportions by volume in {text.strip()!r}: converting them to mole fractions needs each component's"
            " density, which ionicity does not hold; give them in mol% or wt% (mole fraction of i is proportional"
            " to V_i x density_i / molar mass_i)")
    if _JOINERS.isdisjoint(text) and not text[:1].isdigit():
        return None  # only dots: a mixture needs a leading amount ("0.588LiCl·0.412KCl"); hydrates end here
    text, eutectic = _without_eutectic_word(text)
    body, amounts, basis = _proportions(text)
    notes: list[str] = []
    joined_by = ""
    if "+" in body and len(_split_top(body, "+")) > 1 and not body.rstrip().endswith("+"):
        parts = _split_top(body, "+")
        joined_by = "+"
    elif ":" in body:
        parts = _split_top(body, ":")
        joined_by = ":"
    elif any(d in body for d in "-–—") and len(_dash_split(body)) > 1:
        parts = _dash_split(body)
        joined_by = "-"
    elif "/" in body and len(_split_outside_brackets(body, _joining_slash)) > 1:
        parts = _split_outside_brackets(body, _joining_slash)
        joined_by = "/"
    elif any(d in body for d in _DOTS):
        parts = _split_top(body, _DOTS)
        if len(parts) < 2 or not all(_LEADING_AMOUNT.match(p) for p in parts):
            return None
        leading = [float(_LEADING_AMOUNT.match(p).group("amount")) for p in parts]
        whole_percent = all(float(a).is_integer() for a in leading) and abs(sum(leading) - 100.0) < 1e-9 and not any(
            _ADDUCT.match(p[_LEADING_AMOUNT.match(p).end():].strip()) for p in parts[1:])
        if not whole_percent and not all("." in _LEADING_AMOUNT.match(p).group("amount") for p in parts):
            # whole numbers are a hydrate's or adduct's counts (CaCl2·2NH3), unless they add up to 100 before
            # formulas that are no adducts: mole percent, as glass compositions are written (70Li2S·30P2S5)
            return None
        joined_by = "·"
    else:
        return None
    parts = [p for p in (p.strip() for p in parts)]
    if any(not p for p in parts):
        if joined_by in ("+", "·"):
            return None
        raise MixtureNotationError(f"an empty component in {text!r}; write components joined by '-', ':' or ' + '")
    adducts = [p for p in parts[1:] if _ADDUCT.match(p)]
    if joined_by == "+" and not any(p[:1].isdigit() for p in adducts) and not (
            _AMINE.search(parts[0]) and all(p in ("HF", "HCl", "HBr", "HI") for p in adducts)) and (
            " + " in body or any(p != "H2O" for p in adducts)):
        # a plus before an uncounted molecule is two things put together ("NaClO+HCl", "AlCl3 + H2O"), not an
        # adduct: a hydrate is written with its dot, its count or a plus without spaces before water
        # ("CuSO4·5H2O", "CaSO4+2H2O", "LiF+H2O"), an amine salt with its acid ("C6H5NH2 + HCl") stays one
        adducts = []
    if joined_by not in ("/", ":") and not amounts and adducts and (
            joined_by != "-" or any(p[:1].isdigit() or p.endswith("H2O") and "H2O2" not in p for p in adducts)):
        # a hydrate or adduct written with '+' ("CaSO4+2H2O") or with a dash before water or a counted adduct
        # ("CuSO4-5H2O"): the compound reading; with proportions after the components ("H2SO4-H2O2 (3:1)",
        # "NaOH-H2O (1:1)"), or a dash before another molecule ("H2SO4-H2O2"), it is a mixture
        return None
    names, leading, leading_basis, balance_note = _leading_amounts(parts)
    if len(names) < 2:
        # one component is no mixture: a name with commas and a ratio in brackets read as one list item
        # ("phosphoric acid, aluminum salt (1:1), dihydrate", the CAS index's inverted name) goes to the name reader
        return None
    if leading and amounts:
        raise MixtureNotationError(f"{text!r} gives both leading amounts and proportions after the components; give one")
    if leading:
        amounts = leading
        basis = leading_basis or basis
    if balance_note:
        notes.append(balance_note)
    if amounts and len(amounts) != len(names):
        raise MixtureNotationError(
            f"{len(amounts)} proportions for {len(names)} components in {text!r}"
            " (write one number per component, e.g. 'LiCl-KCl (58.8-41.2 mol%)')"
        )
    if any(a <= 0 for a in amounts):
        raise MixtureNotationError(f"a proportion of zero in {text!r}; leave that component out")
    if amounts and "%" in text and abs(sum(amounts) - 100.0) > 0.5:
        notes.append(f"the percentages in {text!r} add up to {sum(amounts):g}, not 100: they were scaled to 100")
    if joined_by == "+" and not leading and "+" in body and " + " not in body:
        notes.append(
            f"{text!r} was read as a mixture of {' and '.join(names)} (also possible: one compound of them,"
            " a double salt); write the double salt as one formula, e.g. KNa(NO3)2, or 'A + B' for a mixture"
        )
    if joined_by == "·":
        notes.append(
            f"{text!r} was read as a mixture of {' and '.join(names)} in the amounts written (also possible:"
            " one non-stoichiometric compound or solid solution); write 'A + B' for a mixture"
        )
    return MixtureText(tuple(names), tuple(amounts), basis, tuple(notes), eutectic)
