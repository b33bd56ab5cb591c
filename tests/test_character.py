"""Tests for scorer.character: electronegativity difference, Pauling and
Hannay-Smyth ionic character, contact atoms, the van Arkel-Ketelaar map."""
from __future__ import annotations

import math

import pytest

from ionicity.scorer import character as C
from ionicity.scorer.ion_library import get_ion, monatomic_ion
from ionicity.scorer.model import Decomposition

from _builders import salt


def neutral(composition, substance_class="covalent_molecular") -> Decomposition:
    return Decomposition(composition=tuple(composition), substance_class=substance_class)


def binary(m, zm, nm, x, zx, nx) -> Decomposition:
    return salt([((m, zm), nm)], [((x, zx), nx)])


# ------------------------------------------------------------ electronegativities

# Pauling electronegativities as tabulated in the CRC Handbook of Chemistry and
# Physics, "Electronegativity" table (Allred's 1961 revision of Pauling's scale,
# A. L. Allred, J. Inorg. Nucl. Chem. 1961, 17, 215) (from memory).
CRC_PAULING = {
    "H": 2.20, "Li": 0.98, "Be": 1.57, "B": 2.04, "C": 2.55, "N": 3.04, "O": 3.44, "F": 3.98,
    "Na": 0.93, "Mg": 1.31, "Al": 1.61, "Si": 1.90, "P": 2.19, "S": 2.58, "Cl": 3.16,
    "K": 0.82, "Ca": 1.00, "Fe": 1.83, "Cu": 1.90, "Zn": 1.65, "Ga": 1.81, "Br": 2.96,
    "Rb": 0.82, "Sr": 0.95, "Ag": 1.93, "Cd": 1.69, "I": 2.66, "Cs": 0.79, "Ba": 0.89,
}


@pytest.mark.parametrize("symbol, expected", sorted(CRC_PAULING.items()))
def test_pauling_electronegativity_matches_published_table(symbol, expected):
    assert C.pauling_electronegativity(symbol) == pytest.approx(expected, abs=0.005)


def test_missing_electronegativity_is_nan():
    # Pauling defined no value for neon; the snapshot leaves it out.
    assert math.isnan(C.pauling_electronegativity("Ne"))
    assert math.isnan(C.pauling_electronegativity("Xx"))


# ------------------------------------------------------------ Pauling's equation

# Pauling, The Nature of the Chemical Bond, 3rd ed. 1960, Table 3-10: amount of
# ionic character of a single bond against the electronegativity difference
# (from memory; whole percent).
PAULING_TABLE = [
    (0.2, 1), (0.4, 4), (0.6, 9), (0.8, 15), (1.0, 22), (1.2, 30), (1.4, 39), (1.6, 47),
    (1.8, 55), (2.0, 63), (2.2, 70), (2.4, 76), (2.6, 82), (2.8, 86), (3.0, 89), (3.2, 92),
]


@pytest.mark.parametrize("delta, percent", PAULING_TABLE)
def test_pauling_equation_reproduces_paulings_table(delta, percent):
    assert C.pauling_ionic_character_pct(delta) == pytest.approx(percent, abs=0.6)


def test_pauling_equation_takes_arrays_and_is_even():
    import numpy as np

    values = C.pauling_ionic_character_pct(np.array([-1.0, 0.0, 1.0]))
    assert values[0] == pytest.approx(values[2]) and values[1] == 0.0


