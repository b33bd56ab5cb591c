"""Salts of organic bases with a hydrogen halide: amine hydrochlorides written with their acid.

``C6H5NH2·HCl``, ``C2H8N2·2HCl``, ``CH3NH2.HBr`` and the names ``aniline hydrochloride``, ``ethylenediamine
dihydrochloride`` say that n molecules of HX protonate the base: the salt is the base with n protons as one
cation of charge n+, beside n halide ions (IUPAC Red Book 2005, IR-5.5 and P-73.2 of the Blue Book 2013: a
"hydrochloride" is the salt of the base and HCl; common practice). Read from the bare composition instead,
the ion library's isomers of that cation were taken (anilinium chloride as 1-methylpyridinium chloride,
triethylammonium chloride as trimethylpropylammonium chloride) or none (ethylenediamine dihydrochloride).

Rule (stated, not fitted): the formula writes or names n HX; the rest holds carbon, hydrogen and at least n
nitrogen atoms (one basic N per proton; amidines and guanidines included); the cation is a protic ion of the
library with that composition and charge where the composition allows no other amine (one carbon:
methylammonium, guanidinium), else one built by rule, ``[C6H8N](+)`` named as the protonated base (C2H8N(+)
is ethylammonium or dimethylammonium, C6H16N(+) triethylammonium or hexylammonium: a formula cannot say).
"""
from __future__ import annotations

from ionicity.scorer.grammar import hill_formula
from ionicity.scorer.ion_library import ions_by_composition, monatomic_ion
from ionicity.scorer.ion_penalties import _PENALTY_SPECIES, _PENALTY_UNCOMMON_ION
from ionicity.scorer.model import Ion
from ionicity.scorer.organic_anions import built_organic_ion

__all__ = ["AMINE_SALT_SOURCE", "amine_salt_readings"]

AMINE_SALT_SOURCE = (
    "constructed by rule (scorer/organic_cations.py), not from the ion library: the organic base protonated by"
    " the hydrogen halide the formula or name writes"
)
# cation families that are the protonated form of a base (a hydrochloride's cation is never quaternary)
_PROTIC_FAMILIES = frozenset({"ammonium-protic", "amidinium", "ammonium-like", "cholinium"})
_ALLOWED = frozenset({"C", "H", "N", "O", "S", "P", "F", "Cl", "Br", "I"})


def protonated_base(composition: dict[str, float], charge: int) -> Ion:
    """The cation of a protonated organic base, built by rule.

    >>> ion = protonated_base({"C": 6.0, "H": 8.0, "N": 1.0}, 1)
    >>> ion.ion_id, ion.family, ion.organic
    ('[C6H8N](+)', 'ammonium-protic', True)
    """
    return built_organic_ion(f"[{hill_formula(composition)}]", composition, charge, "ammonium-protic",
                             "protonated organic base", AMINE_SALT_SOURCE)


def amine_salt_readings(remaining: dict[str, float], halide: str, n: int) -> tuple[list, list[str]]:
    """The reading of ``remaining`` as an organic base protonated by ``n`` H``halide``, and its note; two empty
    lists when the rule does not apply (no carbon, too few N, too few halide atoms).

    >>> readings, notes = amine_salt_readings({"C": 2.0, "H": 10.0, "Cl": 2.0, "N": 2.0}, "Cl", 2)
    >>> sorted(f"{ion.ion_id}*{k:g}" for ion, k in readings[0][1])
    ['Cl(-)*2', '[C2H10N2](2+)*1']
    """
    if n < 1 or remaining.get(halide, 0.0) < n - 1e-9 or remaining.get("N", 0.0) < n - 1e-9:
        return [], []
    if "C" not in remaining or "H" not in remaining or not set(remaining) <= _ALLOWED:
        return [], []
    rest = {s: k for s, k in remaining.items() if s != halide or k > n + 1e-9}
    if halide in rest:
        rest[halide] = remaining[halide] - n
    # a library cation only where the composition has no other amine (one carbon: methylammonium, guanidinium):
    # C2H8N(+) is ethylammonium or dimethylammonium, and the formula cannot say which
    listed = [ion for ion in ions_by_composition(rest, n) if ion.family in _PROTIC_FAMILIES and rest["C"] <= 1]
    cation = listed[0] if listed else protonated_base(rest, n)
    anion = monatomic_ion(halide, -1)
    # a library cation needs no word; one built by rule is said, as the organic anions built by rule are
    notes = [] if listed else [f"{cation.ion_id}: the organic base protonated by the H{halide} the text writes,"
                               " a cation the ion library does not list (built by rule, scorer/organic_cations.py)"]
    penalty = (0.0 if listed else _PENALTY_UNCOMMON_ION) + 2 * _PENALTY_SPECIES
    return [(penalty, [(cation, 1.0), (anion, float(n))])], notes
