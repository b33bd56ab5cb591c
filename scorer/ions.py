"""Ions and oxidation states: a composition -> a charge-balanced
:class:`~scorer.model.Decomposition`, and what kind of substance it is.

The solver
----------
1. Ions written explicitly (the ionic-liquid shorthand, bracketed complexes
   of the library such as ``[Fe(CN)6]``) are taken as given; lattice water
   and neutral adducts (``NH3``) are set apart.
2. The rest is searched for polyatomic ions of the library, largest first,
   each tried at every multiplicity that fits (at most three species).
3. Whatever is left is assigned monatomic ions: metals positive, from their
   element's listed oxidation states; a metal may be split over two states
   (mixed valence, ``Fe3O4`` = Fe(2+) + 2 Fe(3+); ``Fe0.95O``).
4. Every charge-balanced candidate gets a penalty (below); the lowest wins.
   Candidates that tie with it are reported as equally plausible.

Penalties (additive; lower is more plausible), common practice:

====================================================  =======
choice                                                penalty
====================================================  =======
an oxidation state outside the element's main list     2
a monatomic cation of a non-metal (C4+, S6+ ...)       5
H+ as a monatomic cation                               1.5
a metal split over two oxidation states                1
  (+0.1 for each state skipped between the two)
peroxide, superoxide, ozonide                          3.5
polysulfide, C2(2-) and other carbides                 1.5
an oxoanion of a mixed oxide (MnO4(3-), ZnO2(2-) ...)   1.5
an uncommon ion (hydrazinium, sulfamate, S2Ox, amide,  0.5
fulminate, ammine and hydroxo complexes, alkoxides ...)
H3O+ or an oxocation (NO2+, UO2(2+), VO(2+) ...)        2
a hydrogen-oxoanion (HSO4-: H2SO4 reads as 2 H+)       0.05
mercury as Hg(+) (mercury(I) is Hg2(2+))               1
each distinct ion species                              0.1
====================================================  =======

A best penalty of 5 or more means no sensible ionic reading: the entry is
then classed covalent (or unknown) and its formal oxidation states are found
by electronegativity instead (:func:`scorer.substance.formal_oxidation_states`).

What kind of substance a reading is (``substance_class``) and the formal
oxidation states of entries without ions are decided in :mod:`scorer.substance`.
"""
from __future__ import annotations

import dataclasses
import itertools

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.elements import is_metal
from ionicity.scorer.formula import ParsedFormula, format_count
from ionicity.scorer.ion_library import (
    get_ion,
    ion_library,
    ions_by_composition,
    monatomic_ion,
    same_label_ions,
)
from ionicity.scorer.applicability import family_decided, metal_rich_reading, redox_conflicts, settle
from ionicity.scorer.model import Decomposition, Ion, IonTerm
from ionicity.scorer.substance import (
    classify,
    formal_oxidation_states,
    format_oxidation_states,
    listed_states,
    nonionic_decomposition,
    organic_candidate,
    organometallic_states,
    oxidation_states_of,
)

__all__ = ["decompose", "decompose_anhydrous", "decompose_within", "solver_work", "work_bound", "formal_oxidation_states", "format_ion_terms", "format_oxidation_states"]

_RARE_ANION_FAMILIES = frozenset({"chalcogenide-polyatomic", "carbide"})
_PENALTY_EXTRA_STATE = 2.0
_PENALTY_NONMETAL_CATION = 5.0
_PENALTY_PROTON = 1.5
# metalloid cations of the inert pair that form salts with oxoanions and oxides
# (Sb2(SO4)3, Sb2O3, Te(SO4)2, TeO2; Greenwood & Earnshaw, Chemistry of the
# Elements, 2nd ed., 1997, ch. 13 and 16): cheaper than SbO(+) (2), dearer than a metal
_PBLOCK_CATIONS = frozenset({("Sb", 3), ("Te", 4)})
_PENALTY_PBLOCK_CATION = 1.0
_PENALTY_MIXED_VALENCE = 1.0
_PENALTY_RARE_ANION = 1.5
_PENALTY_UNCOMMON_ION = 0.5
# O-O anions only where no mixed valence explains the oxygen (YBa2Cu3O7 is
# Cu(II)/Cu(III), not Cu(I) with peroxide)
_PENALTY_PEROXO = 3.5
_PEROXO_IONS = frozenset({"O2(2-)", "O2(-)", "O3(-)"})
_PENALTY_HYDROGEN_ANION = 0.05
# Ions real salts seldom contain; they win only where nothing common fits.
_UNCOMMON_FAMILIES = frozenset({
    "ammine-complex", "hydroxo-complex", "polyhalide", "organic-anion", "alkylphosphate", "amidinium",
})
_UNCOMMON_IONS = frozenset({
    "N2H5(+)", "N2H6(2+)", "NH3OH(+)", "NH2SO3(-)", "S2O4(2-)", "S2O5(2-)", "S2O6(2-)",
    "S2O7(2-)", "S2O8(2-)", "HO2(-)", "PH4(+)", "CNO(-)", "NH2(-)", "NH(2-)", "C3(4-)", "SO5(2-)",
    "FeO4(2-)",
})
# oxoanions that mostly exist as formula units of mixed oxides, where the
# monatomic reading (spinels ZnFe2O4, LiMn2O4) is the usual description
_FORMULA_UNIT_OXOANIONS = frozenset({
    "SbO4(3-)", "SbO3(-)", "MnO4(3-)", "CrO2(-)", "ZnO2(2-)",
    # spinels MgAl2O4, ZnAl2O4, CaAl2O4 and LiAlO2 are oxide-ion lattices with
    # Al(3+) in octahedral or tetrahedral holes, no discrete AlO2 units
    # (Wells, Structural Inorganic Chemistry, 5th ed., 1984, ch. 13; from memory)
    "AlO2(-)",
})
_PENALTY_FORMULA_UNIT_OXOANION = 1.5
# actinyl ions are the usual form of U(VI), Np(VI), Pu(VI)
_ACTINYL_IONS = frozenset({"UO2(2+)", "UO2(+)", "NpO2(2+)", "NpO2(+)", "PuO2(2+)"})
# acid anions that keep a proton: H2S reads 2 H+ + S2-, oxalic acid 2 H+ + C2O4(2-)
_HYDROGEN_ANIONS = frozenset({"HS(-)", "HSe(-)", "HC2O4(-)"})
_PENALTY_SPECIES = 0.1
# how much less plausible a redox-compatible reading may be than the incompatible one
_REDOX_ALTERNATIVE_MAX_EXTRA = 1.0
_PENALTY_FRACTIONAL_SPLIT = 1.0
# a bare cation of charge 5 or more is a formal device (U6+ + 2 O2- in uranyl nitrate)
_PENALTY_HIGH_CATION = 1.0
_ADDUCT_COMPOSITIONS = {"NH3": (("H", 3.0), ("N", 1.0)), "H2O2": (("H", 2.0), ("O", 2.0))}
# hydronium only where nothing else fits: H3PO4 is 3 H+ + PO4(3-), not H3O+ + PO3-
_ION_PENALTIES = {"H3O(+)": 2.0}
# oxocations (NO2+, UO2 2+, VO 2+) only where nothing else fits: HNO3 is H+ + NO3-
_PENALTY_OXOCATION = 2.0
_IONIC_THRESHOLD = 5.0
_MAX_POLYATOMIC_SPECIES = 3
# multiplicities of a polyatomic ion tried: the most that fit and the next ones down
_MULTIPLICITIES = 3
# equally plausible choices kept per charge of the knapsack table
_MAX_TIES = 16
# solver work (search nodes plus knapsack transitions) the polyatomic-ion walks
# of one composition may spend together, about 15 ms of CPU: 1.5 times the
# dearest read of the demo and reference lists (Tutton's salt, 10,484 units;
# DEVELOPERS.md, "The charge-balance solver and its cost"); a walk that
# reaches it stops and its row's notes say so
_SEARCH_BUDGET = 16_000
_SEARCH_CUT_NOTE = ("the ion search stopped at its work limit before trying every combination of "
                    "polyatomic ions: a more plausible reading may exist (check the formula)")
