"""Neutral organic molecules, recognised before the ion solver.

Most carbon compounds in an inventory are molecules: alcohols, sugars,
amines, nitro compounds, nitriles, azides. The ion solver reads such a
formula as a molecule too, but only after the organic ion-pair rule of
:mod:`scorer.ions` has tried every pair of library ions on it (about 0.2 ms
a formula), and the record then runs descriptors that need ions (Fajans,
HSAB, lattice energies, the generated name), which give nothing to a
molecule. :func:`organic_molecule` gives the same decomposition without the
search, and :func:`molecule_descriptors` the descriptors that apply, so that
:mod:`scorer.record` scores a molecule in a fraction of the time (measured
in DEVELOPERS.md, "Organic molecules").

Recognition, all cheap and in this order:

1. the formula carries no charge, no bracketed ion of the library (an ionic
   liquid written ``[C4mim][BF4]``) and no adduct; of the written groups, amide
   groups (urea as ``CO(NH2)2``) make it a molecule at once, as in the solver;
2. carbon with hydrogen and only non-metals
   (:func:`scorer.substance.organic_candidate`): a metal-organic, a carbide,
   CO2, CS2 and the carbonyl halides are never candidates;
3. the organic ion-pair rule cannot read it as a salt. The rule reads a
   formula as one cation and one anion of the ion library (or H(+) and a
   halide) in whole numbers that use up every atom (acetic acid, HCN,
   ammonium and alkylammonium salts, ethylammonium nitrate, urea written flat
   as ammonium cyanate, an ionic liquid written flat such as C8H15N2BF4).
   ``a`` cations of charge z+ and ``b`` anions of charge q- balance when
   ``a z = b q``, so every such formula is a whole multiple of the unit of
   ``q/g`` cations and ``z/g`` anions (g = gcd(z, q)), and its counts
   divided by their greatest common divisor (:func:`primitive_counts`) are
   that unit's. :func:`_pairs_by_ratio` indexes the pairs by those counts (a
   superset of the pairs the rule tries). A formula that matches no pair, or
   only pairs that :func:`scorer.substance.classify` calls ``unknown`` at its
   multiple (which the solver then reads as the molecule: glucose as 3 H(+)
   with 3 lactate, an alcohol as H(+) with its alkoxide), is a molecule at
   once; any other formula takes the solver, as before.

Nitro compounds, nitriles, nitrate and nitrite esters and organic azides are
therefore molecules (``covalent_molecular``), as the ion-pair rule already
reads them (hydronium and the oxocations NO(+) and NO2(+) are no cation of an
organic formula; common practice). ``tests/test_organic.py`` compares the
record of every formula with the one the full path gives, on molecules and
on formulas that must not be taken for one.

>>> from ionicity.scorer.formula import parse_formula
>>> organic_molecule(parse_formula("C6H5NO2")).substance_class
'covalent_molecular'
>>> [organic_molecule(parse_formula(f)) for f in ("CH3COOH", "HCN", "CO2", "[C4mim][BF4]", "C8H15N2BF4")]
[None, None, None, None, None]
"""
from __future__ import annotations

import math
from fractions import Fraction
from functools import reduce

from ionicity.scorer.applicability import settle
from ionicity.scorer.caching import clear_all, once, per_input
from ionicity.scorer.columns import descriptors
from ionicity.scorer.elements import is_metal
from ionicity.scorer.formula import ParsedFormula, hill_formula
from ionicity.scorer.ion_library import ion_library, monatomic_ion
from ionicity.scorer.ion_search import _NO_ORGANIC_PAIR_ANIONS
from ionicity.scorer.model import Decomposition, IonTerm
from ionicity.scorer.registry_formulas import ACYL_HALIDE_ELEMENTS, ACYL_HALOGENS, registry_salt, registry_zwitterion
from ionicity.scorer.substance import classify, nonionic_decomposition, organic_candidate

__all__ = [
    "organic_molecule", "molecule_descriptors", "primitive_counts", "ION_ONLY_DESCRIPTORS", "set_organic_shortcut",
    "organic_shortcut_enabled",
]

