"""Typing slips (scorer/slips.py) and solutions (scorer/solutions.py).

The slips below are of the kinds the audit looks for, but chosen apart from
the examples the module's docstring and the issue name (held-out style: other
salts, other positions of the slip). The intended formulas are common
laboratory chemicals (from memory); each corrected row's molar mass is checked
against the ``molmass`` package (Gohlke, molmass, standard atomic weights),
an outside reference, not against our own sum.
"""
from __future__ import annotations

import csv
import math
import os
import re
from pathlib import Path

import molmass
import pytest

from ionicity.scorer.record import score_formula
from ionicity.scorer.slips import SLIP_KINDS, find_slip, slip_kind_of
from ionicity.scorer.solutions import split_solution

DATA = Path(__file__).parent / "data"

# (typed, intended formula, slip kind); intended formulas from memory
SLIPS = [
    ("Na2C03", "Na2CO3", "leading_zero"),
    ("KMn04", "KMnO4", "leading_zero"),
    ("Mg(N03)2", "Mg(NO3)2", "leading_zero"),
    ("CaS04", "CaSO4", "leading_zero"),
    ("Al2O3", None, None),  # control: written right
    ("Cr203", "Cr2O3", "zero_for_O"),
    ("Na2S205", "Na2S2O5", "zero_for_O"),
    ("KCI", "KCl", "I_for_l"),
    ("BaCI2", "BaCl2", "I_for_l"),
    ("AI(OH)3", "Al(OH)3", "I_for_l"),
    ("MgC12", "MgCl2", "one_for_l"),
    ("KC1", "KCl", "one_for_l"),
    ("Nal", "NaI", "l_for_I"),
    ("Agl", "AgI", "l_for_I"),
    ("KBR", "KBr", "letter_case"),
    ("MGSO4", "MgSO4", "letter_case"),
    ("AGNO3", "AgNO3", "letter_case"),
    ("kcl", "KCl", "letter_case"),
    ("cacl2", "CaCl2", "letter_case"),
    ("na2so4", "Na2SO4", "letter_case"),
    ("NaBr", None, None),  # control
    ("FeSO47H2O", "FeSO4·7H2O", "hydrate_dot_missing"),
    ("BaCl22H2O", "BaCl2·2H2O", "hydrate_dot_missing"),
    ("CaCl2.6H20", "CaCl2.6H2O", "zero_for_O"),  # lattice water typed H20
    ("CuSO4·5H20", "CuSO4·5H2O", "zero_for_O"),
    ("Na2CO3.10H20", "Na2CO3.10H2O", "zero_for_O"),
    ("C10H20", None, None),  # control: decene, a count of 20 hydrogens (not after a hydrate dot)
    # an oxoanion typed with a lower-case o: as written a calcium-cobalt or a nobelium/polonium compound
    ("SrCo3", "SrCO3", "oxoanion_case"),
    ("KHCo3", "KHCO3", "oxoanion_case"),
    ("Ba(No3)2", "Ba(NO3)2", "oxoanion_case"),
    ("KNo2", "KNO2", "oxoanion_case"),
    ("Mg3(Po4)2", "Mg3(PO4)2", "oxoanion_case"),
    ("NaH2Po4", "NaH2PO4", "oxoanion_case"),
    # the brackets around a group left out: as written a hydride hydroxide (SrOH2 as Sr(2+) H(-) OH(-)), a
    # molecule with 42 hydrogens, or nothing that balances
    ("SrOH2", "Sr(OH)2", "brackets_left_out"),
    ("NiNO32", "Ni(NO3)2", "brackets_left_out"),
    ("Cr2SO43", "Cr2(SO4)3", "brackets_left_out"),
    ("Mg3PO42", "Mg3(PO4)2", "brackets_left_out"),
    ("NH42HPO4", "(NH4)2HPO4", "brackets_left_out"),
    ("CaCN2", None, None),   # control: calcium cyanamide, Ca(2+) CN2(2-)
    ("LiAlH4", None, None),  # control: a hydride written right
    ("LiCoO2", None, None),  # control: lithium cobalt oxide, no count after the o
    ("CoCl2", None, None),   # control
]


