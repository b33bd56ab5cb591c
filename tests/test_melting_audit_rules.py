"""Four general causes of wrong melting classes on unseen inorganic compounds, each a stated rule.

Found on half A of the inorganic audit (``tests/data/inorganic_audit.csv``, drawn by
``tests/audit_inorganic_sample.py``; half B is only measured) and on the calibration data of
the melting index; every reference melting point is read at run time from the registry package
``chemicals`` (``chemicals.phase_change.Tm``, CRC Handbook of Chemistry and Physics table), the CAS
number beside it.

1. Linear pseudohalides (CN-, SCN-, OCN-, N3-) beside an 18/18+2-electron cation read far too low
   (TlN3 and CuSCN came out ``ionic_liquid``): the second-stage term ``soft_cation_pseudohalide``
   (``scorer.melting_anions.soft_cation_pseudohalide_fraction``), fitted on the calibration residuals
   (TlN3 and K2Cd(CN)4 are its calibration rows), checked on Zn(CN)2 and CuSCN (validation half of
   the open set) and CuCN (in neither set).
2. Water-rich salt hydrates melt in their own water of crystallisation: ``melts_in_own_water``
   (``scorer.melting_routes.water_rich_hydrate``); the threshold of four waters is set by the chemistry
   (Lane 1983; Kenisarin & Mahkamov 2007) and measured on ``tests/data/salt_hydrates_registry.csv``
   (the registry's salt hydrates with a melting point outside the audit's half B).
3. A base without ions (NH3, N2H4, N2H4.H2O) takes the molecular route instead of none.
4. Hydrides and carbides of intermetallic hosts (AlNi3H3) are read as intermetallics
   (``scorer.bond_class_rules.interstitial_reason``) and get the element-mixture class.
"""
from __future__ import annotations

import csv
import math
from pathlib import Path

import pytest
from ionicity.scorer import melting
from ionicity.scorer.formula import parse_formula
from ionicity.scorer.ions import decompose
from ionicity.scorer.melting_anions import soft_cation_pseudohalide_fraction
from ionicity.scorer.melting_model import class_disagreement
from ionicity.scorer.melting_routes import (
    HYDRATE_MELT_CLASS,
    LOWER_HYDRATE_CLASS,
    MELTING_CLASS_BANDS,
    WATER_RICH_HYDRATE_MIN,
    lower_salt_hydrate,
    melting_class_for,
    water_rich_hydrate,
)
from ionicity.scorer.record import score_formula

HYDRATES = Path(__file__).parent / "data" / "salt_hydrates_registry.csv"
BANDS = {name: (lo, hi) for name, lo, hi, _ in MELTING_CLASS_BANDS}


def _tm(cas: str) -> float:
    chemicals = pytest.importorskip("chemicals.phase_change")
    value = chemicals.Tm(cas)
    assert value is not None, f"chemicals has no melting point for {cas}"
    return float(value)


def _in_band(melting_class: str, tm_K: float) -> bool:
    lo, hi = BANDS[melting_class]
    return lo <= tm_K < hi


# -------------------------------------------- 1. pseudohalides with soft cations


def test_soft_pseudohalide_share_needs_a_linear_pseudohalide_and_an_18_electron_cation():
    for formula, share in (("TlN3", 1.0), ("CuSCN", 1.0), ("Zn(CN)2", 1.0), ("KN3", 0.0), ("KSCN", 0.0),
                           ("AgCl", 0.0), ("AgNO3", 0.0)):
        assert melting.melting_terms(decompose(parse_formula(formula))).soft_pseudohalide_fraction == share
    dec = decompose(parse_formula("TlN3"))
    assert soft_cation_pseudohalide_fraction(dec.anions, False) == 0.0


def test_calibration_thallium_azide_melts_as_potassium_azide_does():
    # TlN3 607 K, KN3 627 K (CRC via chemicals): Tl+ (18+2 electrons) took the covalency penalty of
    # halides and came out an ionic liquid (293 K); calibration row of the term
    tl, k = score_formula("TlN3"), score_formula("KN3")
    assert _in_band(tl["melting_class"], _tm("13847-66-0")) and tl["melting_class"] == "molten_salt"
    assert abs(math.log(10 ** tl["mp_trend_index"] / _tm("13847-66-0"))) < math.log(1.5)
    without = tl["mp_trend_index"] - melting.TREND_WEIGHTS["soft_cation_pseudohalide"]
    assert melting_class_for(10 ** without, salt=True) == "ionic_liquid"
    # the alkali azide has no soft cation: untouched by the term (within a factor 1.5 of 627 K)
    assert abs(math.log(10 ** k["mp_trend_index"] / _tm("20762-60-1"))) < math.log(1.5)


