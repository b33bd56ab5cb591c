"""Compound names: the reader (scorer.name_reader), the check against formulas
(scorer.name_check, pipelines.name_step), the generated names
(scorer.systematic_name) and names typed in the formula column.

Two sets of reference names, kept apart:

* ``tests/data/name_cases.csv``: names of every kind the reader covers, each
  with its formula and a source (IUPAC Red Book 2005 examples, Greenwood &
  Earnshaw, the CRC Handbook's table of inorganic compounds, the Merck Index;
  recalled, so marked "from memory"). The grammar was written while these
  were tried: they are its **development set**, not a validation.
* the **validation set**: the names and formulas of the inorganic compounds in
  the identifier table of the ``chemicals`` package (built at run time; the
  test is skipped without it), never looked at row by row while the grammar
  was written except to fix general gaps (CAS index name styles).
"""
from __future__ import annotations

import csv
import os
import re
from collections import Counter
from pathlib import Path

import pytest
from hypothesis import given, settings, strategies as st

from ionicity.scorer.elements import is_element_symbol, is_metal
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.name_check import NAME_CHECKS, check_name
from ionicity.scorer.name_reader import read_name
from ionicity.scorer.record import score_formula
from ionicity.scorer.verdict import Verdict, with_warnings

DATA = Path(__file__).parent / "data"


def _total(formula: str) -> dict:
    return {s: round(n, 4) for s, n in parse_formula(formula).total_counts.items()}


def _cases():
    with open(DATA / "name_cases.csv", encoding="utf-8") as handle:
        return list(csv.DictReader(handle))


def test_the_development_names_span_every_kind_and_name_their_sources():
    cases = _cases()
    kinds = Counter(c["kind"].split("+")[0] for c in cases)
    for kind in ("compositional", "prefixes", "stock", "classical", "hydrate", "acid salt", "oxoanion", "thio",
                 "peroxide", "superoxide", "azide", "amide", "hydride", "coordination", "ionic liquid", "trivial"):
        assert kinds[kind] >= 1, kind
    assert all(c["source"].strip() for c in cases)


@pytest.mark.parametrize("case", _cases(), ids=lambda c: c["name"].strip())
def test_a_name_means_its_formula(case):
    formula = read_name(case["name"])
    assert formula is not None, case["name"]
    assert _total(formula) == _total(case["formula"]), (case["name"], formula, case["source"])


def test_names_read_the_same_whatever_the_case_spaces_and_hyphens():
    # common practice: a label's capitals and spacing carry no meaning
    spellings = ["copper(II) sulfate pentahydrate", "COPPER(II) SULFATE PENTAHYDRATE", "copper (II) sulfate  pentahydrate",
                 "copper(II)-sulfate-pentahydrate", "Copper(ii) sulphate 5-hydrate"]
    assert {read_name(s) for s in spellings} == {"CuSO4·5H2O"}


@pytest.mark.parametrize("text", ["", "   ", "no such compound", "sodium", "x" * 5000, "((((", "iron chloride"])
def test_unreadable_or_ambiguous_names_give_none_and_never_raise(text):
    # "iron chloride" says no oxidation number for a metal of two: it is not guessed
    result = read_name(text)
    assert result is None or text == "sodium"


@settings(max_examples=300, deadline=None)
@given(st.text(max_size=80))
def test_reading_arbitrary_text_never_raises(text):
    result = read_name(text)
    assert result is None or isinstance(result, str)


# --- names against formulas -------------------------------------------------------------------


def test_the_four_outcomes_of_the_check():
    assert check_name("NaCl", "sodium chloride")[:2] == ("NaCl", "match")
    assert check_name("CuSO4", "copper(II) sulfate pentahydrate")[:2] == ("CuSO4·5H2O", "hydrate_differs")
    mismatch = check_name("KCl", "sodium chloride")
    assert mismatch.name_check == "mismatch" and "means NaCl" in mismatch.warning and "not KCl" in mismatch.warning
    assert check_name("NaCl", "Reagent X-17 (lot 4)")[:2] == (None, "name_unread")
    assert check_name("NaCl", "") == (None, None, None)
    assert {"match", "hydrate_differs", "mismatch", "name_unread"} == set(NAME_CHECKS)