@pytest.mark.parametrize("typed,intended,kind", SLIPS, ids=[s[0] for s in SLIPS])
def test_a_slip_is_a_warning_with_the_intended_formula(typed, intended, kind):
    record = score_formula(typed)
    if intended is None:
        assert record["status"] == "ok" and record["formula_suggested"] is None
        return
    assert record["status"] == "warning", record["message"]
    assert record["formula_suggested"] == intended
    assert slip_kind_of(record["message"]) == kind
    assert SLIP_KINDS[kind] in record["message"]
    # the values are the intended compound's: molar mass from molmass (outside reference)
    # (tolerance: molmass and our snapshot round some standard atomic weights
    # differently, e.g. S 32.065 against 32.06, 0.012 g/mol on Na2S2O5)
    reference = molmass.Formula(intended.replace("·", ".")).mass
    assert record["molar_mass_g_mol"] == pytest.approx(reference, abs=0.02)


@pytest.mark.parametrize("typed", ["KN03", "NaN03", "H2S04", "CUSO4", "NaCI", "nacl", "naoh", "zncl2", "NaCL", "H0O"])
def test_the_slips_of_the_issue_are_never_ok(typed):
    record = score_formula(typed)
    assert record["status"] == "warning", record["message"]
    assert slip_kind_of(record["message"]) is not None


@pytest.mark.parametrize("text", ["CO", "Co", "HF", "Hf", "NO", "No", "Cs", "Sn", "COCl2", "CI4", "KI", "CS2",
                                  "C10H8", "Na2SO4·10H2O", "NI3", "SnCl2", "PbI2", "BaSi2", "Cu5Si", "TlI"])
def test_valid_formulas_are_not_flagged(text):
    record = score_formula(text)
    assert record["formula_suggested"] is None
    assert slip_kind_of(record["message"]) is None


@pytest.mark.parametrize("text,bracket", [("[N222][TFSI]", "[N222]"), ("[P4444444]Br", "[P4444444]"),
                                          ("[C4mpyrx][NTf2]", "[C4mpyrx]"), ("[DBUH][OAc]", "[DBUH]")])
def test_an_unknown_bracketed_abbreviation_is_an_error_that_says_so(text, bracket):
    record = score_formula(text)
    assert record["status"] == "error"
    assert bracket in record["message"] and "ion library" in record["message"]
    assert slip_kind_of(record["message"]) == "unknown_abbreviation"
    assert record["formula_normalized"] is None and math.isnan(record["molar_mass_g_mol"])
    # a known one, any case, is read through the library
    assert score_formula("[BMIM][PF6]")["formula_normalized"] == "[C4mim][PF6]"


@pytest.mark.parametrize("text,water", [("MgSO4 7H2O", 7), ("CuSO4 5 H2O", 5), ("CaSO4 0.5H2O", 0.5)])
def test_a_space_before_counted_water_reads_as_a_hydrate(text, water):
    record = score_formula(text)
    assert record["status"] == "ok" and record["hydrate_water"] == water
    salt = text.split()[0]
    reference = molmass.Formula(salt).mass + water * molmass.Formula("H2O").mass  # molmass (outside reference)
    assert record["molar_mass_g_mol"] == pytest.approx(reference, abs=0.02)


def test_a_failed_row_carries_no_half_read_formula():
    # five thousand solver steps and no ionic reading: an error with nothing else filled in
    record = score_formula("MgSO4 7H2O 7H2O")
    if record["status"] == "error":
        assert record["formula_normalized"] is None and math.isnan(record["molar_mass_g_mol"])
    record = score_formula("CNa")  # parses, no charge-balanced reading
    assert record["status"] == "error"
    assert record["formula_normalized"] is None and math.isnan(record["molar_mass_g_mol"])


def test_no_reference_case_is_flagged():
    # every formula of the reference cases is written right (sources in the file)
    with open(DATA / "formula_cases.csv", encoding="utf-8") as handle:
        texts = [row["formula"] for row in csv.DictReader(handle)]
    flagged = [t for t in texts if find_slip(t) is not None]
    assert flagged == []