# states kept per knapsack table: bounds the work whatever the counts
_MAX_TABLE = 64
# solver work done in this process (knapsack transitions, and search nodes
# counted once plus once per leftover element they check):
# tests bound it by a polynomial of the formula's size
_WORK = [0]
_TOL = 1e-6


def solver_work() -> int:
    """Solver work done in this process so far: knapsack transitions plus
    search nodes (a deterministic measure of cost, for tests and benchmarks)."""
    return _WORK[0]


def work_bound(size: int) -> int:
    """The most solver work a formula of ``size`` (elements x total atoms) may cost."""
    return 2000 * size * size


def format_ion_terms(terms) -> str:
    """``Fe(3+)*2;SO4(2-)*3`` from a sequence of IonTerm."""
    return ";".join(str(t) for t in terms)


@once
def _states(symbol: str) -> tuple[tuple[int, float], ...]:
    """Non-zero oxidation states with their penalty (main 0, extra 2)."""
    return tuple((state, _PENALTY_EXTRA_STATE if extra else 0.0) for state, extra in listed_states(symbol))


@per_input(maxsize=4096)
def _monatomic_options(symbol: str, count: float):
    """(kind, payload, penalty) options for one leftover element."""
    metal = is_metal(symbol)
    options = []
    states = _states(symbol)
    most_negative = min((s for s, _ in states if s < 0), default=None)
    for state, penalty in states:
        if metal and state < 0:
            continue
        if state < 0 and state != most_negative:
            # a monatomic anion carries its element's most negative state (N3-, O2-, S2-):
            # N- or O- as free ions read NO2 as NO+ + O-
            continue
        if state >= 5:
            penalty += _PENALTY_HIGH_CATION
        if state > 0 and not metal:
            if symbol == "H":
                penalty += _PENALTY_PROTON
            elif (symbol, state) in _PBLOCK_CATIONS:
                penalty += _PENALTY_PBLOCK_CATION
            else:
                penalty += _PENALTY_NONMETAL_CATION
        if symbol == "Hg" and state == 1:
            penalty += 1.0
        options.append(("single", state, penalty))
    options.sort(key=lambda o: o[2])
    if metal:
        positives = [(s, p) for s, p in _states(symbol) if s > 0]
        for (s1, p1), (s2, p2) in itertools.combinations(positives, 2):
            # adjacent states first: YBa2Cu3O7 is Cu(II)/Cu(III) rather than Cu(I)/Cu(III)
            gap = _PENALTY_SPECIES * (s2 - s1 - 1)
            options.append(("mixed", (s1, s2), p1 + p2 + _PENALTY_MIXED_VALENCE + gap))
    return tuple(options)


@per_input(maxsize=65536)
def _assign_monatomic_cached(remaining: tuple[tuple[str, float], ...], needed: float, cap: float, excluded=frozenset()):
    """(work, assignments): :func:`_assign_monatomic_solved` and the solver work
    it cost, also when the answer comes from this cache, so that a search's
    work limit does not depend on what was scored before."""
    before = _WORK[0]
    found = _assign_monatomic_solved(remaining, needed, cap, excluded)
    return _WORK[0] - before, found


