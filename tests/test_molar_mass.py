"""Molar masses from ``scorer.score_formula`` against periodictable.

periodictable (a general-purpose reference library on PyPI) carries the IUPAC
conventional atomic weights, as does the mendeleev snapshot the scorer uses,
so the two must agree to 0.01 %. (molmass uses older interval midpoints for
S, Cl and others and would differ by more than that, so it is not used here.)

The formulas are built deterministically from realistic pieces: cations x
anions x lattice water, charge-balanced, each written twice, once in the
scorer's spelling (with a hydrate separator chosen from the accepted ones)
and once in periodictable's (``+`` joins the water), plus every case of
``tests/data/formula_cases.csv`` that periodictable can read.
"""
from __future__ import annotations

import csv
import math
import random
import re
from pathlib import Path

import pytest

from ionicity.scorer import score_formula

from _builders import formula_piece as _piece
from _builders import periodictable_spelling

periodictable = pytest.importorskip("periodictable")

RELATIVE_TOLERANCE = 1e-4  # 0.01 %
SEED = 20240611
N_GENERATED = 520

# (text, charge); polyatomic pieces are bracketed when more than one is needed
CATIONS = [
    ("Li", 1), ("Na", 1), ("K", 1), ("Rb", 1), ("Cs", 1), ("Ag", 1), ("Tl", 1), ("NH4", 1), ("Cu", 1),
    ("Mg", 2), ("Ca", 2), ("Sr", 2), ("Ba", 2), ("Mn", 2), ("Fe", 2), ("Co", 2), ("Ni", 2), ("Cu", 2),
    ("Zn", 2), ("Cd", 2), ("Pb", 2), ("Sn", 2), ("Hg", 2), ("Be", 2),
    ("Al", 3), ("Fe", 3), ("Cr", 3), ("Ga", 3), ("In", 3), ("Sc", 3), ("Y", 3), ("La", 3), ("Ce", 3),
    ("Nd", 3), ("Gd", 3), ("Bi", 3), ("Ti", 4), ("Zr", 4), ("Sn", 4), ("Th", 4), ("U", 4),
]
ANIONS = [
    ("F", -1), ("Cl", -1), ("Br", -1), ("I", -1), ("OH", -1), ("NO3", -1), ("NO2", -1), ("ClO4", -1),
    ("ClO3", -1), ("BrO3", -1), ("IO3", -1), ("MnO4", -1), ("HCO3", -1), ("HSO4", -1), ("H2PO4", -1),
    ("CN", -1), ("SCN", -1), ("BF4", -1), ("PF6", -1), ("CH3COO", -1), ("HCOO", -1), ("N3", -1),
    ("SO4", -2), ("SO3", -2), ("CO3", -2), ("CrO4", -2), ("Cr2O7", -2), ("C2O4", -2), ("S2O3", -2),
    ("HPO4", -2), ("SeO4", -2), ("MoO4", -2), ("WO4", -2), ("SiF6", -2), ("O", -2), ("S", -2), ("Se", -2),
    ("PO4", -3), ("AsO4", -3), ("VO4", -3), ("N", -3), ("P", -3), ("P2O7", -4), ("SiO4", -4),
]
WATER = [0, 0, 0, 0.5, 1, 1.5, 2, 3, 4, 5, 6, 7, 8, 9, 10, 12, 18, 24]
SEPARATORS = ["·", ".", "*", "•", "+", "⋅"]


def _salt(cation: tuple[str, int], anion: tuple[str, int]) -> str:
    (c, qc), (a, qa) = cation, anion
    lcm = qc * -qa // math.gcd(qc, -qa)
    return _piece(c, lcm // qc) + _piece(a, lcm // -qa)


def generated_pairs() -> list[tuple[str, str]]:
    """(scorer spelling, periodictable spelling), unique, from a fixed seed."""
    rng = random.Random(SEED)
    pairs: dict[str, str] = {}
    while len(pairs) < N_GENERATED:
        salt = _salt(rng.choice(CATIONS), rng.choice(ANIONS))
        water = rng.choice(WATER)
        if not water:
            pairs.setdefault(salt, salt)
            continue
        n = ("%g" % water) if water != 1 else ""
        separator = rng.choice(SEPARATORS)
        pairs.setdefault(f"{salt}{separator}{n}H2O", f"{salt}+{n}H2O")
    return sorted(pairs.items())




def case_pairs() -> list[tuple[str, str]]:
    """Cases of formula_cases.csv in periodictable's spelling, where it has one."""
    path = Path(__file__).resolve().parent / "data" / "formula_cases.csv"
    with path.open(encoding="utf-8", newline="") as fh:
        rows = list(csv.DictReader(fh))
    out = []
    for row in rows:
        text = row["formula"]
        if row["substance_class"] == "ion" or re.search(r"[\[\s]", text) and row["substance_class"] == "ionic_liquid_pair":
            continue
        pt = periodictable_spelling(text)
        if pt is None:
            continue
        out.append((text, pt))
    return out


GENERATED = generated_pairs()
FROM_CASES = case_pairs()


def test_enough_formulas():
    assert len(GENERATED) >= 500
    assert len(FROM_CASES) >= 300


@pytest.mark.parametrize("text,pt_text", GENERATED + FROM_CASES, ids=[t for t, _ in GENERATED + FROM_CASES])
def test_molar_mass_agrees_with_periodictable(text, pt_text):
    expected = periodictable.formula(pt_text).mass
    record = score_formula(text)
    got = record["molar_mass_g_mol"]
    assert not math.isnan(got), record["message"]
    assert got == pytest.approx(expected, rel=RELATIVE_TOLERANCE)


@pytest.mark.parametrize("text,grams", [
    # CRC Handbook of Chemistry and Physics, 97th ed., Physical Constants of Inorganic Compounds (from memory)
    ("NaCl", 58.44),
    ("CuSO4·5H2O", 249.69),
    ("Fe2(SO4)3", 399.88),
    ("KAl(SO4)2·12H2O", 474.39),
    ("K4[Fe(CN)6]·3H2O", 422.39),
])
def test_molar_mass_matches_handbook_values(text, grams):
    # handbook values are rounded to 0.01 g/mol and may predate the 2013 weights: allow 0.01 %
    assert score_formula(text)["molar_mass_g_mol"] == pytest.approx(grams, rel=RELATIVE_TOLERANCE)
