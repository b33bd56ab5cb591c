"""Quaternary onium salts written by their groups: ``(C2H5)3(C6H5CH2)NCl``, ``(C6H5)4PBr``, ``(CH3)3SI``.

A catalogue or a lab notebook writes a quaternary ammonium, phosphonium or
arsonium salt (four organic groups on N, P or As) or a sulfonium salt (three
on S) as its groups around the central atom, followed by the anion. The
formula alone cannot say which cation it holds (C13H22ClN is also
1-octylpyridinium chloride), but the written groups can: the cation is the
centre with its groups, charge +1 (IUPAC Red Book 2005, IR-8.4 and
Recommendations 2013, P-73.1.2: onium cations; from memory), and the rest
of the formula is one anion of charge -1.

:func:`written_onium` finds such a cation in a formula's text (the parser
marks the formula with :func:`onium_hint`); :func:`onium_from_label` reads
the mark back, :func:`onium_shape` gives the cation's torsions and symmetry. The name reader writes named onium salts
(``benzyltriethylammonium chloride``, ``tetraphenylphosphonium bromide``)
in this notation (:func:`onium_formula_from_groups`), so both spellings read
alike. Pure functions of text; the reading itself is built in
:func:`scorer.organic_cations.onium_cation_readings`.
"""
from __future__ import annotations

import re

from ionicity.scorer.onium_codes import ALKYL_NAMES

__all__ = [
    "ONIUM_CATION_HINT",
    "ONIUM_CENTRES",
    "PROTON_GROUP",
    "written_onium",
    "onium_composition",
    "onium_label",
    "onium_hint",
    "onium_from_label",
    "onium_shape",
    "onium_name",
    "GROUP_WORDS",
    "onium_formula_from_groups",
]

#: structure hint of a formula whose written groups name an onium cation: the prefix, then the cation's
#: composition in Hill order (``onium_cation:C13H22N``)
ONIUM_CATION_HINT = "onium_cation:"
#: the central atom of an onium cation and the number of organic groups it carries
ONIUM_CENTRES = {"N": 4, "P": 4, "As": 4, "S": 3}

# one organic group: a bracketed hydrocarbyl or hydroxy/alkoxy-hydrocarbyl formula with its count
# ("(C2H5)3", "(C6H5CH2)"), or, after the centre, an unbracketed one ("PCH3Br", "NCH2C6H5Cl", "PCH2(C6H5)Cl")
_BRACKETED_GROUP = re.compile(r"\((?P<group>(?:[CHO]\d*)+)\)(?P<n>\d*)")
_BARE_GROUP = re.compile(r"(?P<group>C\d*H\d+(?:C\d*H\d+|\((?:[CHO]\d*)+\))*)")
_CENTRE = re.compile(r"(?P<centre>As|N|P|S)(?![a-z])")
# the hydrogens written on the nitrogen of a protonated amine, and the group that stands for one of them
_HYDROGENS = re.compile(r"H([1-3]?)(?![a-z\d])")
PROTON_GROUP = "H"
_LEADING_GROUP = re.compile(r"(?P<group>C\d*H\d+(?:C\d*H\d+)*)N(?=H[1-3]?(?![a-z\d]))")
_ATOM = re.compile(r"([A-Z][a-z]?)(\d*)")


def group_counts(group: str) -> dict[str, int]:
    """The element counts of a group written without brackets (``C6H5CH2`` -> C 7, H 7)."""
    return _counts(group)


def _counts(group: str) -> dict[str, int]:
    out: dict[str, int] = {}
    for symbol, n in _ATOM.findall(group):
        out[symbol] = out.get(symbol, 0) + (int(n) if n else 1)
    return out


def _is_organic_group(counts: dict[str, int]) -> bool:
    """A monovalent organic group: carbon, hydrogen and at most one oxygen per two carbons, no more
    hydrogen than an alkyl group's 2n + 1 (methyl, phenyl, benzyl, 2-hydroxyethyl)."""
    c, h, o = counts.get("C", 0), counts.get("H", 0), counts.get("O", 0)
    return set(counts) <= {"C", "H", "O"} and c >= 1 and 1 <= h <= 2 * c + 1 and 2 * o <= c


def _hill(counts: dict[str, int]) -> str:
    order = ["C", "H"] + sorted(s for s in counts if s not in ("C", "H"))
    return "".join(f"{s}{counts[s] if counts[s] != 1 else ''}" for s in order if counts.get(s))