# descriptor modules whose analyse gives no value and no note to a decomposition
# without ions (each returns at once when dec.is_ionic is False; the generated
# name is for ionic compounds only): a molecule's record leaves their columns empty
ION_ONLY_DESCRIPTORS = frozenset({
    "ionicity.scorer.fajans", "ionicity.scorer.hsab", "ionicity.scorer.lattice", "ionicity.scorer.systematic_name",
})
# monatomic ions the ion-pair rule adds to the library's (scorer.ion_search._ORGANIC_PAIR_MONATOMIC)
_PAIR_MONATOMIC = (("H", 1), ("F", -1), ("Cl", -1), ("Br", -1), ("I", -1))

# cations the ion-pair rule never reads in an organic formula besides the
# oxocations (scorer.ions: "hydronium and oxocations are no cation of an
# organic formula"): nitromethane CH3NO2 is not H3O(+) with cyanate
_NO_ORGANIC_CATIONS = frozenset({"H3O(+)"})

_SHORTCUT = {"enabled": True}


def set_organic_shortcut(enabled: bool) -> None:
    """Turn the early recognition on (the default) or off, so that every
    formula takes the ion solver and every descriptor, as before it existed:
    the benchmark's baseline and the tests comparing both paths. Empties the
    per-input caches, which hold rows of either path."""
    _SHORTCUT["enabled"] = bool(enabled)
    clear_all()


def organic_shortcut_enabled() -> bool:
    """Whether :func:`organic_molecule` recognises molecules (see :func:`set_organic_shortcut`)."""
    return _SHORTCUT["enabled"]


