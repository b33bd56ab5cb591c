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

import dataclasses

from ionicity.scorer.grammar import hill_formula
from ionicity.scorer.ion_library import find_alias, ions_by_composition, monatomic_ion
from ionicity.scorer.ion_penalties import _PENALTY_SPECIES, _PENALTY_UNCOMMON_ION
from ionicity.scorer.model import Ion
from ionicity.scorer.onium_codes import canonical_quaternary_code, onium_from_code
from ionicity.scorer.onium_groups import (
    PROTON_GROUP, group_counts as parse_group, onium_composition, onium_from_label, onium_label, onium_name,
)
from ionicity.scorer.organic_anions import _ALLOWED, built_organic_ion

__all__ = ["AMINE_SALT_SOURCE", "WRITTEN_ONIUM_NOTE_MARK", "amine_salt_readings", "registry_halide_salt_readings",
           "onium_cation_readings"]

AMINE_SALT_SOURCE = (
    "constructed by rule (scorer/organic_cations.py), not from the ion library: the organic base protonated by"
    " the hydrogen halide the formula or name writes"
)
REGISTRY_SALT_SOURCE = (
    "constructed by rule (scorer/organic_cations.py), not from the ion library: the organic cation of a formula"
    " the registry lists only as a salt, beside its halide ions"
)
WRITTEN_ONIUM_SOURCE = (
    "constructed by rule (scorer/onium_groups.py, scorer/organic_cations.py), not from the ion library: the"
    " central atom with the organic groups the text writes on it (or the name names), charge +1"
)
#: the words of the note of an onium cation built from the groups a text writes (it says how the text was read,
#: so the typing-slip audit does not count it against the reading; scorer.slips)
WRITTEN_ONIUM_NOTE_MARK = "cation of the groups the text writes on"
# the family of an onium cation by its central atom (scorer.ion_shapes.ONIUM_FAMILIES pack their chains)
_ONIUM_FAMILY = {"N": "ammonium-quaternary", "P": "phosphonium", "As": "organic-cation", "S": "organic-cation"}
_ONIUM_WORD = {"N": "ammonium", "P": "phosphonium", "As": "arsonium", "S": "sulfonium"}
# cation families that are the protonated form of a base (a hydrochloride's cation is never quaternary)
_PROTIC_FAMILIES = frozenset({"ammonium-protic", "amidinium", "ammonium-like", "cholinium"})


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
    rest = _without_halides(remaining, halide, n)
    # a library cation only where the composition has no other amine (one carbon: methylammonium, guanidinium):
    # C2H8N(+) is ethylammonium or dimethylammonium, and the formula cannot say which
    listed = [ion for ion in ions_by_composition(rest, n) if ion.family in _PROTIC_FAMILIES and rest["C"] <= 1]
    cation = listed[0] if listed else protonated_base(rest, n)
    # a library cation needs no word; one built by rule is said, as the organic anions built by rule are
    notes = [] if listed else [f"{cation.ion_id}: the organic base protonated by the H{halide} the text writes,"
                               " a cation the ion library does not list (built by rule, scorer/organic_cations.py)"]
    return _halide_salt(cation, halide, n, 0.0 if listed else _PENALTY_UNCOMMON_ION), notes


def _without_halides(remaining: dict[str, float], halide: str, n: int) -> dict[str, float]:
    """``remaining`` less ``n`` atoms of ``halide`` (the halide ions): the cation's composition."""
    rest = dict(remaining)
    rest[halide] -= n
    if rest[halide] < 1e-9:
        del rest[halide]
    return rest


def _halide_salt(cation, halide: str, n: int, cation_penalty: float) -> list:
    """The one reading of ``cation`` beside ``n`` halide ions, priced like the solver's readings."""
    return [(cation_penalty + 2 * _PENALTY_SPECIES, [(cation, 1.0), (monatomic_ion(halide, -1), float(n))])]


_HALIDES = ("Cl", "Br", "I")


def registry_halide_salt_readings(remaining: dict[str, float], name: str) -> tuple[list, list[str]]:
    """The reading of a Hill formula that the registry lists only as a salt (``name``), with carbon,
    nitrogen and one halogen and no metal, as an organic cation beside halide ions: amine hydrohalides
    (C6H10Cl2N2, 1,2-benzenediamine dihydrochloride) and quaternary ammonium halides (C7H16BrNO2,
    acetylcholine bromide) that a bare formula otherwise reads as molecules. Each halide ion needs a
    nitrogen to carry its cation's charge, so the halide count is the smaller of the halogen and nitrogen
    counts (2-chloroaniline hydrochloride, C6H7Cl2N: one chloride, one Cl on the ring). The cation is built
    by rule (``organic-cation``: the formula cannot say whether it is protic or quaternary). Two empty lists
    where the rule does not apply.

    >>> readings, notes = registry_halide_salt_readings({"C": 6.0, "H": 7.0, "Cl": 2.0, "N": 1.0}, "x")
    >>> sorted(f"{ion.ion_id}*{k:g}" for ion, k in readings[0][1])
    ['Cl(-)*1', '[C6H7ClN](+)*1']
    """
    halides = [x for x in _HALIDES if x in remaining]
    if len(halides) != 1 or "C" not in remaining or "N" not in remaining or not set(remaining) <= _ALLOWED:
        return [], []
    halide = halides[0]
    n = int(min(remaining[halide], remaining["N"]))
    if n < 1 or any(abs(k - round(k)) > 1e-9 for k in remaining.values()):
        return [], []
    rest = _without_halides(remaining, halide, n)
    cation = built_organic_ion(f"[{hill_formula(rest)}]", rest, n, "organic-cation", "organic cation",
                               REGISTRY_SALT_SOURCE)
    note = (f"{cation.ion_id}: an organic cation beside {n} {halide}(-), read so because the registry lists"
            f" this formula only as a salt ({name}); built by rule (scorer/organic_cations.py)")
    return _halide_salt(cation, halide, n, _PENALTY_UNCOMMON_ION), [note]