def written_onium(text: str) -> tuple[str, tuple[tuple[str, int], ...], str] | None:
    """(central atom, groups, anion text) of a formula written as an onium salt's groups around its centre,
    or None. The groups are (Hill formula, count) pairs in Hill-string order, so every order of writing
    gives the same tuple.

    The text is the whole formula: organic groups in brackets with their counts, the centre (N, P, As with
    four groups, S with three), unbracketed groups after it where the count is not yet reached, then the
    anion, which must be left and must start a formula (a capital letter or a bracket). On nitrogen, the
    hydrogens of a protonated amine written after it fill the places the groups leave (``(C2H5)3NHCl``,
    triethylammonium chloride: the group :data:`PROTON_GROUP` ``H``, counted like the others). The cation
    may stand in square brackets, as :func:`onium_label` writes it. Neutral molecules (``(C6H5)3P``,
    ``(CH3)2SO``, ``(C2H5)3N``, ``(C2H5)2NH``) have fewer groups and give None.

    >>> written_onium("(C2H5)3(C6H5CH2)NCl")
    ('N', (('C2H5', 3), ('C7H7', 1)), 'Cl')
    >>> written_onium("(C6H5)3PCH3Br")[1], written_onium("[(CH3)3S]I")
    ((('C6H5', 3), ('CH3', 1)), ('S', (('CH3', 3),), 'I'))
    >>> written_onium("(C6H5)3PCH2(C6H5)Cl")[1]
    (('C6H5', 3), ('C7H7', 1))
    >>> written_onium("(C2H5)3NHCl"), written_onium("(CH3)2NH2NO3")[1]
    (('N', (('C2H5', 3), ('H', 1)), 'Cl'), (('CH3', 2), ('H', 2)))
    >>> [written_onium(t) for t in ("(C6H5)3P", "(CH3)2SO", "(C2H5)3N", "(C2H5)2NH", "NaCl")]
    [None, None, None, None, None]
    """
    if not isinstance(text, str):
        return None
    text = text.strip()
    closing = None
    position = 0
    if text.startswith("["):
        closing = text.find("]")
        if closing < 0:
            return None
        position = 1
    groups: dict[str, int] = {}
    found = 0
    while True:
        m = _BRACKETED_GROUP.match(text, position)
        if m is None:
            break
        counts = _counts(m.group("group"))
        if not _is_organic_group(counts):
            return None
        n = int(m.group("n")) if m.group("n") else 1
        groups[_hill(counts)] = groups.get(_hill(counts), 0) + n
        found += n
        position = m.end()
    if not found and closing is None:
        # one organic group written without brackets before the nitrogen of a protonated amine (C6H5NH3Cl,
        # anilinium chloride; C6H5CH2NH3Cl): only there, since before a centre with no hydrogens after it such a
        # group is part of a molecule (C6H5NO2)
        m = _LEADING_GROUP.match(text)
        if m is not None and _is_organic_group(_counts(m.group("group"))):
            groups[_hill(_counts(m.group("group")))] = 1
            found = 1
            position = m.end("group")
    centre = _CENTRE.match(text, position)
    if centre is None:
        return None
    symbol = centre.group("centre")
    needed = ONIUM_CENTRES[symbol]
    position = centre.end()
    while found < needed:
        m = _BRACKETED_GROUP.match(text, position) or _BARE_GROUP.match(text, position)
        if m is None and symbol == "N" and found:
            # the hydrogens of a protonated amine written on its nitrogen ((C2H5)3NHCl, (CH3)2NH2NO3): they
            # fill the four places the organic groups leave
            h = _HYDROGENS.match(text, position)
            if h is None:
                return None
            n = int(h.group(1) or 1)
            groups[PROTON_GROUP] = groups.get(PROTON_GROUP, 0) + n
            found += n
            position = h.end()
            continue
        if m is None:
            return None
        counts = _counts(m.group("group"))
        if not _is_organic_group(counts):
            return None
        n = int(m.groupdict().get("n") or 1)
        groups[_hill(counts)] = groups.get(_hill(counts), 0) + n
        found += n
        position = m.end()
    if closing is not None:
        if position != closing:
            return None
        position += 1
    anion = text[position:]
    if found != needed or not anion or not (anion[0].isupper() or anion[0] in "(["):
        return None
    return symbol, tuple(sorted(groups.items())), anion