# Twenty-five binary compounds: the expected value applies Pauling's equation
# (Pauling 1960, eq. 3-10) to the CRC/Allred electronegativities above, computed
# here independently of the module.
BINARIES = [
    ("NaF", ("Na", 1, 1, "F", -1, 1)), ("NaCl", ("Na", 1, 1, "Cl", -1, 1)), ("NaBr", ("Na", 1, 1, "Br", -1, 1)),
    ("NaI", ("Na", 1, 1, "I", -1, 1)), ("KF", ("K", 1, 1, "F", -1, 1)), ("KCl", ("K", 1, 1, "Cl", -1, 1)),
    ("KBr", ("K", 1, 1, "Br", -1, 1)), ("KI", ("K", 1, 1, "I", -1, 1)), ("LiF", ("Li", 1, 1, "F", -1, 1)),
    ("LiCl", ("Li", 1, 1, "Cl", -1, 1)), ("LiBr", ("Li", 1, 1, "Br", -1, 1)), ("LiI", ("Li", 1, 1, "I", -1, 1)),
    ("CsF", ("Cs", 1, 1, "F", -1, 1)), ("CsCl", ("Cs", 1, 1, "Cl", -1, 1)), ("RbCl", ("Rb", 1, 1, "Cl", -1, 1)),
    ("MgO", ("Mg", 2, 1, "O", -2, 1)), ("CaO", ("Ca", 2, 1, "O", -2, 1)), ("BaO", ("Ba", 2, 1, "O", -2, 1)),
    ("BeO", ("Be", 2, 1, "O", -2, 1)), ("MgCl2", ("Mg", 2, 1, "Cl", -1, 2)), ("CaF2", ("Ca", 2, 1, "F", -1, 2)),
    ("SrCl2", ("Sr", 2, 1, "Cl", -1, 2)), ("AlCl3", ("Al", 3, 1, "Cl", -1, 3)), ("ZnS", ("Zn", 2, 1, "S", -2, 1)),
    ("AgCl", ("Ag", 1, 1, "Cl", -1, 1)), ("CuBr", ("Cu", 1, 1, "Br", -1, 1)), ("CdS", ("Cd", 2, 1, "S", -2, 1)),
]


@pytest.mark.parametrize("name, spec", BINARIES, ids=[b[0] for b in BINARIES])
def test_ionic_character_of_binary_compounds(name, spec):
    m, zm, nm, x, zx, nx = spec
    values, notes = C.describe(binary(m, zm, nm, x, zx, nx))
    delta = abs(CRC_PAULING[x] - CRC_PAULING[m])
    assert values["delta_chi_pauling"] == pytest.approx(delta, abs=0.006)
    assert values["ionic_character_pauling_pct"] == pytest.approx(100 * (1 - math.exp(-delta**2 / 4)), abs=0.3)
    assert values["ionic_character_hannay_smyth_pct"] == pytest.approx(16 * delta + 3.5 * delta**2, abs=0.3)
    assert values["ionic_character_pauling_min_pct"] == pytest.approx(values["ionic_character_pauling_pct"])
    assert notes == []


def test_pauling_worked_example_nacl():
    # NaCl: 3.16 - 0.93 = 2.23 gives 71 % (Pauling's equation; CRC values, from memory).
    values, _ = C.describe(binary("Na", 1, 1, "Cl", -1, 1))
    assert values["ionic_character_pauling_pct"] == pytest.approx(71.2, abs=0.1)


# ------------------------------------------------------------ Hannay-Smyth

@pytest.mark.parametrize("delta, percent", [(1.9, 43.0), (0.9, 17.2)])
def test_hannay_smyth_hydrogen_halides(delta, percent):
    # Hannay & Smyth, J. Am. Chem. Soc. 1946, 68, 171: HF (difference 1.9 on
    # Pauling's 1940 scale) 43 % and HCl (0.9) 17 % (from memory).
    assert C.hannay_smyth_ionic_character_pct(delta) == pytest.approx(percent, abs=0.3)


def test_hannay_smyth_capped_at_100():
    assert C.hannay_smyth_ionic_character_pct(4.0) == 100.0


# ------------------------------------------------------------ contact atoms