@pytest.mark.parametrize("formula, cas", [("Zn(CN)2", "557-21-1"), ("CuCN", "544-92-3")])
def test_validation_cyanide_frameworks_and_chains_of_soft_cations(formula, cas):
    # Zn(CN)2 1073 K (validation half of the open set), CuCN 747 K (in neither set): within a factor
    # 1.5 and in the molten-salt band; without the term a factor 2 low
    record = score_formula(formula)
    measured = _tm(cas)
    assert abs(math.log(10 ** record["mp_trend_index"] / measured)) < math.log(1.5)
    assert record["melting_class"] == "molten_salt" and _in_band(record["melting_class"], measured)


def test_validation_copper_thiocyanate_is_no_ionic_liquid():
    # CuSCN 1357 K (CRC via chemicals; validation half): still low (a three-dimensional net the
    # index cannot see), but no longer called a salt melting below 100 C
    record = score_formula("CuSCN")
    assert record["melting_class"] != "ionic_liquid"
    assert 10 ** record["mp_trend_index"] > 500.0 and _tm("1111-67-7") > 1000.0


# ---------------------------------------------------- 2. water-rich salt hydrates


def _hydrate_rows():
    with open(HYDRATES, newline="", encoding="utf-8") as handle:
        return list(csv.DictReader(handle))


def test_water_rich_rule_threshold():
    # four waters per formula unit (Lane 1983, the salt hydrates of latent-heat storage; from memory)
    assert WATER_RICH_HYDRATE_MIN == 4.0
    assert water_rich_hydrate(4.0) and not water_rich_hydrate(3.0)


@pytest.mark.parametrize("formula, cas", [
    ("Na2SO4.10H2O", "7727-73-3"),       # Glauber's salt, 305.6 K
    ("Na2HPO4.12H2O", "10039-32-4"),     # 308.2 K
    ("Fe(NO3)3.9H2O", "7782-61-8"),      # 320.2 K
    ("Cr(NO3)3.9H2O", "7789-02-8"),      # 339.5 K (audit half A)
    ("Ni(NO3)2.6H2O", "13478-00-7"),     # 329.9 K
    ("Na2S2O3.5H2O", "10102-17-7"),      # 338.2 K
    ("Mg(NO3)2.6H2O", "13446-18-9"),     # 362.2 K
    ("NH4Al(SO4)2.12H2O", "7784-26-1"),  # ammonium alum, 367.7 K
])
def test_water_rich_salt_hydrates_melt_in_their_own_water(formula, cas):
    # melting points: CRC via chemicals; the anhydrous salts melt (or decompose) far higher
    record = score_formula(formula)
    assert record["melting_class"] == HYDRATE_MELT_CLASS
    assert _in_band(HYDRATE_MELT_CLASS, _tm(cas))
    # the index stays the anhydrous salt's (one index per composition, as the column says)
    anhydrous = score_formula(formula.split(".")[0])
    assert record["mp_trend_index"] == anhydrous["mp_trend_index"]
    assert anhydrous["melting_class"] != HYDRATE_MELT_CLASS


@pytest.mark.parametrize("formula, cas", [
    ("BaCl2.2H2O", "10326-27-9"),    # 386 K (gives off its water; BaCl2 melts at 1235 K)
    ("SnCl2.H2O", "10025-69-1"),     # 311 K (registry row of the dihydrate's CAS number, written as a monohydrate)
    ("LiI.3H2O", "7790-22-9"),       # 346 K
    ("MgCl2.H2O", "7791-18-6"),      # 390 K
])
def test_lower_salt_hydrates_lose_their_water_below_300C(formula, cas):
    # registry melting points (CRC via chemicals, read at run time): the hydrate's, far below the dry salt's
    record = score_formula(formula)
    assert record["melting_class"] == LOWER_HYDRATE_CLASS
    assert _in_band(LOWER_HYDRATE_CLASS, _tm(cas))
    anhydrous = score_formula(formula.split(".")[0])
    assert not _in_band(anhydrous["melting_class"], _tm(cas))
    assert record["mp_trend_index"] == anhydrous["mp_trend_index"]


