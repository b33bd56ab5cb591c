"""Names of common chemicals read from the registry's tables (scorer/data/registry_names.csv).

Source: the registry package ``chemicals`` (the CRC Handbook's tables of physical constants of
organic and inorganic compounds, names and CAS numbers, and its PubChem identifier table of common
chemicals; the formula of each CAS number from its identifier tables). The checks compare the
committed file with a rebuild, and each row's formula with the molecular weight PubChem gives for
its CAS number (``chemicals.identifiers.search_chemical(CAS).MW``), an outside value the build does
not use.
"""
from __future__ import annotations

import csv
import subprocess
import sys
from pathlib import Path

import pytest
from ionicity.scorer.name_reader import parse_as_name, read_name, registry_entry
from ionicity.scorer.name_vocabulary import compact
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.record import molar_mass_g_mol, score_formula

ROOT = Path(__file__).resolve().parents[1]
TABLE = ROOT / "scorer" / "data" / "registry_names.csv"


def _rows():
    with open(TABLE, newline="", encoding="utf-8") as handle:
        return list(csv.DictReader(handle))


def test_the_file_is_its_rebuild():
    pytest.importorskip("chemicals")
    done = subprocess.run([sys.executable, "-m", "ionicity.scorer.data.build_registry_names", "--check"],
                          capture_output=True, text=True, cwd=ROOT)
    assert done.returncode == 0, done.stdout + done.stderr


def test_one_formula_per_name_key():
    keys = [compact(row["name"]) for row in _rows()]
    assert len(keys) == len(set(keys))


def test_formulas_weigh_what_pubchem_says():
    # every 10th row: the formula's molar mass (ionicity's atomic weights) against PubChem's molecular weight
    # of the row's CAS number, read from the registry package at test time
    identifiers = pytest.importorskip("chemicals.identifiers")
    checked = 0
    for row in _rows()[::10]:
        try:
            expected = identifiers.search_chemical(row["cas"]).MW
        except Exception:
            continue
        mass = score_formula(row["formula"])["molar_mass_g_mol"]  # D and T weigh as themselves
        if mass != mass:  # a row the scorer cannot read as ions (C18H35OSn) has no mass column: its atoms'
            mass = molar_mass_g_mol(dict(parse_formula(row["formula"]).counts))
        assert mass == pytest.approx(expected, rel=2e-3), row
        checked += 1
    assert checked >= 1000


@pytest.mark.parametrize("name, formula, cas", [
    # CAS numbers and formulas: CRC Handbook of Chemistry and Physics, physical constants of organic compounds
    # (via chemicals); spellings as a stock list writes them
    ("acetone", "C3H6O", "67-64-1"), ("Ethyl acetate", "C4H8O2", "141-78-6"), ("HEXANE", "C6H14", "110-54-3"),
    ("n-hexane", "C6H14", "110-54-3"), ("2-propanol", "C3H8O", "67-63-0"), ("toluene", "C7H8", "108-88-3"),
    ("N,N-dimethylformamide", "C3H7NO", "68-12-2"), ("p-xylene", "C8H10", "106-42-3"),
])
def test_common_solvents_read_by_name(name, formula, cas):
    entry = registry_entry(name)
    assert entry is not None and (entry[0], entry[1]) == (formula, cas)
    assert read_name(name) == formula
    note = parse_as_name(name).notes[-1]
    assert f"CAS {cas}" in note and formula in note


def test_the_name_grammar_reads_first():
    # the grammar's reading of a salt's name stands; the registry is asked only when it reads nothing
    assert read_name("sodium chloride") == "NaCl"
    assert read_name("copper(II) sulfate pentahydrate") == "CuSO4·5H2O"
    assert all("hydrate" not in row["name"].lower() for row in _rows())


def test_a_name_with_a_letter_and_a_hyphen_is_not_a_mixture():
    # "N-pentane" had read as nitrogen and pentane in equal moles
    row = score_formula("N-pentane")
    assert row["formula_normalized"] == "C5H12" and row["substance_class"] != "mixture"


@pytest.mark.parametrize("text, words", [
    ("ethanol absolute", "absolute"), ("Acetonitrile for HPLC", "for HPLC"), ("Methanol HPLC grade", "HPLC grade"),
])
def test_solvent_grades_are_left_out_and_named(text, words):
    row = score_formula(text)
    assert row["status"] == "warning" and words in row["message"]
    assert row["melting_class"] == "liquid_at_room_temperature"


def test_explain_reads_grade_words_as_score_does():
    from ionicity.pipelines.explain import explain_formula
    text = explain_formula("NaCl ACS reagent")
    assert "status: warning" in text and "status: error" not in text


@pytest.mark.parametrize("name", ["acetyl chloride", "benzoyl chloride", "oxalyl chloride"])
def test_acyl_halides_by_name_react_with_water(name):
    # the registry's SMILES holds the carbonyl halide (CC(=O)Cl); its Hill formula C2H3ClO does not, and read
    # from the formula alone acetyl chloride had been "miscible" (acyl halides react violently with water:
    # Bretherick's Handbook of Reactive Chemical Hazards; from memory)
    assert registry_entry(name)[4] == "acyl_halide"
    assert score_formula(name)["water_behaviour"] == "reacts_violently"