def test_water_inside_a_complex_matches_its_hydrate_spelling():
    # [Fe(H2O)6]Cl3 and FeCl3·6H2O hold the same atoms (Greenwood & Earnshaw 1997, iron(III) chloride hexahydrate)
    normalized = score_formula("FeCl3·6H2O")["formula_normalized"]
    assert check_name(normalized, "hexaaquairon(III) chloride").name_check == "match"


def test_a_row_that_could_not_be_scored_still_says_what_its_name_means():
    result = check_name(None, "sodium chloride")
    assert result.name_check == "mismatch" and result.warning == "the name 'sodium chloride' means NaCl"


def test_the_batch_step_applies_the_verdict_policy_of_with_warnings():
    import pyarrow as pa

    from ionicity.pipelines.name_step import NameStep

    rows = [("KCl", "sodium chloride", "ok", ""), ("KCl", "sodium chloride", "warning", "structure type guessed"),
            (None, "sodium chloride", "error", "empty formula cell"), ("NaCl", "sodium chloride", "ok", "")]
    normalized, names, status, message = (pa.array(list(c), pa.string()) for c in zip(*rows))
    _, checks, new_status, new_message = NameStep().columns(normalized, names, status, message)
    for (formula, name, s, m), got_status, got_message in zip(rows, new_status.to_pylist(), new_message.to_pylist()):
        warning = check_name(formula, name).warning
        expected = with_warnings(Verdict(s, m, ""), [warning] if warning else [])
        assert (got_status, got_message) == (expected.status, expected.message)
    assert checks.to_pylist() == ["mismatch", "mismatch", "mismatch", "match"]


# --- names in the formula column ------------------------------------------------------------


@pytest.mark.parametrize("text, formula", [
    ("choline chloride", "[Ch]Cl"),  # Merck Index (from memory): choline chloride C5H14ClNO
    ("sodium chloride", "NaCl"),
    ("copper(II) sulfate pentahydrate", "CuSO4·5H2O"),
])
def test_a_name_in_the_formula_column_is_scored_as_its_formula_with_a_warning(text, formula):
    record = score_formula(text)
    assert record["status"] == "warning"
    assert record["formula_normalized"] == formula
    assert "holds a name" in record["message"] and repr(text) in record["message"]


def test_a_formula_that_is_not_a_name_keeps_its_error():
    record = score_formula("Xx2O")
    assert record["status"] == "error" and "unknown element 'Xx'" in record["message"]


# --- generated names ------------------------------------------------------------------------


@pytest.mark.parametrize("formula, name", [
    # IUPAC Red Book 2005, IR-5.4 (Stock names; from memory) and the ion library's names
    ("Fe2(SO4)3", "iron(III) sulfate"),
    ("FeCl2", "iron(II) chloride"),
    ("NaCl", "sodium chloride"),
    ("Al2O3", "aluminium oxide"),
    ("Hg2Cl2", "mercury(I) chloride"),
    ("CuSO4·5H2O", "copper(II) sulfate pentahydrate"),
    ("CaSO4·0.5H2O", "calcium sulfate hemihydrate"),
    ("K3[Fe(CN)6]", "potassium hexacyanidoferrate(III)"),
    ("[Co(NH3)6]Cl3", "hexaamminecobalt(III) chloride"),
    ("[C4mim][BF4]", "1-butyl-3-methylimidazolium tetrafluoridoborate"),
    ("H2SO4", "sulfuric acid"),
])
def test_systematic_names(formula, name):
    assert score_formula(formula)["systematic_name"] == name