def test_lower_hydrate_rule_threshold_and_ionic_liquids():
    assert lower_salt_hydrate(1.0) and lower_salt_hydrate(3.0) and lower_salt_hydrate(0.5)
    assert not lower_salt_hydrate(WATER_RICH_HYDRATE_MIN) and not lower_salt_hydrate(0.0)
    # an ionic liquid's water stays dissolved in it: its class is kept
    assert score_formula("[C4mim]Cl.H2O")["melting_class"] == score_formula("[C4mim]Cl")["melting_class"]
    # a molecular hydrate keeps its route's class (the rule is for salts)
    assert score_formula("C2H2O4.2H2O")["melting_class"] != LOWER_HYDRATE_CLASS


def test_rule_measured_on_the_registry_hydrates():
    # the 46 salt hydrates with a registry melting point outside the audit's half B: 24 in the band of
    # their class with the water-rich rule, 7 without (the anhydrous class; 6 before the ammonium term of
    # 5 December 2026, fourth round, put (NH4)2MoO4.4H2O's anhydrous index at 591 K, registry 673 K); 33 with
    # the lower-hydrate rule too (6 December 2026: 12 of its 15 lower hydrates). The misses are mostly registry
    # rows whose value is the anhydrous salt's (EuCl3.6H2O at 1123 K, LiOH.H2O at 723 K) or a dehydration just
    # above 100 C of a water-rich hydrate (CuSO4.5H2O 383 K)
    rows = _hydrate_rows()
    assert len(rows) == 46
    with_rule = without = 0
    for row in rows:
        record = score_formula(row["formula"])
        measured = _tm(row["cas"])
        with_rule += _in_band(record["melting_class"], measured)
        without += _in_band(melting_class_for(10 ** record["mp_trend_index"], salt=True), measured)
    assert with_rule >= 33 and without <= 7


def test_explain_says_the_hydrate_rule_with_the_caution():
    result = melting.analyse(decompose(parse_formula("Na2SO4.10H2O")))
    assert result.melting_class == HYDRATE_MELT_CLASS
    text = " ".join(result.notes)
    assert "own water of crystallisation" in text and melting.CAUTION in text


def test_model_prediction_inside_the_hydrate_band_agrees_with_the_class():
    record = {"melting_class": HYDRATE_MELT_CLASS, "mp_route": "salt"}
    assert class_disagreement(record, 330.0) is None
    assert "disagrees" in class_disagreement(record, 900.0)


# ------------------------------------------------------- 3. bases without ions


@pytest.mark.parametrize("formula, cas", [("N2H4", "302-01-2"), ("N2H4.H2O", "7803-57-8"), ("NH3", "7664-41-7")])
def test_molecular_bases_take_the_molecular_route(formula, cas):
    # hydrazine 275 K, its hydrate 221 K, ammonia 195 K (CRC via chemicals): liquids at 25 C;
    # before, a base without ions had no route and no class
    record = score_formula(formula)
    assert record["substance_class"] == "base" and record["mp_route"] == "molecular"
    # ammonia also boils below 25 C (240 K, registry): a gas, in the same band
    assert record["melting_class"] in ("liquid_at_room_temperature", "gas_at_room_temperature")
    assert _in_band(record["melting_class"], _tm(cas))


def test_ionic_bases_stay_on_the_salt_route():
    assert score_formula("NaOH")["mp_route"] == "salt"


# -------------------------------------------- 4. hydrides of intermetallic hosts


def test_hydride_of_an_intermetallic_host_gets_a_class():
    # AlNi3H3 1660 K (CRC via chemicals; audit half A): a row error before (no charge-balanced ions)
    record = score_formula("AlH3Ni3")
    assert record["status"] == "ok" and record["substance_class"] == "intermetallic"
    assert _in_band(record["melting_class"], _tm("12003-81-5"))


@pytest.mark.parametrize("formula", ["TiH2", "ZrH2", "PdH0.7", "LaNi5H6", "AlH3Ni3"])
def test_metal_hydrides_carry_the_hydrogen_release_caution(formula):
    # interstitial and intermetallic hydrides lose hydrogen from a few hundred C, far below their metal's melting
    # point (Greenwood & Earnshaw 1997, ch. 3.4; from memory): the class (the metal's) must not read as a
    # temperature to heat the hydride to
    notes = score_formula(formula)["value_notes"]
    assert "gives off its hydrogen" in notes and "safety data sheet" in notes
    assert "gives off its hydrogen" not in (score_formula("Fe3AlC")["value_notes"] or "")


