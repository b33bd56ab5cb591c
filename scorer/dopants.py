"""Doped materials written the way phosphor, scintillator, laser and
transparent-conductor datasets write them: a host and its dopant joined by a
colon (``Y2O3:Eu``, ``SrAl2O4:Eu,Dy``, ``ZnO:Al 2 wt%``, ``Nd:YAG``,
``Ti:sapphire``) or the dopant in brackets after the host (``CsI(Tl)``,
``NaI(Tl)``). A dopant is a few per cent or less of the sites: the compound
is its host, not a mixture of the host with the element in equal moles (how
the mixture reader took ``Y2O3:Eu``). The host is scored; the row says which
dopants were left out and at what level, as written.

The notation is common practice in the luminescence and laser literature (e.g.
Blasse & Grabmaier, Luminescent Materials, 1994, ch. 1: ``Y2O3:Eu``;
Nd:YAG for neodymium-doped yttrium aluminium garnet); the bracket form is the
scintillator makers' (``NaI(Tl)``).
"""
from __future__ import annotations

import re
from dataclasses import dataclass

from ionicity.scorer.elements import is_element_symbol

__all__ = ["Doping", "doped_host", "doping_note"]

# a level written beside a dopant: "5%", "2 wt%", "1 at.%", "0.5 mol %", "(5 mol%)"
_LEVEL = r"\(?\s*\d+(?:[.,]\d+)?\s*(?:(?:at|wt|mol|atom|weight)\.?\s*)?%\s*\)?"
# one dopant of a list: an element symbol with an optional ionic charge (Eu3+, Eu^3+) and a level before or after
_DOPANT_ITEM = re.compile(rf"(?:{_LEVEL}\s*)?(?P<symbol>[A-Z][a-z]?)(?:\^?\d?[+-])?(?:\s*{_LEVEL})?")
# a comma, slash or ampersand between dopants, or a plus that is no charge (Er+Yb, not the + of Eu3+)
_LIST_SEPARATOR = re.compile(r"\s*(?:[,/&]|(?<![\d^+-])\+(?=\s*[A-Z(\d]))\s*")
# the most dopants a list names (co-doped phosphors name two or three)
_MAX_DOPANTS = 6
# the scintillator form: a formula, then one element in brackets ("CsI(Tl)", "CaF2(Eu)")
_BRACKETED = re.compile(r"^\s*(?P<host>[A-Z][A-Za-z0-9]*)\((?P<dopants>[A-Z][a-z]?)\)\s*$")
_SYMBOL = re.compile(r"[A-Z][a-z]?")
_LEVEL_RE = re.compile(_LEVEL)
# elements written alone (with counts or not) on the host side: "Na:K" is two metals, not a doped host
_LONE_ELEMENTS = re.compile(r"[A-Z][a-z]?[\d.]*(?:\s*[,/+&-]\s*[A-Z][a-z]?[\d.]*)*")
# the activators of the bracket form (scintillators and phosphors: thallium, sodium, the lanthanides, the
# transition-metal and post-transition activators; common practice)
_BRACKET_ACTIVATORS = frozenset(
    "Tl Na Li Ag Cu Mn Cr Ti Bi Pb Sn Sb In Ga Al Co Ni Fe V Ce Pr Nd Sm Eu Gd Tb Dy Ho Er Tm Yb".split())


@dataclass(frozen=True)
class Doping:
    """A doped material as written: the host's text, the dopant symbols and any level written."""

    text: str
    host: str
    dopants: tuple[str, ...]
    level: str


def doped_host(text: str) -> Doping | None:
    """The host and dopants of a doped material written ``host:dopants``, ``dopants:host`` or
    ``host(dopant)``; None for any other text (a mixture ``LiCl:KCl``, two metals ``Na:K``).

    >>> doped_host("Y2O3:Eu").host, doped_host("Y2O3:Eu").dopants
    ('Y2O3', ('Eu',))
    >>> d = doped_host("SrAl2O4:Eu2+,Dy3+"); d.host, d.dopants
    ('SrAl2O4', ('Eu', 'Dy'))
    >>> doped_host("Nd:YAG").host, doped_host("CsI(Tl)").host, doped_host("ZnO:Al 2 wt%").level
    ('YAG', 'CsI', '2 wt%')
    >>> doped_host("LiCl:KCl") is None, doped_host("Na:K") is None, doped_host("Ca(OH)2") is None
    (True, True, True)
    """
    if not isinstance(text, str) or len(text) > 200:
        return None
    if text.count(":") == 1:
        left, right = (part.strip() for part in text.split(":"))
        for host, written in ((left, right), (right, left)):
            if not host or not written or _LONE_ELEMENTS.fullmatch(host):
                continue  # elements on both sides: an alloy or a mixture of elements, not a doped host
            found = _dopants(written)
            if found is not None:
                return Doping(text, host, found, _level(written))
        return None
    if text.endswith(")"):
        m = _BRACKETED.match(text)
        if m is not None and m.group("dopants") in _BRACKET_ACTIVATORS and is_element_symbol(m.group("dopants")) \
                and m.group("dopants") not in _SYMBOL.findall(m.group("host")):
            return Doping(text, m.group("host"), (m.group("dopants"),), "")
    return None


def _dopants(written: str) -> tuple[str, ...] | None:
    """The element symbols of a list of dopants (each with its charge and level or not); None when the text is
    not such a list (a formula, a name, a ratio)."""
    items = _LIST_SEPARATOR.split(written)
    if len(items) > _MAX_DOPANTS:
        return None
    symbols = []
    for item in items:
        m = _DOPANT_ITEM.fullmatch(item)
        if m is None or not is_element_symbol(m.group("symbol")):
            return None
        symbols.append(m.group("symbol"))
    return tuple(dict.fromkeys(symbols))


def _level(written: str) -> str:
    return ", ".join(" ".join(m.group().strip(" ()").split()) for m in _LEVEL_RE.finditer(written))


def doping_note(doping: Doping, host_formula: str | None) -> str:
    """The warning of a doped material's row."""
    level = f" at {doping.level}" if doping.level else " (level not written)"
    host = host_formula or doping.host
    return (f"a doped material: {doping.text.strip()!r} read as the host {host} doped with"
            f" {', '.join(doping.dopants)}{level}; the values are the undoped host's (a dopant of a few per cent"
            f" or less changes them little)")
