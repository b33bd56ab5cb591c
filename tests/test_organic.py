"""Neutral organic molecules recognised early (scorer/organic.py) score exactly as before.

The early recognition and the short record of a molecule are a speed trick:
every row must be the one the full path (ion solver, every descriptor, every
reader) gives. So the main test scores a varied sample twice, with the
recognition on and off (``set_organic_shortcut``), and compares every column.
The sample holds molecules (the benchmark's invented C/H/N/O formulas,
common ones) and formulas that must not be taken for a molecule: organic
salts and acids, ionic liquids written with brackets and flat, metal-organics,
carbides, CO2, CS2, carbonyl halides, HCN, urea, and every cation-anion pair
of the ion library written as a flat formula.
"""
from __future__ import annotations

import csv
import math
from pathlib import Path

import pytest

from ionicity.pipelines.bench import realistic_formulas
from ionicity.pipelines.bench_formulas import organic_formulas
from ionicity.scorer import record
from ionicity.scorer.columns import descriptors
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.grammar import hill_formula
from ionicity.scorer.ion_library import ion_library
from ionicity.scorer.ions import decompose_anhydrous
from ionicity.scorer.mixture import read_mixture
from ionicity.scorer.organic import (
    ION_ONLY_DESCRIPTORS,
    molecule_descriptors,
    organic_molecule,
    organic_shortcut_enabled,
    primitive_counts,
    set_organic_shortcut,
)
from ionicity.scorer.prescan import ordinary_formula
from ionicity.scorer.slips import find_slip
from ionicity.scorer.solutions import split_solution

DATA = Path(__file__).parent / "data"

# molecules by common practice (an organic formula without a salt-forming
# group is covalent); nitro, nitrile, azide, nitrate/nitrite ester, nitroso
# and isocyanate groups are covalently bound (common practice)
MOLECULES = [
    "C6H5NO2",  # nitrobenzene (once scored ionic_salt as NO(+) with phenoxide)
    "CH3NO2", "C7H5N3O6", "C6H4N2O4",  # nitromethane, TNT, dinitrobenzene
    "C2H3N", "CH3CN", "C6H5CN", "C3H3N",  # acetonitrile, benzonitrile, acrylonitrile
    "C6H5N3", "CH3N3", "C3H5N9",  # phenyl azide, methyl azide, glyceryl triazide
    "C3H5N3O9", "C2H5NO3", "C5H11NO2",  # nitroglycerin, ethyl nitrate, isoamyl nitrite
    "C6H5NO", "C2H3NO",  # nitrosobenzene, methyl isocyanate as a Hill formula
    "C6H12O6", "C12H22O11", "C2H5OH", "CH3OH", "C6H5OH", "C8H10N4O2", "C6H6", "C10H8", "CH4",
    "C6H5NH2", "C5H5N", "C3H6O", "C2H6OS", "C9H8O4",
    "C2H5Cl", "CH2Cl2", "CHCl3", "C6H5Br", "CH3I", "C6H5Cl",  # mixed case: the ordinary route
    "CO(NH2)2",  # urea with its amide groups written out
]

# formulas that must take the solver (common practice for their classes;
# expected classes are today's full-path readings, checked below)
NOT_MOLECULES = {
    "CH3COOH": "acid", "HCOOH": "acid", "C6H5COOH": "acid", "HCN": "acid",
    "CH3COONH4": "ionic_salt", "CH3COONa": "ionic_salt", "C2H5NH3NO3": "ionic_liquid_pair",
    "[EtNH3][NO3]": "ionic_liquid_pair", "[C4mim][BF4]": "ionic_liquid_pair",
    "C8H15N2BF4": "ionic_liquid_pair",  # [C4mim][BF4] written flat
    # urea and thiourea written flat: their ammonium-salt isomers are read by the solver and set aside
    # (Woehler 1828, scorer.ions._woehler_isomer); written with NH4, the salts (NH4SCN is a common reagent)
    "CH4N2O": "covalent_molecular",
    "CH4N2S": "covalent_molecular",
    "NH4OCN": "ionic_salt",
    "NH4SCN": "ionic_salt",
    "Fe(CO)5": "covalent_molecular", "Fe(C5H5)2": "covalent_molecular",  # metal-organics
    "CaC2": "ionic_salt", "SiC": "covalent_network", "Al4C3": "ionic_salt",  # carbides
    "C2F4": "covalent_molecular",  # no hydrogen: not an organic candidate
    "CO2": "covalent_molecular", "CS2": "covalent_molecular", "COCl2": "covalent_molecular", "CO": "covalent_molecular",
    "Zn(CH3COO)2": "ionic_salt", "C17H35COONa": "ionic_salt",
}


