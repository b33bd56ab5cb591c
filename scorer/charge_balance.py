"""Charge balance of the monatomic rest: a bounded knapsack over the elements'
oxidation states, ranked by the solver's penalties (:mod:`scorer.ion_penalties`).

Used by the walk over polyatomic ions (:mod:`scorer.ion_search`) at each of its
leaves; the solver's work counter (:func:`solver_work`) lives here, where most
of the work is done. See DEVELOPERS.md, "The charge-balance solver and its cost".
"""
from __future__ import annotations

import math
from decimal import Decimal

from ionicity.scorer.caching import per_input
from ionicity.scorer.ion_penalties import (
    _PENALTY_FRACTIONAL_SPLIT,
    _PENALTY_MIXED_VALENCE,
    _PENALTY_SPECIES,
    _monatomic_options,
)

__all__ = ["solver_work", "work_bound"]

# equally plausible choices kept per charge of the knapsack table
_MAX_TIES = 16
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
    if not any(n > _TOL for _, n in remaining):
        return ((0.0, ()),) if abs(needed) < _TOL else ()
    # the reach test visits each element once: counted, whether or not a table follows
    _WORK[0] += len(remaining)
    if not _within_reach(remaining, needed, cap):
        return ()
    prepared = _leftover(remaining, excluded)
    if prepared is None:
        return ()
    symbols, elements, n_of, moves, spans, scale, stoichiometric, reach = prepared
    out = [
        (penalty, tuple((symbols[i], state, n_of[i]) for i, state in enumerate(picks)))
        for penalty, picks in _knapsack(moves, (), n_of, needed, cap, reach, scale)
    ]
    best = min((p + _PENALTY_SPECIES * len(symbols) for p, _ in out), default=float("inf"))
    # single states everywhere first: a reading with one element split has one
    # species more and pays the split's penalty, so it competes only where no
    # single-state reading is that cheap
    mixed_cap = min(cap, best - _PENALTY_SPECIES * (len(symbols) + 1))
    splits = [tuple([(pair, penalty) for pair, penalty in element[1] if penalty <= mixed_cap + _TOL]) for element in elements]
    if mixed_cap + _TOL >= _PENALTY_MIXED_VALENCE and any(splits):
        split_charges = [[state * n for pair, _ in options for state in pair] for options, n in zip(splits, n_of)]
        for penalty, picks in _knapsack(moves, splits, n_of, needed, mixed_cap, _reach(spans, split_charges), scale):
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


def _within_reach(remaining: tuple[tuple[str, float], ...], needed: float, cap: float) -> bool:
    """Whether some assignment of penalty at most ``cap`` can carry ``needed``: a
    test that needs no table, nor the leftover's preparation. Each element pays at
    least its cheapest option, so an option dearer than ``cap`` less the others'
    cheapest is out of reach; the charges of the options left (a split's two ends
    bound what it carries) must span ``needed``. Every assignment
    :func:`_assign_monatomic_solved` returns passes it (one option per element,
    within the cap; states ruled out by redox only remove options), so where it
    fails the answer is empty and no table is built.
    """
    reaches = [(_option_reach(symbol), n) for symbol, n in remaining if n > _TOL]
    allowance = cap + 2 * _TOL - sum([reach[0][0] for reach, _ in reaches if reach])
    if allowance < 0:
        return False
    lo = hi = 0.0
    for reach, n in reaches:
        if not reach:
            return False
        room = allowance + reach[0][0]
        least = most = None
        for penalty, low, high in reach:
            if penalty > room:
                break
            least, most = low, high
        lo += least * n
        hi += most * n
    # twice the knapsack's tolerance: the counts may reach it unrounded (the walk's leaves)
    return lo - 2 * _TOL <= needed <= hi + 2 * _TOL


@per_input(maxsize=4096)
def _option_reach(symbol: str) -> tuple[tuple[float, int, int], ...]:
    """(penalty, lowest, highest state) over ``symbol``'s monatomic options (single
    states and both ends of each split) up to each penalty, cheapest first."""
    options = sorted((penalty, state) for kind, payload, penalty in _monatomic_options(symbol, 1.0)
                     for state in ((payload,) if kind == "single" else payload))
    out = []
    for penalty, state in options:
        low, high = (state, state) if not out else (min(out[-1][1], state), max(out[-1][2], state))
        out.append((penalty, low, high))
    return tuple(out)


@per_input(maxsize=65536)
def _leftover(remaining: tuple[tuple[str, float], ...], excluded=frozenset()):
    """What the knapsack needs of a leftover composition, whatever the charge
    needed and the cap (the walk asks for one leftover at several): (symbols,
    each one's :func:`_element_choices`, counts, moves at the scale of all
    counts, charge spans, scale, whether every count is whole), or None when
    an element has no single state left."""
    symbols = tuple([s for s, n in remaining if n > _TOL])
    counts = dict(remaining)
    elements = tuple([_element_choices(s, counts[s], excluded) for s in symbols])
    if any(not element[0] for element in elements):
        return None
    decimals = max(element[3] for element in elements)
    # each element's moves at the scale of all counts (most formulas: whole counts, scale 1)
    moves = tuple([element[5] if element[3] == decimals else
                   tuple([(state * element[4] * 10 ** (decimals - element[3]), state, penalty) for state, penalty in element[0]])
                   for element in elements])
    # a fractional split is normal in a non-stoichiometric phase (La0.7Sr0.3MnO3)
    # and a last resort in a stoichiometric one
    stoichiometric = all([abs(n - round(n)) < _TOL for _, n in remaining])
    spans = tuple([element[2] for element in elements])
    return (symbols, elements, tuple([counts[s] for s in symbols]), moves, spans, 10 ** decimals, stoichiometric,
            _reach(spans))