def primitive_counts(counts) -> tuple[tuple[str, int], ...] | None:
    """Whole-number counts divided by their greatest common divisor, sorted
    by symbol; None when a count is not a whole number.

    >>> primitive_counts((("C", 2.0), ("H", 4.0), ("O", 2.0)))
    (('C', 1), ('H', 2), ('O', 1))
    >>> primitive_counts((("C", 1.5), ("H", 3.0))) is None
    True
    """
    whole = []
    for symbol, n in counts:
        k = round(n)
        if k < 1 or abs(n - k) > 1e-9:
            return None
        whole.append((symbol, k))
    g = math.gcd(*(k for _, k in whole))
    return tuple(sorted((s, k // g) for s, k in whole)) if g else None


def _whole(composition) -> dict[str, Fraction] | dict[str, int]:
    """An ion's composition as exact numbers (whole where they are)."""
    out = {}
    for symbol, n in composition:
        k = round(n)
        out[symbol] = k if abs(n - k) < 1e-9 else Fraction(n).limit_denominator(1000)
    return out


@once
def _pairs_by_ratio() -> dict[tuple[tuple[str, int], ...], tuple]:
    """Every cation-anion pair the organic ion-pair rule may read a formula
    of carbon, hydrogen and non-metals as, by the pair's primitive counts:
    (how many times its smallest balanced unit holds the primitive counts,
    the cation, the anion, cations and anions in that unit).

    The pairs are those the rule (scorer.ion_search._ion_pair_readings) draws from:
    library ions and H(+) and the halides, not both organic, no oxocation as
    the cation. Keeping a pair the rule does not try only sends more
    formulas to the solver.
    """
    ions = [ion for ion in list(ion_library()) + [monatomic_ion(s, z) for s, z in _PAIR_MONATOMIC]
            if not any(is_metal(s) for s, _ in ion.composition)]
    cations = [(ion, _whole(ion.composition)) for ion in ions
               if ion.charge > 0 and ion.family != "oxocation" and ion.ion_id not in _NO_ORGANIC_CATIONS]
    anions = [(ion, _whole(ion.composition)) for ion in ions if ion.charge < 0 and ion.ion_id not in _NO_ORGANIC_PAIR_ANIONS]
    out: dict[tuple[tuple[str, int], ...], list] = {}
    for cation, held in cations:
        for anion, parts in anions:
            if cation.organic and anion.organic:
                continue
            if not ({"C", "H"} <= held.keys() | parts.keys()):
                continue
            z, q = cation.charge, -anion.charge
            g = math.gcd(z, q)
            unit = {s: n * (q // g) for s, n in held.items()}
            for s, n in parts.items():
                unit[s] = unit.get(s, 0) + n * (z // g)
            # whole numbers: an ion of fractional composition counts in multiples of its denominators
            # (an int's denominator is 1, a Fraction's its own: no Fraction made per count,
            # which was two thirds of building this table, about 50 ms once per process)
            scale = reduce(math.lcm, (n.denominator for n in unit.values()), 1)
            whole = {s: int(n * scale) for s, n in unit.items()}
            common = reduce(math.gcd, whole.values(), 0)
            key = tuple(sorted((s, k // common) for s, k in whole.items()))
            # with an ion of fractional composition every multiple goes to the solver (1 divides every m)
            entry = (common, cation, anion, q // g, z // g) if scale == 1 else (1, cation, anion, None, None)
            out.setdefault(key, []).append(entry)
    return {key: tuple(entries) for key, entries in out.items()}


def _read_as_molecule(counts: dict[str, float], key: tuple[tuple[str, int], ...], multiple: int) -> bool:
    """Whether the solver reads a formula ``multiple`` times ``key`` as a
    molecule: no pair holds it, or every pair that does is one
    :func:`scorer.substance.classify` calls ``unknown`` (H(+) with several
    anions, glucose as 3 H(+) with 3 lactate; H(+) with an alkoxide), which
    the solver then reads as the molecule."""
    for common, cation, anion, cations_per_unit, anions_per_unit in _pairs_by_ratio().get(key, ()):
        if multiple % common:
            continue  # not a whole number of this pair's balanced units
        if cations_per_unit is None:
            return False
        units = multiple // common
        terms = [IonTerm(cation, float(units * cations_per_unit))], [IonTerm(anion, float(units * anions_per_unit))]
        if classify(counts, *terms) != "unknown":
            return False  # a salt, an acid, an ionic liquid: the solver decides
    return True


def organic_molecule(comp: ParsedFormula) -> Decomposition | None:
    """The decomposition of ``comp`` when it is a neutral organic molecule
    (see the module docstring), the same as :func:`scorer.ions.decompose_anhydrous`
    gives it; None for any other formula, which then takes the solver.

    Parameters
    ----------
    comp : ParsedFormula
        A parsed formula; its lattice water is not looked at (the
        decomposition is the anhydrous one).

    Returns
    -------
    Decomposition or None
    """
    if not _SHORTCUT["enabled"] or comp.charge or comp.ion_hints or comp.neutral_adducts:
        return None
    if comp.structure_hint not in _HINTS:
        return None
    return _molecule(comp.counts, comp.structure_hint == "amide")


# written groups the solver reads before the ion-pair rule: amide groups (urea
# as CO(NH2)2) make a formula without metal a molecule at once; a C5H5 group
# (pyridine, C5H5N) says something only beside a metal, which no candidate has
_HINTS = frozenset({"", "amide", "organometallic"})


@per_input(maxsize=65536)
def _molecule(counts: tuple[tuple[str, float], ...], amide: bool = False) -> Decomposition | None:
    as_dict = dict(counts)
    if not organic_candidate(as_dict):
        return None
    key = primitive_counts(counts)
    if key is None:
        return None
    symbol, primitive = key[0]
    if amide:
        # NH2 groups written out mark a molecule (urea), unless they are an amidinium
        # cation's own (HC(NH2)2I, C(NH2)3Cl): the solver reads those
        multiple = round(as_dict[symbol]) // primitive
        if any(getattr(cation, "family", None) == "amidinium" and not multiple % common
               for common, cation, *_ in _pairs_by_ratio().get(key, ())):
            return None
    elif not _read_as_molecule(as_dict, key, round(as_dict[symbol]) // primitive):
        return None
    if "N" in as_dict and any(x in as_dict for x in ("Cl", "Br", "I")) and registry_salt(hill_formula(as_dict)):
        return None  # the registry lists the formula only as a salt (an amine hydrohalide): the solver reads it
    if "O" in as_dict and not as_dict.keys() - ACYL_HALIDE_ELEMENTS and as_dict.keys() & ACYL_HALOGENS:
        return None  # an acyl halide's shape (C2H3ClO): the solver asks the registry whether one is meant
    if "N" in as_dict and as_dict.keys() & {"O", "S"} and registry_zwitterion(hill_formula(as_dict)):
        return None  # every registry compound of the formula is a zwitterion (C6H14N2O2): the solver says so
    # what scorer.ions reads for a formula without ions: no notes, no water, no adducts
    return settle(nonionic_decomposition(0, as_dict, [], 0.0, ()))


@once
def molecule_descriptors() -> tuple:
    """The descriptors that apply to a molecule: every one of
    :func:`scorer.columns.descriptors` but :data:`ION_ONLY_DESCRIPTORS`."""
    return tuple(d for d in descriptors() if d.__module__ not in ION_ONLY_DESCRIPTORS)