def onium_cation_readings(remaining: dict[str, float], hint: str, hinted=()) -> tuple[list, list[str]]:
    """The reading of ``remaining`` as the onium cation a formula writes by its groups (the structure hint of
    :func:`scorer.onium_groups.onium_hint`) beside one anion of charge -1, and its note; two empty lists where
    the rest is no library anion of charge -1 (or one halide). ``hinted``: the ions the text writes in
    brackets (lists of the same ion in its charges, as :func:`scorer.ions._read` keeps them), already taken
    out of ``remaining``: with them, the cation must be all that is left and they must carry charge -1.
    Four n-alkyl groups on N or P are the code of the trade ([N4444](+) for ``(C4H9)4NBr``, from the library
    where it lists the code), (HOCH2CH2)(CH3)3N(+) choline; any other cation is built by rule with its
    substitutive name (:func:`scorer.onium_groups.onium_name`): ``(C2H5)3(C6H5CH2)NCl`` is
    benzyltriethylammonium chloride, not 1-octylpyridinium chloride, which has the same composition.

    >>> readings, notes = onium_cation_readings({"C": 24.0, "H": 20.0, "Br": 1.0, "P": 1.0}, "onium_cation:[(C6H5)4P]")
    >>> sorted(f"{ion.ion_id}*{k:g}" for ion, k in readings[0][1]), readings[0][1][0][0].family
    (['Br(-)*1', '[(C6H5)4P](+)*1'], 'phosphonium')
    """
    read = onium_from_label(hint)
    if read is None:
        return [], []
    centre, groups = read
    cation_counts = onium_composition(centre, groups)
    rest = dict(remaining)
    for symbol, n in cation_counts.items():
        rest[symbol] = rest.get(symbol, 0.0) - n
        if rest[symbol] < -1e-9:
            return [], []
        if rest[symbol] < 1e-9:
            del rest[symbol]
    if hinted:
        chosen = [next((v for v in variants if v[0].charge < 0), None) for variants in hinted]
        if rest or None in chosen or abs(sum(ion.charge * n for ion, n in chosen) + 1) > 1e-9:
            return [], []
        anions, anion_count = [ion for ion, _ in chosen], [n for _, n in chosen]
    else:
        anions, anion_count = _one_anion(rest), [1.0]
    if not anions:
        return [], []
    protic = any(g == PROTON_GROUP for g, _ in groups)
    family = "ammonium-protic" if protic else _ONIUM_FAMILY[centre]
    # the library's ion only where the groups say which: choline's, and the n-alkyl chains of a code of the
    # trade ([N1,1,10,10] is no code: two chains of ten or more); (C5H11)(CH3)3N(+) has the composition of
    # [N2222](+) but is not it
    listed = [ion for ion in ions_by_composition(cation_counts, 1) if ion.family == "cholinium"] \
        if centre == "N" and groups == (("C2H5O", 1), ("CH3", 3)) else []
    chains = [_n_alkyl_carbons(g) for g, n in groups for _ in range(n)]
    if protic:
        # a protonated amine: the library's protic cation of that name (triethylammonium), not an isomer of its
        # composition ([EtNH3](+) is no dimethylammonium)
        named = onium_name(centre, groups)
        listed = [ion for ion in ions_by_composition(cation_counts, 1)
                  if ion.family == "ammonium-protic" and named and ion.name.split(" (")[0] == named]
    elif not listed and centre in ("N", "P") and None not in chains:
        code = canonical_quaternary_code(centre + ",".join(str(c) for c in chains))
        coded = (find_alias(code) or onium_from_code(code)) if code else None
        listed = [coded] if coded is not None and coded.charge == 1 else []
    if listed:
        cation = listed[0]
    else:
        cation = built_organic_ion(onium_label(centre, groups), cation_counts, 1, family,
                                   "protonated amine" if protic else f"quaternary {_ONIUM_WORD[centre]} cation",
                                   WRITTEN_ONIUM_SOURCE)
        named = onium_name(centre, groups)
        if named:
            # its substitutive name, which the salt's systematic name and the training screen's name check use
            cation = dataclasses.replace(cation, name=named)
    notes = [] if listed else [f"{cation.ion_id}: the {_ONIUM_WORD[centre]} {WRITTEN_ONIUM_NOTE_MARK} {centre},"
                               " which the ion library does not list (built by rule, scorer/onium_groups.py)"]
    penalty = (0.0 if listed else _PENALTY_UNCOMMON_ION) + 2 * _PENALTY_SPECIES
    return [(penalty, [(cation, 1.0), *zip(anions, anion_count)])], notes


def _one_anion(rest: dict[str, float]) -> list[Ion]:
    """``rest`` as one anion of charge -1: a library ion or a monatomic one (a halide); [] otherwise."""
    if not rest:
        return []
    found = ions_by_composition(rest, -1)
    if found:
        return found[:1]
    if len(rest) == 1:
        ((symbol, n),) = rest.items()
        ion = monatomic_ion(symbol, -1) if abs(n - 1.0) < 1e-9 else None
        return [ion] if ion is not None else []
    return []


def _n_alkyl_carbons(group: str) -> int | None:
    """The carbons of a saturated CnH(2n+1) group (read as n-alkyl, as the codes of the trade are), else None."""
    counts = dict(parse_group(group))
    c = counts.get("C", 0)
    return c if set(counts) == {"C", "H"} and counts["H"] == 2 * c + 1 else None