# The atom that meets the counter-ion; common practice (Greenwood & Earnshaw,
# Chemistry of the Elements, 2nd ed. 1997, from memory).
CONTACTS = [
    ("SO4(2-)", "O"), ("NO3(-)", "O"), ("ClO4(-)", "O"), ("CH3COO(-)", "O"), ("OH(-)", "O"),
    ("[NTf2](-)", "O"), ("[OTf](-)", "O"), ("BF4(-)", "F"), ("PF6(-)", "F"), ("PtCl6(2-)", "Cl"),
    ("ICl2(-)", "Cl"), ("CN(-)", "C"), ("SCN(-)", "N"), ("OCN(-)", "N"), ("Fe(CN)6(4-)", "N"),
    ("[dca](-)", "N"), ("BH4(-)", "H"), ("AlH4(-)", "H"), ("HS(-)", "S"), ("NH2(-)", "N"),
    ("O2(2-)", "O"), ("C2(2-)", "C"), ("NH4(+)", "H"), ("[C4mim](+)", "H"), ("[N4444](+)", "H"),
    ("UO2(2+)", "U"), ("Hg2(2+)", "Hg"), ("NO(+)", "N"), ("Cu(NH3)4(2+)", "H"),
]


@pytest.mark.parametrize("ion_id, atom", CONTACTS)
def test_contact_atom(ion_id, atom):
    symbol, why = C.contact_atom(get_ion(ion_id))
    assert symbol == atom
    assert why


def test_contact_atom_monatomic():
    assert C.contact_atom(monatomic_ion("Fe", 3))[0] == "Fe"


# ------------------------------------------------------------ several ions

def test_alum_pairs_are_stoichiometry_weighted():
    dec = salt([(("K", 1), 1), (("Al", 3), 1)], [("SO4(2-)", 2)])
    values, notes = C.describe(dec)
    k_o, al_o = 3.44 - 0.82, 3.44 - 1.61
    assert values["delta_chi_pauling"] == pytest.approx((k_o + al_o) / 2, abs=0.006)
    assert values["ionic_character_pauling_min_pct"] == pytest.approx(C.pauling_ionic_character_pct(al_o), abs=0.3)
    expected_mean = (C.pauling_ionic_character_pct(k_o) + C.pauling_ionic_character_pct(al_o)) / 2
    assert values["ionic_character_pauling_pct"] == pytest.approx(expected_mean, abs=0.3)


def test_pair_weights_sum_to_one():
    dec = salt([(("K", 1), 2), (("Mg", 2), 1)], [(("Cl", -1), 3), ("SO4(2-)", 1)])
    weights = [w for _, _, w in C.contact_pairs(dec)]
    assert len(weights) == 4 and sum(weights) == pytest.approx(1.0)


def test_invariant_to_formula_unit_multiple_and_ion_order():
    a = C.describe(salt([(("K", 1), 1), (("Al", 3), 1)], [("SO4(2-)", 2)]))[0]
    b = C.describe(salt([(("Al", 3), 2), (("K", 1), 2)], [("SO4(2-)", 4)]))[0]
    for key in a:
        assert a[key] == pytest.approx(b[key]) if isinstance(a[key], float) else a[key] == b[key]
    c = C.describe(neutral([("C", 1), ("H", 4)]))[0]
    d = C.describe(neutral([("H", 8), ("C", 2)]))[0]
    assert c == d


# ------------------------------------------------------------ covalent and metallic

def test_composition_definition():
    values, _ = C.describe(neutral([("C", 1), ("Cl", 4)]))
    assert values["delta_chi_pauling"] == pytest.approx(3.16 - 2.55)
    assert values["mean_chi_pauling"] == pytest.approx((2.55 + 4 * 3.16) / 5)


