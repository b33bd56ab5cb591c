"""A salt in an ionic liquid or a molten salt, written as a solution with its amount, is a mixture of the two.

Reference definitions: IUPAC Green Book (Cohen et al., Quantities, Units and Symbols in Physical Chemistry,
3rd ed., 2007, section 2.10: amount fraction, molality, mass fraction, amount concentration; from memory).
Molar masses for the checks: the registry package ``molmass`` (its formula masses from IUPAC atomic weights).
The molar volumes of the amount-concentration route are an estimate from the ions' volumes (Glasser &
Jenkins, J. Am. Chem. Soc. 2000, 122, 632); the check below compares the solvent's density so found with a
density from memory, within 20 %.
"""
from __future__ import annotations

import math

import pytest

from ionicity.scorer.electrolytes import (
    AVOGADRO_L_PER_NM3_MOL,
    mass_fraction_to_mole_fraction,
    molality_to_mole_fraction,
    molarity_to_mole_fraction,
    solute_mole_fraction,
)
from ionicity.scorer.record import score_formula


def _mass(formula: str) -> float:
    molmass = pytest.importorskip("molmass")
    return molmass.Formula(formula).mass


def test_the_three_conversions_follow_their_definitions():
    # molality: b = n1 / m2, so per kg of solvent n2 = 1 / M2 (kg/mol)
    assert molality_to_mole_fraction(2.0, 250.0) == pytest.approx(0.5 / 1.5)
    # mass fraction: per gram n1 = w / M1, n2 = (1 - w) / M2
    assert mass_fraction_to_mole_fraction(0.25, 100.0, 300.0) == pytest.approx((0.25 / 100) / (0.25 / 100 + 0.75 / 300))
    # amount concentration: in 1 L, c mol of solute fill c V1; the rest is solvent
    assert molarity_to_mole_fraction(1.0, 0.1, 0.3) == pytest.approx(1.0 / (1.0 + 0.9 / 0.3))
    # none of a solute gives none in the mixture; the limits hold
    assert molality_to_mole_fraction(0.0, 300.0) == 0.0
    assert solute_mole_fraction("0 %", 100.0, 300.0, 0.1, 0.3) is None
    assert solute_mole_fraction("10 % v/v", 100.0, 300.0, 0.1, 0.3) is None   # a volume fraction is not converted


def test_molality_row_against_molmass():
    # 1 mol/kg LiTFSI (LiC2F6NO4S2) in [C2mim][TFSI] (C8H11F6N3O4S2)
    solvent = _mass("C8H11F6N3O4S2")
    expected = molality_to_mole_fraction(1.0, solvent)
    row = score_formula("1 mol/kg LiTFSI in [C2mim][TFSI]")
    assert row["status"] == "ok" and row["substance_class"] == "mixture"
    fractions = dict(zip(row["mixture_components"].split(";"), map(float, row["mixture_mole_fractions"].split(";"))))
    assert fractions["Li[NTf2]"] == pytest.approx(expected, abs=1e-3)
    assert row["concentration_as_written"] == "1 mol/kg"
    assert "an electrolyte" in row["value_notes"] and "molality" in row["value_notes"]


def test_mass_fraction_row_against_molmass():
    solute, solvent = _mass("LiF2NO4S2"), _mass("C8H18F2N2O4S2")   # LiFSI in [C3mpyr][FSI]
    expected = mass_fraction_to_mole_fraction(0.10, solute, solvent)
    row = score_formula("10 wt% LiFSI in [C3mpyr][FSI]")
    fractions = dict(zip(row["mixture_components"].split(";"), map(float, row["mixture_mole_fractions"].split(";"))))
    assert fractions["Li[FSI]"] == pytest.approx(expected, abs=1e-3)


def test_amount_concentration_uses_molar_volumes_near_the_measured_density():
    # [C4mim][BF4]: 226.0 g/mol, density about 1.20 g/mL at 25 C (from memory); the ions' volumes (crystal
    # volumes: a liquid is less dense) give its molar volume, and so its density, within 20 % (measured: 16 % high)
    row = score_formula("[C4mim][BF4] + 0.5 M LiBF4")
    assert row["substance_class"] == "mixture" and row["concentration_as_written"] == "0.5 M"
    note = row["value_notes"]
    solvent_mL = float(note.split("molar volumes ")[1].split(" and ")[1].split(" mL/mol")[0])
    assert _mass("C8H15BF4N2") / solvent_mL == pytest.approx(1.20, rel=0.20)
    # x follows from c and the two molar volumes as written in the note
    solute_mL = float(note.split("molar volumes ")[1].split(" and ")[0])
    x = float(row["mixture_mole_fractions"].split(";")[0])
    assert x == pytest.approx(molarity_to_mole_fraction(0.5, solute_mL / 1000, solvent_mL / 1000), rel=0.01)
    assert AVOGADRO_L_PER_NM3_MOL == pytest.approx(0.602214076)


def test_an_ionic_liquid_electrolyte_is_liquid_where_the_pure_lithium_salt_is_not():
    # LiTFSI melts near 507 K (a low-melting salt, registry via chemicals); 0.5 M of it in [C4mpyr][TFSI] is a room
    # temperature electrolyte: the mixture's liquidus says so, where the solute's row had said low_melting_salt
    salt = score_formula("LiTFSI")
    assert salt["melting_class"] == "low_melting_salt"
    row = score_formula("0.5 M LiTFSI in [C4mpyr][TFSI]")
    assert row["substance_class"] == "mixture" and row["melting_class"] == "ionic_liquid"
    assert math.isfinite(row["liquidus_estimate_K"]) and row["liquidus_estimate_K"] < 298.15


@pytest.mark.parametrize("text", ["1 M LiPF6 in EC/DMC", "2 M NaCl in water", "21 m LiTFSI in water",
                                  "0.1 M ferrocene in [C4mim][PF6]"])
def test_molecular_solvents_and_unconvertible_amounts_stay_solutions(text):
    row = score_formula(text)
    assert row["substance_class"] != "mixture"
    assert "the values are for the pure solute" in row["value_notes"]
