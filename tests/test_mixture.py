"""Mixtures in the formula column (scorer/mixture_notation.py, scorer/mixture.py).

References: molar masses for the weight-percent conversion from molmass (an
independent reference library, IUPAC atomic weights); melting points and
enthalpies of fusion from the chemicals package's CRC tables (CRC Handbook,
Haynes 2014); the compositions of the standard blends from their sources in
scorer/data/blends.csv.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer.mixture import fusion_rows, read_mixture
from ionicity.scorer.mixture_notation import MixtureNotationError, read_mixture_text
from ionicity.scorer.mixture_rules import MIXTURE_RULES
from ionicity.scorer.columns import output_columns
from ionicity.scorer.record import score_formula, score_row
from ionicity.scorer.tables import table


def _mix(text):
    r = score_formula(text)
    assert r["substance_class"] == "mixture", (text, r["message"])
    return r, r["mixture_components"].split(";"), [float(x) for x in r["mixture_mole_fractions"].split(";")]


@pytest.mark.parametrize(
    "text, components, fractions",
    [
        ("LiCl-KCl (58.8-41.2 mol%)", ["LiCl", "KCl"], [0.588, 0.412]),
        ("LiCl–KCl 58.8:41.2", ["LiCl", "KCl"], [0.588, 0.412]),  # en dash
        ("LiCl:KCl 58.8:41.2", ["LiCl", "KCl"], [0.588, 0.412]),
        ("0.588 LiCl + 0.412 KCl", ["LiCl", "KCl"], [0.588, 0.412]),
        ("0.588LiCl·0.412KCl", ["LiCl", "KCl"], [0.588, 0.412]),
        ("LiF-NaF-KF (46.5-11.5-42 mol%)", ["LiF", "NaF", "KF"], [0.465, 0.115, 0.42]),
        ("ChCl:urea 1:2", ["[Ch]Cl", "urea"], [1 / 3, 2 / 3]),
        ("choline chloride : urea (1:2)", ["[Ch]Cl", "urea"], [1 / 3, 2 / 3]),
        ("MgCl2-KCl 32:68", ["MgCl2", "KCl"], [0.32, 0.68]),
        ("NaOH + KOH", ["NaOH", "KOH"], [0.5, 0.5]),
    ],
)
def test_notation_components_and_mole_fractions(text, components, fractions):
    _, got_components, got_fractions = _mix(text)
    assert got_components == components
    assert got_fractions == pytest.approx(fractions, abs=1e-4)


def test_weight_percent_is_converted_with_molar_masses():
    molmass = pytest.importorskip("molmass")
    m_na, m_k = molmass.Formula("NaNO3").mass, molmass.Formula("KNO3").mass  # IUPAC weights via molmass
    expected = (60 / m_na) / (60 / m_na + 40 / m_k)
    for text in ("NaNO3-KNO3 60:40 wt%", "NaNO3:KNO3 (60-40 wt%)", "solar salt"):
        _, components, fractions = _mix(text)
        assert components == ["NaNO3", "KNO3"]
        assert fractions[0] == pytest.approx(expected, abs=1e-4)
    # the same numbers in mol% are not converted
    assert _mix("NaNO3-KNO3 60:40 mol%")[2][0] == pytest.approx(0.6)


@pytest.mark.parametrize(
    "text, components, fractions",
    [  # compositions as the sources in scorer/data/blends.csv give them
        ("FLiNaK", ["LiF", "NaF", "KF"], [0.465, 0.115, 0.42]),
        ("flinak", ["LiF", "NaF", "KF"], [0.465, 0.115, 0.42]),
        ("FLiBe", ["LiF", "BeF2"], [0.67, 0.33]),
        ("reline", ["[Ch]Cl", "urea"], [1 / 3, 2 / 3]),
        ("LiCl-KCl eutectic", ["LiCl", "KCl"], [0.588, 0.412]),
    ],
)
def test_blend_names(text, components, fractions):
    r, got_components, got_fractions = _mix(text)
    assert got_components == components
    assert got_fractions == pytest.approx(fractions, abs=1e-4)
    assert "read as" in r["value_notes"]


def test_hitec_weight_percent_to_mole_fractions():
    molmass = pytest.importorskip("molmass")
    w = {"NaNO2": 40, "NaNO3": 7, "KNO3": 53}  # Kirst, Nagle and Castner 1940 (blends.csv)
    n = {k: v / molmass.Formula(k).mass for k, v in w.items()}
    _, components, fractions = _mix("Hitec")
    assert components == list(w)
    assert fractions == pytest.approx([n[k] / sum(n.values()) for k in w], abs=1e-4)


@pytest.mark.parametrize(
    "text, alternative",
    [("LiCl+KCl", "double salt"), ("KNO3+NaNO3", "KNa(NO3)2"), ("0.588LiCl·0.412KCl", "solid solution")],
)
def test_ambiguous_notations_warn_and_say_which_reading(text, alternative):
    r, _, _ = _mix(text)
    assert r["status"] == "warning"
    assert "read as a mixture" in r["message"] and alternative in r["message"]


def test_no_proportions_warns_and_says_what_was_assumed():
    r, _, fractions = _mix("LiCl-KCl")
    assert r["status"] == "warning" and "published liquidus point" in r["message"]
    assert fractions == pytest.approx([0.588, 0.412])
    r, _, fractions = _mix("NaCl-KBr")  # no published point: equal moles
    assert "equal moles assumed" in r["message"] and fractions == pytest.approx([0.5, 0.5])


@pytest.mark.parametrize(
    "text, normalized",
    [
        ("KNa(NO3)2", "KNa(NO3)2"),
        ("KMgCl3", "KMgCl3"),
        ("K2SO4·Al2(SO4)3·24H2O", "K2Al2(SO4)4·24H2O"),
        ("CuSO4·5H2O", "CuSO4·5H2O"),
        ("CaCl2·6H2O", "CaCl2·6H2O"),
        ("CaSO4+2H2O", "CaSO4·2H2O"),
        ("CaSO4·0.5H2O", "CaSO4·0.5H2O"),
        ("SO4^2-", "SO4^2-"),
        ("[Fe(CN)6]4-", None),
        ("[C4mim]+[BF4]-", "[C4mim][BF4]"),
        ("NaCl", "NaCl"),
    ],
)
def test_compounds_stay_compounds(text, normalized):
    r = score_formula(text)
    assert r["substance_class"] != "mixture"
    assert r["mixture_components"] is None and math.isnan(r["liquidus_estimate_K"])
    if normalized:
        assert r["formula_normalized"] == normalized


def test_component_names_resolve():
    assert fusion_rows()["chcl"]["formula"] == "[Ch]Cl"  # the cholinium ion of scorer/data/ions.csv
    assert fusion_rows()["urea"]["formula"] == "CH4N2O"
    r = score_formula("[Ch]Cl")
    assert r["cations"] == "[Ch](+)*1"


@pytest.mark.parametrize(
    "text, words",
    [
        ("LiCl-KCl 1:2:3", "3 proportions for 2 components"),
        ("0.5 LiCl + KCl", "amounts given for 1 of 2"),
        ("LiCl-Xx", "component 'Xx'"),
        ("LiCl:foo 1:2", "component 'foo'"),
        ("LiCl-LiCl", "named twice"),
        ("LiCl-KCl (0-100 mol%)", "zero"),
    ],
)
def test_unreadable_mixtures_are_error_rows_saying_why(text, words):
    r = score_formula(text)
    assert r["status"] == "error" and words in r["message"], r["message"]


def test_no_row_is_dropped():
    pd = pytest.importorskip("pandas")
    from ionicity.pipelines.table import score_table

    texts = ["LiCl-KCl", "FLiNaK", "LiCl-KCl 1:2:3", "NaCl", None, "ChCl:urea 1:2", "KNO3+NaNO3"]
    out = score_table(pd.DataFrame({"formula": texts}), formula_col="formula")
    assert len(out) == len(texts)
    assert list(out["status"]) == ["warning", "ok", "error", "ok", "error", "ok", "warning"]


def test_mixture_values_follow_their_rules():
    r, _, x = _mix("LiCl-KCl (58.8-41.2 mol%)")
    li, k = score_formula("LiCl"), score_formula("KCl")
    assert r["molar_mass_g_mol"] == pytest.approx(x[0] * li["molar_mass_g_mol"] + x[1] * k["molar_mass_g_mol"])
    assert r["delta_chi_pauling"] == pytest.approx(x[0] * li["delta_chi_pauling"] + x[1] * k["delta_chi_pauling"])
    assert r["cation_polarising_power_max_e_per_A2"] == pytest.approx(li["cation_polarising_power_max_e_per_A2"])
    assert r["cations"] == "Li(+)*0.588;K(+)*0.412" and r["anions"] == "Cl(-)*1"
    assert r["structure_type"] is None and math.isnan(r["lattice_energy_vbt_kJ_mol"])
    assert r["anion_hsab_class"] == li["anion_hsab_class"]


def test_every_column_states_how_a_mixture_value_is_formed():
    for column in output_columns():
        if MIXTURE_RULES.get(column.name) == "own":
            continue
        assert "mixture:" in column.method, column.name
    # every rule names a column that exists (a renamed column shows here)
    names = {c.name for c in output_columns()}
    assert set(MIXTURE_RULES) <= names


def test_molecular_component_has_no_ion_values():
    r, _, _ = _mix("ChCl:urea 1:2")
    assert "urea: neutral molecule" in r["value_notes"]
    chcl = score_formula("[Ch]Cl")
    # the ion-based mean comes from the one component that has ions
    assert r["delta_chi_pauling"] == pytest.approx(chcl["delta_chi_pauling"])


def test_notation_reader_rejects_nothing_it_should_not_see():
    assert read_mixture_text("Fe0.95O") is None
    assert read_mixture_text("CaSO4·0.5H2O") is None
    with pytest.raises(MixtureNotationError):
        read_mixture_text("LiCl-KCl (1-2-3 mol%)")
    assert read_mixture("NaCl", score_row) is None


def test_fusion_table_matches_the_chemicals_crc_data():
    pytest.importorskip("chemicals")
    from chemicals.phase_change import Hfus, Tm

    checked = 0
    for row in table("fusion.csv"):
        if not row["source"].startswith("CRC Handbook"):
            continue  # choline chloride: an estimate, from memory (its source says so)
        assert Tm(row["cas"]) == pytest.approx(float(row["melting_point_K"]), abs=0.01), row["component"]
        assert Hfus(row["cas"]) / 1000 == pytest.approx(float(row["enthalpy_fusion_kJ_mol"]), rel=1e-6), row["component"]
        checked += 1
    assert checked == 37


# Spellings of a mixture as formulators write them (common practice): a slash between
# components, amounts with their unit before each component, and one component left to
# take the balance of percentages. Solar salt is 60 wt% NaNO3 / 40 wt% KNO3 (Bauer et al.,
# "Characterization of sodium nitrate and potassium nitrate ... for thermal energy
# storage", 2012; from memory): its mole fractions follow from the molar masses
# (NaNO3 84.99, KNO3 101.10 g/mol, IUPAC atomic weights).
SOLAR_SALT_X_NANO3 = (60 / 84.9947) / (60 / 84.9947 + 40 / 101.1032)


@pytest.mark.parametrize("text", [
    "NaNO3/KNO3 60:40 wt%", "NaNO3/KNO3 (60/40 wt%)", "60 wt% NaNO3 + 40 wt% KNO3", "KNO3 + 60 wt% NaNO3",
    # spaces alone between the amounts and components, and a percentage after one component, the other the balance
    "60 wt% NaNO3 40 wt% KNO3", "NaNO3 60 wt% + KNO3", "KNO3 + NaNO3 (60 wt%)",
    # each percentage after its component, joined by spaces alone (an error before)
    "NaNO3 60wt% KNO3 40wt%", "NaNO3 60 wt% KNO3 40 wt%",
])
def test_solar_salt_spellings_agree(text):
    from ionicity.scorer.mixture_notation import read_mixture_text
    from ionicity.scorer.record import score_formula
    out = score_formula(text)
    assert out["substance_class"] == "mixture", out
    fractions = dict(zip(out["mixture_components"].split(";"), map(float, out["mixture_mole_fractions"].split(";"))))
    assert fractions["NaNO3"] == pytest.approx(SOLAR_SALT_X_NANO3, abs=1e-3)
    assert read_mixture_text(text).basis == "wt"


def test_balance_component_is_named_in_the_row():
    from ionicity.scorer.record import score_formula
    out = score_formula("NaCl + 5 mol% KCl")
    assert out["status"] == "warning" and "taken as the balance, 95 mol%" in out["message"]
    assert out["mixture_mole_fractions"] == "0.95;0.05"


@pytest.mark.parametrize("text, words", [
    ("60 wt% NaNO3 + 40 mol% KNO3", "mixes mol% and wt%"),
    ("60 wt% NaNO3 + KNO3 + LiNO3", "amounts given for 1 of 3"),
])
def test_unreadable_amounts_are_row_errors(text, words):
    from ionicity.scorer.record import score_formula
    out = score_formula(text)
    assert out["status"] == "error" and words in out["message"]


def test_percentages_that_do_not_add_up_say_so():
    from ionicity.scorer.record import score_formula
    out = score_formula("50 wt% NaCl + 60 wt% KCl")
    assert "add up to 110, not 100" in out["message"]


# Names read as names before mixtures: the hyphens of a systematic ionic-liquid name join
# no components (the IUPAC names of the ions, from the ion library), and components may
# themselves be names (common practice in formulation sheets).
@pytest.mark.parametrize("text, formula", [
    ("1-ethyl-3-methylimidazolium chloride", "[C2mim]Cl"),
    ("1-butyl-3-methylimidazolium tetrafluoroborate", "[C4mim][BF4]"),
])
def test_hyphenated_ionic_liquid_names_are_compounds(text, formula):
    from ionicity.scorer.record import score_formula
    out = score_formula(text)
    assert out["substance_class"] == "ionic_liquid_pair" and out["formula_normalized"] == formula


def test_mixture_components_may_be_names():
    from ionicity.scorer.record import score_formula
    out = score_formula("sodium nitrate + potassium nitrate 60:40 wt%")
    assert out["mixture_components"] == "NaNO3;KNO3"
    assert float(out["mixture_mole_fractions"].split(";")[0]) == pytest.approx(SOLAR_SALT_X_NANO3, abs=1e-3)


def test_amounts_written_after_each_component():
    # Hitec as its makers give it, amounts after the components (Kirst, Nagle and Castner, Trans. Am.
    # Inst. Chem. Eng. 1940, 36, 371: 53 wt% KNO3, 40 wt% NaNO2, 7 wt% NaNO3; from memory): the same
    # mixture as the blend name
    from ionicity.scorer.mixture_notation import read_mixture_text
    text = read_mixture_text("KNO3 53 / NaNO2 40 / NaNO3 7 wt%")
    assert (text.parts, text.amounts, text.basis) == (("KNO3", "NaNO2", "NaNO3"), (53.0, 40.0, 7.0), "wt")
    written = score_formula("KNO3 53 + NaNO2 40 + NaNO3 7 (wt%)")
    named = score_formula("Hitec salt")
    assert written["status"] == named["status"] == "ok"
    assert written["liquidus_estimate_K"] == pytest.approx(named["liquidus_estimate_K"])


def test_blend_names_followed_by_a_trade_word():
    # "Hitec salt", "solar salt mixture": the blend's name with the word people add (common practice)
    for text in ("Hitec salt", "HITEC salt", "Solar salt mixture"):
        assert score_formula(text)["substance_class"] == "mixture", text


def test_a_bracketed_ionic_liquid_with_water_after_a_slash():
    # [C4mim][BF4] with water, as formulators write it; CaSO4+2H2O stays a hydrate (common practice)
    row = score_formula("[C4mim][BF4]/H2O 90:10")
    assert row["substance_class"] == "mixture" and row["status"] == "ok"
    assert score_formula("CaSO4+2H2O")["substance_class"] == "ionic_salt"


@pytest.mark.parametrize("text, components, fractions", [
    # whole-number coefficients on some components, as molten-salt compositions are written: 2LiF-BeF2 is
    # the 2:1 FLiBe melt (Thoma et al., J. Phys. Chem. 63 (1959) 1266, from memory), 3NaF-AlF3 the cryolite
    # ratio (common practice); the component without a coefficient counts once
    ("2LiF-BeF2", "LiF;BeF2", (2 / 3, 1 / 3)),
    ("3NaF-AlF3", "NaF;AlF3", (0.75, 0.25)),
    ("KCl-2MgCl2", "KCl;MgCl2", (1 / 3, 2 / 3)),
])
def test_stoichiometric_coefficients_on_some_components(text, components, fractions):
    r, got_components, got = _mix(text)
    assert ";".join(got_components) == components
    assert got == pytest.approx(fractions, abs=1e-4)
    assert "counted once" in r["message"]


def test_a_fraction_on_one_component_alone_is_still_refused():
    # 0.6 before one component and nothing before the other is no coefficient: ask for the rest
    r = score_formula("0.6 NaNO3 - KNO3")
    assert r["status"] == "error" and "amounts given for 1 of 2 components" in r["message"]


def test_amounts_in_brackets_after_each_component():
    # "NaNO3 (60 wt%) + KNO3 (40 wt%)" was read at equal moles, its amounts ignored as notes; solar salt is
    # 60:40 by weight (blends.csv); molar masses from molmass
    _, components, fractions = _mix("NaNO3 (60 wt%) + KNO3 (40 wt%)")
    assert components == ["NaNO3", "KNO3"]
    assert fractions == pytest.approx([0.6408, 0.3592], abs=1e-3)


@pytest.mark.parametrize("text", ["eutectic LiF-NaF-KF", "LiF-NaF-KF eutectic"])
def test_the_word_eutectic_takes_the_published_point(text):
    # FLiNaK, 46.5-11.5-42 mol% (scorer/data/eutectics.csv, its source there)
    r, components, fractions = _mix(text)
    assert components == ["LiF", "NaF", "KF"]
    assert fractions == pytest.approx([0.465, 0.115, 0.42], abs=1e-3)
    assert r["status"] == "ok"


def test_a_eutectic_without_a_published_point_asks_for_proportions():
    r = score_formula("CsCl-RbCl eutectic")
    assert r["status"] == "error" and "no published eutectic" in r["message"]


@pytest.mark.parametrize("text, normalized, hill", [
    # the CAS index's inverted names with the acid-to-metal ratio in brackets and a hydrate word after a comma
    # (common practice of the registry's name tables): one compound, not a list; the first raised RecursionError
    # (the mixture reader took the whole text for its one component and asked itself again)
    ("phosphoric acid, aluminum salt (1:1), dihydrate", "AlPO4·2H2O", "AlPO4(H2O)2"),
    ("sulfuric acid, europium(3+) salt (3:2), octahydrate", "Eu2(SO4)3·8H2O", "Eu2(SO4)3(H2O)8"),
])
def test_an_inverted_name_with_a_ratio_and_a_hydrate_word_is_one_compound(text, normalized, hill):
    molmass = pytest.importorskip("molmass")
    row = score_formula(text)
    assert row["status"] == "warning" and row["formula_normalized"] == normalized
    # within 1e-4: the two packages' atomic weights of Eu differ by 0.01
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula(hill).mass, rel=1e-4)


def test_water_in_an_ionic_liquid_given_after_it():
    # "[C4mim][BF4] + H2O (10 wt%)" had ignored the note and taken equal moles; 10 wt% water with the ionic liquid
    # as the balance: x(H2O) = (10/18.015) / (10/18.015 + 90/225.99) (molar masses from IUPAC atomic weights)
    out = score_formula("[C4mim][BF4] + H2O (10 wt%)")
    fractions = dict(zip(out["mixture_components"].split(";"), map(float, out["mixture_mole_fractions"].split(";"))))
    expected = (10 / 18.015) / (10 / 18.015 + 90 / 225.99)
    assert fractions["H2O"] == pytest.approx(expected, abs=2e-3)
    assert "taken as the balance, 90 wt%" in out["message"]


@pytest.mark.parametrize("text", ["[C4mim][BF4]/water 1:1 v/v", "ethanol:water 70:30 v/v", "NaCl-KCl 50-50 vol%"])
def test_proportions_by_volume_are_refused_with_the_reason(text):
    # a volume ratio needs densities to become mole fractions (common practice); these were errors about a
    # stray '/' or 'vol%' read as a formula
    out = score_formula(text)
    assert out["status"] == "error" and "proportions by volume" in out["message"] and "density" in out["message"]


def test_a_solution_with_its_solvents_by_volume_stays_a_solution():
    out = score_formula("1 M LiPF6 in EC/DMC (1:1 v/v)")
    assert out["status"] != "error" and out["formula_normalized"] == "LiPF6"
