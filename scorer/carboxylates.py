"""Metal salts of carboxylic acids written with their groups: Zn(C11H23COO)2, Sn(C7H15COO)2, Cu(CH3(CH2)6COO)2.

The ion library lists the common carboxylates (formate, acetate, propanoate,
stearate, benzoate); the salts of the others, the metal soaps and paint driers
of a stockroom (laurates, octanoates and their isomer 2-ethylhexanoate,
butanoates, oleates), had read, for a metal outside the s block, as
organometallic molecules with metal-carbon bonds. A carboxylate holds none: it is
the salt of the metal cation with the acid's conjugate base, M(RCOO)n, its charge
on the two oxygen atoms of the COO group (IUPAC Red Book 2005, IR-5.4 and
IR-9.1; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 8;
from memory).

Rule (stated, not fitted): a bracketed group that a formula writes as a
hydrocarbon group R followed by COO or CO2 (``(C11H23COO)2``,
``(CH3(CH2)6COO)2``, ``(C7H15CO2)3``) is one carboxylate anion of charge -1,
as many times as the bracket's count says; where the rest of the formula is one
metal, that metal is the cation, its charge the number of carboxylates per
metal atom, which must be one of its usual oxidation states. A group the
library lists (``C17H35COO``) is read as that library ion by the parser, not
here. :func:`carboxylate_name_words` gives the names of these anions
(laurate, 2-ethylhexanoate, octoate...) to the name reader, which writes a
named salt in the same form (zinc laurate -> Zn(C11H23COO)2).
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import once
from ionicity.scorer.elements import is_metal
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD, _monatomic_options
from ionicity.scorer.ion_library import find_alias, monatomic_ion
from ionicity.scorer.model import Ion
from ionicity.scorer.organic_anions import _PENALTY_BUILT, built_organic_ion
from ionicity.scorer.tables import table

__all__ = ["CARBOXYLATE_HINT", "CARBOXYLATE_SOURCE", "WRITTEN_CARBOXYLATE_NOTE_MARK", "written_carboxylates",
           "carboxylate_hint", "carboxylate_anion", "carboxylate_salt_readings", "hill_carboxylate_readings",
           "carboxylate_name_words"]

CARBOXYLATE_HINT = "carboxylates:"
CARBOXYLATE_SOURCE = ("constructed by rule (scorer/carboxylates.py), not from the ion library: the carboxylate group"
                      " R-COO(-) the formula writes")
WRITTEN_CARBOXYLATE_NOTE_MARK = "a carboxylate the ion library does not list, read from the group the text writes"
HILL_CARBOXYLATE_NOTE_MARK = ("a carboxylate the ion library does not list, read from the formula as the metal's salt of"
                              " one saturated monocarboxylic acid")
# R-COO or R-CO2 in brackets, R of carbon and hydrogen only (CH3(CH2)10 written with an inner bracket), and the
# bracket's count
_GROUP = re.compile(r"\((?P<r>(?:C\d*H\d*|\(CH2?\)\d*)+?)(?:COO|CO2)\)(?P<n>\d*)")
_BARE = re.compile(r"(?:[A-Z][a-z]?|NH4)?(?P<r>C\d*H\d*(?:C\d*H\d*|\(CH2?\)\d*)*?)(?:COO|CO2)(?:[A-Z][a-z]?|NH4)?")
_ATOM = re.compile(r"([CH])(\d*)")
_INNER = re.compile(r"\((CH2?)\)(\d*)")


def _r_counts(r: str) -> tuple[int, int] | None:
    """(carbons, hydrogens) of a written hydrocarbon group, or None when it is no saturated or aromatic group
    one bond short of a hydrocarbon (its H count odd, as in CnH2n+1 and C6H5)."""
    flat = _INNER.sub(lambda m: m.group(1) * int(m.group(2) or 1), r)
    c = h = 0
    for symbol, n in _ATOM.findall(flat):
        if symbol == "C":
            c += int(n or 1)
        else:
            h += int(n or 1)
    if c < 1 or h < 1 or h % 2 == 0 or h > 2 * c + 1:
        return None
    return c, h


def written_carboxylates(text: str) -> tuple[tuple[str, int], ...]:
    """The carboxylate groups a formula writes that the ion library does not list: (label, count) pairs, the
    label ``CnHmCOO`` whatever the spelling; () when it writes none.

    >>> written_carboxylates("Zn(C11H23COO)2"), written_carboxylates("Cu(CH3(CH2)6COO)2")
    ((('C11H23COO', 2),), (('C7H15COO', 2),))
    >>> written_carboxylates("Ca(C17H35COO)2"), written_carboxylates("C12H25OSO3Na")  # stearate is listed
    ((), ())
    """
    found: dict[str, int] = {}

    def take(r: str, n: int) -> None:
        counts = _r_counts(r)
        if counts is None:
            return
        c, h = counts
        label = f"C{c if c > 1 else ''}H{h if h > 1 else ''}COO"
        if find_alias(label) is None:  # the library's ion (CH3COO, C17H35COO): the parser reads it
            found[label] = found.get(label, 0) + n

    for m in _GROUP.finditer(text):
        take(m.group("r"), int(m.group("n") or 1))
    # one group written without a bracket beside its cation (NaC11H23COO, C7H15COONH4)
    m = _BARE.fullmatch(_GROUP.sub("", text))
    if m is not None and not found:
        take(m.group("r"), 1)
    return tuple(found.items())


def carboxylate_hint(groups) -> str:
    """The structure hint of the written carboxylates (``carboxylates:C11H23COO*2``)."""
    return CARBOXYLATE_HINT + ";".join(f"{label}*{n}" for label, n in groups)


def carboxylate_anion(label: str) -> Ion:
    """The carboxylate anion of a label ``CnHmCOO`` (charge -1, family ``carboxylate``), built by rule.

    >>> ion = carboxylate_anion("C11H23COO")
    >>> ion.ion_id, dict(ion.composition), ion.family
    ('C11H23COO(-)', {'C': 12.0, 'H': 23.0, 'O': 2.0}, 'carboxylate')
    """
    c, h = _r_counts(label[:-3])
    composition = {"C": float(c + 1), "H": float(h), "O": 2.0}
    return built_organic_ion(label, composition, -1, "carboxylate", "carboxylate", CARBOXYLATE_SOURCE)


def _usual_state(symbol: str, z: int) -> bool:
    """Whether ``z`` is a state of ``symbol`` a plausible reading takes (a single-state option under the ionic
    threshold)."""
    return any(kind == "single" and state == z and penalty < _IONIC_THRESHOLD
               for kind, state, penalty in _monatomic_options(symbol, 1.0))


def carboxylate_salt_readings(remaining: dict[str, float], hint: str,
                              mark: str = WRITTEN_CARBOXYLATE_NOTE_MARK) -> tuple[list, list[str]]:
    """The reading of ``remaining`` as one metal's salt of the carboxylates of ``hint``, and its note; two
    empty lists where the rest is not one metal at a usual state.

    >>> readings, notes = carboxylate_salt_readings({"C": 24.0, "H": 46.0, "O": 4.0, "Zn": 1.0},
    ...                                             "carboxylates:C11H23COO*2")
    >>> sorted(f"{ion.ion_id}*{n:g}" for ion, n in readings[0][1])
    ['C11H23COO(-)*2', 'Zn(2+)*1']
    """
    groups = []
    for item in hint[len(CARBOXYLATE_HINT):].split(";"):
        label, _, n = item.partition("*")
        groups.append((carboxylate_anion(label), int(n)))
    rest = dict(remaining)
    for ion, n in groups:
        for symbol, k in ion.composition:
            rest[symbol] = rest.get(symbol, 0.0) - k * n
    rest = {s: n for s, n in rest.items() if abs(n) > 1e-9}
    cation = _cation(rest, sum(n for _, n in groups))
    if cation is None:
        return [], []
    notes = [f"{ion.ion_id}: {mark} (built by rule, scorer/carboxylates.py)"
             for ion, _ in groups]
    penalty = _PENALTY_BUILT * len(groups)
    return [(penalty, [cation, *((ion, float(n)) for ion, n in groups)])], notes


def _cation(rest: dict[str, float], charge: int):
    """(cation, count) of a rest that is one metal at a usual state carrying ``charge``, or ammonium; else None."""
    if set(rest) == {"N", "H"} and abs(rest["H"] - 4 * rest["N"]) < 1e-9 and abs(rest["N"] - charge) < 1e-9:
        return find_alias("NH4"), float(charge)
    if len(rest) != 1:
        return None
    (metal, m), = rest.items()
    if not is_metal(metal) or m <= 0 or abs(m - round(m)) > 1e-9 or charge % round(m):
        return None
    z = charge // round(m)
    return (monatomic_ion(metal, z), float(round(m))) if _usual_state(metal, z) else None


def hill_carboxylate_readings(remaining: dict[str, float]) -> tuple[list, list[str]]:
    """A formula of one metal with carbon, hydrogen and oxygen only, read as that metal's salt of one
    saturated monocarboxylic acid where its rest splits into as many equal CkH(2k-1)O2 parts (k >= 3) as the
    metal's charge: C24H46O4Zn is zinc laurate, Zn(C11H23COO)2. The caller asks only where the library's ions
    read nothing (a metal alkyl or chelate is no such split: Zn(C2H5)2 has no oxygen, Fe(acac)2 reads its
    library ion). Two empty lists otherwise.

    >>> readings, notes = hill_carboxylate_readings({"C": 24.0, "H": 46.0, "O": 4.0, "Zn": 1.0})
    >>> sorted(f"{ion.ion_id}*{n:g}" for ion, n in readings[0][1])
    ['C11H23COO(-)*2', 'Zn(2+)*1']
    >>> hill_carboxylate_readings({"C": 4.0, "H": 10.0, "Zn": 1.0})
    ([], [])
    """
    metals = [s for s in remaining if is_metal(s)]
    if len(metals) != 1 or set(remaining) - {metals[0]} != {"C", "H", "O"}:
        return [], []
    metal, m = metals[0], remaining[metals[0]]
    if abs(m - round(m)) > 1e-9 or round(m) < 1:
        return [], []
    for z in range(1, 5):
        parts = z * round(m)
        c, h, o = (remaining[s] / parts for s in ("C", "H", "O"))
        if o == 2 and c == int(c) and c >= 3 and h == 2 * c - 1 and _usual_state(metal, z):
            label = f"C{int(c) - 1}H{int(h)}COO"
            return carboxylate_salt_readings(remaining, carboxylate_hint(((label, parts),)), HILL_CARBOXYLATE_NOTE_MARK)
    return [], []


@once
def carboxylate_name_words() -> tuple[tuple[str, Ion], ...]:
    """(word, anion) of every carboxylate name of ``scorer/data/carboxylate_names.csv`` (laurate,
    dodecanoate, 2-ethylhexanoate, octoate...), for the name reader."""
    return tuple((row["word"], carboxylate_anion(row["group"])) for row in table("carboxylate_names.csv"))
