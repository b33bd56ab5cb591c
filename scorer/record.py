"""Score one compound into one record: a dict with one value per output column."""
from __future__ import annotations

import dataclasses
import math
import re

from ionicity.scorer.applicability import family_decided
from ionicity.scorer.audit_rows import (
    CAPITALS_CODE, GLASS_CODES, audited_row, code_like_row, material_message, polymer_name, with_count_suggestion,
)
from ionicity.scorer.caching import once, per_input
from ionicity.scorer.cas import cas_check_digit_valid, registry_by_cas, trailing_cas, whole_cas
from ionicity.scorer.columns import descriptors, output_columns
from ionicity.scorer.dopants import doped_host, doping_note
from ionicity.scorer.elements import get_element, is_element_symbol, is_metal
from ionicity.scorer.formula import (
    FormulaError,
    deuterated_solvent,
    ParsedFormula,
    format_count,
    parse_formula,
)
from ionicity.scorer.ions import (
    decompose_anhydrous,
    format_ion_terms,
    format_oxidation_states,
)
from ionicity.scorer.grammar import iupac_formula
from ionicity.scorer.registry_formulas import inorganic_formula_listed
from ionicity.scorer.slips import registry_count_neighbours
from ionicity.scorer.substance import (
    formal_oxidation_states, formal_state_strain, listed_states, most_electronegative, usual_state,
)
from ionicity.scorer.ion_library import find_alias
from ionicity.scorer.isotopes import isotope_mass_shift_g_mol, isotope_text
from ionicity.scorer.melting import hydrate_melting_class
from ionicity.scorer.mixture import mixture_row
from ionicity.scorer.model import Decomposition, IonTerm, RowWarning, format_charge
from ionicity.scorer.name_reader import (
    ambiguous_name,
    formula_with_hydrate_word,
    known_word_name,
    parse_as_name,
    trivial_name_formula,
)
from ionicity.scorer.organic import molecule_descriptors, organic_molecule
from ionicity.scorer.prescan import ordinary_formula
from ionicity.scorer.solutions import split_grade_words, split_in_solvent, split_solution, split_stock_fields
from ionicity.scorer.electrolytes import solute_mole_fraction
from ionicity.scorer.lattice_inputs import _formula_unit_volume
from ionicity.scorer.systematic_name import hydrate_words
from ionicity.scorer.verdict import Verdict, finalise, with_warnings

_IONIC_CLASSES = frozenset({"ionic_salt", "ionic_liquid_pair", "acid", "base", "ion"})
_MOLECULAR_OR_LAYER = frozenset({"covalent_molecular", "chain_layer_solid"})

__all__ = ["score_formula", "score_row", "score_parsed", "normalized_formula", "molar_mass_g_mol", "empty_record",
           "without_grade_words"]


def empty_record() -> dict:
    """A record with every column empty: NaN for numbers, None for text."""
    names, _, empty = _layout()
    return dict(zip(names, empty))


def molar_mass_g_mol(counts: dict[str, float]) -> float:
    """Sum of standard atomic weights times counts.

    >>> molar_mass_g_mol({"Na": 1, "Cl": 1})
    58.4398
    """
    # standard atomic weights carry at most 5-6 significant figures; rounding
    # drops float noise such as 58.43976928000001 from the table
    return round(_unrounded_mass(tuple(counts.items())), 4)


@per_input(maxsize=65536)
def _unrounded_mass(counts: tuple[tuple[str, float], ...]) -> float:
    """Sum of standard atomic weights times counts, cached per composition
    (a hydrate adds its water to its salt's sum)."""
    return float(sum(get_element(s).atomic_weight * n for s, n in counts))


def _ion_text(term: IonTerm, bracket_polyatomic: bool) -> str:
    ion = term.ion
    label = ion.label
    count = "" if abs(term.count - 1) < 1e-9 else format_count(term.count)
    if ion.monatomic or label.startswith("["):
        return label + count
    if "(" in label or bracket_polyatomic:
        return f"[{label}]{count}"
    if count and len(ion.composition) > 1 or (count and ion.composition[0][1] != 1):
        return f"({label}){count}"
    return label + count


def normalized_formula(comp: ParsedFormula, dec: Decomposition) -> str:
    """One canonical string per compound.

    Ionic entries are written from their ions, cations then anions
    (``Fe2(SO4)3``, ``(NH4)2SO4``, ``K4[Fe(CN)6]``, ``[C4mim][BF4]``); a metal
    present in two oxidation states, covalent and metallic entries are written
    in IUPAC order without carbon (``TiCl4``, ``SiO2``; Red Book 2005,
    IR-4.4.2.1, Table VI) and in Hill order with it (``CCl4``, ``C6H12O6``).
    Lattice water follows as ``·nH2O``.
    """
    if dec.substance_class == "ion" and len(dec.cations + dec.anions) == 1:
        ion = (dec.cations + dec.anions)[0].ion
        return f"{ion.label}^{format_charge(ion.charge)}"
    if not dec.is_ionic or comp.charge != 0:
        return _inorganic_order(comp)
    if dec.substance_class == "acid" and any(t.ion.organic for t in dec.anions):
        return _inorganic_order(comp)
    # a metal in two oxidation states is written once (Fe3O4, Pb3O4)
    merged: dict[str, IonTerm] = {}
    for term in dec.cations + dec.anions:
        key = term.ion.element or term.ion.ion_id
        if key in merged:
            merged[key] = IonTerm(merged[key].ion, merged[key].count + term.count)
        else:
            merged[key] = term
    if any(abs(t.count - round(t.count)) > 1e-9 for t in merged.values()) and all(
            float(n).is_integer() for _, n in comp.counts):
        # a whole formula read at half a unit (GaCl2 as Ga(+)*0.5 with GaCl4(-)*0.5, HgCl as
        # Hg2(2+)*0.5 with Cl(-)): written as given, in IUPAC order, not with half counts
        return _inorganic_order(comp) + _hydrate_text(dec)
    ionic_liquid = any(t.ion.organic for t in dec.cations)
    text = "".join(_ion_text(t, ionic_liquid) for t in merged.values())
    return text + _hydrate_text(dec)