def _reach(spans, extra=None) -> tuple[list[float], list[float]]:
    """(lows, highs): the least and greatest charge elements i.. can still carry,
    from each one's single-state ``spans`` and, with ``extra``, the charges of
    its splits over two states."""
    lows = [0.0] * (len(spans) + 1)
    highs = [0.0] * (len(spans) + 1)
    for i in range(len(spans) - 1, -1, -1):
        least, greatest = spans[i]
        if extra and extra[i]:
            least, greatest = min(least, *extra[i]), max(greatest, *extra[i])
        lows[i] = lows[i + 1] + least
        highs[i] = highs[i + 1] + greatest
    return lows, highs


@per_input(maxsize=65536)
def _element_choices(symbol: str, count: float, excluded=frozenset()):
    """What the knapsack needs of one leftover element, computed once per
    (element, count): (single states ((state, penalty), ...), splits over two
    states (((s1, s2), penalty), ...), (least, greatest) charge of a single
    state, decimals, count x 10**decimals, the knapsack's moves at that
    scale). Counts reach the solver rounded to
    1e-9 (:func:`_assign_monatomic`), so their shortest decimal form has at
    most nine decimals and the whole count is exact."""
    options = _monatomic_options(symbol, count)
    if excluded:
        # states ruled out by redox (Tl(3+) beside I(-)): see scorer.applicability.redox_conflicts
        options = tuple(o for o in options
                        if not ({(symbol, o[1])} if o[0] == "single" else {(symbol, o[1][0]), (symbol, o[1][1])}) & excluded)
    singles = tuple([(state, penalty) for kind, state, penalty in options if kind == "single"])
    splits = tuple([(pair, penalty) for kind, pair, penalty in options if kind == "mixed"])
    charges = [state * count for state, _ in singles]
    span = (min(charges), max(charges)) if charges else (0.0, 0.0)
    if float(count).is_integer():
        decimals, whole = 0, int(count)
    else:
        exact = Decimal(repr(float(count)))
        decimals = -exact.as_tuple().exponent
        whole = int(exact.scaleb(decimals))
    # the knapsack's moves at this scale: (charge x 10**decimals, state, penalty)
    moves = tuple([(state * whole, state, penalty) for state, penalty in singles])
    return singles, splits, span, decimals, whole, moves


def _least_scaled(x: float, scale: int) -> int:
    """The least whole c with c / scale >= x, as Python compares them."""
    if scale == 1:
        return math.ceil(x)
    c = math.ceil(x * scale)
    while (c - 1) / scale >= x:
        c -= 1
    while c / scale < x:
        c += 1
    return c


def _most_scaled(x: float, scale: int) -> int:
    """The greatest whole c with c / scale <= x, as Python compares them."""
    if scale == 1:
        return math.floor(x)
    c = math.floor(x * scale)
    while (c + 1) / scale <= x:
        c += 1
    while c / scale > x:
        c -= 1
    return c


def _cheapest_states(following: dict, needed: float, scale: int) -> dict:
    """The ``_MAX_TABLE`` cheapest states of a table, then those nearest
    ``needed``, in that order (the order of a sort of the whole table by that
    key: it decides which ties later tables keep). Only the states at or under
    the 64th lowest penalty are ranked by the whole key."""
    penalties = [held[0] for held in following.values()]
    # a table holds few distinct penalties (sums of a few option penalties): each rounded once
    rounded = {penalty: round(penalty, 9) for penalty in set(penalties)}
    ranked = [rounded[penalty] for penalty in penalties]
    cut = sorted(ranked)[_MAX_TABLE - 1]
    within = [(r, kv) for r, kv in zip(ranked, following.items()) if r <= cut]
    within.sort(key=lambda rkv: (rkv[0], abs(needed - rkv[1][0][0] / scale), rkv[1][0]))
    return dict([kv for _, kv in within[:_MAX_TABLE]])


def _choices(tables: list[dict], level: int, state_key, written: dict) -> tuple:
    """The choices reaching ``state_key`` of table ``level``: tuples of one
    option per element so far, at most ``_MAX_TIES``, in the order they were
    found -- the previous state's choices in its order, each extended by the
    option taken, as long as fewer than ``_MAX_TIES`` are held. ``written``
    keeps those already written out (a state reached by several others)."""
    if level == 0:
        return ((),)
    done = written.get((level, state_key))
    if done is None:
        held: list = []
        for previous, option in tables[level][state_key][2]:
            earlier = _choices(tables, level - 1, previous, written)
            held.extend([k + (option,) for k in earlier[: _MAX_TIES - len(held)]])
        done = written[(level, state_key)] = tuple(held)
    return done


