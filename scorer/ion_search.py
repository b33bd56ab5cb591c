"""The walk over polyatomic ions: which library ions, how many of each, with
the monatomic rest balanced by :mod:`scorer.charge_balance`; and the one-pair
rule for organic formulas. Called by :mod:`scorer.ions`, which reads a
composition and shares one work limit among its walks.
"""
from __future__ import annotations

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.charge_balance import _TOL, _WORK, _assign_monatomic, _within_reach
from ionicity.scorer.elements import get_element
from ionicity.scorer.ion_library import ion_library, monatomic_ion
from ionicity.scorer.ion_penalties import (
    _IONIC_THRESHOLD,
    _ION_PENALTIES,
    _PENALTY_SPECIES,
    _PENALTY_UNCOMMON_ION,
    _ion_penalty,
    _monatomic_options,
    _pair_penalty,
)
from ionicity.scorer.model import Ion

_MAX_POLYATOMIC_SPECIES = 3
# multiplicities of a polyatomic ion tried: the most that fit and the next ones down
_MULTIPLICITIES = 3
# leftover elements up to which a branch's floor is a set cover (cover_floor in _search): 2**6 subsets
_COVER_ELEMENTS = 6
# steps of the set cover's list comprehensions (a candidate read, a set tried on a subset) counted as one
# unit of solver work: a unit is a node's charge check of one element, about 1 us of CPU; a step about a
# sixth of that (measured on C12H24CaN2O6S2 and C6H12FeN3O12, whose walks compute some 800 covers)
_STEPS_PER_UNIT = 6

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


# carbon bonded to hydrogen is never a carbide (common practice; the organic ion pairs hold the same rule,
# :data:`_NO_ORGANIC_PAIR_ANIONS`): in a composition with both, no walk reads carbon as C(4-) or as the
# acetylide and allylenide ions. Those readings were never kept (scorer.organic_anions.suspect_organic_reading
# sets them aside), but C(4-) at no penalty let every branch of a metal's organic salt balance its charge, so
# the walks of C12H25NaO4S or C15H30NNaO4 visited every combination of the library's organic ions
_CARBIDE_STATE = ("C", -4)
_CARBIDE_EXCLUSIONS = frozenset({_CARBIDE_STATE, "C2(2-)", "C3(4-)"})

# superoxide and ozonide: ions of the salts of the heavy alkali and alkaline-earth metals alone (KO2, CsO3,
# Ba(O2)2; tetramethylammonium superoxide among the organic cations), oxidants no reducing cation or other anion
# keeps beside it (Greenwood & Earnshaw, 2nd ed., 1997, ch. 14.2.2; from memory): KCr2O7 was read as chromium(II)
# superoxide
_SUPEROXO_IONS = frozenset({"O2(-)", "O3(-)"})
_SUPEROXO_PARTNERS = frozenset({"O", "C", "H", "N"})


@per_input(maxsize=4096)
def _candidates_for(present: frozenset) -> tuple[Ion, ...]:
    """Polyatomic library ions made only of the elements ``present`` (superoxide and ozonide only beside the
    s-block metals, :data:`_SUPEROXO_IONS`)."""
    superoxo = all(s in _SUPEROXO_PARTNERS or get_element(s).block == "s" for s in present)
    return tuple(ion for ion, elements in _polyatomic_ions()
                 if elements <= present and (superoxo or ion.ion_id not in _SUPEROXO_IONS))


@per_input(maxsize=4096)
def _least_monatomic_penalty(symbol: str, no_anion: bool = False) -> float:
    """The least penalty of any monatomic option of ``symbol`` (a single state or a
    split over two, whose penalty is at least its lower state's single option's): a
    floor for what the knapsack charges an element the walk leaves to it; with
    ``no_anion``, of its cation options only (carbon beside hydrogen)."""
    return min([penalty for kind, pair, penalty in _monatomic_options(symbol, 1.0)
                if not no_anion or min((pair,) if kind == "single" else pair) > 0], default=0.0)