def onium_composition(centre: str, groups) -> dict[str, float]:
    """The composition of the onium cation of ``centre`` with ``groups`` ((Hill formula, count) pairs).

    >>> onium_composition("N", (("C2H5", 3), ("C7H7", 1)))
    {'N': 1.0, 'C': 13.0, 'H': 22.0}
    """
    out = {centre: 1.0}
    for group, n in groups:
        for s, k in _counts(group).items():
            out[s] = out.get(s, 0.0) + k * n
    return out


def onium_label(centre: str, groups) -> str:
    """The label of the onium cation: its groups in brackets, then the centre (``[(C2H5)3(C7H7)N]``).

    >>> onium_label("P", (("C6H5", 4),)), onium_label("N", (("C2H5", 3), ("H", 1)))
    ('[(C6H5)4P]', '[(C2H5)3NH]')
    """
    hydrogens = sum(n for g, n in groups if g == PROTON_GROUP)
    return ("[" + "".join(f"({g}){n if n > 1 else ''}" for g, n in groups if g != PROTON_GROUP) + centre
            + (f"H{hydrogens if hydrogens > 1 else ''}" if hydrogens else "") + "]")


def onium_hint(centre: str, groups) -> str:
    """The structure hint of a formula holding this onium cation (:data:`ONIUM_CATION_HINT`, then the label).

    >>> onium_hint("N", (("C2H5", 3), ("C7H7", 1)))
    'onium_cation:[(C2H5)3(C7H7)N]'
    """
    return ONIUM_CATION_HINT + onium_label(centre, groups)


def onium_from_label(label: str) -> tuple[str, tuple[tuple[str, int], ...]] | None:
    """(centre, groups) of an onium label (:func:`onium_label`) or of a structure hint that ends in one.

    >>> onium_from_label("onium_cation:[(C6H5)4P]")
    ('P', (('C6H5', 4),))
    """
    if not isinstance(label, str):
        return None
    if label.startswith(ONIUM_CATION_HINT):
        label = label[len(ONIUM_CATION_HINT):]
    read = written_onium(label + "X") if label.startswith("[") and label.endswith("]") else None
    return (read[0], read[1]) if read else None


def _group_torsions(group: str) -> float | None:
    """Dannenfelser-Yalkowsky torsions a group adds on an onium centre: its non-terminal sp3 atoms, plus half
    a torsion for an aromatic ring (C6 with 4 degrees of unsaturation, as phenyl or benzyl); None for other
    unsaturated groups, whose shape the composition does not tell."""
    if group == PROTON_GROUP:
        return 0.0  # a hydrogen on the centre turns nothing
    counts = _counts(group)
    c, h, o = counts.get("C", 0), counts.get("H", 0), counts.get("O", 0)
    unsaturation = (2 * c + 2 - h - 1) // 2
    if unsaturation == 0:
        return float(c - 1 + o)  # CH3 is terminal; every CH2 and an ether O of the chain is not
    if unsaturation == 4 and c >= 6 and not o:
        return 0.5 + (c - 6)  # phenyl 0.5, benzyl 1.5, 2-phenylethyl 2.5
    return None


def onium_shape(label: str) -> tuple[float, float] | None:
    """(tau, sigma) of an onium cation from its label: Dannenfelser and Yalkowsky's torsion count (Ind. Eng.
    Chem. Res. 1996, 35, 1483; from memory: tau = SP3 + 0.5 SP2 + 0.5 RING - 1, the centre counted as one
    non-terminal sp3 atom) and the symmetry number of its core as the ion library gives its tetraalkyl ions
    (four equal groups 12, three equal 3, otherwise 1); None where a group's shape is not known.

    >>> onium_shape("[(C4H9)4N]"), onium_shape("[(C2H5)3(C7H7)N]"), onium_shape("[(C6H5)4P]")
    ((12.0, 12.0), (4.5, 3.0), (2.0, 12.0))
    """
    read = onium_from_label(label)
    if read is None:
        return None
    centre, groups = read
    torsions = [_group_torsions(g) for g, _ in groups]
    if any(t is None for t in torsions):
        return None
    tau = sum(t * n for t, (_, n) in zip(torsions, groups))
    largest = max(n for _, n in groups)
    sigma = 12.0 if largest == 4 else 3.0 if largest == 3 else 1.0
    return tau, sigma