def test_false_positives_on_the_chemicals_inorganic_table():
    # validation set: the formulas of the chemicals package's inorganic identifier
    # table (Bell, chemicals, "Inorganic db.tsv"), none of which was used to set
    # the penalties; at most 1 % may be flagged (measured 1 of 590 when written: BKO)
    chemicals = pytest.importorskip("chemicals")
    path = Path(os.path.dirname(chemicals.__file__)) / "Identifiers" / "Inorganic db.tsv"
    with open(path, encoding="utf-8") as handle:
        formulas = {line.split("\t")[2] for line in handle if line.count("\t") > 2}
    formulas = {f for f in formulas if re.fullmatch(r"[A-Za-z0-9()]+", f)}
    flagged = [f for f in formulas if find_slip(f) is not None]
    assert len(flagged) <= 0.01 * len(formulas), flagged


@pytest.mark.parametrize("text,solute,concentration", [
    ("HCl 37%", "HCl", "37 %"),
    ("NaOH 1 M", "NaOH", "1 M"),
    ("H2SO4 conc.", "H2SO4", "conc."),
    ("NH3 (aq) 25%", "NH3", "25 %"),
    ("HNO3 65 % w/w", "HNO3", "65 % w/w"),
    ("KOH 0.1 mol/L", "KOH", "0.1 mol/L"),
    ("H3PO4 85%", "H3PO4", "85 %"),
    ("NaCl 0.9 % w/v", "NaCl", "0.9 % w/v"),
    ("CH3COOH glacial", "CH3COOH", "glacial"),
    ("H2O2 30% (w/w)", "H2O2", "30 % w/w"),
    ("HCl (37%)", "HCl", "37 %"),
    ("H2SO4 95-98%", "H2SO4", "95-98 %"),
    ("Ca(OH)2 sat.", "Ca(OH)2", "sat."),
    ("hcl 37%", "hcl", "37 %"),  # and the solute's slip is found too
])
def test_a_solution_scores_its_solute(text, solute, concentration):
    assert split_solution(text).solute == solute
    record = score_formula(text)
    assert record["concentration_as_written"] == concentration
    assert record["status"] != "error", record["message"]
    assert record["formula_normalized"] == score_formula(solute)["formula_normalized"]


@pytest.mark.parametrize("text, solute, concentration, solvent", [
    # electrolyte and stock-solution labels (common practice): the solute is scored, the solvent named
    ("1 M LiPF6 in EC/DMC", "LiPF6", "1 M", "EC/DMC"),
    ("1 M LiPF6 in EC:DMC (1:1 v/v)", "LiPF6", "1 M", "EC:DMC (1:1 v/v)"),
    ("LiTFSI (1 M) in DME/DOL", "LiTFSI", "1 M", "DME/DOL"),
    ("NaCl in water", "NaCl", None, "water"),
    # the molarity between the salt and the solvents' codes, without "in" (common practice on cell-maker labels)
    ("LiPF6 1.0M EC/EMC 3/7", "LiPF6", "1.0 M", "EC/EMC 3/7"),
    ("LiPF6 1 M EC:DMC 1:1", "LiPF6", "1 M", "EC:DMC 1:1"),
    ("NaPF6 1M PC", "NaPF6", "1 M", "PC"),
    ("KOH 6M water", "KOH", "6 M", "water"),
])
def test_a_solute_in_a_named_solvent(text, solute, concentration, solvent):
    record = score_formula(text)
    assert record["status"] == "ok" and record["concentration_as_written"] == concentration
    assert record["formula_normalized"] == score_formula(solute)["formula_normalized"]
    assert f"in {solvent}: the values are for the pure solute" in record["value_notes"]
    assert "the solvent is not scored" in record["value_notes"]


def test_an_acid_solution_defers_to_the_safety_data_sheet():
    notes = score_formula("HCl 37%")["value_notes"]
    assert "safety data sheet" in notes
    assert "safety data sheet" not in (score_formula("NaCl 1 M")["value_notes"] or "")


@pytest.mark.parametrize("text", ["NaCl", "CuSO4·5H2O", "Fe0.95O", "2CaSO4·H2O", "[C4mim][BF4]", "SO4^2-"])
def test_plain_formulas_are_not_solutions(text):
    assert split_solution(text) is None
    assert score_formula(text)["concentration_as_written"] is None