def _hydrate_text(dec: Decomposition) -> str:
    """The neutral parts and lattice water of a normalized formula (``·2NH3``, ``·5H2O``)."""
    text = "".join("·" + _adduct_text(p) for p in dec.neutral_parts)
    if dec.hydrate_water:
        water = format_count(dec.hydrate_water)
        text += "·" + ("" if water == "1" else water) + "H2O"
    return text


def _inorganic_order(comp: ParsedFormula) -> str:
    """``comp.canonical`` (Hill order) with the element part written in
    IUPAC order instead when there is no carbon (:func:`iupac_formula`):
    ``TiCl4``, ``SiO2``, ``SF6``, ``Cl2O7``; carbon compounds keep Hill
    order, and formulas of metals alone their alphabetical one."""
    # alloys and intermetallics keep their alphabetical order (Cu3Au, not AuCu3)
    if "C" in comp.as_dict() or all(is_metal(s) for s in comp.elements):
        return comp.canonical
    return iupac_formula(comp.counts) + comp.canonical[len(comp.hill):]


def _adduct_text(part: str) -> str:
    name, _, count = part.partition("*")
    return ("" if count == "1" else count) + name


def _water_suffix(water: float) -> str:
    if not water:
        return ""
    count = format_count(water)
    return "·" + ("" if count == "1" else count) + "H2O"


@per_input(maxsize=65536)
def _anhydrous_scores(counts, charge, ion_hints, neutral_adducts, structure_hint, hydrated=False):
    """Everything a record holds that does not depend on lattice water or on
    the spelling, computed once per anhydrous composition: the hydrates and
    the spellings of one salt share it.

    Returns (values, warnings, (value_notes, value_notes of a hydrate),
    formula_normalized without water, the values laid out as a row in
    column order).
    """
    comp = ParsedFormula(
        text="", counts=counts, charge=charge, ion_hints=ion_hints,
        neutral_adducts=neutral_adducts, structure_hint=structure_hint,
    )
    # a neutral organic molecule skips the ion search and the descriptors that need ions (scorer.organic)
    dec = None if hydrated else organic_molecule(comp)
    modules = descriptors() if dec is None else molecule_descriptors()
    if dec is None:
        dec = decompose_anhydrous(comp, hydrated)
    values: dict = {
        "substance_class": dec.substance_class,
        "cations": format_ion_terms(dec.cations),
        "anions": format_ion_terms(dec.anions),
        "oxidation_states": format_oxidation_states(dec.oxidation_states),
    }
    warnings = list(dec.notes)
    gaps: list[str] = []
    if dec.substance_class not in _IONIC_CLASSES and not dec.is_ionic:
        gaps.append(f"{dec.substance_class.replace('_', ' ')}: ion-based values do not apply")
    for descriptor in modules:
        result = descriptor(dec)
        values.update(descriptor.values(result))
        for note in result.notes:
            (warnings if isinstance(note, RowWarning) else gaps).append(note)
    _, position, empty = _layout()
    row = list(empty)
    for name, value in values.items():
        row[position[name]] = value
    verdict = _verdict(dec.substance_class, warnings, gaps)
    row[position["status"]] = verdict.status
    row[position["message"]] = verdict.message
    hydrate_notes = verdict.value_notes
    if dec.substance_class in _IONIC_CLASSES or dec.is_ionic:
        hydrate_notes = finalise(gaps=(_HYDRATE_NOTE, *gaps)).value_notes
    return values, tuple(warnings), (verdict.value_notes, hydrate_notes), normalized_formula(comp, dec), tuple(row)


def _verdict(substance_class: str, warnings: list[str], gaps: list[str]):
    # a formula no ions, molecule, network or metal could be found for is an
    # error; the solver's notes say why
    if substance_class == "unknown":
        return finalise(error=warnings[0] if warnings else "", warnings=warnings[1:], gaps=gaps)
    return finalise(warnings=warnings, gaps=gaps)


# the same words for every hydrate: how much water is in hydrate_water, and
# one text per salt keeps value_notes a small dictionary in the output
_HYDRATE_NOTE = (
    "descriptors are for the anhydrous salt (its lattice water, counted in hydrate_water, is not modelled;"
    " a hydrate usually melts or loses its water far lower)"
)


@once
def _layout() -> tuple[tuple[str, ...], dict[str, int], tuple]:
    """Column names, their positions and the empty row (NaN / None)."""
    columns = output_columns()
    names = tuple(c.name for c in columns)
    empty = tuple(math.nan if c.dtype == "float64" else None for c in columns)
    assert names[_STATUS_SLOT] == "status", "status must be the first output column (record._STATUS_SLOT)"
    return names, {n: i for i, n in enumerate(names)}, empty


def score_parsed(comp: ParsedFormula) -> dict:
    """Score a parsed composition; see :func:`score_formula`."""
    return dict(zip(_layout()[0], _parsed_row(comp)))


