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

Each choice pays a penalty (:mod:`scorer.ion_penalties`, common practice).

A best penalty of 5 or more means no sensible ionic reading: the entry is
then classed covalent (or unknown) and its formal oxidation states are found
by electronegativity instead (:func:`scorer.substance.formal_oxidation_states`).

What kind of substance a reading is (``substance_class``) and the formal
oxidation states of entries without ions are decided in :mod:`scorer.substance`.
"""
from __future__ import annotations

import dataclasses
import itertools
import re

from ionicity.scorer.applicability import AMBIGUOUS_READINGS_NOTE, family_decided, metal_rich_reading, redox_conflicts, settle
from ionicity.scorer.bond_class_rules import metal_rich_phase_reason, organometallic_reason
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.alkoxides import ALKOXIDE_HINT, alkoxide_decomposition
from ionicity.scorer.metal_amides import METAL_AMIDE_HINT, metal_amide_decomposition
from ionicity.scorer.carboxylates import CARBOXYLATE_HINT, carboxylate_salt_readings, hill_carboxylate_readings
from ionicity.scorer.charge_balance import _TOL, solver_work, work_bound
from ionicity.scorer.complex_anions import complex_anion_readings
from ionicity.scorer.organic_anions import (
    NO_CONJUGATE_BASE,
    ammonium_organic_anion_readings,
    organic_anion_readings,
    suspect_organic_reading,
)
from ionicity.scorer.onium_groups import ONIUM_CATION_HINT
from ionicity.scorer.organic_cations import amine_salt_readings, onium_cation_readings, registry_halide_salt_readings
from ionicity.scorer.elements import element_symbols, get_element, is_metal
from ionicity.scorer.formula import (
    AMMONIUM_HINT,
    HYDROHALIDE_HINT,
    NONACID_MOLECULE_HINT,
    ONIUM_NAME_HINT,
    ParsedFormula,
    format_count,
    hill_formula,
)
from ionicity.scorer.ion_library import (
    get_ion,
    ion_library,
    ions_by_composition,
    monatomic_ion,
    same_label_ions,
)
from ionicity.scorer.ion_penalties import _FORMULA_UNIT_OXOANIONS, _IONIC_THRESHOLD, _PENALTY_SPECIES, _pair_penalty, _states
from ionicity.scorer.ion_search import _candidates_for, _fits, _ion_pair_readings, _search, _subtract, carbide_balances
from ionicity.scorer.coordination import COORDINATION_HINT, complex_reading, ligand_compositions
from ionicity.scorer.model import Decomposition, Ion, IonTerm
from ionicity.scorer.name_vocabulary import compact
from ionicity.scorer.registry_formulas import (
    ACYL_HALIDE_ELEMENTS, ACYL_HALOGENS, registry_molecule, registry_names_of, registry_reactive_group,
    registry_reactive_isomer, registry_salt, registry_zwitterion,
)
from ionicity.scorer.substance import (
    binary_carbonyl,
    classify,
    formal_oxidation_states,
    format_oxidation_states,
    listed_states,
    nonionic_decomposition,
    organic_candidate,
    organometallic_states,
    oxidation_states_of,
)
from ionicity.scorer.tables import table

__all__ = ["decompose", "decompose_anhydrous", "decompose_within", "solver_work", "work_bound", "formal_oxidation_states", "format_ion_terms", "format_oxidation_states"]

# how much less plausible a redox-compatible reading may be than the incompatible one
_REDOX_ALTERNATIVE_MAX_EXTRA = 1.0
# groups a formula's text or a name shows that water attacks (scorer.water)
_REACTIVE_GROUPS = frozenset({"acyl_halide", "acid_anhydride", "isocyanate"})
# hypohalites, and the N-H cations that react with them (chloramine chemistry)
_HYPOHALITES = frozenset({"ClO(-)", "BrO(-)", "IO(-)"})
# how much dearer than the cheapest reading of the atoms the reading with every written NH4 group may be
_WRITTEN_AMMONIUM_EXTRA = 1.0
_AMMONIUM_LIKE = frozenset({"NH4(+)", "N2H5(+)", "N2H6(2+)", "NH3OH(+)"})
_ADDUCT_COMPOSITIONS = {"NH3": (("H", 3.0), ("N", 1.0)), "H2O2": (("H", 2.0), ("O", 2.0))}
# solver work (search nodes plus knapsack transitions) the polyatomic-ion walks
# of one composition may spend together, about 20 ms of CPU: first 1.5 times the
# dearest read of the demo and reference lists (Tutton's salt, 10,484 units; 7,393
# since issue 14's exact cuts), 16,000; 20,000 since the set-cover floor, whose steps
# count, so that the dearest reference read (calcium cyclamate, 19,451) finishes
# (DEVELOPERS.md, "The work limit, seventh round"); a walk that reaches it stops and
# its row's notes say so
_SEARCH_BUDGET = 20_000
_SEARCH_CUT_NOTE = ("the ion search stopped at its work limit before trying every combination of "
                    "polyatomic ions: a more plausible reading may exist (check the formula)")


def format_ion_terms(terms) -> str:
    """``Fe(3+)*2;SO4(2-)*3`` from a sequence of IonTerm."""
    return ";".join(str(t) for t in terms)


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


# notes that say what the registry knows of a molecule, not that its reading is in doubt (scorer.slips does not
# count them against a reading)
ZWITTERION_REGISTRY_NOTE = "every compound of this formula the registry lists is a zwitterion"
ZWITTERION_NOTE = ("a zwitterion in the solid (an inner salt: its basic nitrogen holds the acid's proton, as in"
                   " the amino acids); a molecule, its ions in one molecule")
_METAL_ORGANIC_NOTE = ("metal-organic complex: a metal bound by an organic ligand the ion library does not list"
                       " (porphyrins, corrins, the alkoxides of Al, Ga, Sn); formal oxidation states not assigned")
# carbon atoms from which a formula with hydrogen has an organic skeleton: no inorganic ion holds them
_SKELETON_CARBON = 4


def _skeleton_without_library_ion(counts: dict[str, float]) -> bool:
    """Whether ``counts`` (a metal with an organic part: four or more C beside H) has a carbon skeleton that no
    organic ion of the library holds whole, in any number of copies. A salt's skeleton is one ion (one organic
    species per reading, :mod:`scorer.ion_search`), so then no walk over the library can read it: the walk is
    skipped and the last resorts read the rest as one organic anion (sodium salts of dyes, Congo red) or the compound as metal-organic (hematin). Those walks ran to the work limit over every
    small ion of C, H, N, O and S, so their reading depended on it.

    >>> _skeleton_without_library_ion({"C": 4.0, "H": 6.0, "Ca": 1.0, "O": 4.0})  # calcium acetate
    False
    >>> _skeleton_without_library_ion({"C": 32.0, "H": 22.0, "N": 6.0, "Na": 2.0, "O": 6.0, "S": 2.0})  # Congo red
    True
    """
    carbon = counts.get("C", 0.0)
    if carbon < _SKELETON_CARBON or "H" not in counts or not any(is_metal(s) for s in counts):
        return False
    for ion in _candidates_for(frozenset(counts)):
        if not ion.organic:
            continue
        held = dict(ion.composition).get("C", 0.0)
        if held and abs(carbon / held - round(carbon / held)) < 1e-9 and round(carbon / held) <= _fits(ion.composition, counts):
            return False
    return True


def _amidinium_salt(counts: dict[str, float]) -> bool:
    """Whether a formula written with NH2 groups reads as a salt of an amidinium
    cation of the library (formamidinium, guanidinium)."""
    if not organic_candidate(counts):
        return False
    return any(ion.family == "amidinium" and ion.charge > 0
               for _, terms in _ion_pair_readings(tuple(sorted(counts.items()))) for ion, _ in terms)


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
    # the ammonium ion written out, and how many NH4 groups the text writes where it says so plainly
    ammonium = comp.structure_hint == "ammonium" or comp.structure_hint.startswith(AMMONIUM_HINT)
    written_nh4 = float(comp.structure_hint[len(AMMONIUM_HINT):]) if comp.structure_hint.startswith(AMMONIUM_HINT) \
        else None
    # no hydrogen beyond the ammonium's: no organic skeleton (an ammonium salt of an organic acid the library does
    # not list, NH4HC4H4O6, is left as it was)
    inorganic_ammonium = ammonium and ("C" not in counts or counts.get("H", 0.0) <= 4 * counts.get("N", 0.0) + _TOL)
    water = comp.hydrate_water
    neutral = tuple(f"{name}*{format_count(n)}" for name, n in comp.neutral_adducts)
    for name, n in comp.neutral_adducts:
        counts = _subtract(counts, _ADDUCT_COMPOSITIONS.get(name) or ligand_compositions()[name], n)
    if comp.structure_hint.startswith(COORDINATION_HINT):
        # neutral ligands written in brackets (Pd(PPh3)4, [Co(en)3]Cl3): the rest is read as any formula, then
        # the compound is called a neutral complex or a complex salt (scorer.coordination)
        rest = _read(tuple(counts.items()), 0.0, comp.ion_hints, (), "", budget)
        ligands = tuple((name, n) for name, n in comp.neutral_adducts if name not in _ADDUCT_COMPOSITIONS)
        return complex_reading(rest, ligands, comp.structure_hint, comp.counts, neutral, water)

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
    group = comp.structure_hint if comp.structure_hint in _REACTIVE_GROUPS else None
    if group is None and not comp.structure_hint and not comp.ion_hints and "C" in symbols and "O" in symbols and (
            symbols & ACYL_HALOGENS) and symbols <= ACYL_HALIDE_ELEMENTS:
        # a Hill formula whose every registry compound is an acyl halide (C2Cl2O2 is oxalyl chloride, CCl2O
        # phosgene); where an isomer is not (C2H3ClO: acetyl chloride and chloroacetaldehyde), no group is said
        hill = hill_formula(counts)
        group = registry_reactive_group(hill)
        isomer = registry_reactive_isomer(hill) if group is None else None
        if isomer is not None:
            # the formula also names a compound water attacks: say so rather than let "miscible" stand alone
            notes.append(f"one compound of this formula, {isomer[1]}, is an {isomer[0].replace('_', ' ')} that water"
                         " attacks (the hydrogen halide and the acid); the formula does not say which compound this is:"
                         " check it and its safety data sheet")
    if group is not None and not any(is_metal(s) for s in symbols):
        # an acyl halide written out (CH3COCl, COCl2), or an acid anhydride or isocyanate a name says
        # (name_reader: the registry's SMILES): a molecule with a group water attacks
        dec = nonionic_decomposition(comp.charge, counts, notes, water, neutral)
        return dataclasses.replace(dec, written_groups=(group,))
    if comp.structure_hint == METAL_AMIDE_HINT and not comp.ion_hints:
        # LiN(C3H7)2, NaN(Si(CH3)3)2 written by their groups: M-N bonds in aggregates (scorer.metal_amides)
        return metal_amide_decomposition(counts, water, neutral)
    if comp.structure_hint == ALKOXIDE_HINT and not comp.ion_hints:
        # a metal alkoxide written by its groups (Ti(OC3H7)4): a molecule of M-O-C bonds (scorer.alkoxides)
        return alkoxide_decomposition(counts, water, neutral)
    if comp.structure_hint == "ester" and not any(is_metal(s) for s in symbols):
        # an ester written out (CH3COOCH3): no acidic hydrogen, a molecule (its Hill formula also names an acid)
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    if (not comp.structure_hint and not comp.ion_hints and {"C", "N"} <= symbols and symbols & {"O", "S"}
            and not any(is_metal(s) for s in symbols)):
        # a formula alone whose every registry compound is an amino acid or another inner salt (C6H14N2O2: the
        # lysines): read as that name would be, and said so
        named = registry_zwitterion(hill_formula(counts))
        if named is not None:
            dec = _read(counts_key, charge, ion_hints, neutral_adducts, "zwitterion", budget)
            return dataclasses.replace(dec, notes=(*dec.notes, f"{ZWITTERION_REGISTRY_NOTE} ({named}, ...)"))
    if comp.structure_hint == "zwitterion":
        # a name the registry's structure shows to be an amino acid or another inner salt (glycine, betaine,
        # taurine: scorer.data.smiles_groups): read as any molecule the registry names (no salt of its atoms;
        # an acid's reading stands, EDTA), and marked for the melting route, which counts the ion pair
        # (scorer.melting_organic)
        dec = _read(counts_key, charge, ion_hints, neutral_adducts, "molecule", budget)
        return dataclasses.replace(dec, written_groups=(*dec.written_groups, "zwitterion"),
                                   notes=(*dec.notes, ZWITTERION_NOTE))
    if comp.structure_hint == "amide" and not any(is_metal(s) for s in symbols) and not _amidinium_salt(counts):
        # amide groups written out (urea, CO(NH2)2) mark a molecule, not NH4+ salts;
        # an amidinium cation's own NH2 groups do not (HC(NH2)2I, C(NH2)3Cl)
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    if (comp.structure_hint == "organometallic" and any(is_metal(s) for s in symbols)) or binary_carbonyl(counts):
        # carbonyl and cyclopentadienyl ligands written out: Fe(CO)5, Fe(C5H5)2; a binary carbonyl in Hill
        # order (C5FeO5, C4NiO4, C10Mn2O10)
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

    skeleton = False  # an organic skeleton no library ion holds (_skeleton_without_library_ion): no walk
    onium, onium_notes = onium_cation_readings(remaining, comp.structure_hint, hinted) \
        if comp.structure_hint.startswith(ONIUM_CATION_HINT) else ([], [])
    carboxylate, carboxylate_notes = carboxylate_salt_readings(remaining, comp.structure_hint) \
        if comp.structure_hint.startswith(CARBOXYLATE_HINT) and not hinted else ([], [])
    if onium:
        # organic groups written on N, P, As or S before one anion (scorer.onium_groups): that onium salt
        readings = onium
        notes.extend(onium_notes)
    elif carboxylate:
        # carboxylate groups written beside one metal (scorer.carboxylates): that metal's salt of them
        readings = carboxylate
        notes.extend(carboxylate_notes)
    elif not hinted and organic_candidate(remaining):
        # a molecule unless it is one ion pair of the library (acetic acid,
        # ethylammonium nitrate): no search over organic fragments
        readings = _ion_pair_readings(tuple(sorted(remaining.items())))
        if not ammonium and comp.structure_hint != "fulminate" and _woehler_isomer(readings):
            readings = []
        # an organic cation beside a hypohalite is an oxidant and a fuel that do not keep: where the formula
        # also reads otherwise, that reading stands (C5H14ClNO is choline chloride, which tied with
        # ethyltrimethylammonium hypochlorite; common practice)
        readings = [r for r in readings if not (
            any(ion.ion_id in _HYPOHALITES for ion, _ in r[1]) and any(ion.organic and ion.charge > 0 for ion, _ in r[1])
        )] or readings
        if ammonium:
            # the ammonium ion written out (NH4 in the text) is an ammonium salt: (NH4)2C2O4 is ammonium oxalate,
            # not its isomer 2-hydroxyethylammonium nitrate, with which it tied
            written = [r for r in readings if any(ion.ion_id == "NH4(+)" for ion, _ in r[1])]
            readings = written or readings
        if comp.structure_hint == "quaternary" or comp.structure_hint.startswith(ONIUM_CATION_HINT):
            # four alkyl groups written on nitrogen: the quaternary ammonium salt ((CH3)4NCl, not butylammonium)
            written = [r for r in readings if any(ion.family == "ammonium-quaternary" for ion, _ in r[1])]
            readings = written or readings
        if comp.structure_hint == ONIUM_NAME_HINT:
            # a name that says ammonium or phosphonium: no ring cation of the same composition; with none left
            # the registry's salt reading below builds the cation by rule
            readings = [r for r in readings if not any(
                ion.organic and ion.charge > 0 and ion.family not in _OPEN_CHAIN_ONIUM_FAMILIES for ion, _ in r[1])]
        if comp.structure_hint.startswith(HYDROHALIDE_HINT):
            # an amine salt written with its acid (C6H5NH2·HCl) or so named: the base protonated, beside the halide
            halide, _, n = comp.structure_hint[len(HYDROHALIDE_HINT):].partition("*")
            built, built_notes = amine_salt_readings(remaining, halide, int(n))
            if built:
                readings = built
                notes.extend(built_notes)
        elif comp.structure_hint == "molecule":
            # a name the registry knows as one molecule (name_reader.parse_as_name): only an acid's reading
            readings = _acid_readings(readings)
        elif comp.structure_hint == NONACID_MOLECULE_HINT:
            # the same, where the name says no acid: no reading of ions
            readings = []
        elif readings and not ammonium and comp.structure_hint not in ("fulminate", "quaternary") and \
                not comp.structure_hint.startswith(ONIUM_CATION_HINT):
            # (a written NH4 or C-N-O says which isomer; "organometallic" from a C5H5 in the text means nothing
            # without a metal: C5H5N5 is adenine)
            readings = _registry_molecule_readings(remaining, readings, notes)
        if not readings and comp.structure_hint not in ("molecule", "amide", NONACID_MOLECULE_HINT):
            salt = registry_salt(hill_formula(remaining))
            if salt is not None:
                # the registry lists the formula only as a salt: an amine hydrohalide or quaternary ammonium halide
                readings, built_notes = registry_halide_salt_readings(remaining, salt)
                notes.extend(built_notes)
    else:
        # no reading at or above the ionic threshold is used (:func:`_best`), so the walks
        # need not look for one; with written ions, whether any reading balances at all
        # decides a note, so there the ceiling holds once one is found
        skeleton = not hinted and _skeleton_without_library_ion(remaining)
        readings = [] if skeleton else \
            _readings(remaining, hinted, notes, budget=budget, ceiling=_IONIC_THRESHOLD, any_reading=bool(hinted))
    if readings and inorganic_ammonium and written_nh4 is not None:
        # every NH4 group the text writes is an ammonium ion: (NH4)2Cr2O6 (the dichromate with an O lost) was read
        # as one ammonium beside nitrite and chromium(II)
        kept = [r for r in readings if _holds_ammonium([r], written_nh4)]
        if not kept and written_nh4 and not hinted and not skeleton:
            # the walks kept only their cheapest readings, none with the ammonium written: the rest read with
            # those NH4 groups given, as a bracketed ion is ((NH4)10W12O41, ammonium paratungstate, balances as
            # W(6+) with oxide, dearer than hydroxide, azide and W(4+) read from the atoms), where that reading
            # costs at most one penalty unit more (a formula that lost a count, (NH4)2Cr2O6, stays an error: it
            # balances with the ammonium only through Cr(4+), an odd state)
            nh4 = get_ion("NH4(+)")
            rest = _subtract(remaining, nh4.composition, written_nh4)
            ceiling = min(_IONIC_THRESHOLD, min(p for p, _ in readings) + _WRITTEN_AMMONIUM_EXTRA)
            if all(n >= -_TOL for n in rest.values()):
                rest = {s: n for s, n in rest.items() if n > _TOL}
                kept = [r for r in _readings(rest, [[(nh4, written_nh4)]], [], budget=budget, ceiling=ceiling)
                        if r[0] <= ceiling] if rest else []
        readings = kept
    readings = _coexisting(readings, remaining)
    if readings and not hinted:
        # a metal's oxoacid or complex acid written whole (HMnO4, H2CrO4, HAuCl4, H3PW12O40): H(+) with its anion,
        # not a metal(VII) cation with oxide and hydroxide
        readings = _metal_acid_reading(remaining) or readings
    chosen = _best(readings)
    if chosen is None and not hinted:
        # a metal with C, H and O whose rest is as many equal saturated carboxylates as its charge (C24H46O4Zn,
        # zinc laurate): that salt, before the carbide test reads it as a metal alkyl (scorer.carboxylates)
        built, built_notes = hill_carboxylate_readings(remaining)
        if built:
            readings, chosen = built, _best(built)
            notes.extend(built_notes)
    # carbon beside hydrogen is read in no carbide (scorer.ion_search): where nothing else balances, whether a
    # carbide would (a metal alkyl or chelate, organometallic_reason below; the last resorts that build ions
    # then stand aside, as they did while the walks still returned such a reading)
    carbide_only = (chosen is None and not hinted and not skeleton and "C" in remaining and "H" in remaining
                    and any(is_metal(s) for s in remaining) and carbide_balances(remaining, budget))
    if chosen is None and not hinted and not skeleton and not carbide_only:
        # last resort: a complex anion built by rule (K2GeF6)
        built, built_notes = complex_anion_readings(remaining, budget)
        # (the same ions that cannot sit together: H2MnO4S.1H2O came back from it as Mn(4+), H(-), SO4(2-))
        built = _coexisting(built, remaining)
        if built:
            readings, chosen = built, _best(built)
            notes.extend(built_notes)
    if chosen is None and not hinted and not skeleton and not carbide_only:
        tetrel = _tetrel_cation_reading(remaining)
        if tetrel is not None:
            readings = [tetrel]
            chosen = _best(readings)
    if not hinted and (chosen is None or suspect_organic_reading(chosen[0], chosen[1])):
        # last resort for a salt of an organic acid the library does not list (C12H25NaO4S, KHC8H4O4):
        # the s-block metal with the rest as one organic anion
        built, built_notes = organic_anion_readings(remaining)
        if built:
            readings, chosen = built, _best(built)
            notes.extend(built_notes)
        elif built_notes == [NO_CONJUGATE_BASE] and (chosen is not None or carbide_only):
            # an alkali metal with a rest that is no acid's conjugate base (NaHCO, C2H3NaO): a typo of a
            # carboxylate or hydrogencarbonate is likelier than the walk's carbide reading of the atoms
            readings, chosen, carbide_only = [], None, False
    if (not hinted and written_nh4 and "C" in remaining and not any(is_metal(s) for s in remaining)
            and not _holds_ammonium(readings, written_nh4)):
        # the NH4 the text writes beside an organic acid's conjugate base the library does not list
        # (NH4C7H15COO, ammonium octanoate, had read as a molecule C8H19NO2)
        built, built_notes = ammonium_organic_anion_readings(remaining, written_nh4)
        if built:
            readings, chosen = built, _best(built)
            notes.extend(built_notes)
    if hinted and not remaining and not readings:
        notes.append("the ions written do not balance: " + ", ".join(
            f"{ion.ion_id}*{format_count(n)}" for ion, n in (h[0] for h in hinted)))
    if not comp.ion_hints:
        # metal alkyls, aryls and arene complexes: no salt of carbide ions beside H(+)
        organometallic = organometallic_reason(counts, None if chosen is None else [t.ion.ion_id for t in chosen[1]],
                                               carbide_only)
        if organometallic is not None:
            return Decomposition(
                composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
                substance_class="covalent_molecular", notes=(organometallic,),
            )
        if chosen is None and skeleton and any(get_element(s).block in ("d", "f", "p") for s in remaining
                                                if is_metal(s)):
            # a d-, f- or p-block metal in an organic skeleton no library ion holds and no organic anion reads,
            # not an alkyl or arene: a metal-organic complex (hematin, cobalamin; the aluminium and tin alkoxides,
            # Al(OiPr)3 a tetramer of Al-O-Al bridges, Greenwood & Earnshaw, 2nd ed., 1997, ch. 7; from memory),
            # its ligand bound through N or O donors, no salt
            return Decomposition(
                composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
                substance_class="covalent_molecular", notes=(_METAL_ORGANIC_NOTE,),
            )
    if chosen is None and not comp.ion_hints:
        # Fe4N, Pd4S: more metal than any ion reading can balance, a metal-rich phase
        metal_rich = metal_rich_phase_reason(counts)
        if metal_rich is not None:
            return Decomposition(
                composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
                oxidation_states=tuple((s, 0.0) for s in counts), substance_class="intermetallic",
                ionic_model="not_applicable", ionic_model_reasons=(metal_rich,),
            )
    if ammonium and inorganic_ammonium and not _holds_ammonium(readings, written_nh4):
        # NH4 written in an inorganic formula (no hydrogen beyond the ammonium's, so no organic skeleton: an
        # ammonium salt of an organic acid the library does not list, NH4HC4H4O6, stays as it was) that no
        # reading balances with the ammonium ion: a count left out (NH4SO4 for (NH4)2SO4 or NH4HSO4, NH4PO4 for
        # (NH4)3PO4, NH4CO3), not a molecule with S(-2) and O(+1/4) nor hydroxylammonium metaphosphate
        notes.append("no charge-balanced set of ions found: check the formula (counts, charges, a missing element);"
                     " the NH4 written is an ammonium ion in no reading that balances (a count left out?"
                     + _ammonium_count_proposal(counts) + ")")
        return Decomposition(composition=tuple(counts.items()), hydrate_water=water, neutral_parts=neutral,
                             substance_class="unknown", notes=tuple(notes))
    if not readings:
        if comp.ion_hints and not comp.charge and _ligand_holder_exists(comp.ion_hints, counts):
            # the bracketed groups may be the ligands of a complex ion the library lists (LiB(C2O4)2 is
            # Li[B(C2O4)2], lithium bis(oxalato)borate; its oxalate groups balanced with B(3+), a non-metal
            # cation): where the atoms read as a salt of a library ion that holds every written group, that reading
            # (and the note that says so)
            whole = _read(counts_key, charge, (), neutral_adducts, structure_hint, budget)
            holder = next((t.ion for t in whole.cations + whole.anions
                           if not t.ion.monatomic and _holds_groups(t.ion, comp.ion_hints)), None)
            if holder is not None and whole.substance_class != "unknown":
                written = ", ".join(ion_id for ion_id, _ in comp.ion_hints)
                return dataclasses.replace(whole, notes=(*whole.notes, (
                    f"the groups written in brackets ({written}) are ligands of {holder.ion_id}, not ions of their own:"
                    " read as its salt")))
        if comp.ion_hints and not notes:
            notes.append("the written ions leave a remainder that no ion assignment balances")
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    if chosen is None:
        return nonionic_decomposition(comp.charge, counts, notes, water, neutral)
    cations, anions, alternatives, _ = chosen
    if comp.structure_hint == "fulminate":
        # the text writes C-N-O: the fulminate the library ranks after cyanate (one composition)
        anions = [IonTerm(get_ion("CNO(-)"), t.count) if t.ion.ion_id == "OCN(-)" else t for t in anions]
    ammine = _ammine_ligands(cations, anions)
    if ammine and sum(counts.values()) > 4 * ammine:
        # NH4(+) beside NH2(-), NH(2-) or N(3-) is NH3 (they neutralise each other): the ammine ligands of a
        # complex written flat, Pt(NH3)2Cl2 (cisplatin) or Cu(NH3)4SO4, read as ammonium with amide or nitride,
        # salts that react violently with water. Read again with that NH3 set apart as neutral parts, as in
        # PtCl2·2NH3 (common practice).
        adducts = dict(comp.neutral_adducts)
        adducts["NH3"] = adducts.get("NH3", 0.0) + ammine
        return _read(counts_key, charge, ion_hints, tuple(sorted(adducts.items())), structure_hint, budget)

    if not hinted and any(t.ion.ion_id in _PAIRED_CATIONS for t in cations):
        paired = _paired_reading(remaining, chosen[3], budget, notes)
        if paired is not None:
            cations, anions, alternatives = paired

    reasons: tuple[str, ...] = ()
    if not hinted and _heptavalent_beside_another_metal(cations):
        # a monatomic cation at +7 or more (Mn, Re, Tc, Os, Ru) exists in molecules (Mn2O7, OsO4) and as the
        # oxoanions of salts (MnO4-, ReO4-), never as a cation of a mixed-metal oxide: NCM622,
        # LiNi0.6Mn0.2Co0.2O2, balanced as Co(2+), Ni(2+) and Mn(7+); read again without those states
        # (Greenwood & Earnshaw, 2nd ed., 1997, ch. 24.3 and 25; from memory)
        high = frozenset((t.ion.element, state) for t in cations if t.ion.monatomic and t.ion.charge >= 7
                         for state, _ in _states(t.ion.element) if state >= 7)
        other = _best(_readings(remaining, hinted, [], high, budget, _IONIC_THRESHOLD))
        if other is not None:
            cations, anions, alternatives, _ = other
    hypohalites = [t.ion.ion_id for t in anions if t.ion.ion_id in _HYPOHALITES]
    if hypohalites and not hinted and any(t.ion.ion_id in _AMMONIUM_LIKE for t in cations):
        # ammonium (or hydrazinium, hydroxylammonium) with a hypohalite is no salt: they react to a
        # chloramine (NH4+ + OCl- -> NH2Cl + H2O; Greenwood & Earnshaw, 2nd ed., 1997, ch. 11.3; from memory).
        # H4ClNO is hydroxylamine hydrochloride, NH3OH(+) Cl(-): read again without the hypohalite
        ceiling = min(_IONIC_THRESHOLD, chosen[3] + _REDOX_ALTERNATIVE_MAX_EXTRA)
        other = _best(_readings(remaining, hinted, [], frozenset(hypohalites), budget, ceiling))
        if other is not None and other[3] <= chosen[3] + _REDOX_ALTERNATIVE_MAX_EXTRA:
            if ammonium:  # NH4 written out: say why it is not read so
                notes.append(f"{hypohalites[0]} beside NH4(+) is no salt (they react to a chloramine): the composition"
                             " is read as " + _reading_text(other[0], other[1]))
            cations, anions, alternatives, _ = other
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
        # only a reading at most _REDOX_ALTERNATIVE_MAX_EXTRA dearer is taken: the walks need no dearer one
        ceiling = min(_IONIC_THRESHOLD, chosen[3] + _REDOX_ALTERNATIVE_MAX_EXTRA)
        compatible = _best(_readings(remaining, hinted, [], excluded, budget, ceiling)) if excluded else None
        # only a reading of common states and ions will do (TlI3 = Tl(+) I3(-)),
        # not an odd state invented to balance (Fe(+) with I3(-) for FeI3)
        if (compatible is not None and compatible[3] <= chosen[3] + _REDOX_ALTERNATIVE_MAX_EXTRA
                and not redox_conflicts(compatible[0], compatible[1])):
            reasons = tuple(c + ": read without it" for c in conflicts)
            cations, anions, alternatives, _ = compatible
        else:
            notes.extend(c + "; no compatible reading balances the formula (check it)" for c in conflicts)
    if alternatives:
        notes.append(AMBIGUOUS_READINGS_NOTE + " | ".join(
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


def _readings(remaining, hinted, notes: list[str], excluded=frozenset(), budget=None, ceiling=float("inf"),
              any_reading=False):
    """Every best charge-balanced reading, the written ions included; the
    walks share ``budget`` (one composition's, see :func:`_search`) and need
    look for no reading above ``ceiling`` (with ``any_reading``, only once
    some reading is found: the caller asks whether any balances)."""
    budget = [_SEARCH_BUDGET] if budget is None else budget
    readings = []
    for given in itertools.product(*hinted):
        given = list(given)
        given_charge = sum(ion.charge * n for ion, n in given)
        if remaining:
            found, stopped = _search(remaining, -given_charge, excluded, budget, ceiling,
                                     any_reading and not readings)
            if stopped and _SEARCH_CUT_NOTE not in notes:
                notes.append(_SEARCH_CUT_NOTE)
            readings.extend((penalty, given + terms) for penalty, terms in found)
        elif abs(given_charge) < _TOL:
            readings.append((0.0, given))
    return [r for r in readings if _has_both_signs(r[1])]


# cations a formula written with one metal atom gets where the compound holds two: group 13 has no
# M(2+) ion (GaCl2 is Ga(+)[GaCl4](-), InCl2 In(+)[InCl4](-); Greenwood & Earnshaw, Chemistry of the
# Elements, 2nd ed., 1997, ch. 7.3.5; from memory). Left out for now: Hg(+) (HgCl is calomel, Hg2Cl2)
# and Tl(2+), whose readings are calibration rows of the melting index (HgCl, TlSe): changing them
# moves the fitted weights (DEVELOPERS.md, "Group 13 and paired cations")
_PAIRED_CATIONS = frozenset({"Al(2+)", "Ga(2+)", "In(2+)"})
_GROUP_13_PAIRED = frozenset({"Al", "Ga", "In"})


def _paired_reading(remaining: dict[str, float], penalty: float, budget, notes: list[str]):
    """The reading of the doubled formula unit, counts halved, when it is more plausible than ``penalty``.

    Only for whole counts (a formula unit written at its smallest: GaCl2 for Ga2Cl4); None when
    the doubled unit reads no better. The walk draws on the composition's ``budget`` and adds
    the work-limit note to ``notes`` when it stops there.

    >>> from ionicity.scorer.formula import parse_formula
    >>> [decompose(parse_formula(f)).cations[0].ion.ion_id for f in ("GaCl2", "InBr2", "InCl3")]
    ['Ga(+)', 'In(+)', 'In(3+)']
    """
    if not all(float(n).is_integer() for n in remaining.values()):
        return None
    doubled = {symbol: 2 * n for symbol, n in remaining.items()}
    better = _best(_readings(doubled, [], notes, budget=budget, ceiling=penalty))
    if better is None or better[3] >= penalty - _TOL:
        return None
    cations, anions, alternatives, _ = better
    if not any(t.ion.monatomic and t.ion.charge == 1 and t.ion.element in _GROUP_13_PAIRED for t in cations):
        # the doubled unit is read for the M(+)[MX4](-) of group 13; a doubled unit without M(+) is no such
        # salt (AlSO4, a count left out of Al2(SO4)3, read as Al2O(SO3)(SO4) with status ok)
        return None
    return ([IonTerm(t.ion, t.count / 2) for t in cations], [IonTerm(t.ion, t.count / 2) for t in anions],
            alternatives)


# NH4(+) with these anions is the isomer of urea, thiourea, selenourea (Woehler 1828)
_WOEHLER_ANIONS = frozenset({"OCN(-)", "CNO(-)", "SCN(-)", "SeCN(-)"})


# a basic nitrogen anion and the ammonium ions that neutralise it: NH2(-) + NH4(+) = 2 NH3, N(3-) + 3 NH4(+) = 4 NH3
_AMMONIUM_BASES = {"NH2(-)": 1, "NH(2-)": 2, "N(3-)": 3}


def _ammonium_count_proposal(counts: dict[str, float]) -> str:
    """`` did you mean (NH4)2SO4?`` when the atoms beside one NH4 are a library anion of charge -2 to -4, so that
    the ammonium count was left out; ``""`` otherwise.

    >>> _ammonium_count_proposal({"H": 4.0, "N": 1.0, "O": 4.0, "S": 1.0})
    ' did you mean (NH4)2SO4?'
    """
    rest = _subtract(counts, (("H", 4.0), ("N", 1.0)), 1.0)
    for charge in (-2, -3, -4):
        found = [ion for ion in ions_by_composition(rest, charge) if not ion.organic]
        if found:
            return f" did you mean (NH4){-charge}{found[0].label}?"
    return ""


# the organic cation families a name with "ammonium" or "phosphonium" may mean (ONIUM_NAME_HINT)
_OPEN_CHAIN_ONIUM_FAMILIES = frozenset({"ammonium-quaternary", "ammonium-protic", "phosphonium", "cholinium",
                                        "organic-cation"})


# ions that give up a proton to a hydride (the acid anions, hydroxide and hydroxo complexes, the ammonium-like
# cations, H(+) itself)
_PROTIC_FAMILIES = frozenset({"hydrogen-oxoanion", "hydrogen-chalcogenide", "hydroxo-complex", "ammonium-like"})


def _heptavalent_beside_another_metal(cations) -> bool:
    """Whether a reading's cations hold a monatomic ion at +7 or more beside a cation of another metal.

    >>> from ionicity.scorer.ion_library import monatomic_ion
    >>> mn7, li = monatomic_ion("Mn", 7), monatomic_ion("Li", 1)
    >>> _heptavalent_beside_another_metal((IonTerm(mn7, 0.2), IonTerm(li, 1))), _heptavalent_beside_another_metal((IonTerm(mn7, 2),))
    (True, False)
    """
    high = {t.ion.element for t in cations if t.ion.monatomic and t.ion.charge >= 7}
    return bool(high) and any(t.ion.monatomic and is_metal(t.ion.element) and t.ion.element not in high
                              for t in cations)


def _coexisting(readings, remaining: dict[str, float]) -> list:
    """The readings whose ions can sit together in one solid: no hydride beside a proton donor or an oxoanion,
    no silicide or germanide beside another anion."""
    if readings and "H" in remaining and "O" in remaining:
        # no hydride beside a proton donor: H(-) and an O-H or N-H acid react to H2 (H(-) + OH(-) -> H2 + O(2-);
        # Greenwood & Earnshaw, 2nd ed., 1997, ch. 3.6; from memory): BaH3O4P read as Ba(2+), H(-), H2PO4(-);
        # nor beside an oxoanion, which it reduces: Ca(OH)Cl tied as Ca(2+), H(-), ClO(-) with the hydroxide
        # chloride
        readings = [r for r in readings if not _hydride_beside_reactive_ion(r[1])]
    if readings and ("Si" in remaining or "Ge" in remaining):
        # silicide and germanide ions only where no other anion takes the electrons: Cu2GeS3 was read as Cu(3+)
        # with Ge(4-) and a trisulfide (Mg2Si is Si(4-); beside S, Se, P or O the tetrel is the cation)
        readings = [r for r in readings if not _tetride_beside_another_anion(r[1])]
    if readings and "N" in remaining and "O" in remaining:
        readings = [r for r in readings if not _nitrosyl_beside_base(r[1])]
    return readings


_NITROSYL_CATIONS = frozenset({"NO(+)", "NO2(+)"})
# the anions of strong acids beside which NO+ and NO2+ keep as salts, and the halo-complexes (BF4-, PF6-, SbF6-,
# AlCl4-); N2O5 is NO2+ NO3- (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.3; from memory)
_NITROSYL_PARTNERS = frozenset({"ClO4(-)", "ClO3(-)", "BrO4(-)", "IO4(-)", "NO3(-)", "HSO4(-)", "SO4(2-)",
                                "S2O7(2-)", "SO3F(-)", "[OTf](-)", "[NTf2](-)"})


def _nitrosyl_beside_base(terms) -> bool:
    """Whether a reading holds the nitrosonium or nitronium ion beside an anion that is no strong acid's: NO+ and
    NO2+ keep as salts only beside such anions (:data:`_NITROSYL_PARTNERS` and the halo-complexes: NOBF4,
    NO2ClO4, NOHSO4); with a halide, a pseudohalide or a basic anion they are covalent molecules (NOCl, NO2F,
    C(NO2)3Cl) or no compound at all (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 11.3;
    from memory). The trinitromethanes had read as NO(+) with carbonate and a halide."""
    if not any(ion.ion_id in _NITROSYL_CATIONS for ion, _ in terms):
        return False
    return any(ion.charge < 0 and ion.family != "halo-complex" and ion.ion_id not in _NITROSYL_PARTNERS
               for ion, _ in terms)


def _hydride_beside_reactive_ion(terms) -> bool:
    """Whether a reading ((Ion, count) pairs) holds H(-) beside an ion that gives it a proton, or beside an
    oxoanion (a polyatomic anion holding oxygen), which the hydride reduces: hydride salts hold halides, oxide,
    nitride and the hydrido complexes beside it (NaH, LaHO, Li2NH... BH4(-), AlH4(-); Greenwood & Earnshaw,
    Chemistry of the Elements, 2nd ed., 1997, ch. 3.6; from memory)."""
    ids = [ion for ion, _ in terms]
    if not any(ion.ion_id == "H(-)" for ion in ids):
        return False
    if any(ion.ion_id == "O(2-)" for ion in ids) and not any(
            ion.charge > 0 and ion.monatomic and _oxyhydride_host(ion.element) for ion in ids):
        # an oxide hydride needs a cation of an electropositive host (LaHO, BaTiO2.5H0.5, SrVO2H): beside Al,
        # Fe or Ti alone "Al(OH)" and "Fe(OH)" are hydroxides that lost a count, not AlHO and FeHO
        return True
    return any(
        ion.family in _PROTIC_FAMILIES or ion.ion_id == "H(+)"
        or ion.charge < 0 and not ion.monatomic and any(symbol == "O" for symbol, _ in ion.composition)
        for ion in ids)


# the hosts of the known oxide hydrides: the s-block metals and the rare earths (Sc, Y, La-Lu)
_RARE_EARTHS = frozenset({"Sc", "Y", "La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd", "Tb", "Dy", "Ho", "Er", "Tm",
                          "Yb", "Lu"})


def _oxyhydride_host(symbol: str) -> bool:
    return symbol in _RARE_EARTHS or get_element(symbol).block == "s"


def _tetride_beside_another_anion(terms) -> bool:
    """Whether a reading ((Ion, count) pairs) holds Si(4-) or Ge(4-) beside another anion (common practice:
    the more electronegative element takes the electrons; silicides and germanides are binary or metal-only)."""
    anions = [ion for ion, _ in terms if ion.charge < 0]
    return len(anions) > 1 and any(ion.monatomic and ion.element in ("Si", "Ge") for ion in anions)


# the tetrels whose group state the ion penalties price as a non-metal cation, and the anions of the
# tetrahedral semiconductors they form with a metal (II-IV-V2 chalcopyrites, I2-IV-VI3, I2-II-IV-VI4)
_SEMICONDUCTOR_TETRELS = frozenset({"Si", "Ge"})
_TETRAHEDRAL_ANIONS = frozenset({"P", "As", "Sb", "S", "Se", "Te"})


def _tetrel_cation_reading(counts: dict[str, float]):
    """The formal reading of a metal, Si or Ge and pnictide or chalcogenide ions, where no reading balances
    otherwise: ZnGeP2 as Zn(2+), Ge(4+), 2 P(3-) (the chalcopyrite semiconductors ZnGeP2, CdGeAs2, MgSiP2,
    Cu2GeS3; Shay & Wernick, Ternary Chalcopyrite Semiconductors, 1975; from memory), which the penalty of a
    non-metal cation (Ge(4+), 5) left an error. Each element at its formal state (the electronegativity
    order), every state one the element lists; the applicability rules then call the compound a semiconductor
    or a salt as they do any reading. None otherwise.

    >>> [ion.ion_id for ion, _ in _tetrel_cation_reading({"Zn": 1.0, "Ge": 1.0, "P": 2.0})[1]]
    ['Zn(2+)', 'Ge(4+)', 'P(3-)']
    """
    symbols = set(counts)
    if not symbols & _SEMICONDUCTOR_TETRELS or not any(is_metal(s) for s in symbols):
        return None
    rest = symbols - _SEMICONDUCTOR_TETRELS
    anions = {s for s in rest if not is_metal(s)}
    if not anions or not anions <= _TETRAHEDRAL_ANIONS:
        return None
    states = dict(formal_oxidation_states(counts, 0))
    if any(s not in states or not float(states[s]).is_integer() or states[s] == 0 for s in symbols):
        return None
    if any(int(states[s]) not in [state for state, _ in listed_states(s)] for s in symbols):
        return None
    if any((states[s] < 0) != (s in anions) for s in symbols):
        return None
    terms = [(monatomic_ion(s, int(states[s])), counts[s]) for s in counts]
    # priced as the walk prices it, but for the tetrel's non-metal-cation penalty: one species each
    return _PENALTY_SPECIES * len(terms), terms


def _holds_ammonium(readings, count: float | None = None) -> bool:
    """Whether any reading ((penalty, [(Ion, count), ...]) pairs) holds the ammonium ion (``count`` of them, when
    given)."""
    for reading in readings:
        held = sum(n for ion, n in reading[1] if ion.ion_id == "NH4(+)")
        if held and (count is None or abs(held - count) < _TOL):
            return True
    return False


def _ammine_ligands(cations, anions) -> float:
    """How many NH3 a reading's ammonium ions make with its amide, imide or nitride anions (0 for none)."""
    ammonium = sum(t.count for t in cations if t.ion.ion_id == "NH4(+)")
    if not ammonium:
        return 0.0
    total = 0.0
    for term in anions:
        need = _AMMONIUM_BASES.get(term.ion.ion_id)
        if need:
            used = min(term.count, ammonium / need)
            ammonium -= used * need
            total += used * (need + 1)
    return total


# cation families of the aprotic ionic liquids: a formula that reads as one of their salts and as a registry
# molecule is said to be both
_IONIC_LIQUID_CATIONS = frozenset({"imidazolium", "pyridinium", "pyrrolidinium", "piperidinium", "ammonium-quaternary",
                                   "phosphonium"})
# and of their anions (the ionic-liquid families of the ion library, and the simple anions ionic liquids pair
# with); hydroxide, cyanide, hydrogencarbonate and the like are no ionic-liquid anion a formula means
_IONIC_LIQUID_ANION_FAMILIES = frozenset({"sulfonylimide", "sulfonate", "alkylsulfate", "cyano-anion",
                                          "fluoroalkylphosphate", "alkylphosphate"})
_IONIC_LIQUID_ANIONS = frozenset({"BF4(-)", "PF6(-)", "Cl(-)", "Br(-)", "I(-)", "NO3(-)", "HSO4(-)", "SCN(-)",
                                  "CH3COO(-)", "CF3COO(-)"})


# the anions whose protonated forms are the metals' acids (permanganic, chromic, tungstic, chloroauric,
# hexachloroplatinic, ferrocyanic and the heteropoly acids): a high-valent metal's oxoanion, a halo or cyano
# complex (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 22-25 and 28; Pope,
# Heteropoly and Isopoly Oxometalates, 1983; from memory). The amphoteric oxoanions of the lower states
# (AlO2, CrO2, ZnO2, the formula units of mixed oxides) are left out: HAlO2 is boehmite AlO(OH), no acid.
_METAL_ACID_FAMILIES = frozenset({"metal-oxoanion", "oxoanion", "halo-complex", "cyano-complex"})
_METAL_ACID_LOWEST_OXO_STATE = 5


@per_input(maxsize=4096)
def _metal_acid_anions(present: frozenset) -> tuple[Ion, ...]:
    """Library anions of :data:`_METAL_ACID_FAMILIES` made of the elements ``present`` and holding a metal."""
    out = []
    for ion in ion_library():
        symbols = {symbol for symbol, _ in ion.composition}
        if ion.charge >= 0 or ion.organic or ion.monatomic or ion.family not in _METAL_ACID_FAMILIES \
                or not symbols <= present or ion.ion_id in _FORMULA_UNIT_OXOANIONS:
            continue
        metal_states = [state for symbol, state in ion.oxidation_states if is_metal(symbol)]
        if not metal_states:
            continue
        if ion.family in ("metal-oxoanion", "oxoanion") and min(metal_states) < _METAL_ACID_LOWEST_OXO_STATE:
            continue
        out.append(ion)
    return tuple(out)


def _metal_acid_reading(remaining: dict[str, float]):
    """[(penalty, [(H(+), n), (anion, 1)])] when ``remaining`` is H_n and one metal-acid anion of charge -n
    (:func:`_metal_acid_anions`); None otherwise."""
    hydrogen = remaining.get("H", 0.0)
    if not hydrogen or not any(is_metal(s) for s in remaining):
        return None
    rest = {s: n for s, n in remaining.items() if s != "H"}
    for ion in _metal_acid_anions(frozenset(remaining)):
        if abs(hydrogen + ion.charge) < _TOL and dict(ion.composition) == rest:
            proton = monatomic_ion("H", 1)
            penalty = _pair_penalty(proton, remaining) + _pair_penalty(ion, remaining) + 2 * _PENALTY_SPECIES
            return [(penalty, [(proton, hydrogen), (ion, 1.0)])]
    return None


def _acid_readings(readings):
    """The readings whose only cation is H(+): an acid's (acetic acid), which a molecule's formula keeps."""
    return [r for r in readings if all(ion.charge < 0 or ion.ion_id == "H(+)" for ion, _ in r[1])]


def _registry_molecule_readings(remaining: dict[str, float], readings, notes: list[str]):
    """The organic pair readings of a formula without written ions, less the salts where the registry's tables
    know the formula as molecules only (``scorer.registry_formulas``): C6H15NO3 is triethanolamine, not
    [N1112][HCO3]; C3H6N6 melamine, not guanidinium dicyanamide; C6H12N4 hexamethylenetetramine, not
    [N1111][dca] (325 registry molecules had read as salts). An acid's reading stands (acetic acid). Where the
    salt is one of an aprotic ionic-liquid cation, ``notes`` gets the warning that the formula reads as both."""
    acids = _acid_readings(readings)
    salts = [r for r in readings if r not in acids]
    if not salts:
        return readings  # an acid's reading only: no registry to ask (its table loads only when needed)
    name = registry_molecule(hill_formula(remaining))
    if name is None:
        return readings
    penalty, terms = min(salts, key=lambda r: r[0])
    if not acids and any(ion.charge > 0 and ion.family in _IONIC_LIQUID_CATIONS for ion, _ in terms) and any(
            ion.charge < 0 and (ion.family in _IONIC_LIQUID_ANION_FAMILIES or ion.ion_id in _IONIC_LIQUID_ANIONS)
            for ion, _ in terms):
        written = "".join(f"[{ion.label.strip('[]')}]" + (format_count(n) if n != 1 else "")
                          for ion, n in sorted(terms, key=lambda t: -t[0].charge))
        notes.append(f"read as a molecule, {name}, the registry's compound of this formula; it also reads as the"
                     f" ionic liquid {written}: write its ions to score the salt")
    return acids


def _woehler_isomer(readings) -> bool:
    """Whether an organic formula's only pair readings are ammonium (thio)cyanate; the caller asks
    only when the text does not write NH4: CH4N2O is urea and CH4N2S thiourea, the molecules a formula
    in that form names, not their ammonium-salt isomers (Woehler, Ann. Phys. Chem. 1828, 88, 253;
    from memory).

    >>> from ionicity.scorer.formula import parse_formula
    >>> [decompose(parse_formula(f)).substance_class for f in ("CH4N2O", "NH4OCN", "CH4N2S", "NH4SCN")]
    ['covalent_molecular', 'ionic_salt', 'covalent_molecular', 'ionic_salt']
    """
    if not readings:
        return False
    _, terms = min(readings, key=lambda r: r[0])
    ids = {ion.ion_id for ion, _ in terms}
    return "NH4(+)" in ids and bool(ids - {"NH4(+)"}) and ids - {"NH4(+)"} <= _WOEHLER_ANIONS


_NONMETAL_CATION_ELEMENTS: set[str] = set()


def _nonmetal_cation_elements() -> set[str]:
    """The non-metals and metalloids but hydrogen, filled once (the check runs on every reading the solver ranks)."""
    if not _NONMETAL_CATION_ELEMENTS:
        _NONMETAL_CATION_ELEMENTS.update(s for s in element_symbols() if not is_metal(s) and s != "H")
    return _NONMETAL_CATION_ELEMENTS


def reversed_polarity(terms) -> bool:
    """Whether a reading makes a non-metal (or metalloid) a monatomic cation beside a monatomic anion of a
    less electronegative element: Te(4+) with Ge(4-) for GeTe. An oxidation
    number gives the bonding electrons to the more electronegative partner (IUPAC Red Book 2005, IR-4.6.1),
    so such a reading is not a reading of the compound at all.

    >>> reversed_polarity([(get_ion("Te(4+)"), 1.0), (get_ion("Ge(4-)"), 1.0)])
    True
    >>> reversed_polarity([(get_ion("Ge(4+)"), 1.0), (get_ion("O(2-)"), 2.0)])
    False
    """
    # hydrogen keeps +1 beside the non-metals by convention (H2Te and H2Se are acids), whatever the scale says
    nonmetals = _NONMETAL_CATION_ELEMENTS or _nonmetal_cation_elements()
    cations = [ion.element for ion, _ in terms if ion.charge > 0 and ion.element in nonmetals and ion.monatomic]
    if not cations:
        return False
    anions = [ion.element for ion, _ in terms if ion.monatomic and ion.charge < 0]
    chi = {s: get_element(s).electronegativity_pauling for s in {*cations, *anions}}
    return any(chi[c] is not None and chi[a] is not None and chi[c] > chi[a] for c in cations for a in anions)


def _ligand_holder_exists(ion_hints, counts) -> bool:
    """Whether some polyatomic library ion of the formula's elements holds every hinted group (the read from the
    atoms is tried only then: it costs a second walk)."""
    present = set(counts)
    return any(not ion.monatomic and {s for s, _ in ion.composition} <= present and _holds_groups(ion, ion_hints)
               for ion in ion_library())


def _holds_groups(ion, ion_hints) -> bool:
    """Whether ``ion`` is a complex of the hinted groups: they are anions, its composition holds every one of them
    (as many as written), and the rest is other elements, its central atom and other ligands ([B(C2O4)2](-) holds two
    oxalates and a boron; [C4mim](+) holds the atoms of [C2mim](+) but is no complex of it).

    >>> _holds_groups(get_ion("B(C2O4)2(-)"), (("C2O4(2-)", 2.0),)), _holds_groups(get_ion("[C4mim](+)"), (("[C2mim](+)", 1.0),))
    (True, False)
    """
    left = dict(ion.composition)
    group_elements = set()
    for ion_id, n in ion_hints:
        group = get_ion(ion_id)
        if group.charge >= 0:
            return False
        for symbol, k in group.composition:
            left[symbol] = left.get(symbol, 0.0) - k * n
            group_elements.add(symbol)
    rest = {s for s, v in left.items() if v > _TOL}
    return all(v >= -_TOL for v in left.values()) and bool(rest) and not rest & group_elements


def _best(readings):
    """(cations, anions, alternatives, penalty) of the most plausible reading; None when
    no reading is plausible enough to be ionic (or none gives the electrons to the more
    electronegative element, :func:`reversed_polarity`)."""
    readings = [r for r in readings if not reversed_polarity(r[1])]
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
    if len(seen) > 1:
        # of the rest, one whose hydrogen sits in an anion (hydroxide, a hydrogen-oxoanion) rather than as a
        # bare proton beside metal cations: talc Mg3Si4O10(OH)2 is Mg(2+) with hydroxide and Si2O5(2-) sheets,
        # not H(+) with metasilicate (a proton in a solid is bonded to an oxygen; common practice)
        protons = {t: _bare_protons(ca) for t, ca in seen.items()}
        fewest_protons = min(protons.values())
        seen = {t: ca for t, ca in seen.items() if protons[t] <= fewest_protons + _TOL}
    if len(seen) > 1:
        # of the rest, one that gives each element one oxidation state: Na3V2(PO4)2O2F is V(4+) with oxide,
        # phosphate and fluoride, not V(3+) beside a metavanadate V(V) and a fluorophosphate (a mixed valence
        # hidden in two species; the reading with fewer distinct states is the simpler; common practice)
        split = {t: _split_elements(ca) for t, ca in seen.items()}
        fewest = min(split.values())
        seen = {t: ca for t, ca in seen.items() if split[t] == fewest}
    if len(seen) > 1:
        # of the rest, the oxide goes into the oxoanion: orthophosphate with fluoride or oxide rather than a
        # fluoro- or metaphosphate beside more free O(2-) (Na2FePO4F, KTiOPO4; Pauling's electrostatic valence
        # rule: the oxide is saturated by the most acidic centre; common practice)
        oxide = {t: sum(term.count for term in ca[1] if term.ion.ion_id == "O(2-)") for t, ca in seen.items()}
        least = min(oxide.values())
        seen = {t: ca for t, ca in seen.items() if oxide[t] <= least + _TOL}
    if len(seen) > 1:
        # and the C-bound metal of a cyano complex takes the lower state, its N-bound partner the higher: Prussian
        # blue KFe[Fe(CN)6] is Fe(3+) with hexacyanoferrate(II), the strong-field low-spin Fe(II) inside
        # (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 25; from memory)
        cyano = {t: sum(term.ion.charge * term.count for term in ca[1] if term.ion.family == "cyano-complex")
                 for t, ca in seen.items()}
        most = min(cyano.values())
        seen = {t: ca for t, ca in seen.items() if cyano[t] <= most + _TOL}
    if len(seen) > 1:
        # and, where the registry names this formula, the reading whose ions its name says: C2H8N2O4 is ammonium
        # oxalate, not 2-hydroxyethylammonium nitrate; H6N2O3S ammonium sulfamate, not hydrazinediium sulfite
        seen = _registry_named(seen)
    (_, (cations, anions)), *others = seen.items()
    return cations, anions, tuple(t for t, _ in others), best_penalty


def _ion_name_stems(ion) -> tuple[str, ...]:
    """The compact words of an ion's name and of the alternatives in its brackets that a compound's name would
    write: a cation's without its -ium ending (hydrazinium -> hydrazin, as in "hydrazine acetate"), an anion's
    whole (nitrate, not nitr, which nitrite shares); none shorter than five letters."""
    if ion.monatomic and ion.charge < 0:
        words = _anion_element_words().get(ion.element, [])  # bromide, not bromine
    else:
        main, _, rest = ion.name.partition(" (")
        words = [main, *re.split(r"[,;]", rest.rstrip(")"))] if rest else [main]
    stems = []
    for word in words:
        key = compact(word)
        if ion.charge > 0 and key.endswith("ium"):
            key = key[:-3]
        if len(key) >= 5:
            stems.append(key)
    return tuple(stems)


@once
def _anion_element_words() -> dict[str, list[str]]:
    """Element symbol -> the names of its monatomic anion (chloride, sulfide; scorer/data/name_words.csv)."""
    words: dict[str, list[str]] = {}
    for row in table("name_words.csv"):
        if row["kind"] == "anion_element":
            words.setdefault(row["value"], []).append(row["word"])
    return words


def _registry_named(seen: dict) -> dict:
    """Of tied readings (text -> (cations, anions)), the one whose every ion each of the registry's names of the
    formula writes (:func:`registry_names_of`), where every name writes that one reading and no other; all of them
    otherwise (C4H12ClN, which the registry lists as tetramethylammonium chloride and as two amine
    hydrochlorides, stays a tie)."""
    cations, anions = next(iter(seen.values()))
    counts: dict[str, float] = {}
    for term in (*cations, *anions):
        for symbol, k in term.ion.composition:
            counts[symbol] = counts.get(symbol, 0.0) + k * term.count
    names = [compact(name) for name in registry_names_of(hill_formula(counts))]
    if not names:
        return seen
    named = set()
    for name in names:
        full = {text for text, ca in seen.items()
                if all(any(stem in name for stem in _ion_name_stems(term.ion)) for term in (*ca[0], *ca[1]))}
        if len(full) != 1:
            return seen
        named |= full
    return {text: seen[text] for text in named} if len(named) == 1 else seen


def _bare_protons(cations_anions) -> float:
    """How many H(+) a reading holds beside a metal cation (0 without one: an acid's protons are its cation)."""
    cations = cations_anions[0]
    if not any(term.ion.monatomic and is_metal(term.ion.element) for term in cations):
        return 0.0
    return float(sum(term.count for term in cations if term.ion.ion_id == "H(+)"))


def _split_elements(cations_anions) -> int:
    """How many elements of a reading stand in more than one oxidation state across its ions."""
    states: dict[str, set] = {}
    for terms in cations_anions:
        for term in terms:
            ion = term.ion
            pairs = ((ion.element, ion.charge),) if ion.monatomic else ion.oxidation_states
            for symbol, state in pairs:
                states.setdefault(symbol, set()).add(round(float(state), 6))
    return sum(1 for found in states.values() if len(found) > 1)


@once
def _library_rank() -> dict[str, int]:
    return {ion.ion_id: i for i, ion in enumerate(ion_library())}


def _library_order(terms) -> tuple[int, ...]:
    """Ties go to the ions listed first in the library (ferrocyanide before ferricyanide)."""
    rank = _library_rank()
    return tuple(sorted(rank.get(ion.ion_id, -1) for ion, _ in terms if not ion.monatomic))


def _has_both_signs(terms) -> bool:
    return any(ion.charge > 0 for ion, _ in terms) and any(ion.charge < 0 for ion, _ in terms)


def _written_ligand_states(comp: ParsedFormula, counts: dict[str, float], charge: int):
    """Oxidation states of a complex ion written with its ligand anions named ("[Fe(C2O4)3]3-",
    "Fe(C2O4)3^3-"): each named ion's own states, and the elements left (the metal) balanced by the charge the
    named ions leave: Fe +3 in tris(oxalato)ferrate(III), where electronegativity alone gave C +4 and Fe -3.
    None when no ion is named, or the rest shares an element with a named ion.

    >>> from ionicity.scorer.formula import parse_formula
    >>> comp = parse_formula("[Fe(C2O4)3]3-")
    >>> _written_ligand_states(comp, dict(comp.counts), comp.charge)
    (('Fe', 3.0),)
    """
    if not comp.ion_hints:
        return None
    rest = dict(counts)
    states: list[tuple[str, float]] = []
    left = float(charge)
    for ion_id, n in comp.ion_hints:
        ion = get_ion(ion_id)
        for symbol, k in ion.composition:
            rest[symbol] = rest.get(symbol, 0.0) - k * n
        left -= ion.charge * n
        states.extend(ion.oxidation_states)
    rest = {s: n for s, n in rest.items() if abs(n) > _TOL}
    if not rest or any(n < 0 for n in rest.values()) or rest.keys() & {s for s, _ in states}:
        return None
    return tuple(states) + tuple(formal_oxidation_states(rest, left))


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
            oxidation_states=_written_ligand_states(comp, counts, charge) or formal_oxidation_states(counts, charge),
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