@per_input(maxsize=4096)
def _monatomic_reach(symbol: str) -> tuple[tuple[float, float, float], ...]:
    """(penalty, lowest, highest charge per atom) of ``symbol``'s plausible monatomic
    options (those of :func:`_monatomic_shares`), cheapest first, the range growing
    over every option up to that penalty."""
    options = sorted((penalty, state) for kind, pair, penalty in _monatomic_options(symbol, 1.0)
                     if penalty < _IONIC_THRESHOLD for state in ((pair,) if kind == "single" else pair))
    out = []
    lo, hi = float("inf"), float("-inf")
    for penalty, state in options:
        lo, hi = min(lo, state), max(hi, state)
        out.append((penalty, float(lo), float(hi)))
    return tuple(out)


def _within_room(symbol: str, room: float):
    """(lowest, highest) charge per atom of ``symbol``'s plausible monatomic options
    of penalty at most ``room``, or None when none is that cheap."""
    reach = None
    for penalty, lo, hi in _monatomic_reach(symbol):
        if penalty > room:
            break
        reach = (lo, hi)
    return reach


# the charge range of an element no candidate holds: empty, so the branch is cut (one
# constant, not two float() calls per element of every node visited)
_NO_SHARE = (float("inf"), float("-inf"))


def _search(remaining: dict[str, float], needed: float, excluded: frozenset, budget: list[int],
            ceiling: float = float("inf"), ceiling_after_first: bool = False, carbide: bool = False):
    """Charge-balanced readings of ``remaining`` as library and monatomic ions.

    A depth-first branch and bound: library ions that fit are tried, common
    ones and larger ones first, each at its largest multiplicities and at
    none; a branch is cut once its penalty so far exceeds the best complete
    reading. The walk spends at most what is left of ``budget`` (a one-item
    list shared by the walks of one composition, ``_SEARCH_BUDGET`` units of
    solver work: nodes plus knapsack transitions) and takes what it spent
    from it; one that reaches it stops there.

    ``ceiling`` is the highest penalty a reading may have and still be of
    use to the caller (the ionic threshold for a composition's reading: a
    reading at or above it is no ionic reading). A branch whose penalty floor
    is above it is cut as a branch above the best reading is, and a leaf's
    knapsack is capped by it: the walk reaches every reading at or under the
    ceiling that it reached without it, and no reading above it that it misses
    could have been used. With ``ceiling_after_first`` the ceiling holds only
    once a first reading is found, for a caller that asks whether any reading
    balances at all (written ions whose remainder no assignment balances).
    Carbon beside hydrogen is read in no carbide (:data:`_CARBIDE_EXCLUSIONS`)
    unless ``carbide`` says so (the caller asking whether the atoms balance
    only as one, :func:`carbide_balances`).
    Returns ([(penalty, [(Ion, count), ...]), ...], whether it stopped early).
    """
    if budget[0] <= 0:
        return [], True  # the composition's work limit is spent: no walk, nothing to prepare
    # ``excluded`` holds (element, state) pairs of monatomic states and the ids of library ions to leave out
    if not carbide and "C" in remaining and "H" in remaining:
        # carbon beside hydrogen is no carbide: its carbon sits in polyatomic ions
        excluded = excluded | _CARBIDE_EXCLUSIONS
    candidates = [ion for ion in _candidates_for(frozenset(remaining))
                  if _fits(ion.composition, remaining) and ion.ion_id not in excluded]
    # common ions first, larger first: the best reading is found early and bounds the rest
    candidates.sort(key=lambda ion: (_ion_penalty(ion) >= _PENALTY_UNCOMMON_ION, -ion.atom_count, _ion_penalty(ion), ion.ion_id))
    coverable = [frozenset()] * (len(candidates) + 1)
    for i in range(len(candidates) - 1, -1, -1):
        coverable[i] = coverable[i + 1] | {symbol for symbol, _ in candidates[i].composition}
    # the same over the inorganic candidates only: once a reading holds an organic ion, the walk passes over
    # every later organic candidate (one organic species per reading), so only these can still take an atom
    coverable_inorganic = [frozenset()] * (len(candidates) + 1)
    for i in range(len(candidates) - 1, -1, -1):
        coverable_inorganic[i] = coverable_inorganic[i + 1] | (
            frozenset() if candidates[i].organic else {symbol for symbol, _ in candidates[i].composition})
    any_organic = any(ion.organic for ion in candidates)
    # per-atom charge range of each element (a relaxation: an ion's charge
    # shared evenly by its atoms, or the element's monatomic states): a branch
    # whose leftover atoms cannot carry the charge still needed is cut, so a
    # formula with no reading is found out without visiting every combination
    per_atoms = [ion.charge / sum(k for _, k in ion.composition) for ion in candidates]
    shares = [dict(_monatomic_shares(tuple(remaining)))]
    if _CARBIDE_STATE in excluded:
        shares[0].pop("C", None)
    shares_inorganic = [shares[0]] if any_organic else shares
    for ion, per_atom in zip(reversed(candidates), reversed(per_atoms)):
        for table_ in ((shares, shares_inorganic) if any_organic and not ion.organic else (shares,)):
            share = dict(table_[-1])
            for symbol, _ in ion.composition:
                lo, hi = share.get(symbol, (float("inf"), float("-inf")))
                share[symbol] = (min(lo, per_atom), max(hi, per_atom))
            table_.append(share)
        if any_organic and ion.organic:
            shares_inorganic.append(shares_inorganic[-1])
    shares.reverse()
    if any_organic:
        shares_inorganic.reverse()
    # the same relaxation with each candidate's capacity: the candidates holding each
    # element, by per-atom charge (``carried`` below)
    mono = dict(shares[-1])
    holders: dict[str, list] = {}
    for i, (ion, per_atom) in enumerate(zip(candidates, per_atoms)):
        for symbol, k in ion.composition:
            holders.setdefault(symbol, []).append((per_atom, i, k))
    # sorted when first asked (many walks end before): highest per-atom charge first
    ordered_holders: dict[str, list] = {}
    least_of = {symbol: _least_monatomic_penalty(symbol, symbol == "C" and _CARBIDE_STATE in excluded)
                for symbol in remaining}
    # the elements as bits: each candidate's, for the set cover of a node's leftover (cover_floor)
    element_bit = {symbol: 1 << k for k, symbol in enumerate(sorted(remaining))}
    cover_sets = [(sum(element_bit[symbol] for symbol, _ in ion.composition), _PENALTY_SPECIES + _ion_penalty(ion),
                   ion.organic) for ion in candidates]
    covers: dict = {}

    def cover_floor(index: int, organic_chosen: bool, left) -> float:
        """The least the species still to come can cost: a weighted set cover of the
        elements ``left`` by the candidates from ``index`` (no organic one once an
        organic ion is chosen), each at ``_PENALTY_SPECIES`` plus its own penalty, and
        by monatomic species at ``_PENALTY_SPECIES`` plus the element's cheapest
        option. Every reading below the node holds such a cover (an element sits in a
        later candidate or is monatomic), so the floor is a lower bound; unlike a
        count of species it tells a branch that needs two zero-penalty ions and a
        monatomic one from one that needs two (ammonium ferric oxalate read through
        gluconate). Exact over up to ``_COVER_ELEMENTS`` elements by dynamic
        programming over subsets, with the sets another covers as cheaply left out;
        0 beyond that. Memoised per walk."""
        nonlocal nodes
        if len(left) > _COVER_ELEMENTS:
            return 0.0
        elements = 0
        for symbol in left:
            elements |= element_bit[symbol]
        key = (index, organic_chosen, elements)
        found_floor = covers.get(key)
        if found_floor is not None:
            return found_floor
        cheapest = {element_bit[symbol]: _PENALTY_SPECIES + least_of[symbol] for symbol in left}
        for mask, c in [(mask, c) for mask, c, organic in cover_sets[index:]
                        if not mask & ~elements and not (organic_chosen and organic)]:
            if c < cheapest.get(mask, float("inf")):
                cheapest[mask] = c
        # a set another holds at no more cost adds nothing to a cover
        sets: list[tuple[int, float]] = []
        for mask, c in sorted(cheapest.items(), key=lambda mc: (mc[1], -bin(mc[0]).count("1"))):
            if not any(mask & kept == mask and c_kept <= c for kept, c_kept in sets):
                sets.append((mask, c))
        # every subset of the elements, in increasing order: a subset less a set that meets it is settled before it
        dp = {0: 0.0}
        sub = 0
        while True:
            sub = (sub - elements) & elements
            if not sub:
                break
            low = sub & -sub
            dp[sub] = min([c + dp[sub & ~mask] for mask, c in sets if mask & low])
        # counted as work: the candidates read and the subsets settled (:data:`_STEPS_PER_UNIT`)
        nodes += (len(cover_sets) - index + len(cheapest) * len(sets) + len(dp) * len(sets)) // _STEPS_PER_UNIT
        covers[key] = dp[elements]
        return dp[elements]

    limit = budget[0]
    nodes = 0
    best = [float("inf")]
    # what a branch's floor is held to: the best reading so far or the ceiling, the lower
    bound = [float("inf") if ceiling_after_first else ceiling]
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
        organic_chosen = any_organic and any(c.organic for c, _ in chosen)
        share = (shares_inorganic if organic_chosen else shares)[share_index]
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
        later = (coverable_inorganic if organic_chosen else coverable)[index]
        alone = left.keys() - later
        floor = cost + _PENALTY_SPECIES * (len(chosen) + len(alone) + (1 if len(left) > len(alone) else 0))
        # and each element left alone pays at least its cheapest monatomic option: a
        # floor for the cut only (the knapsack's cap below counts those penalties itself)
        least = sum([least_of[symbol] for symbol in alone]) if alone else 0.0
        if floor + least > bound[0] + _TOL:
            return None
        if len(left) > len(alone):
            # the set cover, where it can cut: where every leftover element alone as a
            # monatomic species would still be under the bound, no cover is above it
            base = cost + _PENALTY_SPECIES * len(chosen)
            if base + sum([_PENALTY_SPECIES + least_of[symbol] for symbol in left]) > bound[0] + _TOL and \
                    base + cover_floor(index, organic_chosen, left) > bound[0] + _TOL:
                return None
        return floor

    def leaf(left: dict[str, float], chosen, charge: float, cost: float, floor: float) -> None:
        cap = best[0] - floor + _TOL if best[0] < float("inf") else _IONIC_THRESHOLD
        if bound[0] < best[0]:
            # the ceiling: a reading's penalty is at least the knapsack's plus the floor
            cap = min(cap, bound[0] - floor + _TOL)
        # the knapsack's reach test first, without preparing the leftover (counted as
        # the knapsack counts it: once per element)
        spent[0] += len(left)
        _WORK[0] += len(left)
        if left and not _within_reach(left.items(), round(needed - charge, 9), round(cap, 9)):
            return
        work, assignments = _assign_monatomic(left, needed - charge, round(cap, 9), excluded)
        spent[0] += work
        for penalty, singles in assignments:
            terms = list(chosen) + [(monatomic_ion(s, st), n) for s, st, n in singles]
            total = penalty + cost + _PENALTY_SPECIES * len(terms)
            if total <= best[0] + _TOL:
                best[0] = min(best[0], total)
                bound[0] = min(best[0], ceiling)
                found.append((total, terms))

    def carried(index: int, left: dict[str, float], wanted: float, chosen, cost: float) -> bool:
        """Whether the atoms ``left`` can carry the charge ``wanted`` with candidates
        ``index``.. each used at most as often as it fits and the rest monatomic.

        The per-atom relaxation of :func:`floor_at` with capacities: an atom of an
        element in a copy of candidate i carries i's per-atom charge, and at most
        fits x (its atoms of the element) atoms of it sit in candidate i; the rest
        carry the element's monatomic range (or, without a plausible monatomic
        state, must all sit in candidates). The highest charge fills each element's
        atoms from the candidate of highest per-atom charge down, the lowest from
        the lowest up: a bound no reading below this node exceeds, never looser
        than :func:`floor_at`'s, so a node it cuts holds no reading the walk
        would reach. Under a finite bound the monatomic range holds only the
        options the bound leaves room for: an element's option costs at most the
        bound less the node's floor and the cheapest options of the other elements
        left alone (:func:`_monatomic_reach`).
        """
        nonlocal nodes
        # counted as a node's charge check is: once per element visited
        nodes += len(left)
        fits: dict[int, int] = {}
        lo = hi = 0.0
        room = float("inf")
        # with an organic ion chosen, no later organic candidate takes part (one organic species per reading)
        organic_chosen = any_organic and any(c.organic for c, _ in chosen)
        cover = coverable_inorganic if organic_chosen else coverable
        if bound[0] < float("inf"):
            alone = left.keys() - cover[index]
            least = [least_of[symbol] for symbol in alone]
            floor = cost + _PENALTY_SPECIES * (len(chosen) + len(alone) + (1 if len(left) > len(alone) else 0))
            room = bound[0] + _TOL - floor - sum(least)
            if room < 0:
                return False
        for symbol, n in left.items():
            single = mono.get(symbol)
            if single is not None and room < float("inf"):
                single = _within_room(symbol, room + (least_of[symbol] if symbol not in cover[index] else 0.0))
            highest = ordered_holders.get(symbol)
            if highest is None:
                highest = ordered_holders[symbol] = sorted(holders.get(symbol, ()), key=lambda h: -h[0])
            # equal per-atom charges carry the same whichever fills first
            for ordered, side in ((highest, 1), (highest[::-1], 0)):
                rest = n
                total = 0.0
                for per_atom, i, k in ordered:
                    if i < index or organic_chosen and candidates[i].organic:
                        continue
                    if single is not None and (per_atom <= single[1] if side else per_atom >= single[0]):
                        break
                    times = fits.get(i)
                    if times is None:
                        times = fits[i] = _fits(candidates[i].composition, left)
                    take = min(rest, times * k)
                    total += take * per_atom
                    rest -= take
                    if rest <= _TOL:
                        break
                if rest > _TOL:
                    if single is None:
                        return False
                    total += rest * single[side]
                if side:
                    hi += total
                else:
                    lo += total
        return lo - _TOL <= wanted <= hi + _TOL

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
        if not carried(index, left, needed - charge, chosen, cost):
            return
        organic_chosen = any(c.organic for c, _ in chosen)
        for j in range(index, len(candidates)):
            ion = candidates[j]
            if organic_chosen and ion.organic:
                # one organic ion species per reading: a salt's carbon skeleton is one ion (or one written per
                # species), not rebuilt from fragments (uranyl acetate as hydroxide and succinate)
                continue
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