def _same(a, b) -> bool:
    return a == b or (isinstance(a, float) and isinstance(b, float) and math.isnan(a) and math.isnan(b))


def _pair_formulas() -> list[str]:
    """Every cation-anion pair of the ion library made of non-metals with C
    and H, written flat in Hill order, one and two balanced units."""
    ions = [ion for ion in ion_library() if all(s in _NON_METALS for s, _ in ion.composition)]
    out = []
    for cation in (i for i in ions if i.charge > 0):
        for anion in (i for i in ions if i.charge < 0):
            z, q = cation.charge, -anion.charge
            for units in (1, 2):
                counts: dict[str, float] = {}
                for ion, n in ((cation, q * units), (anion, z * units)):
                    for s, k in ion.composition:
                        counts[s] = counts.get(s, 0.0) + k * n
                if "C" in counts and "H" in counts:
                    out.append(hill_formula(tuple(counts.items())))
    return out


_NON_METALS = frozenset({"H", "B", "C", "N", "O", "F", "P", "S", "Cl", "Se", "Br", "I"})


def _sample() -> list[str]:
    with (DATA / "formula_cases.csv").open(newline="", encoding="utf-8") as f:
        cases = [row["formula"] for row in csv.DictReader(f)]
    # hydrates of molecules take the record's hydrate route (anhydrous reading, then the water)
    hydrates = ["C6H12O6·H2O", "C2H2O4·2H2O", "C6H8O7·H2O", "C4H4O4.2H2O"]
    texts = MOLECULES + list(NOT_MOLECULES) + hydrates + organic_formulas(1500, seed=11) + cases
    texts += realistic_formulas(400, seed=3) + _pair_formulas()
    return list(dict.fromkeys(texts))


def test_fast_path_rows_equal_full_path_rows():
    texts = _sample()
    assert organic_shortcut_enabled()
    fast = {t: record.score_row(t) for t in texts}
    taken = [t for t in texts if _takes_shortcut(t)]
    set_organic_shortcut(False)
    try:
        full = {t: record.score_row(t) for t in texts}
    finally:
        set_organic_shortcut(True)
    names = record._layout()[0]
    for text in texts:
        differ = [n for n, a, b in zip(names, fast[text], full[text]) if not _same(a, b)]
        assert not differ, (text, [(n, fast[text][names.index(n)], full[text][names.index(n)]) for n in differ])
    # the comparison is worth something only if both kinds are in the sample
    assert len(taken) > 1000 and len(texts) - len(taken) > 500


def _takes_shortcut(text: str) -> bool:
    try:
        return organic_molecule(parse_formula(text)) is not None
    except ValueError:
        return False


@pytest.mark.parametrize("text", MOLECULES)
def test_molecules_are_recognised_and_covalent(text):
    dec = organic_molecule(parse_formula(text))
    assert dec is not None
    assert dec.substance_class == "covalent_molecular"
    assert record.score_formula(text)["substance_class"] == "covalent_molecular"
    # the same decomposition as the solver's
    assert dec == decompose_anhydrous(parse_formula(text))


def test_a_written_isocyanate_takes_the_solver_which_marks_its_group():
    # CH3NCO: the shortcut leaves a text whose written group the water rules need to the solver
    # (scorer.formula marks "isocyanate"), which reads the same molecule with the group noted
    assert organic_molecule(parse_formula("CH3NCO")) is None
    dec = decompose_anhydrous(parse_formula("CH3NCO"))
    assert dec.substance_class == "covalent_molecular" and dec.written_groups == ("isocyanate",)


@pytest.mark.parametrize("text,cls", sorted(NOT_MOLECULES.items()))
def test_salts_acids_ionic_liquids_and_inorganic_carbon_take_the_solver(text, cls):
    assert organic_molecule(parse_formula(text)) is None
    assert record.score_formula(text)["substance_class"] == cls


