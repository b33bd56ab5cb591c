"""Neutral ligands written in a formula: coordination compounds such as ``Pd(PPh3)4``, ``PdCl2(PPh3)2``,
``[Co(en)3]Cl3``, ``Ni(cod)2`` and ``[Cu(MeCN)4]PF6``.

Stock lists and catalogues write metal complexes with the ligand abbreviations of the trade (IUPAC Red Book
2005, Table VII; ``scorer/data/ligands.csv``). Read as atoms, such a formula has no charge-balanced set of
ions (Pd(PPh3)4 is Pd with C72H60P4), or a nonsensical one. Here each written neutral ligand, a
bracketed ``(L)`` with an optional count, is set apart as a neutral part of the formula (as NH3 is in
CaCl2·8NH3), its atoms still counted in the formula's composition and mass; what is left (the metal and its
anionic ligands or counter-ions: ``Pd``, ``PdCl2``, ``CoCl3``, ``Cu(PF6)``) is read by the ion solver as any
formula is. :func:`scorer.ions.decompose` then calls the compound (:func:`complex_reading`):

* a **neutral complex** (``covalent_molecular``) when nothing stands outside a square-bracketed complex and
  no weakly coordinating counter-ion (PF6-, BF4-, ClO4-, SbF6-, triflate, NTf2-) is read: Pd(PPh3)4 with
  Pd 0, PdCl2(PPh3)2 and Wilkinson-type RhCl(PPh3)3 with the metal's formal state from its anionic
  ligands (common practice: the neutral ligands carry no charge, IUPAC Red Book 2005, IR-9.1);
* a **complex salt** (``ionic_salt``) otherwise, or where the neutral ligands alone give the metal six donor
  atoms (``Co(en)3Cl3``, written flat): the complex ion is built from the metal, its ligands and the anions
  written inside its square brackets, with the charge the counter-ions leave (``[Co(en)3]Cl3`` is
  [Co(en)3](3+) with three Cl(-)).

A ``CO`` in brackets counts as a ligand only beside another ligand of the table (``RhCl(CO)(PPh3)2``); the
binary carbonyls (``Fe(CO)5``) keep their own reading. Ligands written without brackets (``Ph3PAuCl``)
are not read.

>>> written_ligands("PdCl2(PPh3)2")
('PdCl2', (('PPh3', 2.0),), '')
>>> written_ligands("[Co(en)3]Cl3")
('(Co)Cl3', (('en', 3.0),), 'Co')
>>> written_ligands("[Rh(cod)Cl]2")
('(RhCl)2', (('cod', 2.0),), '')
>>> written_ligands("NaCl")
('NaCl', (), '')
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import is_metal
from ionicity.scorer.model import Decomposition, Ion, IonTerm, format_charge
from ionicity.scorer.tables import table

__all__ = ["LIGAND_SOURCE", "is_ligand", "ligand_abbreviation", "ligand_compositions", "ligand_spellings",
           "written_ligands", "WEAKLY_COORDINATING_ANIONS"]

LIGAND_SOURCE = (
    "constructed by rule (scorer/coordination.py), not from the ion library: the metal with the neutral ligands"
    " written in its brackets (scorer/data/ligands.csv) and the anions written inside them"
)
# counter-ions that do not bind the metal (common practice: Strauss, Chem. Rev. 1993, 93, 927; from memory):
# beside one of them the written complex is a cation, even without square brackets ([Cu(MeCN)4]PF6)
WEAKLY_COORDINATING_ANIONS = frozenset({
    "PF6(-)", "BF4(-)", "ClO4(-)", "SbF6(-)", "AsF6(-)", "[OTf](-)", "[NTf2](-)", "[TFSI](-)", "B(C6H5)4(-)",
})
_TERM = re.compile(r"[A-Z][a-z]?(\d+(?:\.\d+)?)?")


@once
def _ligand_table() -> dict[str, tuple[str, str]]:
    """Every spelling (abbreviation and aliases) -> (abbreviation, Hill formula)."""
    out: dict[str, tuple[str, str]] = {}
    for row in table("ligands.csv"):
        for spelling in [row["abbreviation"], *(a for a in row["aliases"].split(";") if a)]:
            out[spelling] = (row["abbreviation"], row["formula"])
    return out


@once
def ligand_compositions() -> dict[str, tuple[tuple[str, float], ...]]:
    """Abbreviation -> composition (sorted (symbol, count) pairs) of every ligand of ``ligands.csv``."""
    out = {}
    for abbreviation, formula in _ligand_table().values():
        counts: dict[str, float] = {}
        for m in re.finditer(r"([A-Z][a-z]?)(\d*)", formula):
            counts[m.group(1)] = counts.get(m.group(1), 0.0) + float(m.group(2) or 1)
        out[abbreviation] = tuple(sorted(counts.items()))
    return out


def ligand_spellings() -> tuple[str, ...]:
    """Every abbreviation and alias of ``ligands.csv``."""
    return tuple(_ligand_table())


def ligand_abbreviation(spelling: str) -> str:
    """The abbreviation of the ligand a spelling names (``THF`` -> ``thf``)."""
    return _ligand_table()[spelling][0]


def is_ligand(spelling: str) -> bool:
    """Whether ``spelling`` is an abbreviation or alias of ``ligands.csv`` (``dppe``, ``COD``, ``CH3CN``).

    >>> is_ligand("dppe"), is_ligand("aq")
    (True, False)
    """
    return spelling in _ligand_table()


@once
def _denticities() -> dict[str, int]:
    return {row["abbreviation"]: int(row["denticity"]) for row in table("ligands.csv")}


# donor atoms from neutral ligands per metal at which a formula written without square brackets is a complex salt:
# the octahedron is full, so every anion is a counter-ion (Co(en)3Cl3 is [Co(en)3]Cl3; common practice)
SATURATED_DONORS = 6


@once
def _pattern() -> re.Pattern:
    spellings = sorted(_ligand_table(), key=len, reverse=True)
    return re.compile(r"\((" + "|".join(re.escape(s) for s in spellings) + r")\)(\d+)?")


def _closing(text: str, start: int) -> int:
    """Index of the bracket closing the one opened at ``start`` (-1 when none)."""
    depth = 0
    for i in range(start, len(text)):
        if text[i] in "([":
            depth += 1
        elif text[i] in ")]":
            depth -= 1
            if depth == 0:
                return i
    return -1


def _enclosing_multiplier(text: str, position: int) -> float:
    """The product of the counts written after every bracket that encloses ``position``."""
    factor = 1.0
    stack = []
    for i, ch in enumerate(text[:position]):
        if ch in "([":
            stack.append(i)
        elif ch in ")]" and stack:
            stack.pop()
    for opened in stack:
        close = _closing(text, opened)
        if close < 0:
            continue
        m = re.match(r"\d+(?:\.\d+)?", text[close + 1:])
        if m:
            factor *= float(m.group())
    return factor


@per_input(maxsize=4096)
def written_ligands(text: str) -> tuple[str, tuple[tuple[str, float], ...], str]:
    """The formula text without its written neutral ligands, the ligands with their counts per formula unit,
    and, where a square-bracketed complex stands beside something else (a counter-ion: a complex salt), the
    text left inside its brackets ("" otherwise).

    Brackets left holding only the metal and its anionic ligands become round ones (``[Co]Cl3`` is read as
    ``(Co)Cl3``). A ``CO`` is a ligand only beside another one. Text without a table ligand comes back as
    it is, with no ligands.
    """
    if "(" not in text:
        return text, (), ""
    found = [m for m in _pattern().finditer(text)]
    if not found or all(_ligand_table()[m.group(1)][0] == "CO" for m in found):
        return text, (), ""
    ligands: dict[str, float] = {}
    for m in found:
        abbreviation = _ligand_table()[m.group(1)][0]
        count = float(m.group(2) or 1) * _enclosing_multiplier(text, m.start())
        ligands[abbreviation] = ligands.get(abbreviation, 0.0) + count
    core = _pattern().sub("", text)
    salt = ""
    square = core.find("[")
    if square >= 0:
        close = _closing(core, square)
        if close > 0:
            after = re.sub(r"^\d+(?:\.\d+)?", "", core[close + 1:])
            inner = core[square + 1:close]
            salt = inner if core[:square].strip() or after.strip() else ""
            if not _TERM.sub("", inner.replace("(", "").replace(")", "")):
                core = core[:square] + "(" + inner + ")" + core[close + 1:]
    core = core.replace("()", "")
    return core, tuple(sorted(ligands.items())), salt


COORDINATION_HINT = "coordination"
COORDINATION_SALT_HINT = "coordination_salt:"


def coordination_hint(inner_counts: dict[str, float] | None) -> str:
    """The parser's structure hint for a formula with written ligands: a neutral complex, or a complex salt
    with the composition written inside its square brackets (``coordination_salt:Co1`` for [Co(en)3]Cl3)."""
    if inner_counts is None:
        return COORDINATION_HINT
    return COORDINATION_SALT_HINT + ";".join(f"{s}{n:g}" for s, n in sorted(inner_counts.items()))


def _inner_counts(hint: str) -> dict[str, float]:
    return {m.group(1): float(m.group(2)) for m in re.finditer(r"([A-Z][a-z]?)([\d.]+)", hint)}


def _ligand_label(ligands: tuple[tuple[str, float], ...], per_complex: float) -> str:
    return "".join(f"({name})" + ("" if n / per_complex == 1 else f"{n / per_complex:g}") for name, n in ligands)


def complex_reading(core, ligands: tuple[tuple[str, float], ...], hint: str, composition, neutral_parts, water):
    """The decomposition of a formula with written neutral ligands from the ion solver's reading of the rest
    (``core``, a Decomposition): a neutral complex (``covalent_molecular``) or a complex salt whose complex
    ion is built here (see the module docstring). ``composition`` and ``neutral_parts`` are the whole
    formula's. A core the solver could not read keeps its error."""
    ligand_text = ", ".join(f"{n:g} {name}" for name, n in ligands)
    if core.substance_class == "unknown":
        return core.with_fields(composition=tuple(composition), neutral_parts=neutral_parts, hydrate_water=water,
                                notes=(f"the neutral ligands ({ligand_text}) were set apart, and the rest has no"
                                       " reading:", *core.notes))
    states = core.oxidation_states
    # a neutral complex: one molecule, the metal's formal state from the rest's reading
    molecule = Decomposition(composition=tuple(composition), neutral_parts=neutral_parts, hydrate_water=water,
                             oxidation_states=states, substance_class="covalent_molecular")
    weakly = any(t.ion.ion_id in WEAKLY_COORDINATING_ANIONS for t in core.anions)
    metal_atoms = sum(n for s, n in composition if is_metal(s))
    donors = sum(_denticities()[name] * n for name, n in ligands) / metal_atoms if metal_atoms else 0.0
    if not hint.startswith(COORDINATION_SALT_HINT) and not weakly and donors < SATURATED_DONORS:
        return molecule
    # the complex: the metal cations and the anions written inside the square brackets (all of them where no
    # bracket is written beside a weakly coordinating counter-ion), with every ligand
    inner = _inner_counts(hint) if hint.startswith(COORDINATION_SALT_HINT) else None
    metals = [t for t in core.cations if any(is_metal(s) for s, _ in t.ion.composition)]
    if not metals or len(metals) > 1 and inner is None:
        return molecule
    metal = metals[0] if inner is None else next(
        (t for t in metals if all(s in inner for s, _ in t.ion.composition)), metals[0])
    metal_symbol = metal.ion.composition[0][0]
    per_complex = inner.get(metal_symbol, 1.0) if inner else 1.0
    complexes = metal.count / per_complex
    if complexes <= 0 or abs(complexes - round(complexes)) > 1e-9:
        return molecule
    complexes = float(round(complexes))
    left = dict(inner or {metal_symbol: per_complex})
    left[metal_symbol] = left.get(metal_symbol, 0.0) - per_complex
    inner_anions, outer_anions = [], []
    for term in core.anions:
        if inner is None or term.ion.ion_id in WEAKLY_COORDINATING_ANIONS:
            outer_anions.append(term)
            continue
        fits = min((left.get(s, 0.0) // k for s, k in term.ion.composition), default=0.0)
        inside = min(fits, term.count / complexes)
        if inside > 0:
            inner_anions.append((term.ion, inside))
            for s, k in term.ion.composition:
                left[s] = left.get(s, 0.0) - k * inside
        if term.count - inside * complexes > 1e-9:
            outer_anions.append(IonTerm(term.ion, term.count - inside * complexes))
    charge = metal.ion.charge + sum(ion.charge * n for ion, n in inner_anions)
    outer_cations = [t for t in core.cations if t is not metal]
    if charge == 0 or abs(charge - round(charge)) > 1e-9:
        return molecule
    charge = int(round(charge))
    body: dict[str, float] = {metal_symbol: 1.0}
    for ion, n in inner_anions:
        for s, k in ion.composition:
            body[s] = body.get(s, 0.0) + k * n
    for name, n in ligands:
        for s, k in ligand_compositions()[name]:
            body[s] = body.get(s, 0.0) + k * n / complexes
    written = metal_symbol + "".join(
        (ion.label if ion.monatomic else f"({ion.label})") + ("" if n == 1 else f"{n:g}") for ion, n in inner_anions)
    label = f"[{written}{_ligand_label(ligands, complexes)}]"
    inner_states = {s for s, _ in metal.ion.composition} | {s for ion, _ in inner_anions for s, _ in ion.composition}
    ion = Ion(
        ion_id=f"{label}({format_charge(charge)})", label=label, charge=charge,
        composition=tuple(sorted(body.items())), family="coordination-complex",
        name=f"complex ion {label}({format_charge(charge)}), built from the formula's written ligands",
        organic=False, element=None,
        oxidation_states=tuple((s, z) for s, z in states if s in inner_states), source=LIGAND_SOURCE)
    term = IonTerm(ion, complexes)
    cations = (term, *outer_cations) if charge > 0 else tuple(outer_cations)
    anions = tuple(outer_anions) if charge > 0 else (term, *outer_anions)
    if not cations or not anions:
        return molecule
    return Decomposition(
        composition=tuple(composition), cations=tuple(cations), anions=tuple(anions), neutral_parts=(),
        hydrate_water=water, oxidation_states=states, substance_class="ionic_salt")