# Grade, purity and form words written after a formula or a name, as catalogues and stock
# lists do (common practice): the compound is scored and the row names the words left out.
@pytest.mark.parametrize("text, formula", [
    ("NaOH pellets", "NaOH"), ("Sodium hydroxide pellets", "NaOH"), ("Na2SO4 anhydrous", "Na2SO4"),
    ("NaCl ACS reagent", "NaCl"), ("NaCl 99.9% ACS reagent", "NaCl"), ("Mg turnings", "Mg"),
    ("CuSO4·5H2O cryst.", "CuSO4·5H2O"), ("iodine, resublimed", "I2"), ("copper(II) oxide, wire", "CuO"),
])
def test_grade_and_form_words_are_left_out_and_named(text, formula):
    record = score_formula(text)
    assert record["status"] == "warning"
    assert record["formula_normalized"] == formula
    assert "ignored the grade or form words" in record["message"]


@pytest.mark.parametrize("text", ["NaCl pellet-ish", "NaCl granulated sugar"])
def test_unknown_trailing_words_stay_errors(text):
    assert score_formula(text)["status"] == "error"


@pytest.mark.parametrize("text, meant", [
    ("H20", "H2O"),    # water with the digit 0: hydrogen has no H20 molecule
    ("N20", "N2O"),    # nitrous oxide
    ("CD", "Cd"),      # capitals that read as a radical (C and D, 7 electrons)
    ("SN", "Sn"),      # NS, 23 electrons
    ("SIO2", "SiO2"),  # S, I and O2: 85 electrons
    ("BII3", "BiI3"),  # BI4: 217 electrons
])
def test_readings_no_shelf_holds_are_slips(text, meant):
    # common practice: an element with a count none of its molecules has, and an odd-electron
    # molecule other than NO, NO2 and ClO2, are not what an inventory line means
    slip = find_slip(text)
    assert slip is not None and slip.suggested == meant, (text, slip)


@pytest.mark.parametrize("text", ["NO", "NO2", "ClO2", "CO", "HF", "H2", "O3", "S8", "CH4", "C13H12N3"])
def test_stable_molecules_and_long_formulas_are_read_as_written(text):
    # NO, NO2 and ClO2 are the stable odd-electron molecules of a shelf (common practice); a long
    # formula with an odd electron count is read as written
    assert find_slip(text) is None


@pytest.mark.parametrize("text", [
    # real cobalt intermetallics with three Co per rare-earth atom (YCo3, LaCo3: Buschow, Rep. Prog. Phys. 40
    # (1977) 1179, from memory) and SmCo5: no carbonate balances them, so they stay as written
    "YCo3", "LaCo3", "SmCo5", "Co3O4",
])
def test_cobalt_compounds_are_not_carbonate_slips(text):
    record = score_formula(text)
    assert record["formula_suggested"] is None, record["message"]


@pytest.mark.parametrize("text, ion", [
    # a monatomic cation at +1 of an element whose salts hold it at +2 or more: a count is missing
    # (CaCl2, AlCl3, FeCl2/FeCl3, Mg(NO3)2; Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997:
    # Ca(I), Al(I), Fe(I) halides are gas-phase molecules only; from memory)
    ("CaCl", "Ca(+)"), ("AlCl", "Al(+)"), ("FeCl", "Fe(+)"), ("Mg(NO3)", "Mg(+)"), ("Al2O", "Al(+)"),
])
def test_a_missing_count_that_needs_a_subvalent_cation_is_a_warning(text, ion):
    record = score_formula(text)
    assert record["status"] == "warning"
    assert f"{ion} is not a state" in record["message"] and "a count may be missing" in record["message"]


@pytest.mark.parametrize("text", [
    # +1 salts that exist: indium(I) and gallium(I) halides, thallium(I), copper(I), silver(I), and Hg2(2+)
    # (Greenwood & Earnshaw ch. 7.3, 28.3, 29.3; from memory); interstitial Cr2N keeps no ions
    "InCl", "InBr", "TlCl", "CuCl", "AgCl", "Hg2Cl2", "Cr2N",
])
def test_real_monovalent_salts_carry_no_subvalent_warning(text):
    record = score_formula(text)
    assert record["status"] == "ok", record["message"]


@pytest.mark.parametrize("text, solute, concentration", [
    # concentrations written before the formula, as bottle labels write them (common practice)
    ("0.1 M NaCl", "NaCl", "0.1 M"),
    ("1M H2SO4", "H2SO4", "1 M"),
    ("37% HCl", "HCl", "37 %"),
    ("10 % w/v NaOH", "NaOH", "10 % w/v"),
    ("conc. HNO3", "HNO3", "conc."),
    ("saturated NaCl", "NaCl", "sat."),
    ("2 N HCl", "HCl", "2 N"),
])
def test_leading_concentrations_are_solutions(text, solute, concentration):
    record = score_formula(text)
    assert record["status"] == "ok", record["message"]
    assert record["formula_normalized"] == solute
    assert record["concentration_as_written"] == concentration