def onium_formula_from_groups(groups: list[tuple[str, int]], centre: str, anion: str) -> str | None:
    """The onium salt written by its groups (``[("C7H7", 1), ("C2H5", 3)]``, ``N``, ``Cl`` ->
    ``(C7H7)(C2H5)3NCl``), as :func:`written_onium` reads it; None unless the groups fill the centre, or, on
    nitrogen, one to three groups with hydrogens for the rest (a protonated amine).

    >>> onium_formula_from_groups([("C6H5", 4)], "P", "Br"), onium_formula_from_groups([("CH3", 2)], "N", "NO3")
    ('(C6H5)4PBr', '(CH3)2NH2NO3')
    """
    if centre not in ONIUM_CENTRES:
        return None
    placed = sum(n for _, n in groups)
    # a protonated amine (an ammonium with one to three groups): the hydrogens fill the nitrogen's other places
    hydrogens = ONIUM_CENTRES[centre] - placed if centre == "N" and 1 <= placed < 4 else 0
    if placed + hydrogens != ONIUM_CENTRES[centre]:
        return None
    return ("".join(f"({g}){n if n > 1 else ''}" for g, n in groups) + centre
            + (f"H{hydrogens if hydrogens > 1 else ''}" if hydrogens else "") + anion)


#: substituent names of the groups, by Hill formula (IUPAC Recommendations 2013, P-29 and P-32; allyl, vinyl,
#: benzyl as retained or common names; from memory); the name reader reads the same names back
GROUP_WORDS = {**{f"C{n if n > 1 else ''}H{2 * n + 1}": name for n, name in enumerate(ALKYL_NAMES, start=1)},
               "C6H5": "phenyl", "C7H7": "benzyl", "C3H5": "allyl", "C2H3": "vinyl", "C6H11": "cyclohexyl",
               "C2H5O": "2-hydroxyethyl", "C8H9": "2-phenylethyl"}
_SIMPLE_MULTIPLIERS = {1: "", 2: "di", 3: "tri", 4: "tetra"}
_GROUP_MULTIPLIERS = {1: "", 2: "bis", 3: "tris", 4: "tetrakis"}
_CENTRE_WORDS = {"N": "ammonium", "P": "phosphonium", "As": "arsonium", "S": "sulfonium"}


def _prefixed(word: str, n: int) -> str:
    if n == 1:
        return f"({word})" if "-" in word else word
    return f"{_GROUP_MULTIPLIERS[n]}({word})" if "-" in word else _SIMPLE_MULTIPLIERS[n] + word


def onium_name(centre: str, groups) -> str | None:
    """The substitutive name of the onium cation: its substituent prefixes in alphanumerical order, the
    multiplying prefixes not counted (IUPAC Recommendations 2013, P-14.5 and P-73.1.2; from memory), then
    the suffix; where the older order that counts them differs, it follows in brackets (catalogues write
    ``benzyldimethylhexadecylammonium``). None where a group has no name here.

    >>> onium_name("N", (("C2H5", 3), ("C7H7", 1))), onium_name("P", (("C6H5", 4),))
    ('benzyltriethylammonium', 'tetraphenylphosphonium')
    >>> onium_name("N", (("C16H33", 1), ("C7H7", 1), ("CH3", 2)))
    'benzylhexadecyldimethylammonium (benzyldimethylhexadecylammonium)'
    """
    groups = [(g, n) for g, n in groups if g != PROTON_GROUP]  # a protonated amine: its organic groups
    if centre not in _CENTRE_WORDS or not groups or any(g not in GROUP_WORDS for g, _ in groups):
        return None
    words = [(GROUP_WORDS[g], n) for g, n in groups]

    def bare(word: str) -> str:
        return re.sub(r"[^a-z]", "", word)

    iupac = "".join(_prefixed(w, n) for w, n in sorted(words, key=lambda x: bare(x[0]))) + _CENTRE_WORDS[centre]
    older = "".join(_prefixed(w, n) for w, n in sorted(words, key=lambda x: bare(_prefixed(*x))))
    older += _CENTRE_WORDS[centre]
    return iupac if older == iupac else f"{iupac} ({older})"