def test_a_molecule_by_name_is_no_ion_pair():
    # lysine, C6H14N2O2: as a bare formula the library pair choline cyanate fits; the name is the molecule
    # (registry SMILES of CAS 56-87-1: one component, an amino acid: a zwitterion in the solid)
    assert registry_entry("lysine")[4] == "zwitterion"
    named, bare = score_formula("lysine"), score_formula("C6H14N2O2")
    assert named["formula_normalized"] == "C6H14N2O2" and not named["cations"]
    # the bare formula too: every registry compound of C6H14N2O2 is a molecule (scorer.registry_formulas;
    # tests/test_registry_molecules.py), so choline cyanate is no longer taken
    assert not bare["cations"] and bare["substance_class"] == "covalent_molecular"
    assert score_formula("benzoic acid")["cations"] == "H(+)*1"  # an acid's proton stands


@pytest.mark.parametrize("name, kind, products", [
    # the registry's SMILES shows the group, the Hill formula does not (acetic anhydride C4H6O3 read from its
    # formula "dissolves"; methyl isocyanate C2H3NO was "miscible"); water opens anhydrides to the acid and adds
    # to isocyanates, giving CO2 and the amine (Clayden et al., Organic Chemistry, 2nd ed., 2012, ch. 10; from memory)
    ("acetic anhydride", "acid_anhydride", "carboxylic acid"), ("maleic anhydride", "acid_anhydride", "carboxylic acid"),
    ("methyl isocyanate", "isocyanate", "amine;CO2"), ("phenyl isocyanate", "isocyanate", "amine;CO2"),
])
def test_anhydrides_and_isocyanates_by_name_react_with_water(name, kind, products):
    assert registry_entry(name)[4] == kind
    record = score_formula(name)
    assert record["water_behaviour"] == "reacts" and record["water_reaction_products"] == products


# A registry name written with a space is the name reader's: the slip search had re-cased its letters into
# element symbols ("Tin (white)" as TiN with WHITe, "Cucurbitacin C" as a rubidium tantalum copper iodide) or
# taken a bracket of a systematic name for an unknown ion code (an error). The formula is the registry's for the
# row's CAS number (the registry package chemicals, search_chemical).
@pytest.mark.parametrize("name, cas", [
    ("Tin (white)", "7440-31-5"), ("Phosphorus (white)", "7723-14-0"), ("Cucurbitacin C", "5988-76-1"),
    ("Aloin A", "1415-73-2"), ("Bis[2-(vinyloxy)ethyl] ether", "764-99-8"),
])
def test_a_registry_name_with_a_space_is_no_typing_slip(name, cas):
    from chemicals.identifiers import search_chemical

    row = score_formula(name)
    assert row["status"] == "warning" and "the formula cell holds a name" in row["message"], row["message"]
    assert "typing slip" not in row["message"]
    assert parse_formula(row["formula_normalized"]).total_counts == parse_formula(search_chemical(cas).formula).total_counts


@pytest.mark.parametrize("hill, cas, cations, anions", [
    # Hill formulas whose ionic readings tie; the registry (the package chemicals) names one of them
    ("C2H8N2O4", "1113-38-8", "NH4(+)*2", "C2O4(2-)*1"),  # ammonium oxalate, not 2-hydroxyethylammonium nitrate
    ("H6N2O3S", "7773-06-0", "NH4(+)*1", "NH2SO3(-)*1"),  # ammonium sulfamate, not hydrazinediium sulfite
])
def test_a_tie_the_registry_names_goes_to_the_named_salt(hill, cas, cations, anions):
    from chemicals.identifiers import search_chemical

    assert parse_formula(search_chemical(cas).formula).total_counts == parse_formula(hill).total_counts
    out = score_formula(hill)
    assert (out["cations"], out["anions"], out["status"]) == (cations, anions, "ok")


def test_a_tie_the_registry_names_both_ways_stays_a_tie():
    # C4H12ClN is tetramethylammonium chloride and butylamine hydrochloride (and diethylamine hydrochloride) in the
    # registry: no reading is the formula's only compound, so the row says both
    assert "ambiguous" in score_formula("C4H12ClN")["message"]


@pytest.mark.parametrize("name, cas", [
    ("tris(hydroxymethyl)aminomethane", "77-86-1"), ("trichloroisocyanuric acid", "87-90-1"),
    ("tetrakis(triphenylphosphine)palladium(0)", "14221-01-3"),
])
def test_stockroom_names_read_as_the_registry_compound(name, cas):
    # each had been "neither a formula nor a name"; the composition is the registry package's (chemicals)
    from chemicals.identifiers import search_chemical

    formula = read_name(name)
    assert formula is not None
    assert parse_formula(formula).total_counts == parse_formula(search_chemical(cas).formula).total_counts


def test_sodium_dichloroisocyanurate_is_the_sodium_salt():
    # the acid C3HCl2N3O3 (CAS 2782-57-2, chemicals) with its N-H proton replaced by sodium (common practice)
    row = score_formula("sodium dichloroisocyanurate")
    assert (row["cations"], row["anions"]) == ("Na(+)*1", "C3Cl2N3O3(-)*1")
