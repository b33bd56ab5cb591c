"""The plain form of the walk over polyatomic ions, for tests/test_ion_walk_exact.py.

This is scorer/ion_search.py's ``_search`` as it was before issue 14's exact cuts
(the ceiling at the ionic threshold, the cheapest monatomic option of each element
left alone in the cut's floor, the relaxation with each candidate's capacity): the
walk as it is must give the same readings wherever this one did not reach its work
limit. It takes (and ignores) the ceiling the callers now pass.
"""
from __future__ import annotations

from ionicity.scorer.charge_balance import _TOL, _WORK, _assign_monatomic
from ionicity.scorer.ion_library import monatomic_ion
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD, _PENALTY_SPECIES, _PENALTY_UNCOMMON_ION, _ion_penalty
from ionicity.scorer.ion_search import _NO_SHARE, _candidates_for, _fits, _monatomic_shares, _MULTIPLICITIES, _MAX_POLYATOMIC_SPECIES, _subtract
from ionicity.scorer.model import Ion


def plain_search(remaining: dict[str, float], needed: float, excluded: frozenset, budget: list[int], *ignored):
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