def _knapsack(moves_of, splits, n_of, needed: float, cap: float, reach, scale: int):
    """Charge balance as a bounded knapsack over the elements' oxidation states.

    Dynamic programming, one element at a time. A table maps each state
    reached so far -- the charge carried, and with ``splits`` which element
    is split over two states, whose charge is settled at the end -- to its
    lowest penalty and the choices reaching it at that penalty (ties kept up
    to ``_MAX_TIES``). A state from which ``needed`` can no longer be reached,
    or whose penalty exceeds ``cap``, is dropped; a table keeps at most
    ``_MAX_TABLE`` states, the cheapest (then those nearest the charge still
    needed). Work: O(elements x _MAX_TABLE x options), whatever the counts.

    ``moves_of`` holds each element's single states as (charge x ``scale``,
    state, penalty) and ``reach`` the least and greatest charge elements i..
    can carry (:func:`_reach`): the charge is kept as a whole number, in
    units of 1 / ``scale`` (:func:`_element_choices`), exact, with no rounding per transition, and
    ``charge / scale`` is the float the charge rounded to 1e-9 would be.

    Without ``splits``: (penalty, states) of the cheapest single-state
    assignments summing to ``needed``. With them: the assignments with
    exactly one element split, its choice given as ((s1, s2), charge it must
    carry), the charge strictly between s1 x count and s2 x count.
    """
    lows, highs = reach
    # key: (charge x scale of the single-state elements, (split element, its two states) or ()).
    # value: [penalty, how many choices reach it (at most _MAX_TIES), [(state of the
    # previous table, option taken), ...]]: the choices are written out only for the
    # states of the last table (:func:`_choices`), not at every transition
    table: dict[tuple[int, tuple], list] = {(0, ()): [0.0, 1, []]}
    tables = [table]
    work = 0
    over = cap + _TOL
    for i, moves in enumerate(moves_of):
        if scale == 1:
            lo, hi = math.ceil(needed - highs[i + 1] - _TOL), math.floor(needed - lows[i + 1] + _TOL)
        else:
            lo = _least_scaled(needed - highs[i + 1] - _TOL, scale)
            hi = _most_scaled(needed - lows[i + 1] + _TOL, scale)
        n_moves = len(moves)
        split_options = splits[i] if splits else ()
        following: dict[tuple[int, tuple], list] = {}
        # the cheapest choices reaching each state, ties kept (written out rather
        # than a helper: this loop is most of the solver's time)
        for state_key, (penalty, count, _) in table.items():
            charge, split = state_key
            # every option tried counts, whether or not it is kept
            work += n_moves
            for move, state, option_penalty in moves:
                p = penalty + option_penalty
                if p > over:
                    continue
                c = charge + move
                if not split and not lo <= c <= hi:
                    continue
                key = (c, split)
                held = following.get(key)
                if held is None or p < held[0] - _TOL:
                    following[key] = [p, count, [(state_key, state)]]
                elif p <= held[0] + _TOL and held[1] < _MAX_TIES:
                    held[1] = min(held[1] + count, _MAX_TIES)
                    held[2].append((state_key, state))
            if split_options and not split:
                work += len(split_options)
                for pair, option_penalty in split_options:
                    p = penalty + option_penalty
                    if p > over:
                        continue
                    key = (charge, (i, pair))
                    held = following.get(key)
                    if held is None or p < held[0] - _TOL:
                        following[key] = [p, count, [(state_key, pair)]]
                    elif p <= held[0] + _TOL and held[1] < _MAX_TIES:
                        held[1] = min(held[1] + count, _MAX_TIES)
                        held[2].append((state_key, pair))
        if len(following) > _MAX_TABLE:
            following = _cheapest_states(following, needed, scale)
        table = following
        tables.append(table)
    _WORK[0] += work + 1
    found = []
    written: dict = {}
    last = len(tables) - 1
    for state_key, (penalty, _, _) in table.items():
        scaled_charge, split = state_key
        charge = scaled_charge / scale
        if not split:
            if abs(charge - needed) < _TOL:
                found.extend((penalty, picks) for picks in _choices(tables, last, state_key, written))
            continue
        rest = needed - charge
        j, (s1, s2) = split
        if s1 * n_of[j] + _TOL < rest < s2 * n_of[j] - _TOL:
            found.extend((penalty, picks[:j] + (((s1, s2), rest),) + picks[j + 1:])
                         for picks in _choices(tables, last, state_key, written))
    return found


def _assign_monatomic(remaining: dict[str, float], needed: float, cap: float = float("inf"), excluded=frozenset()):
    """(work, charge-balanced monatomic readings of ``remaining``: (penalty, [(symbol, state, count)]))."""
    key = tuple(sorted((s, round(n, 9)) for s, n in remaining.items() if n > _TOL))
    return _assign_monatomic_cached(key, round(needed, 9), cap, excluded)