def test_every_generated_name_reads_back_as_its_formula():
    # a property of our own code: the generated column can relabel an inventory
    from ionicity.pipelines.bench import realistic_formulas

    named = 0
    for formula in realistic_formulas(1500, seed=5):
        record = score_formula(formula)
        name = record["systematic_name"]
        if name is None:
            assert record["substance_class"] not in ("ionic_salt", "ionic_liquid_pair") or record["status"] != "ok" \
                or "systematic_name" in (record["value_notes"] or ""), formula
            continue
        named += 1
        assert check_name(record["formula_normalized"], name).name_check == "match", (formula, name)
    assert named > 1000


def test_non_ionic_rows_get_no_name():
    assert score_formula("CO2")["systematic_name"] is None


# --- the external validation set ------------------------------------------------------------

_BRACKET_ATOM = re.compile(r"\[(\d*)([A-Z][a-z]?)(@*)(H\d*)?([+-]\d*|[+-]+)?\]")


def _smiles_charge(text: str | None) -> int:
    if not text:
        return 0
    sign = 1 if text[0] == "+" else -1
    return sign * int(text[1:]) if text[1:].isdigit() else sign * len(text)


def _salt_record(smiles: str) -> bool:
    """A record of the table that describes a salt: a metal cation and an
    anion with charges in its SMILES, summing to zero, and no water component
    (the table's records list each distinct component once, so a hydrate's
    water count is lost in them; such rows cannot check a hydrate name)."""
    if "O" in smiles.split("."):
        return False
    total, metal_cation, anion = 0, False, False
    for match in _BRACKET_ATOM.finditer(smiles):
        charge = _smiles_charge(match.group(5))
        total += charge
        symbol = match.group(2)
        metal_cation |= charge > 0 and is_element_symbol(symbol) and is_metal(symbol)
        anion |= charge < 0
    return metal_cation and anion and total == 0


def salt_agreement():
    """(rows counted, rows whose name reads as the table's formula, rows unread, misses).

    Rows counted ("salts"): records of ``chemicals``' inorganic identifier
    table (``Inorganic db.tsv``: PubChem CID, CAS, Hill formula, MW, SMILES,
    InChI, InChIKey, IUPAC name, common name, synonyms) whose SMILES is a salt
    record (:func:`_salt_record`) and whose Hill formula our scorer classes as
    ``ionic_salt``. The name read is the common name; agreement is equal
    element counts, water included."""
    identifiers = pytest.importorskip(
        "chemicals.identifiers", reason="the chemicals package (the 'melting' extra) is not installed")
    path = os.path.join(identifiers.folder, "Inorganic db.tsv")
    counted = agreed = unread = 0
    misses = []
    with open(path, encoding="utf-8") as handle:
        for line in handle:
            fields = line.rstrip("\n").split("\t")
            if len(fields) < 9:
                continue
            formula, smiles, name = fields[2], fields[4], fields[8]
            if not _salt_record(smiles) or score_formula(formula)["substance_class"] != "ionic_salt":
                continue
            counted += 1
            read = read_name(name)
            if read is None:
                unread += 1
                misses.append((name, formula, None))
            elif _total(read) == _total(formula):
                agreed += 1
            else:
                misses.append((name, formula, read))
    return counted, agreed, unread, misses


def test_validation_names_of_the_chemicals_identifier_table():
    counted, agreed, unread, misses = salt_agreement()
    print(f"chemicals inorganic salts: {agreed}/{counted} names read as their formula "
          f"({agreed / counted:.1%}); {unread} unread, {len(misses) - unread} read otherwise")
    assert counted >= 150
    assert agreed / counted >= 0.90, misses


# --- the columns in files -------------------------------------------------------------------