def carbide_balances(remaining: dict[str, float], budget: list[int]) -> bool:
    """Whether ``remaining`` (carbon beside hydrogen and a metal, of which the walks read no
    reading) balances as ions once carbon may be a carbide: the atoms of a metal alkyl,
    aryl or chelate (Zn(C2H5)2, Co(acac)3 with no acac ion written) that only C(4-) beside
    H(+) balances (:func:`scorer.bond_class_rules.organometallic_reason`). The walk stops
    at the first reading it finds (a ceiling below every penalty)."""
    found, _ = _search(remaining, 0.0, frozenset(), budget, -1.0, True, carbide=True)
    return bool(found)


# anions that pair with no cation in a formula without a metal: H2CN2 is cyanamide or
# diazomethane, C2H4N4 dicyandiamide, molecules (CN2(2-) is a salt anion only beside a
# metal, as in CaCN2; Greenwood & Earnshaw, 2nd ed., 1997, ch. 8.6; from memory)
# The carbide anions neither: they are strong bases that no cation of an organic formula (ammonium, H+) would
# leave unprotonated, and carbon bonded to hydrogen is never a carbide (C2H8N2 is ethylenediamine, not
# ammonium acetylide; common practice)
# acetylacetonate too: it is read where written ((acac), or beside a metal); as one side of an organic pair it
# made amino acids salts (valine, C5H11NO2, ammonium acetylacetonate)
# bromite neither: an unstable oxidising anion (its salts are made from bromine and a hydroxide beside the metal)
# that no organic formula holds; with it C7H16BrNO2, acetylcholine bromide, read as a pyrrolidinium bromite
# nor the peroxomonosulfates, oxidants likewise: with HSO5(-) in the library C7H11NO5S (a registry formula of a
# 4-(methylamino)phenol sulfate) read as an ethylpyridinium salt of it
# and the hypohalites, chlorite and chlorate, which oxidise amines and onium ions (N-haloamines; Greenwood &
# Earnshaw, 2nd ed., 1997, ch. 17.2; from memory): with [C2OHmim](+) in the library C6H11BrN2O2 read as its
# hypobromite, acetylcholine chloride as a pyrrolidinium chlorite; hydroperoxide and ozonide likewise
# (C8H19NO2, ammonium octanoate, read as a pyrrolidinium hydroperoxide)
_NO_ORGANIC_PAIR_ANIONS = frozenset({"CN2(2-)", "C2(2-)", "C3(4-)", "C5H7O2(-)", "BrO2(-)", "HSO5(-)", "SO5(2-)",
                                     "ClO(-)", "BrO(-)", "IO(-)", "ClO2(-)", "ClO3(-)", "HO2(-)", "O3(-)"})
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
              for ion in candidates if ion.charge < 0 and ion.ion_id not in _NO_ORGANIC_PAIR_ANIONS]
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