@pytest.mark.parametrize("text", ["2 NaCl", "3 MgO"])
def test_a_count_before_a_formula_is_no_concentration(text):
    assert score_formula(text)["concentration_as_written"] is None


@pytest.mark.parametrize("text", ["\u200bNaCl", "Na\u00adCl", "\ufeffNaCl", "NaCl\u2060"])
def test_invisible_format_characters_are_dropped(text):
    # zero-width space, soft hyphen, byte-order mark, word joiner: left by copying from web pages (common practice)
    record = score_formula(text)
    assert record["status"] == "ok" and record["formula_normalized"] == "NaCl"


@pytest.mark.parametrize("text", ["NaCl ≥99%", "KCl >99.5%"])
def test_purity_with_a_comparison_sign_is_a_grade(text):
    record = score_formula(text)
    assert record["status"] == "warning" and "ignored the grade or form words" in record["message"]


def test_a_molar_amount_after_plus_is_a_solute_in_the_first_component():
    # "[C4mim][BF4] + 0.5 M LiBF4": an electrolyte salt dissolved in an ionic liquid (common practice), as
    # "0.5 M LiBF4 in [C4mim][BF4]" is read; in an ionic solvent the solution is the mixture of the two salts
    # (5 December 2026, tenth round; tests/test_electrolytes.py), a salt in a molecular solvent stays its solute
    record = score_formula("[C4mim][BF4] + 0.5 M LiBF4")
    assert record["status"] == "ok" and record["substance_class"] == "mixture"
    assert record["mixture_components"] == "LiBF4;[C4mim][BF4]"
    assert record["concentration_as_written"] == "0.5 M"
    assert "in the ionic solvent [C4mim][BF4]" in record["value_notes"]
    lithium = score_formula("0.5 M LiTFSI in [C4mim][TFSI]")
    assert lithium["substance_class"] == "mixture" and lithium["concentration_as_written"] == "0.5 M"


@pytest.mark.parametrize("text, scored", [("CaCo3", "CaCO3"), ("NaCI", "NaCl"), ("37% HCl", "HCl")])
def test_explain_shows_what_score_scored(text, scored):
    # `ionicity explain` explained the text as written while `score` read the slip's correction or the solute
    from ionicity.pipelines.explain import explain_formula
    out = explain_formula(text)
    assert f"read as: {scored}" in out
    assert f"formula_normalized: {scored}" in out


@pytest.mark.parametrize("formula", [
    # molecules whose hydrogen count passes 100 (formulas of the CRC Handbook's organic table via chemicals:
    # glyceryl tristearate CAS 555-43-1, glyceryl trioleate CAS 122-32-7) and a C110H220 wax: the 0 in
    # "110" had been read as an O (C57H11OO6), a radical
    "C57H110O6", "C57H104O6", "C110H220",
])
def test_large_saturated_counts_are_not_zero_slips(formula):
    record = score_formula(formula)
    assert record["formula_suggested"] is None and record["status"] == "ok", record["message"]


def test_a_hydrogen_count_the_carbons_cannot_hold_is_still_a_slip():
    # C6H1206: 1206 hydrogens on six carbons (at most 2 C + 2 = 14, degree of unsaturation; common practice)
    assert score_formula("C6H1206")["formula_suggested"] == "C6H12O6"


@pytest.mark.parametrize("text, formula", [
    # one word that is a name is that name (element names: IUPAC; arsine: CRC Handbook inorganic table via
    # chemicals, CAS 7784-42-1): "tin" had read as TiN, "TIN" as TlN, "arsine" as argon-silicon-neon
    ("tin", "Sn"), ("Tin", "Sn"), ("TIN", "Sn"), ("IRON", "Fe"), ("arsine", "AsH3"), ("neon", "Ne"),
])
def test_a_word_that_is_a_name_is_no_slip(text, formula):
    record = score_formula(text)
    assert record["formula_normalized"] == formula and record["formula_suggested"] is None