def _assign_monatomic_solved(remaining: tuple[tuple[str, float], ...], needed: float, cap: float, excluded=frozenset()):
    """The best charge-balanced monatomic assignments with penalty <= cap.

    "Best" counts each species as the caller does (penalty plus
    ``_PENALTY_SPECIES`` per species): only the assignments within tolerance
    of the lowest such cost are returned, since the caller's cost of a
    reading differs from it by a constant. Dynamic programming over the
    elements with the charge carried so far as the state (a bounded knapsack,
    :func:`_single_state_tables`); at most one element is split over two
    states (mixed valence), settled by the charge left at the end. Returns a
    tuple of (penalty, ((symbol, state, count), ...)).
    """
    symbols = [s for s, n in remaining if n > _TOL]
    counts = {s: n for s, n in remaining}
    if not symbols:
        return ((0.0, ()),) if abs(needed) < _TOL else ()
    per_symbol = [_monatomic_options(s, counts[s]) for s in symbols]
    if excluded:
        # states ruled out by redox (Tl(3+) beside I(-)): see scorer.applicability.redox_conflicts
        per_symbol = [
            tuple(o for o in options if not ({(s, o[1])} if o[0] == "single" else {(s, o[1][0]), (s, o[1][1])}) & excluded)
            for s, options in zip(symbols, per_symbol)
        ]
    singles = [tuple([(state, penalty) for kind, state, penalty in options if kind == "single"]) for options in per_symbol]
    if any(not options for options in singles):
        return ()
    n_of = [counts[s] for s in symbols]
    # a fractional split is normal in a non-stoichiometric phase (La0.7Sr0.3MnO3)
    # and a last resort in a stoichiometric one
    stoichiometric = all([abs(n - round(n)) < _TOL for _, n in remaining])
    out = [
        (penalty, tuple((symbols[i], state, n_of[i]) for i, state in enumerate(picks)))
        for penalty, picks in _knapsack(singles, (), n_of, needed, cap)
    ]
    best = min((p + _PENALTY_SPECIES * len(symbols) for p, _ in out), default=float("inf"))
    # single states everywhere first: a reading with one element split has one
    # species more and pays the split's penalty, so it competes only where no
    # single-state reading is that cheap
    mixed_cap = min(cap, best - _PENALTY_SPECIES * (len(symbols) + 1))
    splits = [tuple([(state, penalty) for kind, state, penalty in options if kind == "mixed" and penalty <= mixed_cap + _TOL])
              for options in per_symbol]
    if mixed_cap + _TOL >= _PENALTY_MIXED_VALENCE and any(splits):
        for penalty, picks in _knapsack(singles, splits, n_of, needed, mixed_cap):
            j = next(i for i, pick in enumerate(picks) if isinstance(pick, tuple))
            (s1, s2), rest, n = picks[j][0], picks[j][1], n_of[j]
            # x ions at s1 and n - x at s2 carry the charge the others leave
            x = (s2 * n - rest) / (s2 - s1)
            if stoichiometric and abs(x - round(x)) > _TOL:
                penalty += _PENALTY_FRACTIONAL_SPLIT
                if penalty > cap + _TOL:
                    continue
            terms = [(symbols[i], state, n_of[i]) for i, state in enumerate(picks)]
            terms[j:j + 1] = [(symbols[j], s1, round(x, 9)), (symbols[j], s2, round(n - x, 9))]
            out.append((penalty, tuple(terms)))
    if not out:
        return ()
    best = min(p + _PENALTY_SPECIES * len(t) for p, t in out)
    return tuple((p, t) for p, t in out if p + _PENALTY_SPECIES * len(t) <= best + _TOL)


def _knapsack(singles, splits, n_of, needed: float, cap: float):
    """Charge balance as a bounded knapsack over the elements' oxidation states.

    Dynamic programming, one element at a time. A table maps each state
    reached so far -- the charge carried (rounded to 1e-9), and with
    ``splits`` which element is split over two states, whose charge is
    settled at the end -- to its lowest penalty and the choices reaching it at
    that penalty (ties kept up to ``_MAX_TIES``). A state from which
    ``needed`` can no longer be reached, or whose penalty exceeds ``cap``, is
    dropped; a table keeps at most ``_MAX_TABLE`` states, the cheapest (then
    those nearest the charge still needed). Work: O(elements x _MAX_TABLE x
    options), whatever the counts.

    Without ``splits``: (penalty, states) of the cheapest single-state
    assignments summing to ``needed``. With them: the assignments with
    exactly one element split, its choice given as ((s1, s2), charge it must
    carry), the charge strictly between s1 x count and s2 x count.
    """
    lows = [0.0] * (len(singles) + 1)
    highs = [0.0] * (len(singles) + 1)
    for i in range(len(singles) - 1, -1, -1):
        spans = [s * n_of[i] for s, _ in singles[i]]
        if splits and splits[i]:
            spans += [s * n_of[i] for (pair, _) in splits[i] for s in pair]
        lows[i] = lows[i + 1] + min(spans)
        highs[i] = highs[i + 1] + max(spans)
    # key: (charge of the single-state elements, (split element, its two states) or ())
    table: dict[tuple[float, tuple], tuple[float, tuple]] = {(0.0, ()): (0.0, ((),))}
    work = 0
    # whole counts keep the charge an integer: no rounding per transition
    whole = all([float(n).is_integer() for n in n_of])
    for i, options in enumerate(singles):
        n = int(n_of[i]) if whole else n_of[i]
        lo, hi = needed - highs[i + 1] - _TOL, needed - lows[i + 1] + _TOL
        following: dict[tuple[float, tuple], tuple[float, tuple]] = {}
        # the cheapest choices reaching each state, ties kept (written out rather
        # than a helper: this loop is most of the solver's time)
        for (charge, split), (penalty, picks) in table.items():
            for state, option_penalty in options:
                work += 1
                p = penalty + option_penalty
                if p > cap + _TOL:
                    continue
                c = charge + state * n if whole else round(charge + state * n, 9)
                if not split and not lo <= c <= hi:
                    continue
                key = (c, split)
                held = following.get(key)
                if held is None or p < held[0] - _TOL:
                    following[key] = (p, tuple([k + (state,) for k in picks[:_MAX_TIES]]))
                elif p <= held[0] + _TOL and len(held[1]) < _MAX_TIES:
                    following[key] = (held[0], held[1] + tuple([k + (state,) for k in picks[: _MAX_TIES - len(held[1])]]))
            if splits and not split:
                for pair, option_penalty in splits[i]:
                    work += 1
                    p = penalty + option_penalty
                    if p > cap + _TOL:
                        continue
                    key = (charge, (i, pair))
                    held = following.get(key)
                    if held is None or p < held[0] - _TOL:
                        following[key] = (p, tuple([k + (pair,) for k in picks[:_MAX_TIES]]))
                    elif p <= held[0] + _TOL and len(held[1]) < _MAX_TIES:
                        following[key] = (held[0], held[1] + tuple([k + (pair,) for k in picks[: _MAX_TIES - len(held[1])]]))
        if len(following) > _MAX_TABLE:
            # the cheapest states, then those nearest what is still needed
            kept = sorted(following.items(), key=lambda kv: (round(kv[1][0], 9), abs(needed - kv[0][0]), kv[0]))
            following = dict(kept[:_MAX_TABLE])
        table = following
    _WORK[0] += work + 1
    found = []
    for (charge, split), (penalty, choices) in table.items():
        if not split:
            if abs(charge - needed) < _TOL:
                found.extend((penalty, picks) for picks in choices)
            continue
        rest = needed - charge
        j, (s1, s2) = split
        if s1 * n_of[j] + _TOL < rest < s2 * n_of[j] - _TOL:
            found.extend((penalty, picks[:j] + (((s1, s2), rest),) + picks[j + 1:]) for picks in choices)
    return found