def test_name_columns_in_a_scored_file_and_none_without_a_name_column(tmp_path):
    import pyarrow.parquet as pq

    from ionicity.pipelines.run import score_file

    source = tmp_path / "stock.csv"
    source.write_text(
        "id,formula,label\n1,KCl,sodium chloride\n2,CuSO4.5H2O,copper(II) sulfate pentahydrate\n"
        "3,CuSO4,blue vitriol\n4,NaCl,Reagent X-17\n5,choline chloride,\n", encoding="utf-8")
    named = tmp_path / "named.parquet"
    score_file(str(source), str(named), name_col="label", workers=1, quiet=True)
    table = pq.read_table(named).to_pydict()
    assert [str(v) if v is not None else None for v in table["name_check"]] == \
        ["mismatch", "match", "hydrate_differs", "name_unread", None]
    assert table["status"][0] == "warning" and "means NaCl, not KCl" in table["message"][0]
    assert table["status"][1] == "ok" and table["name_formula"][1] == "CuSO4·5H2O"
    assert table["systematic_name"][1] == "copper(II) sulfate pentahydrate"
    plain = tmp_path / "plain.parquet"
    score_file(str(source), str(plain), workers=1, quiet=True)
    names = pq.read_table(plain).schema.names
    assert "name_formula" not in names and "name_check" not in names and "systematic_name" in names


@pytest.mark.parametrize("text", ["machine oil", "polyvinyl alcohol", "Sealant solution"])  # mineral oil: a material  # bleach is a named solution now
def test_an_unknown_name_says_names_are_read_and_to_write_the_formula(text):
    # materials of no one formula and names the name reader does not hold: the row says what happened, not
    # only "unexpected 'm'" (common practice); acetone and sodium dodecyl sulfate are read since the registry's
    # names (tests/test_registry_names.py)
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["status"] == "error"
    assert "neither a formula nor a name the name reader knows" in row["message"]
    assert "write the formula" in row["message"]


@pytest.mark.parametrize("text", ["K4[Fe(CN)6", "Xx2"])
def test_a_broken_formula_keeps_the_grammar_message(text):
    from ionicity.scorer.record import score_formula
    assert "name reader" not in score_formula(text)["message"]


@pytest.mark.parametrize("text, formula", [
    # laboratory codes of solvents (common practice; the carbonates after Xu, Chem. Rev. 104 (2004) 4303):
    # THF was read as tritium, hydrogen and fluorine, PC as phosphorus carbide, AcOEt as an actinium compound
    ("THF", "C4H8O"), ("DMSO", "C2H6OS"), ("PC", "C4H6O3"), ("AcOEt", "C4H8O2"), ("dmf", "C3H7NO"),
])
def test_solvent_codes_read_as_their_molecules(text, formula):
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["formula_normalized"] == formula and row["substance_class"] == "covalent_molecular"
    assert "read the laboratory code" in row["message"]


@pytest.mark.parametrize("text, cas", [
    # buffers and a chelator by their codes (common practice); formulas of the CAS numbers from the registry
    # package chemicals at test time. TRIS had no code; as a formula, C4H11NO3 reads as propylammonium
    # hydrogencarbonate, while a code names the molecule
    ("TRIS", "77-86-1"), ("HEPES", "7365-45-9"), ("MOPS", "1132-61-2"), ("MES", "4432-31-9"),
    ("EDTA", "60-00-4"), ("PIPES", "5625-37-6"),
])
def test_buffer_codes_read_as_their_molecules(text, cas):
    identifiers = pytest.importorskip("chemicals.identifiers")
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.grammar import hill_formula
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    expected = identifiers.search_chemical(cas).formula
    assert hill_formula(dict(parse_formula(row["formula_normalized"]).counts)) == hill_formula(
        dict(parse_formula(expected).counts))
    # one molecule: no cation but an acid's protons; EDTA reads as its four carboxyl protons with edetate, the
    # library's convention for a polyprotic acid (H3PO4 is 3 H+ with phosphate), since edetate joined the library
    # (5 December 2026; before, as two protons with the dihydrogen edetate of disodium EDTA)
    protons = "H(+)*4" if text == "EDTA" else "H(+)*1"
    assert row["substance_class"] in ("covalent_molecular", "acid") and (row["cations"] or protons) == protons


def test_a_compound_that_shares_a_code_stays_itself():
    from ionicity.scorer.record import score_formula
    assert score_formula("VC")["substance_class"] == "intermetallic"  # vanadium carbide, no solvent code