@pytest.mark.parametrize("text, suggested", [("nacl", "NaCl"), ("SN", "Sn"), ("CD", "Cd"), ("CUSO4", "CuSO4")])
def test_words_that_are_no_names_keep_their_slips(text, suggested):
    assert score_formula(text)["formula_suggested"] == suggested


@pytest.mark.parametrize("text", ["HCl 1 M KCl", "LiCl 0.5 M NaCl"])
def test_a_molarity_before_a_formula_is_no_solvent_blend(text):
    # only laboratory solvent codes (scorer/data/solvent_codes.csv) and their ratio stand after the molarity
    from ionicity.scorer.solutions import split_in_solvent

    assert split_in_solvent(text) is None


# text all in capitals: an I after T, N, S, L, B is the capital of the i of Ti, Ni, Si, Li, Bi, not an l mistyped
# (TIO2 was read as thallium superoxide TlO2, NIO as nitrosyl iodide); real compounds of capitals stay as written
# (NI3 nitrogen triiodide, BI3 boron triiodide, KIO3 potassium iodate; from memory). Molar masses of the intended
# formulas from molmass.
@pytest.mark.parametrize("text, meant", [("TIO2", "TiO2"), ("NIO", "NiO"), ("SI3N4", "Si3N4"), ("TICL4", "TiCl4"),
                                         ("KCI", "KCl")])
def test_capital_i_in_text_all_in_capitals_is_read_as_lost_case(text, meant):
    row = score_formula(text)
    assert row["status"] == "warning" and row["formula_suggested"] == meant
    assert math.isclose(row["molar_mass_g_mol"], molmass.Formula(meant).mass, rel_tol=1e-4)


@pytest.mark.parametrize("text", ["NI3", "BI3", "KIO3", "HI", "CI4"])
def test_compounds_written_in_capitals_with_iodine_stay_as_written(text):
    row = score_formula(text)
    assert row["status"] == "ok" and not row["formula_suggested"]


@pytest.mark.parametrize("text, proposal", [("KCO3", "K2CO3")])
def test_capitals_keep_a_written_oxoanion_when_a_count_is_lost(text, proposal):
    # KCO3: potassium carbonate with its count of K lost (common practice of typing slips), not a
    # potassium-cobalt compound KCo3 (no such intermetallic is known; from memory); the carbonate written in
    # capitals keeps its O
    row = score_formula(text)
    assert row["status"] == "error" and f"did you mean {proposal}?" in row["message"]


@pytest.mark.parametrize("text, meant", [("SMCO5", "SmCo5"), ("CACO3", "CaCO3"), ("NANO3", "NaNO3")])
def test_capitals_still_recover_cobalt_and_sodium(text, meant):
    # SmCo5, the samarium-cobalt magnet (CO5 is no oxoanion), and the carbonate and nitrate whose metal lost its case
    row = score_formula(text)
    assert row["formula_suggested"] == meant
    assert math.isclose(row["molar_mass_g_mol"], molmass.Formula(meant).mass, rel_tol=1e-4)


# An element no shelf holds a compound of (nihonium, nobelium, californium: made a few atoms at a time) beside
# others or with a count, or one metal with a count (metals are no molecules), is a formula that lost its case:
# these read as metals with status ok before (the prescan passed them as ordinary). Intended formulas from
# memory; masses checked against molmass.
@pytest.mark.parametrize("text, meant", [
    ("Nh3", "NH3"), ("Nh4Cl", "NH4Cl"), ("MgNh4PO4", "MgNH4PO4"), ("No2", "NO2"), ("Co2", "CO2"),
    ("Cs2", "CS2"), ("Cf4", "CF4"),
])
def test_an_impossible_element_or_a_counted_metal_is_lost_case(text, meant):
    row = score_formula(text)
    assert row["status"] == "warning" and row["formula_normalized"] == meant, row["message"]
    assert "typing slip?" in row["message"]
    # (molmass and our snapshot round S differently, 32.065 against 32.06: the tolerance of the tests above)
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula(meant).mass, abs=0.02)


@pytest.mark.parametrize("text", ["Co", "Bk", "Es", "I2", "Sn"])
def test_an_element_symbol_alone_stays_that_element(text):
    # an element's symbol alone is that element, however exotic (BK is no likelier than berkelium)
    assert score_formula(text)["formula_normalized"] == text