def test_every_library_pair_written_flat_is_left_to_the_solver_or_read_the_same():
    for text in _pair_formulas():
        dec = organic_molecule(parse_formula(text))
        if dec is not None:
            # only where the solver itself reads the pair's formula as a molecule
            assert dec == decompose_anhydrous(parse_formula(text)), text


def test_ion_only_descriptors_give_a_molecule_nothing():
    # the record of a molecule leaves these columns empty without calling them
    names = {d.__module__ for d in descriptors()}
    assert ION_ONLY_DESCRIPTORS <= names
    assert {d.__module__ for d in molecule_descriptors()} == names - ION_ONLY_DESCRIPTORS
    for text in MOLECULES:
        dec = organic_molecule(parse_formula(text))
        for descriptor in descriptors():
            if descriptor.__module__ in ION_ONLY_DESCRIPTORS:
                result = descriptor(dec)
                assert result.notes == ()
                assert all(v is None or (isinstance(v, float) and math.isnan(v))
                           for v in descriptor.values(result).values()), (text, descriptor.__module__)


def test_capital_organic_texts_skip_the_readers_only_where_they_find_nothing():
    texts = organic_formulas(600, seed=4) + [t for t in MOLECULES if t.isupper() or t.isalnum()]
    texts += ["C10H8", "C20H42", "CH3I", "CHI3", "C2H2O4", "CN3O8", "C60", "C5", "C12H2O"]
    accepted = [t for t in texts if ordinary_formula(t) is not None]
    assert len(accepted) > 0.9 * len(texts)
    for text in accepted:
        # read as the grammar reads it
        assert ordinary_formula(text) == parse_formula(text), text
        assert ordinary_formula(text).text == text
        assert find_slip(text) is None, text
        assert split_solution(text) is None, text
        assert read_mixture(text, record.score_row) is None, text


# texts a slip reader has evidence in (a leading zero, CI, a count 1 written
# after C), and a molecule with more hydrogens than its carbons hold, whose
# written reading a 0-for-O may beat (common practice: the same kinds as
# tests/test_slips.py; C150H302N2O2, whose 302 hydrogens 150 carbons and two
# nitrogens can hold, is a molecule since the slip reader's counts rule says so)
@pytest.mark.parametrize("text", ["C6H5N02", "CI4", "C1H4", "CH3C1", "C6H1206", "C15H3020N2O2"])
def test_capital_texts_with_slip_evidence_take_the_readers(text):
    assert ordinary_formula(text) is None


def test_a_slip_in_capitals_is_still_found():
    # what the reader finds in two of those (the digit 0 for the letter O)
    assert find_slip("C6H5N02").suggested == "C6H5NO2"
    assert find_slip("C6H1206").suggested == "C6H12O6"
    # hydrogens the carbons can hold (H <= 2 C + N + 2): a molecule, whatever the count
    assert find_slip("C150H302N2O2") is None


def test_primitive_counts_of_a_pair_multiple():
    # glucose is 6 x CH2O, and so is 3 x acetic acid's CH2O x 2 (common practice)
    assert primitive_counts(parse_formula("C6H12O6").counts) == primitive_counts(parse_formula("C2H4O2").counts)
    # the solver reads glucose as a molecule, acetic acid as an acid
    assert organic_molecule(parse_formula("C6H12O6")) is not None
    assert organic_molecule(parse_formula("C2H4O2")) is None


@pytest.mark.parametrize("text", ["C6H12O6", "C6H5NO2", "C2H6O", "C8H10N4O2"])
def test_a_molecule_with_hydrogen_and_oxygen_is_scored_without_the_ion_search(text):
    # the check for a hydrate written flat (FeH14O11S) asks the shortcut first: a molecule's reading holds
    # no H(+), so the ion search is never run for it (it was two thirds of a molecule's cost)
    from ionicity.scorer.caching import clear_all
    from ionicity.scorer.ion_search import _ion_pair_readings
    clear_all()
    row = record.score_formula(text)
    assert row["substance_class"] == "covalent_molecular"
    assert _ion_pair_readings.cache_info().currsize == 0