def _assign_monatomic(remaining: dict[str, float], needed: float, cap: float = float("inf"), excluded=frozenset()):
    """(work, charge-balanced monatomic readings of ``remaining``: (penalty, [(symbol, state, count)]))."""
    key = tuple(sorted((s, round(n, 9)) for s, n in remaining.items() if n > _TOL))
    return _assign_monatomic_cached(key, round(needed, 9), cap, excluded)


def _fits(composition, remaining: dict[str, float]) -> int:
    """How many times an ion's composition fits in ``remaining``."""
    times = None
    for symbol, k in composition:
        have = remaining.get(symbol, 0.0)
        t = int((have + _TOL) // k)
        times = t if times is None else min(times, t)
        if times == 0:
            return 0
    return times or 0


def _subtract(remaining: dict[str, float], composition, times: float) -> dict[str, float]:
    out = dict(remaining)
    for symbol, k in composition:
        out[symbol] = out.get(symbol, 0.0) - k * times
        if abs(out[symbol]) < _TOL:
            del out[symbol]
    return out


def _ion_penalty(ion: Ion) -> float:
    if ion.ion_id in _ION_PENALTIES:
        return _ION_PENALTIES[ion.ion_id]
    if ion.ion_id in _PEROXO_IONS:
        return _PENALTY_PEROXO
    if ion.family in _RARE_ANION_FAMILIES:
        return _PENALTY_RARE_ANION
    if ion.ion_id in _FORMULA_UNIT_OXOANIONS:
        return _PENALTY_FORMULA_UNIT_OXOANION
    if ion.ion_id in _ACTINYL_IONS:
        return _PENALTY_UNCOMMON_ION
    if ion.family == "oxocation":
        return _PENALTY_OXOCATION
    if ion.family in _UNCOMMON_FAMILIES or ion.ion_id in _UNCOMMON_IONS:
        return _PENALTY_UNCOMMON_ION
    if ion.family == "hydrogen-oxoanion" or ion.ion_id in _HYDROGEN_ANIONS:
        return _PENALTY_HYDROGEN_ANION
    return 0.0


@once
def _polyatomic_ions() -> tuple[tuple[Ion, frozenset], ...]:
    return tuple(
        (ion, frozenset(symbol for symbol, _ in ion.composition))
        for ion in ion_library()
        if len(ion.composition) > 1 or ion.composition[0][1] > 1
    )


@per_input(maxsize=4096)
def _monatomic_shares(symbols: tuple[str, ...]) -> tuple[tuple[str, tuple[float, float]], ...]:
    """(lowest, highest) charge per atom of each element as a monatomic ion of
    a plausible reading (an option of penalty under the ionic threshold)."""
    out = []
    for symbol in symbols:
        states = [state for kind, pair, penalty in _monatomic_options(symbol, 1.0) if penalty < _IONIC_THRESHOLD
                  for state in ((pair,) if kind == "single" else pair)]
        if states:
            out.append((symbol, (float(min(states)), float(max(states)))))
    return tuple(out)


@per_input(maxsize=4096)
def _candidates_for(present: frozenset) -> tuple[Ion, ...]:
    """Polyatomic library ions made only of the elements ``present``."""
    return tuple(ion for ion, elements in _polyatomic_ions() if elements <= present)


# the charge range of an element no candidate holds: empty, so the branch is cut (one
# constant, not two float() calls per element of every node visited)
_NO_SHARE = (float("inf"), float("-inf"))


def _search(remaining: dict[str, float], needed: float, excluded=frozenset(), budget=None):
    """Charge-balanced readings of ``remaining`` as library and monatomic ions.

    A depth-first branch and bound: library ions that fit are tried, common
    ones and larger ones first, each at its largest multiplicities and at
    none; a branch is cut once its penalty so far exceeds the best complete
    reading. The walk spends at most what is left of ``budget`` (a one-item
    list shared by the walks of one composition, ``_SEARCH_BUDGET`` units of
    solver work: nodes plus knapsack transitions) and takes what it spent
    from it; one that reaches it stops there.
    Returns ([(penalty, [(Ion, count), ...]), ...], whether it stopped early).
    """
    candidates = [ion for ion in _candidates_for(frozenset(remaining)) if _fits(ion.composition, remaining)]
    # common ions first, larger first: the best reading is found early and bounds the rest
    candidates.sort(key=lambda ion: (_ion_penalty(ion) >= _PENALTY_UNCOMMON_ION, -ion.atom_count, _ion_penalty(ion), ion.ion_id))
    coverable = [frozenset()] * (len(candidates) + 1)
    for i in range(len(candidates) - 1, -1, -1):
        coverable[i] = coverable[i + 1] | {symbol for symbol, _ in candidates[i].composition}
    # per-atom charge range of each element (a relaxation: an ion's charge
    # shared evenly by its atoms, or the element's monatomic states): a branch
    # whose leftover atoms cannot carry the charge still needed is cut, so a
    # formula with no reading is found out without visiting every combination
    shares = [dict(_monatomic_shares(tuple(remaining)))]
    for ion in reversed(candidates):
        per_atom = ion.charge / sum(k for _, k in ion.composition)
        share = dict(shares[-1])
        for symbol, _ in ion.composition:
            lo, hi = share.get(symbol, (float("inf"), float("-inf")))
            share[symbol] = (min(lo, per_atom), max(hi, per_atom))
        shares.append(share)
    shares.reverse()
    budget = [_SEARCH_BUDGET] if budget is None else budget
    limit = budget[0]
    nodes = 0
    best = [float("inf")]
    found: list = []
    cut = [limit <= 0]
    # work of the knapsacks counted whether or not their answer was cached:
    # where a walk stops depends on the formula alone
    spent = [0]

    def floor_at(index: int, left: dict[str, float], chosen, charge: float, cost: float, share_index: int):
        """The penalty floor of a node whose next candidate is ``index``, or None when
        it is cut (by the charge relaxation, the penalty floor or the work limit)."""
        nonlocal nodes
        if nodes + spent[0] >= limit:
            cut[0] = True
            return None
        # a node's cost grows with the elements its charge check visits
        nodes += 1 + len(left)
        share = shares[share_index]
        lo = hi = 0.0
        for symbol, n in left.items():
            s_lo, s_hi = share.get(symbol, _NO_SHARE)
            if s_lo > s_hi:
                return None
            lo += s_lo * n
            hi += s_hi * n
        if not lo - _TOL <= needed - charge <= hi + _TOL:
            return None
        # a leftover element no later candidate contains becomes a monatomic
        # species of its own; the others need at least one more species
        later = coverable[index]
        alone = len(left.keys() - later)
        floor = cost + _PENALTY_SPECIES * (len(chosen) + alone + (1 if len(left) > alone else 0))
        return None if floor > best[0] + _TOL else floor

    def leaf(left: dict[str, float], chosen, charge: float, cost: float, floor: float) -> None:
        cap = best[0] - floor + _TOL if best[0] < float("inf") else _IONIC_THRESHOLD
        work, assignments = _assign_monatomic(left, needed - charge, round(cap, 9), excluded)
        spent[0] += work
        for penalty, singles in assignments:
            terms = list(chosen) + [(monatomic_ion(s, st), n) for s, st, n in singles]
            total = penalty + cost + _PENALTY_SPECIES * len(terms)
            if total <= best[0] + _TOL:
                best[0] = min(best[0], total)
                found.append((total, terms))

    def walk(index: int, left: dict[str, float], chosen: list[tuple[Ion, float]], charge: float, cost: float):
        """Every reading that adds candidates ``index``.. to ``chosen``: each candidate
        that fits, at its largest multiplicities, then the monatomic rest.

        The bounds only tighten as the index grows (fewer candidates left to
        carry charge or hold an element), so a node cut at one candidate is
        cut at every later one and at the monatomic rest: the loop stops there,
        and candidates that do not fit are passed over without a node. The
        readings are those of a walk that visits every index in turn.
        """
        if cut[0]:
            return
        full = len(chosen) == _MAX_POLYATOMIC_SPECIES
        if full or not left:
            floor = floor_at(index, left, chosen, charge, cost, len(candidates) if full else index)
            if floor is not None:
                leaf(left, chosen, charge, cost, floor)
            return
        for j in range(index, len(candidates)):
            ion = candidates[j]
            most = _fits(ion.composition, left)
            if not most:
                continue
            if floor_at(j, left, chosen, charge, cost, j) is None or cut[0]:
                return
            # the largest multiplicities only: an ion used fewer times leaves its
            # limiting element to monatomic ions, which a real salt seldom holds
            # beside the same element in a polyatomic ion; this bounds the nodes
            # by a polynomial of the candidates, O((candidates x 3)^3)
            for times in range(most, max(most - _MULTIPLICITIES, 0), -1):
                walk(
                    j + 1,
                    _subtract(left, ion.composition, times),
                    chosen + [(ion, float(times))],
                    charge + ion.charge * times,
                    cost + _ion_penalty(ion),
                )
                if cut[0]:
                    return
        floor = floor_at(len(candidates), left, chosen, charge, cost, len(candidates))
        if floor is not None:
            leaf(left, chosen, charge, cost, floor)

    walk(0, dict(remaining), [], 0.0, 0.0)
    _WORK[0] += nodes
    budget[0] -= nodes + spent[0]
    return [(p, t) for p, t in found if p <= best[0] + _TOL], cut[0]


# monatomic ions an organic formula may hold as one side of its ion pair
_ORGANIC_PAIR_MONATOMIC = (("H", 1), ("F", -1), ("Cl", -1), ("Br", -1), ("I", -1))


@per_input(maxsize=65536)
def _ion_pair_readings(counts_key: tuple[tuple[str, float], ...]):
    """Readings of an organic formula as exactly one cation and one anion.

    The ions are library ions (or H(+) and the halides), at least one of the
    two inorganic, in whole multiples that use up every atom: carboxylic
    acids (H(+) with a carboxylate), ammonium and alkylammonium salts of
    inorganic anions. Ranked by the solver's penalties. For a cation of
    charge z+ and an anion of charge q-, a cations and b = a z / q anions
    hold a (c_e + z n_e / q) atoms of each element e (c_e, n_e its atoms in
    the two ions), so one element fixes a and the others check it. Cost:
    O(cations x anions x elements), whatever the counts.
    """
    counts = dict(counts_key)
    candidates = [ion for ion in _candidates_for(frozenset(counts)) if _fits(ion.composition, counts)]
    for symbol, charge in _ORGANIC_PAIR_MONATOMIC:
        if symbol in counts:
            candidates.append(monatomic_ion(symbol, charge))
    # every candidate is made of the formula's elements only: a pair fits only if together they hold all of them
    anions = [(ion, dict(ion.composition), frozenset(symbol for symbol, _ in ion.composition))
              for ion in candidates if ion.charge < 0]
    symbols = tuple(counts)
    present = frozenset(symbols)
    readings = []
    work = 0
    # hydronium and oxocations (NO(+), NO2(+)) are no cation of an organic
    # formula: nitro and nitroso compounds, nitrites and nitrates of alcohols
    # are molecules (common practice)
    for cation in (ion for ion in candidates if ion.charge > 0 and ion.family != "oxocation" and ion.ion_id not in _ION_PENALTIES):
        held = dict(cation.composition)
        held_symbols = frozenset(held)
        cation_penalty = None
        for anion, parts, part_symbols in anions:
            work += 1
            if (cation.organic and anion.organic) or held_symbols | part_symbols != present:
                continue
            ratio = cation.charge / -anion.charge
            a = None
            for symbol in symbols:
                per_cation = held.get(symbol, 0) + ratio * parts.get(symbol, 0)
                times = counts[symbol] / per_cation
                if a is None:
                    a = round(times)
                    if a < 1 or abs(times - a) > _TOL:
                        break
                elif abs(a * per_cation - counts[symbol]) > _TOL:
                    break
            else:
                b, r = divmod(a * cation.charge, -anion.charge)
                if r:
                    continue
                if cation_penalty is None:
                    cation_penalty = _pair_penalty(cation, counts)
                penalty = cation_penalty + _pair_penalty(anion, counts) + 2 * _PENALTY_SPECIES
                readings.append((penalty, [(cation, float(a)), (anion, float(b))]))
    _WORK[0] += work + 1
    return readings


def _pair_penalty(ion: Ion, counts: dict[str, float]) -> float:
    if not ion.monatomic:
        return _ion_penalty(ion)
    return next(p for kind, state, p in _monatomic_options(ion.element, counts[ion.element])
                if kind == "single" and state == ion.charge)


def _merge(terms: list[tuple[Ion, float]]) -> tuple[list[IonTerm], list[IonTerm]]:
    merged: dict[str, list] = {}
    for ion, n in terms:
        if ion.ion_id in merged:
            merged[ion.ion_id][1] += n
        else:
            merged[ion.ion_id] = [ion, n]
    cations = [IonTerm(ion, n) for ion, n in merged.values() if ion.charge > 0]
    anions = [IonTerm(ion, n) for ion, n in merged.values() if ion.charge < 0]
    # metals before ammonium-like cations, lower charge first: a stable order
    cations.sort(key=lambda t: (t.ion.organic, not t.ion.monatomic, t.ion.charge, t.ion.ion_id))
    anions.sort(key=lambda t: (t.ion.organic, not t.ion.monatomic, -t.ion.charge, t.ion.ion_id))
    return cations, anions


def _reading_text(cations, anions) -> str:
    return format_ion_terms(list(cations) + list(anions))


def decompose(comp: ParsedFormula) -> Decomposition:
    """Find the ions, oxidation states and substance class of a composition.

    Parameters
    ----------
    comp : ParsedFormula
        From :func:`scorer.formula.parse_formula`.

    Returns
    -------
    Decomposition
        ``notes`` carries warnings (ambiguity, guessed readings); an entry that
        could not be resolved has ``substance_class == "unknown"`` and a note
        saying why.

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> d = decompose(parse_formula("Fe3O4"))
    >>> format_ion_terms(d.cations), format_ion_terms(d.anions)
    ('Fe(2+)*1;Fe(3+)*2', 'O(2-)*4')
    >>> format_oxidation_states(d.oxidation_states)
    'Fe:+2.667;O:-2'
    """
    anhydrous = decompose_anhydrous(comp, hydrated=bool(comp.hydrate_water))
    if comp.hydrate_water:
        return dataclasses.replace(anhydrous, hydrate_water=comp.hydrate_water)
    return anhydrous


def decompose_anhydrous(comp: ParsedFormula, hydrated: bool = False) -> Decomposition:
    """:func:`decompose` of the formula without its lattice water: the hydrates
    of one salt share this result (and the solver's work).

    ``hydrated`` says the formula carries lattice water: where the anhydrous
    solid is molecular or a chain or layer solid by the structural-family table
    (AlCl3), its hydrate is a salt of the aqua ion ([Al(H2O)6]Cl3) and is read
    again without the table; every other hydrate shares the anhydrous result.
    """
    dry = _decompose(comp.counts, comp.charge, comp.ion_hints, comp.neutral_adducts, comp.structure_hint)
    if hydrated and family_decided(dry):
        return _decompose(comp.counts, comp.charge, comp.ion_hints, comp.neutral_adducts, comp.structure_hint, True)
    return dry


@per_input(maxsize=65536)
def _decompose(counts_key, charge, ion_hints, neutral_adducts, structure_hint, hydrated=False) -> Decomposition:
    # whether the ionic model applies (and the classes it implies) is decided
    # once per anhydrous composition, after the reading
    return settle(_read(counts_key, charge, ion_hints, neutral_adducts, structure_hint), hydrated=hydrated)


def decompose_within(comp: ParsedFormula, work_limit: int) -> tuple[Decomposition, int]:
    """:func:`decompose_anhydrous` with the walks of its read limited to
    ``work_limit`` units of solver work (at most ``_SEARCH_BUDGET``), and the
    work they spent: how a caller that reads many spellings (the typing-slip
    search, :mod:`scorer.slips`) bounds its own cost. The work is counted as
    the walks count it, also where their knapsacks' answers come from a cache,
    so it depends on the formula and the limit alone. A read that stays under
    the limit is the read :func:`decompose_anhydrous` gives; one that reaches it
    carries the work-limit note.
    """
    return _decompose_within(comp.counts, comp.charge, comp.ion_hints, comp.neutral_adducts, comp.structure_hint,
                             min(int(work_limit), _SEARCH_BUDGET))


@per_input(maxsize=16384)
def _decompose_within(counts_key, charge, ion_hints, neutral_adducts, structure_hint, limit: int):
    budget = [limit]
    dec = settle(_read(counts_key, charge, ion_hints, neutral_adducts, structure_hint, budget))
    return dec, limit - budget[0]


def _read(counts_key, charge, ion_hints, neutral_adducts, structure_hint, budget=None) -> Decomposition:
    comp = ParsedFormula(
        text="", counts=counts_key, charge=charge, ion_hints=ion_hints,
        neutral_adducts=neutral_adducts, structure_hint=structure_hint,
    )
    counts = comp.as_dict()
    # the parser's notes (ignored annotations...) belong to the spelling, not the
    # composition: the record adds them, so this cache stays spelling-free
    notes: list[str] = []
    water = comp.hydrate_water
    neutral = tuple(f"{name}*{format_count(n)}" for name, n in comp.neutral_adducts)
    for name, n in comp.neutral_adducts:
        counts = _subtract(counts, _ADDUCT_COMPOSITIONS[name], n)

    if comp.charge:
        return _lone_ion(comp, counts, notes)

    symbols = set(counts)
    if not comp.ion_hints:
        # metals with metals, B, Si or Ge: Zintl phases and intermetallics, not salts
        metal_rich = metal_rich_reading(counts, water, neutral)
        if metal_rich is not None:
            return metal_rich
    if len(symbols) == 1 or all(is_metal(s) for s in symbols):
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    if comp.structure_hint == "amide" and not any(is_metal(s) for s in symbols):
        # amide groups written out (urea, CO(NH2)2) mark a molecule, not NH4+ salts
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    if comp.structure_hint == "organometallic" and any(is_metal(s) for s in symbols):
        # carbonyl and cyclopentadienyl ligands written out: Fe(CO)5, Fe(C5H5)2
        return Decomposition(
            composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
            substance_class="covalent_molecular",
            oxidation_states=organometallic_states(counts),
            notes=() if organometallic_states(counts) else (
                "organometallic with ligands other than CO or C5H5: formal oxidation states not assigned",),
        )

    remaining = dict(counts)
    # every walk of this composition (the charge variants of written ions, the
    # redox re-read) draws on one work limit: the cost of a read is bounded
    budget = [_SEARCH_BUDGET] if budget is None else budget
    hinted = []
    for ion_id, n in comp.ion_hints:
        ion = get_ion(ion_id)
        # a bracketed complex names its composition, not its charge:
        # [Fe(CN)6] is hexacyanoferrate(II) in K4[Fe(CN)6], (III) in K3[Fe(CN)6]
        hinted.append([(variant, n) for variant in same_label_ions(ion)])
        remaining = _subtract(remaining, ion.composition, n)

    if not hinted and organic_candidate(remaining):
        # a molecule unless it is one ion pair of the library (acetic acid,
        # ethylammonium nitrate): no search over organic fragments
        readings = _ion_pair_readings(tuple(sorted(remaining.items())))
    else:
        readings = _readings(remaining, hinted, notes, budget=budget)
    if hinted and not remaining and not readings:
        notes.append("the ions written do not balance: " + ", ".join(
            f"{ion.ion_id}*{format_count(n)}" for ion, n in (h[0] for h in hinted)))
    if not readings:
        if comp.ion_hints and not notes:
            notes.append("the written ions leave a remainder that no ion assignment balances")
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    chosen = _best(readings)
    if chosen is None:
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    cations, anions, alternatives, _ = chosen

    reasons: tuple[str, ...] = ()
    conflicts = redox_conflicts(cations, anions)
    if conflicts:
        # a cation that oxidises its anion: look for the reading without it
        # (TlI3 is Tl(+) with I3(-)); if none balances, keep the reading and warn
        # a state at or above an oxidising one oxidises too (Cu(3+) beside I(-))
        excluded = frozenset(
            (t.ion.element, state)
            for t in cations if t.ion.monatomic and any(c.startswith(t.ion.ion_id + " ") for c in conflicts)
            for state, _ in _states(t.ion.element) if state >= t.ion.charge
        )
        compatible = _best(_readings(remaining, hinted, [], excluded, budget)) if excluded else None
        # only a reading of common states and ions will do (TlI3 = Tl(+) I3(-)),
        # not an odd state invented to balance (Fe(+) with I3(-) for FeI3)
        if (compatible is not None and compatible[3] <= chosen[3] + _REDOX_ALTERNATIVE_MAX_EXTRA
                and not redox_conflicts(compatible[0], compatible[1])):
            reasons = tuple(c + ": read without it" for c in conflicts)
            cations, anions, alternatives, _ = compatible
        else:
            notes.extend(c + "; no compatible reading balances the formula (check it)" for c in conflicts)
    if alternatives:
        notes.append("ambiguous: equally plausible readings " + " | ".join(
            (_reading_text(cations, anions),) + alternatives))

    states = oxidation_states_of(cations + anions)
    cls = classify(counts, cations, anions)
    if cls == "unknown":
        # H+ with organic fragments (glucose as "lactic acid"), NH3 as H+ + NH2-,
        # nitrobenzene as NO+ with phenoxide: not a salt, so read it as the molecule it is
        return nonionic_decomposition(comp.charge, counts, [n for n in notes if n == _SEARCH_CUT_NOTE], water, neutral)
    if cls == "covalent_molecular":
        return Decomposition(
            composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
            oxidation_states=states, substance_class=cls, notes=tuple(notes),
        )
    return Decomposition(
        composition=tuple(counts.items()),
        cations=tuple(cations),
        anions=tuple(anions),
        neutral_parts=neutral,
        hydrate_water=water,
        oxidation_states=states,
        substance_class=cls,
        alternatives=alternatives,
        notes=tuple(notes),
        ionic_model_reasons=reasons,
    )


def _readings(remaining, hinted, notes: list[str], excluded=frozenset(), budget=None):
    """Every best charge-balanced reading, the written ions included; the
    walks share ``budget`` (one composition's, see :func:`_search`)."""
    budget = [_SEARCH_BUDGET] if budget is None else budget
    readings = []
    for given in itertools.product(*hinted):
        given = list(given)
        given_charge = sum(ion.charge * n for ion, n in given)
        if remaining:
            found, stopped = _search(remaining, -given_charge, excluded, budget)
            if stopped and _SEARCH_CUT_NOTE not in notes:
                notes.append(_SEARCH_CUT_NOTE)
            readings.extend((penalty, given + terms) for penalty, terms in found)
        elif abs(given_charge) < _TOL:
            readings.append((0.0, given))
    return [r for r in readings if _has_both_signs(r[1])]


def _best(readings):
    """(cations, anions, alternatives, penalty) of the most plausible reading; None when
    no reading is plausible enough to be ionic."""
    if not readings:
        return None
    best_penalty = min(p for p, _ in readings)
    if best_penalty >= _IONIC_THRESHOLD:
        return None
    seen: dict[str, tuple] = {}
    for penalty, terms in sorted(readings, key=lambda r: (round(r[0], 9), _library_order(r[1]), _reading_text(*_merge(r[1])))):
        if penalty > best_penalty + _TOL:
            break
        cations, anions = _merge(terms)
        seen.setdefault(_reading_text(cations, anions), (cations, anions))
    if len(seen) > 1:
        # of equally plausible readings, one whose ions cannot coexist is no
        # alternative (FeTiO3: Fe(3+) beside Ti(3+)); redox checked only on ties
        compatible = {t: ca for t, ca in seen.items() if not redox_conflicts(*ca)}
        if compatible:
            seen = compatible
    (_, (cations, anions)), *others = seen.items()
    return cations, anions, tuple(t for t, _ in others), best_penalty


@once
def _library_rank() -> dict[str, int]:
    return {ion.ion_id: i for i, ion in enumerate(ion_library())}


def _library_order(terms) -> tuple[int, ...]:
    """Ties go to the ions listed first in the library (ferrocyanide before ferricyanide)."""
    rank = _library_rank()
    return tuple(sorted(rank.get(ion.ion_id, -1) for ion, _ in terms if not ion.monatomic))


def _has_both_signs(terms) -> bool:
    return any(ion.charge > 0 for ion, _ in terms) and any(ion.charge < 0 for ion, _ in terms)


def _lone_ion(comp: ParsedFormula, counts: dict[str, float], notes: list[str]) -> Decomposition:
    charge = comp.charge
    candidates = ions_by_composition(counts, charge)
    ion = candidates[0] if candidates else None
    if ion is None and len(counts) == 1:
        ((symbol, n),) = counts.items()
        if n == 1:
            ion = monatomic_ion(symbol, charge)
            if charge not in [s for s, _ in _states(symbol)]:
                notes.append(f"{symbol} is not listed with oxidation state {charge:+d}")
    if ion is None:
        notes.append(f"{comp.hill} with charge {charge:+d} is not an ion of the library")
        return Decomposition(
            composition=tuple(counts.items()),
            oxidation_states=formal_oxidation_states(counts, charge),
            substance_class="ion",
            notes=tuple(notes),
        )
    if len(candidates) > 1:
        notes.append("ambiguous: " + " | ".join(i.ion_id for i in candidates))
    term = (IonTerm(ion, 1.0),)
    return Decomposition(
        composition=tuple(counts.items()),
        cations=term if charge > 0 else (),
        anions=term if charge < 0 else (),
        hydrate_water=comp.hydrate_water,
        oxidation_states=ion.oxidation_states,
        substance_class="ion",
        notes=tuple(notes),
    )
