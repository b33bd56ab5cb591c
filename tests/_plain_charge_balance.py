"""The plain form of the monatomic charge balance, for tests/test_charge_balance.py.

This is scorer/charge_balance.py's knapsack as it was before its speed-ups
(the charge a float rounded to 1e-9 at every transition, the choices written
out at every transition, each table sorted whole to trim it): the fast form
must give the same readings, in the same order, and count the same work.
Work is counted on the scorer's own counter so the two can be compared.
"""
from __future__ import annotations

from ionicity.scorer.charge_balance import _MAX_TABLE, _MAX_TIES, _TOL, _WORK
from ionicity.scorer.ion_penalties import (
    _PENALTY_FRACTIONAL_SPLIT,
    _PENALTY_MIXED_VALENCE,
    _PENALTY_SPECIES,
    _monatomic_options,
)


def plain_assign_monatomic(remaining: tuple[tuple[str, float], ...], needed: float, cap: float, excluded=frozenset()):
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
        for penalty, picks in _plain_knapsack(singles, (), n_of, needed, cap)
    ]
    best = min((p + _PENALTY_SPECIES * len(symbols) for p, _ in out), default=float("inf"))
    # single states everywhere first: a reading with one element split has one
    # species more and pays the split's penalty, so it competes only where no
    # single-state reading is that cheap
    mixed_cap = min(cap, best - _PENALTY_SPECIES * (len(symbols) + 1))
    splits = [tuple([(state, penalty) for kind, state, penalty in options if kind == "mixed" and penalty <= mixed_cap + _TOL])
              for options in per_symbol]
    if mixed_cap + _TOL >= _PENALTY_MIXED_VALENCE and any(splits):
        for penalty, picks in _plain_knapsack(singles, splits, n_of, needed, mixed_cap):
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


def _plain_knapsack(singles, splits, n_of, needed: float, cap: float):
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