# ------------------------------------ 4b. the intermetallics' rule of mixtures


@pytest.fixture(scope="module")
def intermetallic_rows():
    """(split, formula, rule-of-mixtures K, variance, measured K) of datasets/melting/intermetallic_compounds.csv.

    Calibration and validation by the SHA-256 parity of formula_normalized
    (``pipelines.melting_weights.open_set_half``); melting points from chemicals at run time.
    """
    pytest.importorskip("chemicals")
    from ionicity.pipelines.melting_weights import intermetallic_rows as rows

    out = rows()
    assert sum(r[0] == "calibration" for r in out) >= 45 and sum(r[0] == "validation" for r in out) >= 35  # 50, 41
    return out


def test_calibration_intermetallic_weight_is_the_fit_of_the_calibration_rows(intermetallic_rows):
    # least squares through the origin of log10(T_m / T_mix) on the variance, calibration rows only
    from ionicity.pipelines.melting_weights import fit_intermetallic_weight

    assert melting.TREND_WEIGHTS["intermetallic_chi_variance"] == pytest.approx(
        fit_intermetallic_weight(intermetallic_rows), abs=0.0006)


def test_validation_intermetallics_closer_with_the_heat_of_formation_term(intermetallic_rows):
    # validation rows (never fitted): mean |log10 error| 0.078 -> 0.058, Spearman 0.80 -> 0.86,
    # class right 0.90 -> 0.93 (python -m ionicity.pipelines.melting_weights prints them)
    from ionicity.pipelines.melting_weights import intermetallic_figures

    figures = intermetallic_figures(intermetallic_rows, melting.TREND_WEIGHTS["intermetallic_chi_variance"])
    before, after = (figures[f"intermetallics_validation_{k}"] for k in ("rule_of_mixtures", "with_term"))
    assert after["mean_abs_log10"] < before["mean_abs_log10"] - 0.01
    assert after["spearman"] >= 0.84 and after["class_accuracy"] >= before["class_accuracy"]


def test_scoring_applies_the_term_to_intermetallics_only():
    # NiAl: rule of mixtures 1331 K (Ni 1728 K, Al 933 K; CRC via chemicals), raised by the term
    nial = melting.analyse(decompose(parse_formula("NiAl")))
    w = melting.TREND_WEIGHTS["intermetallic_chi_variance"]
    assert nial.mp_trend_index == pytest.approx(math.log10((1728.15 + 933.47) / 2) + w * 0.0225, abs=2e-4)
    # a carbide: carbon takes no part (graphite's triple point already carries the network's cohesion)
    wc = melting.analyse(decompose(parse_formula("WC")))
    assert wc.mp_trend_index == pytest.approx(math.log10((3687.15 + 3823.15) / 2), abs=2e-4)  # W, C: CRC via chemicals


def test_intermetallic_set_rebuilds_from_the_registry():
    pytest.importorskip("chemicals")
    import subprocess
    import sys

    script = Path(__file__).resolve().parents[1] / "datasets" / "melting" / "build_intermetallic_set.py"
    assert subprocess.run([sys.executable, str(script), "--check"], timeout=600).returncode == 0


# Peroxides and superoxides lose O2, hydrogencarbonates CO2 and water, hydrogensulfites and disulfites
# SO2, hypochlorites disproportionate, all on heating (Greenwood & Earnshaw, Chemistry of the Elements,
# 2nd ed., 1997, ch. 8.6, 14.2, 15.2, 17.2; from memory; the peroxosulfates lose O2 from about 100 C): their rows say that the trend is of a
# decomposition and carry the caution; a carbonate, a sulfate and a chlorate do not (they melt first or
# are not listed: KClO3 melts at 629 K before it decomposes, CRC via chemicals)
@pytest.mark.parametrize("formula, decomposes", [
    ("BaO2", True), ("KO2", True), ("NaHCO3", True), ("Na2S2O5", True), ("Ca(ClO)2", True),
    ("K2S2O8", True), ("KHSO5", True),
    ("K2CO3", False), ("Na2SO4", False), ("KClO3", False),
])
def test_salts_of_anions_that_decompose_on_heating_say_so(formula, decomposes):
    notes = score_formula(formula)["value_notes"] or ""
    assert ("decomposes on heating" in notes and "safety data sheet" in notes) is decomposes