def flattened_hydrate(comp: ParsedFormula) -> ParsedFormula | None:
    """A salt hydrate written as one formula, its water counted into H and O (FeH14O11S, a registry's Hill
    formula of FeSO4·7H2O), read as the salt with its lattice water; ``None`` for any other formula.

    The sign is the reading: H(+) beside O(2-) or OH(-) in one solid is no salt (they are water). The
    most water is taken whose rest reads with neither H(+) nor O(2-) (Ba(OH)2·8H2O, not BaO·9H2O;
    common practice).

    >>> flattened_hydrate(parse_formula("FeH14O11S")).hydrate_water
    7.0
    >>> flattened_hydrate(parse_formula("FeSO4")) is None
    True
    """
    if comp.hydrate_water or comp.ion_hints or comp.charge or comp.isotopes or comp.neutral_adducts:
        return None  # the checks that cost nothing come first: this runs for every spelling scored
    counts = dict(comp.counts)
    if "H" not in counts or "O" not in counts or not all(float(n).is_integer() for n in counts.values()):
        return None
    # a neutral organic molecule (scorer.organic: the solver's own reading, without its ion search) holds no H(+)
    dec = organic_molecule(comp) or decompose_anhydrous(comp)
    protons = sum(t.count for t in dec.cations if t.ion.ion_id == "H(+)")
    bases = sum(t.count for t in dec.anions if t.ion.ion_id in ("O(2-)", "OH(-)"))
    if not protons or not bases:
        return None
    for water in range(int(min(counts["H"] // 2, counts["O"])), 0, -1):
        taken = {"H": 2 * water, "O": water}
        dry = tuple((s, n - taken.get(s, 0)) for s, n in comp.counts if n > taken.get(s, 0))
        salt = ParsedFormula(comp.text, dry, float(water))
        read = decompose_anhydrous(salt)
        if read.cations and not any(t.ion.ion_id == "H(+)" for t in read.cations) and not any(
                t.ion.ion_id == "O(2-)" for t in read.anions):
            note = (f"{comp.text!r} holds its water of crystallisation in the formula (H(+) beside O(2-) or OH(-) is"
                    f" water): read as the hydrate with {water:g} H2O")
            return ParsedFormula(comp.text, dry, float(water), notes=(*comp.notes, note))
    return None


def _parsed_row(comp: ParsedFormula) -> tuple:
    # a salt hydrate written as one formula, its water counted in (FeH14O11S): the salt with its water
    flat = flattened_hydrate(comp)
    if flat is not None:
        return _parsed_row(flat)
    # once per spelling: what is not shared with the salt's other spellings is
    # its lattice water (a few distinct counts, each worded once) and its mass
    key = (comp.counts, comp.charge, comp.ion_hints, comp.neutral_adducts, comp.structure_hint)
    values, warnings, gaps, formula, base = _anhydrous_scores(*key)
    water = comp.hydrate_water
    # the hydrate of a molecular halide is a salt of the aqua ion ([Al(H2O)6]Cl3):
    # only those few hydrates are scored apart from their anhydrous compound
    if (water and values["substance_class"] in _MOLECULAR_OR_LAYER
            and family_decided(organic_molecule(comp) or decompose_anhydrous(comp))):
        values, warnings, gaps, formula, base = _anhydrous_scores(*key, True)
    if water and values["substance_class"] in _METALLIC_CLASSES and all(is_metal(s) for s, _ in comp.counts):
        # a metal or an alloy written with water (Ca·H2O; Ca(OH2), a slip of Ca(OH)2): no metal holds water of
        # crystallisation, and the alkali and alkaline-earth metals react with it (common practice)
        return _error_row(_metal_with_water(formula, comp.text))
    formula_at, name_at, water_at, mass_at, status_at, message_at, notes_at = _slots()
    row = list(base)
    mass = _unrounded_mass(comp.counts)
    if water:
        suffix, words, water_mass = _hydrate_parts(float(water))
        row[formula_at] = formula + suffix
        traded = None
        if row[name_at]:
            row[name_at] += words
            traded = _trade_name_of_another(row[name_at], row[formula_at])
            if traded:  # "ammonium molybdate tetrahydrate" is what the trade sells as the heptamolybdate
                row[name_at] = None
        mass += water_mass
    else:
        row[formula_at] = formula
    row[water_at] = float(water)
    if water:  # a water-rich salt hydrate melts in its own water (scorer.melting.hydrate_melting_class)
        class_at, route_at = _melting_slots()
        anions = row[_layout()[1]["anions"]] or ""
        row[class_at] = hydrate_melting_class(row[class_at], row[route_at], float(water),
                                              oxide_only=bool(anions) and all(
                                                  part.startswith("O(2-)") for part in anions.split(";")))
    if comp.isotopes:  # D2O: scored as water above, written and weighed as D2O here
        mass += isotope_mass_shift_g_mol(comp.isotopes, get_element("H").atomic_weight)
        _write_isotopes(row, comp)
    # per formula unit with its lattice water
    row[mass_at] = round(mass, 4)
    if comp.notes:  # a spelling-specific warning (an ignored annotation, an ambiguous charge)
        verdict = _verdict(values["substance_class"], [*comp.notes, *warnings], [])
        row[status_at] = verdict.status
        row[message_at] = verdict.message
    if row[status_at] == "error":
        # a failed row carries no half-read formula, mass or score
        return _error_row(row[message_at])
    row[notes_at] = gaps[1] if water else gaps[0]
    if water and traded:
        row[notes_at] = ("; ".join(filter(None, (row[notes_at], traded))))
    if "(" in comp.text and row[status_at] == "ok":
        unread = _written_group_not_read(comp.text, row[_layout()[1]["anions"]] or "")
        if unread is not None:
            return _warned(tuple(row), unread)
    return tuple(row)


# an oxoanion or hydroxide written as a bracketed group right after a metal ("Fe(NO3)", "Ca(SO4)") names that ion
_WRITTEN_GROUP = re.compile(r"([A-Z][a-z]?)\d*(?:\.\d+)?\((NO3|SO4|PO4|CO3|ClO4|ClO3|BrO3|IO3|OH|HSO4|H2PO4|HPO4|HCO3"
                            r"|C2O4|CrO4|MnO4)\)")


def _written_group_not_read(text: str, anions: str) -> str | None:
    """A warning where a bracketed oxoanion written after a metal outside square brackets ("Fe(NO3)") is not among
    the reading's anions: the counts as written balance only by breaking the group (Fe(3+) with oxide and nitrite),
    so a count was most likely lost; None otherwise."""
    if "[" in text:
        return None  # a complex's ligands (K[Al(OH)4], [Co(NH3)5(NO2)]Cl2) are not the salt's anions
    for m in _WRITTEN_GROUP.finditer(text):
        if not is_metal(m.group(1)):
            continue  # B(OH)3, C6H4(OH)2: an acid's or a molecule's OH groups
        ion = find_alias(m.group(2), exact_case=True).ion_id  # the library's ion of that label (NO3 -> NO3(-))
        if ion not in anions:
            return (f"the group ({m.group(2)}) written after {m.group(1)} is not {ion} in the reading that balances"
                    f" the counts as written: a count may be missing (check the formula)")
        counted = _group_count_lost(text, m)
        if counted is not None:
            return (f"the group ({m.group(2)}) written in brackets after {m.group(1)} has no count, and the registry's"
                    f" tables list no compound of this formula but list {counted}: a count was most likely lost;"
                    f" check it (did you mean {counted}?)")
    return None


def _group_count_lost(text: str, m: re.Match) -> str | None:
    """The spelling of ``text`` with a count of 2 to 4 after the bracketed group ``m``, where that group has none
    written and the registry's tables list the counted composition but not the one as written ("Cu(NO3)": CuNO3
    is copper(I) nitrate, which no table lists, Cu(NO3)2 is listed); None otherwise ("Ag(NO3)", "Tl(OH)")."""
    end = m.end()
    if end < len(text) and (text[end].isdigit() or text[end] == "."):
        return None
    try:
        if inorganic_formula_listed(dict(parse_formula(text).counts)):
            return None
    except FormulaError:
        return None
    for n in (2, 3, 4):
        proposal = text[:end] + str(n) + text[end:]
        try:
            if inorganic_formula_listed(dict(parse_formula(proposal).counts)):
                return proposal
        except FormulaError:
            return None
    return None


@per_input(maxsize=65536)
def _trade_name_of_another(name: str, formula: str) -> str | None:
    """A note when a generated hydrate name is a trivial name of another compound (scorer/data/trivial_names.csv),
    else None: ``ammonium molybdate tetrahydrate`` names (NH4)6Mo7O24·4H2O in the trade, not (NH4)2MoO4·4H2O."""
    meant = trivial_name_formula(name)
    if meant is None or meant == formula:
        return None
    return (f"systematic_name: not given; the generated name {name!r} is the trade name of {meant}"
            " (scorer/data/trivial_names.csv)")


_METALLIC_CLASSES = frozenset({"metallic", "intermetallic"})
# (a metal-rich phosphide or nitride, CrP, FeN, is read as intermetallic too, and its hydrate is left as it was)
# a water ligand written OH2 after a metal with nothing else: a hydroxide whose count slipped inside the bracket
_AQUA_FOR_HYDROXIDE = re.compile(r"\(OH2\)(?![\d.])")


def _metal_with_water(formula: str, text: str) -> str:
    """The error of a metal or alloy written with water of crystallisation, with the hydroxide where the text
    wrote the water as an OH2 group (Ca(OH2) for Ca(OH)2).

    >>> _metal_with_water("Ca", "Ca(OH2)").endswith("check the formula (Ca(OH)2?)")
    True
    """
    message = (f"{formula} is written with water of crystallisation, which no metal holds: a hydroxide is written"
               " with OH, a salt hydrate with its anion (CaCl2·2H2O); check the formula")
    if text and _AQUA_FOR_HYDROXIDE.search(text):
        message += f" ({_AQUA_FOR_HYDROXIDE.sub('(OH)2', text.strip())}?)"
    return message


def _write_isotopes(row: list, comp: ParsedFormula) -> None:
    """The columns that name hydrogen, with the hydrogens written D or T again."""
    hydrogens = comp.total_counts.get("H", 0.0)
    formula_at = _slots()[0]
    row[formula_at] = isotope_text(row[formula_at], comp.isotopes, hydrogens, whole_formula=True)
    for at in _isotope_slots():
        row[at] = isotope_text(row[at], comp.isotopes, hydrogens)


@once
def _isotope_slots() -> tuple[int, ...]:
    position = _layout()[1]
    return tuple(position[name] for name in ("cations", "anions", "oxidation_states"))


@once
def _slots() -> tuple[int, ...]:
    """Positions of the columns a spelling sets itself (see :func:`_parsed_row`)."""
    position = _layout()[1]
    return tuple(position[name] for name in (
        "formula_normalized", "systematic_name", "hydrate_water", "molar_mass_g_mol", "status", "message",
        "value_notes",
    ))


_STATUS_SLOT = 0  # scorer.columns puts status first (checked in _layout)
# the shape of a CAS Registry Number anywhere in a cell (digits, two digits, one check digit)
_CAS_DIGITS = re.compile(r"\d{2,7}-\d{2}-\d(?!\d)")


@once
def _melting_slots() -> tuple[int, int]:
    position = _layout()[1]
    return position["melting_class"], position["mp_route"]


@per_input(maxsize=1024)
def _hydrate_parts(water: float) -> tuple[str, str, float]:
    """The ``·nH2O`` suffix, the hydrate words (with their space) and the
    mass of ``water`` lattice water molecules: the same for every salt."""
    return _water_suffix(water), " " + hydrate_words(water), water * _unrounded_mass(_WATER)


_WATER = (("H", 2.0), ("O", 1.0))



def _error_row(message: str) -> tuple:
    _, position, empty = _layout()
    row = list(empty)
    verdict = finalise(error=message)
    row[position["status"]] = verdict.status
    row[position["message"]] = verdict.message
    return tuple(row)


@per_input(maxsize=65536)
def _score_text(text: str) -> tuple:
    # one scan: an ordinary formula (most texts) skips the mixture, solution and slip readers
    if text.endswith(")"):
        doped = _doped_row(text)  # "CsI(Tl)": a host and its activator, not one formula
        if doped is not None:
            return doped
    comp = ordinary_formula(text)
    if comp is None:
        return _read_row(text)
    capitals = CAPITALS_CODE.fullmatch(text)
    if (capitals or text in GLASS_CODES) and polymer_name(text):
        return _error_row(material_message(text))  # "PVC", "PTFE", "PBS", "LiPON": a polymer, medium or glass
    row = _parsed_row(comp)
    if capitals:
        # capitals alone, the shape of an abbreviation as much as of a formula (PBS, SDS, KCN)
        row = code_like_row(row, text, _layout()[1], _error_row)
    return _counted(row, text)


_SYMBOL = re.compile(r"[A-Z][a-z]?")


def _unlisted_formula(text: str) -> ParsedFormula | None:
    """``text`` parsed, where it is a neutral formula whose composition the registry's identifier tables list no
    compound of (:func:`scorer.registry_formulas.inorganic_formula_listed`); None otherwise."""
    try:
        comp = parse_formula(text)
    except FormulaError:
        return None
    return None if comp.charge or inorganic_formula_listed(dict(comp.counts)) else comp


@per_input(maxsize=16384)
def _unknown_molecule(normalized: str, text: str) -> str | None:
    """A warning for a small inorganic molecule that the registry's tables list no compound of, where a count
    was most likely lost: its formal oxidation states are strained (``SO4``: S at +6 leaves O at -1.5;
    ``HClO5``, ``NO4``; :func:`scorer.substance.formal_state_strain`), or a spelling one count away is a listed
    compound while an element beside the most electronegative one is at zero or below (``H2SO``, S 0 -> H2SO4;
    ``H3PO``, P -1 -> H3PO3 or H3PO4; :func:`scorer.slips.registry_count_neighbours`).
    None for organic molecules (carbon with hydrogen: the tables hold a small share of them), metals, hydrates
    and anything listed. These had read ``ok`` with S(0), or with oxygen positive beside sulfur at -2."""
    symbols = set(_SYMBOL.findall(normalized))
    if len(symbols) < 2 or {"C", "H"} <= symbols or any(is_metal(s) for s in symbols) or not text \
            or any(c in text for c in "·.*+ "):
        return None
    comp = _unlisted_formula(text)
    if comp is None or set(dict(comp.counts)) != symbols:
        return None
    counts = dict(comp.counts)
    states = formal_oxidation_states(counts)
    strain = formal_state_strain(counts, states)
    most = most_electronegative(tuple(counts))
    if strain is None and not any(value < 1e-9 and s not in ("H", most) and value != usual_state(s)
                                  for s, value in states):
        # every element but the most electronegative above zero or at its usual negative state (NO2Cl: N +5,
        # Cl -1; Cl2O6, XeO4): a compound the tables miss; a lost count leaves the centre at zero or below
        # (H2SO for H2SO4: S 0; H3PO: P -1)
        return None
    neighbours = registry_count_neighbours(text)
    if strain is None and not neighbours:
        return None
    message = "no compound of this formula is listed in the registry's tables"
    if strain is not None:
        message += f", and its formal oxidation states are strained ({strain})"
    message += ": a count may be missing from the formula as written; check it"
    return message + (f" (did you mean {' or '.join(neighbours)}?)" if neighbours else "")


# cations that form simple peroxides and superoxides (groups 1 and 2; zinc, cadmium and mercury peroxides too;
# Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 14.2.3; from memory)
_PEROXIDE_FORMERS_OTHER = frozenset({"Zn", "Cd", "Hg"})
_PEROXIDE_IONS = frozenset({"O2(2-)", "O2(-)"})


@per_input(maxsize=16384)
def _unlisted_salt(text: str) -> str | None:
    """A warning for a salt written in a short formula that the registry's tables list no compound of, whose
    reading needs what no stocked compound has, where a spelling one count away is listed: a metal cation in a
    state mendeleev and :data:`scorer.substance._COMMON_STATES` call uncommon (PbCl3 as Pb(3+), KMnO3 as
    Mn(5+), AgNO4 as Ag(3+), CuO2 as Cu(4+)), one metal as cations in two states (MnO3) or as a cation and in an
    anion (Fe2O4 as Fe(2+) ferrate(VI); Pb3O4, listed, stays), or a peroxide beside a
    cation that forms none (Al2O4, TiO3). None otherwise: peroxo and manganate anions, superoxides and the
    many real salts the tables miss (KO2, KHSO5, NaBO3, K2MnO4, LiNiO2) keep their reading."""
    if len(text) > 16 or any(c in text for c in "·.*+ [(") or not text[:1].isupper():
        return None
    comp = _unlisted_formula(text)
    if comp is None:
        return None
    dec = decompose_anhydrous(comp)
    reason = None
    states: dict[str, set] = {}
    for t in dec.cations:
        if t.ion.monatomic and is_metal(t.ion.element):
            states.setdefault(t.ion.element, set()).add(t.ion.charge)
            if dict(listed_states(t.ion.element)).get(t.ion.charge, True):
                reason = f"{t.ion.ion_id}, a state its salts seldom hold"
    mixed = [e for e, found in states.items() if len(found) > 1]
    mixed += [e for e in states for t in dec.anions if not t.ion.monatomic and e in dict(t.ion.composition)]
    if mixed:
        reason = f"{mixed[0]} in two states"
    if reason is None and any(t.ion.ion_id in _PEROXIDE_IONS for t in dec.anions) and any(
            not t.ion.monatomic or get_element(t.ion.element).group not in (1, 2)
            and t.ion.element not in _PEROXIDE_FORMERS_OTHER for t in dec.cations):
        reason = "a peroxide beside a cation that forms none"
    if reason is None:
        return None
    neighbours = registry_count_neighbours(text)
    if not neighbours:
        return None
    return (f"no compound of this formula is listed in the registry's tables, and its reading needs {reason}: a"
            f" count may be missing from the formula as written; check it (did you mean {' or '.join(neighbours)}?)")


def _counted(row: tuple, text: str) -> tuple:
    """``row``, where it is an error or warning whose formula most likely lost a count, with the complete
    formulas named (:func:`scorer.audit_rows.with_count_suggestion`); one check of the status for the rest.
    An acceptor-doped oxide written with the ideal oxygen count is read with its oxygen vacancies
    (:func:`_oxygen_vacancy_row`)."""
    if row[_STATUS_SLOT] == "ok":
        position = _layout()[1]
        cls = row[position["substance_class"]]
        if cls == "covalent_molecular":
            unknown = _unknown_molecule(row[position["formula_normalized"]] or "", text.strip())
        elif cls == "ionic_salt":
            unknown = _unlisted_salt(text.strip())
        else:
            return row
        return row if unknown is None else _warned(row, unknown)
    vacancies = _oxygen_vacancy_row(row, text)
    return vacancies if vacancies is not None else with_count_suggestion(row, text, _layout()[1])


# the most oxygen a vacancy reading may take away, as a share of the oxygen written: acceptor-doped perovskites
# and fluorites lose a few per cent (BaZr0.8Y0.2O2.9: 3 %; Zr0.85Y0.15O1.93: 4 %; common practice)
_MAX_VACANCY_SHARE = 0.1


def _oxygen_vacancy_row(row: tuple, text: str) -> tuple | None:
    """The row of an oxide whose metals are substituted in fractions (an acceptor-doped perovskite or
    fluorite: BaCe0.8Y0.2O3, Zr0.92Y0.08O2, La0.8Sr0.2Ga0.8Mg0.2O3) and whose written oxygen no ions
    balance, read with the oxygen vacancies the acceptors bring: each acceptor of one charge below the
    site's takes half an oxide ion away (Kroger-Vink: 2 Y'_Zr per V_O; Kroger & Vink, Solid State
    Physics 3, 1956, 307; from memory). The smallest such deficit that balances, within
    :data:`_MAX_VACANCY_SHARE` of the oxygen, is taken, and said; None when there is none or the row
    has another fault."""
    message = row[_layout()[1]["message"]] or ""
    if row[_STATUS_SLOT] != "error" or "no charge-balanced set of ions found" not in message:
        return None
    try:
        comp = parse_formula(text)
    except FormulaError:
        return None
    counts = comp.as_dict()
    oxygen = counts.get("O", 0.0)
    if not oxygen or comp.charge or comp.ion_hints or comp.neutral_adducts or comp.hydrate_water:
        return None
    metals = {s: n for s, n in counts.items() if s != "O"}
    if not metals or not all(is_metal(s) for s in metals):
        return None
    minor = sorted(n for n in metals.values() if abs(n - round(n)) > 1e-6 and n < 0.5)
    if not minor:
        return None
    deficits = sorted({round(k * (a + b) / 2, 6) for k in (1, 2) for i, a in enumerate(minor)
                       for b in (0.0, *minor[i + 1:])})
    for deficit in deficits:
        if deficit <= 0 or deficit > _MAX_VACANCY_SHARE * oxygen:
            continue
        left = round(oxygen - deficit, 6)
        vacant = dataclasses.replace(comp, counts=tuple((s, left if s == "O" else n) for s, n in comp.counts))
        candidate = _parsed_row(vacant)
        if candidate[_STATUS_SLOT] == "error":
            continue
        return _warned(candidate, f"no ions balance the oxygen as written ({format_count(oxygen)}): read with oxygen"
                                  f" vacancies, O{format_count(left)} (delta = {format_count(deficit)}), as an"
                                  f" acceptor-doped oxide has them; write the oxygen count, e.g."
                                  f" O{format_count(left)} or O{format_count(oxygen)}-δ")
    return None


def _read_row(text: str) -> tuple:
    """The row of ``text`` through every reader (what an ordinary formula skips)."""
    # (a field follows a space, comma or "#": a cell without one pays no call here)
    stock_line = split_stock_fields(text) if (" " in text or "," in text or "#" in text) else None
    if stock_line is not None:
        # a stock line's lot, catalogue, expiry or shelf after the compound: the compound's row, whatever reads it
        body, words = stock_line
        return _warned(score_row(body), f"ignored the grade, lot or location words {words!r}")
    doped = _doped_row(text) if (":" in text or text.endswith(")")) else None
    if doped is not None:
        return doped
    cas = _cas_row(text) if "-" in text and _CAS_DIGITS.search(text) else None
    if cas is not None:
        return cas
    deuterated = _deuterated_name_row(text) if "-d" in text else None
    if deuterated is not None:
        return deuterated
    stock = _stock_symbol_row(text) if "(" in text and _STOCK_SYMBOL.search(text) else None
    if stock is not None:
        return stock
    buffer = split_solution(text) if "pH" in text else None
    if buffer is not None and buffer.concentration.startswith("pH"):
        # a buffer's pH is no mixture component: "Tris-HCl pH 8.0", "KH2PO4-K2HPO4 pH 7"
        mixture = mixture_row(buffer.solute, score_row)
        if mixture is not None:
            return _warned(mixture, f"a buffer solution ({buffer.concentration}): the values are for the components,"
                                    " not for the solution")
    else:
        mixture = mixture_row(text, score_row)
        if mixture is not None:
            return mixture
    electrolyte = _ionic_solvent_row(text) if " in " in text or "+" in text else None
    if electrolyte is not None:
        return electrolyte
    # the audit (a solution's concentration, a typing slip) decides which text is scored
    return _counted(audited_row(text, _plain_row, _error_row, _layout()[1], _parsed_row), text)


_IONIC_SOLVENT_CLASSES = frozenset({"ionic_liquid_pair", "ionic_salt"})


def _ionic_solvent_row(text: str) -> tuple | None:
    """The mixture row of a solute in an ionic liquid or a molten salt written as a solution with its amount
    (``0.5 M LiTFSI in [C4mpyr][TFSI]``, ``[C4mim][BF4] + 1 mol/kg LiBF4``): the amount as mole fractions
    (:func:`scorer.electrolytes.solute_mole_fraction`), scored as the mixture of the two by
    :func:`scorer.mixture.mixture_row`, with the conversion in ``value_notes`` and the amount in
    ``concentration_as_written``. None for a molecular solvent (the solute's row, as before), an amount that
    does not convert, or a side that does not read as one compound."""
    solution = split_in_solvent(text)
    if solution is None or not solution.solvent or not solution.concentration:
        return None
    position = _layout()[1]
    solvent, solute = score_row(solution.solvent), score_row(solution.solute)
    if (solvent[_STATUS_SLOT] == "error" or solute[_STATUS_SLOT] == "error"
            or solvent[position["substance_class"]] not in _IONIC_SOLVENT_CLASSES
            or solute[position["substance_class"]] == "mixture"):
        return None
    masses = (solute[position["molar_mass_g_mol"]], solvent[position["molar_mass_g_mol"]])
    if not all(isinstance(m, float) and m > 0 for m in masses):
        return None
    found = solute_mole_fraction(solution.concentration, masses[0], masses[1],
                                 _formula_unit_volume_nm3(solute[position["formula_normalized"]]),
                                 _formula_unit_volume_nm3(solvent[position["formula_normalized"]]))
    if found is None:
        return None
    x, how = found
    share = f"{100 * x:.5g}-{100 * (1 - x):.5g} mol%"
    row = mixture_row(f"{solution.solute} + {solution.solvent} ({share})", score_row)
    if row is None or row[_STATUS_SLOT] == "error":
        return None
    row = list(row)
    note = (f"an electrolyte: {solution.concentration} of {solution.solute} in the ionic solvent"
            f" {solution.solvent}, scored as their mixture at a solute mole fraction of {x:.4g} ({how})")
    row[position["value_notes"]] = "; ".join(filter(None, (note, row[position["value_notes"]])))
    row[position["concentration_as_written"]] = solution.concentration
    return tuple(row)


def _formula_unit_volume_nm3(formula: str | None) -> float:
    """The formula-unit volume of a salt from its ions (:func:`scorer.lattice_inputs._formula_unit_volume`),
    NaN where it has none."""
    try:
        dec = decompose_anhydrous(parse_formula(formula or ""))
    except FormulaError:
        return math.nan
    if not dec.is_ionic:
        return math.nan
    volume, _ = _formula_unit_volume(dec.cations, dec.anions)
    return float(volume)


def _warned(row: tuple, note: str) -> tuple:
    """``row`` with ``note`` among its warnings (an ``ok`` row becomes ``warning``; an error stays one)."""
    position = _layout()[1]
    verdict = with_warnings(Verdict(row[_STATUS_SLOT], row[position["message"]] or "",
                                    row[position["value_notes"]] or ""), [note])
    out = list(row)
    out[_STATUS_SLOT], out[position["message"]] = verdict.status, verdict.message
    return tuple(out)


def _cas_row(text: str) -> tuple | None:
    """The row of a cell that is a CAS Registry Number (``7647-14-5``) or ends with one (``Sodium chloride
    [7647-14-5]``): the number's check digit checked, the registry's compound read or compared
    (:mod:`scorer.cas`); None for any other text."""
    number = whole_cas(text)
    if number is not None:
        if not cas_check_digit_valid(number):
            return _error_row(f"{text.strip()!r} is written as a CAS Registry Number, but its check digit does not"
                              " hold (a digit mistyped?); write the formula or the name")
        entry = registry_by_cas(number)
        if entry is None:
            return _error_row(f"CAS Registry Number {number} is not in the registry table read here"
                              " (scorer/data/registry_names.csv, from the package chemicals); write the formula or"
                              " the name")
        return _warned(score_row(entry[0]), f"read the CAS Registry Number {number} as {entry[1]}, {entry[0]}"
                                            " (registry table of the package chemicals)")
    found = trailing_cas(text)
    if found is None:
        return None
    rest, number = found
    row = score_row(rest)
    if not cas_check_digit_valid(number):
        return _warned(row, f"the CAS Registry Number {number} written with it fails its check digit (a digit"
                            " mistyped?): the text before it was read, unchecked")
    entry = registry_by_cas(number)
    if entry is None:
        return row
    position = _layout()[1]
    if row[_STATUS_SLOT] == "error":
        return _warned(score_row(entry[0]), f"{rest!r} was not read; read the CAS Registry Number {number} written"
                                            f" with it as {entry[1]}, {entry[0]} (registry table of the package"
                                            " chemicals)")
    try:
        same = parse_formula(entry[0]).total_counts == parse_formula(row[position["formula_normalized"]]).total_counts
    except FormulaError:
        return row  # a mixture or a written-out ion the parser gives back in another notation: not compared
    if same:
        return row
    return _warned(row, f"the CAS Registry Number {number} written with it names {entry[1]} ({entry[0]}), not the"
                        f" compound read ({row[position['formula_normalized']]}): check which is meant")


# an element symbol with its Stock numeral, as inventories write it: "Fe(III) chloride", "Cu(II)SO4" (common
# practice; the IUPAC Red Book writes the numeral after the element's name, IR-5.4.2.2)
_STOCK_SYMBOL = re.compile(r"\b([A-Z][a-z]?)\s?\((I|II|III|IV|V|VI|VII|VIII)\)")
_ROMAN = {"I": 1, "II": 2, "III": 3, "IV": 4, "V": 5, "VI": 6, "VII": 7, "VIII": 8}


def _stock_symbol_row(text: str) -> tuple | None:
    """The row of a text that writes a metal's symbol with its Stock numeral: before an anion's name
    ("Fe(III) chloride" is read as iron(III) chloride) or inside a formula ("Cu(II)SO4" as CuSO4, with the
    state checked against the reading); None for any other text."""
    m = _STOCK_SYMBOL.search(text)
    symbol, numeral = m.group(1), m.group(2)
    if not is_element_symbol(symbol) or not is_metal(symbol):
        return None
    rest = text[m.end():]
    if rest[:1].isspace() and re.match(r"\s+[a-z]", rest):
        # the anion's name follows: the element's name with the numeral is the Stock name
        named = text[:m.start()] + get_element(symbol).name.lower() + f"({numeral})" + rest
        return _warned(score_row(named), f"read {symbol}({numeral}) in {text.strip()!r} as the element's name with"
                                         f" its Stock numeral: {named.strip()!r}")
    row = score_row(text[:m.start()] + symbol + rest)
    if row[_STATUS_SLOT] == "error":
        return None
    written = _ROMAN[numeral]
    states = dict(part.split(":") for part in (row[_layout()[1]["oxidation_states"]] or "").split(";") if ":" in part)
    read = states.get(symbol)
    if read is not None and abs(float(read) - written) < 1e-6:
        return _warned(row, f"read the Stock numeral of {symbol}({numeral}) in {text.strip()!r} as written: the formula"
                            f" balances with {symbol} +{written}")
    return _warned(row, f"{symbol}({numeral}) is written in {text.strip()!r}, but the formula balances with {symbol}"
                        f" {read or 'in another state'}: check the formula")


# a solvent's name with its deuteration as NMR catalogues write it: "Chloroform-d", "Methanol-d4", "Acetone-d6"
_DEUTERATED_NAME = re.compile(r"^\s*(?P<name>[A-Za-z][A-Za-z0-9 ,()']*?)\s*-\s*d(?P<n>\d{0,2})\s*$")


def _deuterated_name_row(text: str) -> tuple | None:
    """The row of a named solvent with every hydrogen deuterated (``Chloroform-d`` is CDCl3, ``Methanol-d4``
    CD3OD; the count after d is the molecule's hydrogen count, as NMR solvent catalogues write it; common
    practice); None for any other text or a count that is not the molecule's."""
    m = _DEUTERATED_NAME.match(text)
    if m is None or deuterated_solvent(text) is not None:
        return None  # not a name, or a laboratory code the parser reads itself (DMSO-d6)
    comp = parse_as_name(m.group("name")) or known_word_name(m.group("name"))
    counts = dict(comp.counts) if comp is not None and not comp.hydrate_water else {}
    if not counts.get("H") or counts["H"] != int(m.group("n") or 1):
        return None
    formula = "".join(f"{'D' if s == 'H' else s}{format_count(n) if n != 1 else ''}" for s, n in counts.items())
    return _warned(score_row(formula), f"read {text.strip()!r} as {m.group('name').strip()} with every hydrogen"
                                       f" deuterated, {formula} (common practice)")


def _doped_row(text: str) -> tuple | None:
    """The row of a doped material (``Y2O3:Eu``, ``Nd:YAG``, ``CsI(Tl)``): its host's row with the dopants
    named (:mod:`scorer.dopants`); None for any other text."""
    doping = doped_host(text)
    if doping is None:
        return None
    row = score_row(doping.host)
    return _warned(row, doping_note(doping, row[_layout()[1]["formula_normalized"]]))


def _plain_row(text: str) -> tuple:
    try:
        comp = parse_formula(text)
    except FormulaError as exc:
        comp = parse_as_name(text)  # a name typed in the formula column ("choline chloride")
        if comp is None:
            comp = _with_hydrate_word(text)
        if comp is None:
            comp = without_grade_words(text)
            if comp is None:
                if not _LOWER_WORD.search(text):
                    return _error_row(str(exc))
                return _error_row(material_message(text) or _unread_text_message(text, exc))
    return _parsed_row(comp)


# letters, spaces and the punctuation of names only, starting with a lower-case word or holding a space between
# words, or one capitalised word: "acetone", "sodium dodecyl sulfate", "Bleach solution", "Unknown" (not "NaCI" or
# "K4[Fe(CN)6")
_NAME_LIKE = re.compile(r"(?=.*[a-z]{3})(?:[a-z][A-Za-z0-9(),'-]*|[A-Z][a-z]{3,}|[A-Za-z][A-Za-z0-9(),'-]*(?:\s+[A-Za-z0-9(),'-]+)+)")


_LOWER_WORD = re.compile(r"[a-z]{3}")


def _unread_text_message(text: str, exc: FormulaError) -> str:
    """The error of a cell that is neither a formula nor a name the reader knows: a word-like text says that
    names are read too and which, then what the formula grammar found."""
    stripped = " ".join(text.split())
    options = ambiguous_name(stripped) if _NAME_LIKE.fullmatch(stripped) else ()
    if options:
        fits = (f"more than one compound fits: {', '.join(options)}" if len(options) > 1 else
                f"the one compound of the registry that fits is {options[0]}, but others may exist")
        return (f"{stripped!r} gives no oxidation state, and {fits}; write the formula, or the name with its"
                f" oxidation state (as 'iron(III) chloride' for FeCl3)")
    if _NAME_LIKE.fullmatch(stripped):
        return (f"{stripped!r} is neither a formula nor a name the name reader knows (it reads inorganic salts,"
                f" acids, bases and ionic liquids by systematic, Stock and trivial names, e.g. 'copper(II) sulfate"
                f" pentahydrate', and handbook names such as 'acetone'); write the formula instead (as a formula:"
                f" {exc})")
    return str(exc)


def _with_hydrate_word(text: str):
    """A formula followed by its hydrate word ("CuCl2 dihydrate") parsed with its water; None otherwise."""
    written = formula_with_hydrate_word(text)
    if written is None:
        return None
    try:
        return parse_formula(written).respelled(text)
    except FormulaError:
        return None


def without_grade_words(text: str):
    """The formula or name before grade and form words ("NaOH pellets", "Na2SO4
    anhydrous"), with a note naming the words left out; None when there are none
    or the rest does not read either."""
    body, words = split_grade_words(text)
    if words is None:
        return None
    try:
        comp = parse_formula(body)
    except FormulaError:
        # a name, or one word the vocabulary holds as a name ("Tin granules", "Iron filings")
        comp = parse_as_name(body) or known_word_name(body)
        if comp is None:
            return None
    notes = (*comp.notes, f"ignored the grade or form words {words!r}")
    if _FINE_FORM.search(words) and comp.counts and all(is_metal(s) for s, _ in comp.counts):
        notes = (*notes, _FINE_METAL_CAUTION)
    return comp.respelled(text, notes=notes)


# a metal as powder or dust burns, and fine or freshly made powders can ignite in air; their dust clouds explode
# (Bretherick's Handbook of Reactive Chemical Hazards, 7th ed., 2007; common practice)
_FINE_FORM = re.compile(r"\b(?:powder(?:ed)?|dust|fine|nanopowder|flakes?)\b", re.I)
_FINE_METAL_CAUTION = ("a finely divided metal (powder or dust) burns, can ignite in air when very fine, and its dust"
                       " can explode: keep it from ignition sources and water as the safety data sheet says")


def score_row(text) -> tuple:
    """:func:`score_formula` as a tuple of values in
    :func:`scorer.columns.column_names` order (what batch engines store)."""
    if text is None or (isinstance(text, float) and math.isnan(text)):
        return _error_row("empty formula cell")
    if isinstance(text, (bytes, bytearray)):
        try:
            text = bytes(text).decode("utf-8")
        except UnicodeDecodeError:
            return _error_row("the cell holds bytes that are not UTF-8 text")
    elif not isinstance(text, str):
        text = str(text)
    if not text.strip():
        return _error_row("empty formula cell")
    return _score_text(text)


def score_formula(text) -> dict:
    """Score one formula: a dict with one value per generated output column.

    Never raises on bad input: a formula that cannot be read or resolved gets
    ``status == "error"`` and a ``message`` saying why.

    Parameters
    ----------
    text : str
        A formula as typed (``"CuSO4·5H2O"``, ``"[C4mim][BF4]"``...).

    Returns
    -------
    dict
        Keys are the generated column names of :func:`scorer.columns.output_columns`.

    Examples
    --------
    >>> r = score_formula("Fe2(SO4)3")
    >>> r["status"], r["cations"], r["anions"], r["oxidation_states"]
    ('ok', 'Fe(3+)*2', 'SO4(2-)*3', 'Fe:+3;S:+6;O:-2')
    >>> score_formula("Xx2O")["message"]
    "unknown element 'Xx' at position 1 of 'Xx2O'"
    """
    return dict(zip(_layout()[0], score_row(text)))