# No metal holds water of crystallisation (common practice): Ca·H2O and Ca(OH2) (an aqua group after a metal,
# a slip of Ca(OH)2) read as calcium metal with status ok; they are errors that say so, the second with the
# hydroxide proposed; a salt written with aqua ligands keeps its water
@pytest.mark.parametrize("text, proposal", [("Ca(OH2)", "Ca(OH)2"), ("Mg(OH2)", "Mg(OH)2"), ("Ca·H2O", None),
                                            ("Fe·6H2O", None), ("CuAl·H2O", None)])
def test_a_metal_written_with_water_is_an_error(text, proposal):
    row = score_formula(text)
    assert row["status"] == "error"
    assert "which no metal holds" in row["message"]
    if proposal:
        assert row["message"].endswith(f"({proposal}?)")


def test_aqua_ligands_of_a_salt_stay_its_water():
    row = score_formula("[Cu(OH2)6]SO4")
    assert row["status"] == "ok" and row["formula_normalized"] == "CuSO4·6H2O"


# Three to six capitals alone are as often an abbreviation as a formula that lost its case: a re-casing or a
# suggestion that needs a radioactive element no shelf holds a compound of is no correction (PAN,
# propylammonium nitrate or polyacrylonitrile, read as protactinium nitride with a warning before); thorium,
# uranium and plutonium compounds written in capitals with a count still recover, and a T in capitals is thorium
# or thallium before tritium (THO2 read as tritiated hydrogen peroxide with status ok; common practice)
@pytest.mark.parametrize("text", ["PAN", "RAN", "AMP"])
def test_a_capital_code_is_not_recased_into_a_radioactive_rarity(text):
    row = score_formula(text)
    assert row["status"] == "error"
    assert not re.search(r"\b(?:Pa|Ra|Am)[A-Z]", row["message"] or "")


@pytest.mark.parametrize("text, meant", [("PUO2", "PuO2"), ("THO2", "ThO2"), ("TH(NO3)4", "Th(NO3)4"),
                                         ("FECL3", "FeCl3")])
def test_capitals_with_counts_still_recover(text, meant):
    row = score_formula(text)
    assert row["formula_normalized"] == meant and "typing slip?" in row["message"]


@pytest.mark.parametrize("text", ["D2O", "HTO", "T2O", "CDCl3"])
def test_isotopic_waters_and_solvents_stay_as_written(text):
    assert score_formula(text)["formula_normalized"] == text


@pytest.mark.parametrize("typed, meant, name", [
    ("PBSO4", "PbSO4", "lead sulfate"), ("PB(NO3)2", "Pb(NO3)2", "lead nitrate"),
    ("CU(NO3)2", "Cu(NO3)2", "copper(II) nitrate"), ("CO(NO3)2", "Co(NO3)2", "cobalt(II) nitrate"),
    ("IN2O3", "In2O3", "indium oxide"), ("NB2O5", "Nb2O5", "niobium pentoxide"), ("PBO", "PbO", "lead(II) oxide"),
])
def test_capitals_whose_literal_reading_is_no_registry_compound_take_the_one_it_lists(typed, meant, name):
    # read letter by letter these are BPSO4, BPN2O6, a uranyl nitrate cyanate, nitronium carbonate, N2IO3, B2NO5,
    # BPO: compositions the registry lists no compound of, while the re-casing is a stock salt (common practice);
    # the registry package chemicals gives the meant formula for the name
    identifiers = pytest.importorskip("chemicals.identifiers")
    from ionicity.scorer.formula import hill_formula, parse_formula
    row = score_formula(typed)
    assert row["formula_normalized"] == meant and "typing slip" in row["message"]
    assert hill_formula(dict(parse_formula(meant).counts)) == identifiers.search_chemical(name).formula


@pytest.mark.parametrize("text", ["CO", "CO2", "NO", "KI", "KIO3", "UO2", "UF6", "CS2", "SF6", "HCN", "BN", "BF3",
                                  "VOSO4", "YF3", "WO3", "C6H5NO2"])
def test_capital_formulas_the_registry_lists_stay_as_written(text):
    # each is a compound as written (carbon monoxide, uranium dioxide, vanadyl sulfate...; common practice)
    row = score_formula(text)
    assert "typing slip" not in (row["message"] or "")