@pytest.mark.parametrize("text, formula", [
    # NMR solvents: the code with every hydrogen deuterated (common practice); molar mass from periodictable's D
    ("DMSO-d6", "C2D6OS"), ("THF-d8", "C4D8O"), ("DCM-d2", "CD2Cl2"),
])
def test_deuterated_solvent_codes(text, formula):
    import periodictable
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["formula_normalized"] == formula
    expected = periodictable.formula(formula.replace("D", "D")).mass
    assert row["molar_mass_g_mol"] == pytest.approx(expected, rel=1e-4)


@pytest.mark.parametrize("name, formula", [
    # the trade's oxide names (common practice; the Red Book writes diphosphorus pentaoxide, IR-5.2): the first
    # element's count is unsaid where one atom could not hold the state the prefix implies (P(+10))
    ("phosphorus pentoxide", "P2O5"), ("nitrogen tetroxide", "N2O4"), ("arsenic trioxide", "As2O3"),
    ("chlorine heptoxide", "Cl2O7"), ("vanadium pentoxide", "V2O5"), ("rhenium heptoxide", "Re2O7"),
    ("bismuth trioxide", "Bi2O3"),
    # one atom holds the state: as written
    ("sulfur trioxide", "SO3"), ("nitrogen dioxide", "NO2"), ("osmium tetroxide", "OsO4"), ("chlorine dioxide", "ClO2"),
    # a metal of several states without an oxidation number: the prefix counts atoms, not an ozonide ion
    ("chromium trioxide", "CrO3"), ("molybdenum trioxide", "MoO3"), ("iron disulfide", "FeS2"),
    # a metal of one state: the ion (disulfide(2-), ozonide)
    ("sodium disulfide", "Na2S2"), ("potassium ozonide", "KO3"),
    # borides and silicides of metallic phases: the prefix counts atoms, the metal's count is one (the registry
    # package chemicals: TiB2, ZrB2, VB2, MoSi2); they had read Ti2B2, Zr2B2, V2B2, Mo2Si2
    ("titanium diboride", "TiB2"), ("zirconium diboride", "ZrB2"), ("vanadium diboride", "VB2"),
    ("molybdenum disilicide", "MoSi2"),
])
def test_traditional_oxide_names(name, formula):
    from ionicity.scorer.name_reader import read_name
    assert read_name(name) == formula
    # "phosphorus pentoxide" had read as PO5, "chromium trioxide" as chromium(III) ozonide


@pytest.mark.parametrize("text", ["caesium tert-pentoxide", "n-hexyllithium"])
def test_a_hyphen_inside_an_unknown_name_is_not_a_mixture(text):
    # the error had been "component 'potassium tert' of the mixture" (potassium tert-butoxide, now a registry name)
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["status"] == "error" and "neither a formula nor a name" in row["message"]
    assert row["substance_class"] != "mixture"


def test_a_metal_named_as_the_metal():
    from ionicity.scorer.record import score_formula
    row = score_formula("sodium metal")
    assert row["formula_normalized"] == "Na" and "'metal'" in row["message"]


@pytest.mark.parametrize("mineral", [
    "sapphire", "anatase", "brookite", "cassiterite", "zircon", "spinel", "periclase", "dolomite", "aragonite",
    "magnesite", "cerussite", "witherite", "strontianite", "anglesite", "celestine", "brucite", "stibnite",
    "molybdenite", "pyrolusite", "wollastonite", "hydroxyapatite", "moissanite", "goethite",
])
def test_mineral_names_read_as_the_registry_s_formula(mineral):
    # the formula of the mineral name in scorer/data/trivial_names.csv against the registry package's own
    # lookup of the name (chemicals.identifiers.search_chemical); the registry's entries for chalcopyrite,
    # ilmenite, chromite, kaolinite and talc are not the minerals' formulas and are not compared
    chemicals = pytest.importorskip("chemicals")
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.record import score_formula
    registry = parse_formula(chemicals.identifiers.search_chemical(mineral).formula).hill
    row = score_formula(mineral)
    assert row["status"] == "warning" and parse_formula(row["formula_normalized"]).hill == registry