# Regions of the van Arkel-Ketelaar triangle where textbooks place these
# substances (common practice; e.g. Jensen, J. Chem. Educ. 1995, 72, 395).
TRIANGLE = [
    (binary("Na", 1, 1, "Cl", -1, 1), "ionic"),
    (binary("Cs", 1, 1, "F", -1, 1), "ionic"),
    (binary("Mg", 2, 1, "O", -2, 1), "ionic"),
    (binary("K", 1, 1, "Br", -1, 1), "ionic"),
    (binary("Al", 3, 1, "Cl", -1, 3), "ionic_covalent"),
    (binary("Ag", 1, 1, "Cl", -1, 1), "ionic_covalent"),
    (binary("Zn", 2, 1, "S", -2, 1), "ionic_covalent"),
    (binary("H", 1, 1, "F", -1, 1), "ionic_covalent"),
    (neutral([("H", 2), ("O", 1)]), "ionic_covalent"),
    (neutral([("Si", 1), ("O", 2)], "covalent_network"), "ionic_covalent"),
    (neutral([("Cl", 2)], "element"), "covalent"),
    (neutral([("C", 1), ("H", 4)]), "covalent"),
    (neutral([("S", 8)], "element"), "covalent"),
    (neutral([("Fe", 1)], "metallic"), "metallic"),
    (neutral([("Na", 1)], "metallic"), "metallic"),
    (neutral([("Cu", 1), ("Zn", 1)], "metallic"), "metallic"),
    (neutral([("Ni", 3), ("Al", 1)], "metallic"), "metallic"),
    (neutral([("Ge", 1)], "element"), "covalent_metallic"),
    (binary("Ga", 3, 1, "As", -3, 1), "covalent_metallic"),
    (neutral([("Li", 1), ("Al", 1)], "metallic"), "metallic_ionic"),
    (binary("Na", 1, 3, "Sb", -3, 1), "metallic_ionic"),
    (binary("Mg", 2, 2, "Si", -4, 1), "metallic_ionic"),
]


@pytest.mark.parametrize("dec, expected", TRIANGLE)
def test_van_arkel_ketelaar_regions(dec, expected):
    assert C.describe(dec)[0]["bond_type"] == expected


def test_triangle_boundaries():
    assert C.van_arkel_ketelaar_bond_type(2.0, 1.7) == "ionic"
    assert C.van_arkel_ketelaar_bond_type(2.0, 1.69) == "ionic_covalent"
    assert C.van_arkel_ketelaar_bond_type(1.94, 0.0) == "metallic"
    assert C.van_arkel_ketelaar_bond_type(1.95, 0.0) == "covalent_metallic"
    assert C.van_arkel_ketelaar_bond_type(2.2, 0.0) == "covalent"
    assert C.van_arkel_ketelaar_bond_type(math.nan, 1.0) is None
    assert set(C.BOND_TYPES) >= {"ionic", "covalent", "metallic"}


def test_pauling_scale_overlap_is_noted():
    # Known weakness of a Pauling-scale triangle: Pt (2.20) lands with the non-metals.
    values, notes = C.describe(neutral([("Pt", 1)], "metallic"))
    assert values["bond_type"] == "covalent"
    assert any("Pt" in n for n in notes)


# ------------------------------------------------------------ protocol

def test_columns_declared_once_with_required_names():
    names = [c.name for c in C.COLUMNS]
    assert len(names) == len(set(names))
    for required in ("delta_chi_pauling", "ionic_character_pauling_pct", "ionic_character_hannay_smyth_pct",
                     "bond_type", "mean_chi_pauling"):
        assert required in names
    for column in C.COLUMNS:
        assert column.source and column.method and column.aggregation
        assert column.dtype in ("string", "float64", "int64", "bool")


@pytest.mark.parametrize("dec", [
    Decomposition(),
    neutral([("Xx", 1)]),
    neutral([("Ne", 1)], "element"),
    salt([(("Eu", 2), 1)], [(("Cl", -1), 2)]),
], ids=["empty", "unknown-element", "neon", "europium-no-chi"])
def test_describe_never_raises_and_notes_every_gap(dec):
    values, notes = C.describe(dec)
    assert set(values) == {c.name for c in C.COLUMNS}
    if any(isinstance(v, float) and math.isnan(v) for v in values.values()):
        assert notes
    assert C.explain(dec)



def test_explain_names_inputs_and_equation():
    text = "\n".join(C.explain(salt([(("Ba", 2), 1)], [("SO4(2-)", 1)])))
    assert "contact atoms Ba" in text and "oxygen-bearing anion" in text
    assert C.PAULING_EQUATION in text and C.HANNAY_SMYTH_EQUATION in text
    # the equation text is written once: the column declaration quotes the same words
    assert C.PAULING_EQUATION in next(c.method for c in C.COLUMNS if c.name == "ionic_character_pauling_pct")
