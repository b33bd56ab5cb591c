"""Checks on the polyatomic and organic ion table ``scorer/data/ions.csv``.

The table is read with the ``csv`` module rather than the scorer's own loader,
so these checks hold whoever writes the loader. Compositions are compared
against molmass (a general-purpose formula library) and against a small
independent parser written here; molar masses are compared with published
values, each named beside it.
"""
from __future__ import annotations

import csv
import functools
import re
from collections import Counter
from pathlib import Path

import pytest

molmass = pytest.importorskip("molmass")

ION_TABLE = Path(__file__).resolve().parents[1] / "scorer" / "data" / "ions.csv"
DATA_README = ION_TABLE.parent / "README.md"

COLUMNS = [
    "ion_id", "label", "formula", "charge", "family", "name",
    "organic", "aliases", "oxidation_states", "source",
]

IONIC_LIQUID_FAMILIES = frozenset({
    "imidazolium", "pyridinium", "pyrrolidinium", "piperidinium",
    "ammonium-quaternary", "phosphonium", "cholinium", "ammonium-protic",
    "sulfonylimide", "sulfonate", "alkylsulfate", "cyano-anion",
    "fluoroalkylphosphate", "alkylphosphate", "aminoacidate",
})
OTHER_FAMILIES = frozenset({
    "oxoanion", "metal-oxoanion", "thiometalate", "hydrogen-oxoanion", "hydroxo-complex",
    "hydrogen-chalcogenide", "chalcogenide-polyatomic", "carbide", "hydride",
    "nitrogen-anion", "pseudohalide", "ammonium-like", "oxocation",
    "metal-cluster", "halo-complex", "polyhalide", "cyano-complex",
    "ammine-complex", "carboxylate", "organic-anion", "amidinium", "dithiocarbamate",
})
FAMILIES = IONIC_LIQUID_FAMILIES | OTHER_FAMILIES

# Abbreviations that name two different ions in the literature; the table
# leaves them out so that a lookup reports "unknown" instead of guessing.
AMBIGUOUS_ABBREVIATIONS = ("dmim", "BMPy", "TEA", "TBP", "bpy", "BA", "PA")

SYMBOLS = frozenset(
    el.symbol for el in molmass.ELEMENTS if el.number >= 1 and len(el.symbol) <= 2
) - {"D", "T"}


@functools.cache
def load_rows() -> tuple[dict[str, str], ...]:
    with ION_TABLE.open(newline="", encoding="utf-8") as fh:
        return tuple(csv.DictReader(fh))


@functools.cache
def rows_by_id() -> dict[str, dict[str, str]]:
    return {row["ion_id"]: row for row in load_rows()}


def charge_text(charge: int) -> str:
    sign = "+" if charge > 0 else "-"
    return sign if abs(charge) == 1 else f"{abs(charge)}{sign}"


_TOKEN = re.compile(r"([A-Z][a-z]?)(\d*)|(\()|(\))(\d*)")


def expand_formula(text: str) -> Counter:
    """Element counts of a bracketed formula, independent of molmass.

    Only what the table needs: element symbols, integer counts, nested
    round brackets.
    """
    stack = [Counter()]
    pos = 0
    while pos < len(text):
        match = _TOKEN.match(text, pos)
        if match is None:
            raise ValueError(f"cannot read {text!r} at position {pos}")
        symbol, count, opening, closing, group_count = match.groups()
        if symbol:
            if symbol not in SYMBOLS:
                raise ValueError(f"unknown element {symbol!r} in {text!r}")
            stack[-1][symbol] += int(count or 1)
        elif opening:
            stack.append(Counter())
        else:
            if len(stack) == 1:
                raise ValueError(f"unbalanced ')' in {text!r}")
            group = stack.pop()
            for el, n in group.items():
                stack[-1][el] += n * int(group_count or 1)
        pos = match.end()
    if len(stack) != 1:
        raise ValueError(f"unbalanced '(' in {text!r}")
    return stack[0]


def parse_oxidation_states(text: str) -> dict[str, float]:
    states = {}
    for part in text.split(";"):
        element, value = part.split(":")
        states[element] = float(value)
    return states


def molar_mass(formula: str) -> float:
    return molmass.Formula(formula).mass


def is_ionic_liquid(row: dict[str, str]) -> bool:
    return row["family"] in IONIC_LIQUID_FAMILIES


def aliases_of(row: dict[str, str]) -> list[str]:
    return [a for a in row["aliases"].split(";")] if row["aliases"] else []


# ---------------------------------------------------------------- structure


def test_header_is_exactly_the_documented_columns():
    with ION_TABLE.open(newline="", encoding="utf-8") as fh:
        header = next(csv.reader(fh))
    assert header == COLUMNS


def test_every_row_is_complete():
    for row in load_rows():
        for column in ("ion_id", "label", "formula", "charge", "family", "name", "organic", "source"):
            assert row[column].strip(), f"{row['ion_id']}: empty {column}"
        assert row["organic"] in ("true", "false"), row["ion_id"]
        assert row["family"] in FAMILIES, f"{row['ion_id']}: family {row['family']!r} not in the vocabulary"


def test_ion_id_is_label_and_charge_and_unique():
    seen = Counter(row["ion_id"] for row in load_rows())
    assert [k for k, n in seen.items() if n > 1] == []
    for row in load_rows():
        charge = int(row["charge"])
        assert charge != 0, row["ion_id"]
        assert row["ion_id"] == f"{row['label']}({charge_text(charge)})"


def test_charge_text_matches_the_shared_convention():
    # The ion_id convention of scorer.model.format_charge, restated here so a
    # change on either side shows up.
    assert [charge_text(c) for c in (1, -1, 2, -2, 3, -4)] == ["+", "-", "2+", "2-", "3+", "4-"]


def test_bracketed_labels_belong_to_organic_or_ionic_liquid_rows():
    for row in load_rows():
        if row["label"].startswith("["):
            assert row["label"].endswith("]"), row["ion_id"]
            assert is_ionic_liquid(row) or row["family"] == "amidinium", row["ion_id"]


def test_only_monatomic_row_is_hydride():
    # Monatomic ions come from the element table; hydride is kept here because
    # H(-) is the unusual state of hydrogen that salt-like hydrides need.
    monatomic = [
        row["ion_id"] for row in load_rows()
        if sum(expand_formula(row["formula"]).values()) == 1
    ]
    assert monatomic == ["H(-)"]


def test_examples_named_in_the_design_are_present():
    for ion_id in (
        "SO4(2-)", "NH4(+)", "Hg2(2+)", "O2(2-)", "O2(-)", "C2(2-)", "H(-)",
        "Fe(CN)6(4-)", "Fe(CN)6(3-)", "[C4mim](+)", "[NTf2](-)", "CH3COO(-)",
        "HCOO(-)", "C2O4(2-)", "AlCl4(-)", "PF6(-)", "BF4(-)", "SiF6(2-)",
        "H3O(+)", "SCN(-)", "OCN(-)", "N3(-)", "CN(-)", "HSO4(-)", "H2PO4(-)",
        "[C4py](+)", "[C4mpyr](+)", "[C4mpip](+)", "[N1111](+)", "[N4444](+)",
        "[P66614](+)", "[Ch](+)", "[EtNH3](+)", "[FSI](-)", "[OTf](-)",
        "[dca](-)", "[tcm](-)", "[C2SO4](-)", "[C1SO4](-)", "[OTs](-)", "[OMs](-)",
    ):
        assert ion_id in rows_by_id(), ion_id
    for n in range(1, 11):
        assert f"[C{n}mim](+)" in rows_by_id()


def test_row_counts():
    rows = load_rows()
    inorganic = [r for r in rows if not is_ionic_liquid(r) and r["organic"] == "false"]
    ionic_liquid = [r for r in rows if is_ionic_liquid(r)]
    assert len(inorganic) >= 80
    assert len(ionic_liquid) >= 40


def test_every_family_is_documented_in_the_data_readme():
    text = DATA_README.read_text(encoding="utf-8")
    assert "## ions.csv" in text
    section = text.split("## ions.csv", 1)[1].split("\n## ", 1)[0]
    for family in sorted({row["family"] for row in load_rows()}):
        assert f"`{family}`" in section, family


# ---------------------------------------------------------------- aliases


def test_aliases_are_unique_case_insensitively_across_ions():
    owner: dict[str, str] = {}
    for row in load_rows():
        for alias in set(a.casefold() for a in aliases_of(row)):
            assert alias not in owner, f"alias {alias!r} on {owner.get(alias)} and {row['ion_id']}"
            owner[alias] = row["ion_id"]


def test_aliases_are_well_formed():
    for row in load_rows():
        aliases = aliases_of(row)
        assert len(aliases) == len(set(aliases)), f"{row['ion_id']}: repeated alias"
        for alias in aliases:
            assert alias and alias == alias.strip() and " " not in alias, (row["ion_id"], alias)
            assert "[" not in alias and "]" not in alias, (row["ion_id"], alias)


def test_aliases_do_not_shadow_other_labels_or_elements():
    # A bracketed label is also found without its brackets, so compare both.
    label_owner = {}
    for row in load_rows():
        for spelling in {row["label"], row["label"].strip("[]")}:
            label_owner.setdefault(spelling.casefold(), set()).add(row["label"])
    element_symbols = {s.casefold() for s in SYMBOLS}
    for row in load_rows():
        for alias in aliases_of(row):
            owners = label_owner.get(alias.casefold(), set())
            assert owners <= {row["label"]}, f"{row['ion_id']}: alias {alias!r} is the label of {owners}"
            assert alias.casefold() not in element_symbols, f"{row['ion_id']}: alias {alias!r} reads as an element"


def test_ambiguous_abbreviations_are_left_out():
    every_alias = {a.casefold() for row in load_rows() for a in aliases_of(row)}
    for abbreviation in AMBIGUOUS_ABBREVIATIONS:
        assert abbreviation.casefold() not in every_alias, abbreviation


def test_common_ionic_liquid_spellings_resolve():
    # Spellings from Wasserscheid & Welton, Ionic Liquids in Synthesis, 2nd ed.,
    # 2008, and common practice in the ionic-liquid literature (from memory).
    lookup = {}
    for row in load_rows():
        for alias in aliases_of(row):
            lookup[alias] = row["ion_id"]
    expected = {
        "bmim": "[C4mim](+)", "BMIM": "[C4mim](+)", "C4C1im": "[C4mim](+)",
        "emim": "[C2mim](+)", "Tf2N": "[NTf2](-)", "TFSI": "[NTf2](-)",
        "TfO": "[OTf](-)", "OAc": "CH3COO(-)", "Pyr14": "[C4mpyr](+)",
        "N(CN)2": "[dca](-)", "MeSO4": "[C1SO4](-)", "EtSO4": "[C2SO4](-)",
    }
    for alias, ion_id in expected.items():
        assert lookup.get(alias) == ion_id, alias


# ---------------------------------------------------------------- composition


@pytest.mark.parametrize("row", load_rows(), ids=lambda r: r["ion_id"])
def test_formula_parses_the_same_way_in_both_parsers(row):
    local = expand_formula(row["formula"])
    reference = {el: item.count for el, item in molmass.Formula(row["formula"]).composition().items()}
    assert dict(local) == reference
    assert molar_mass(row["formula"]) > 0


def test_local_parser_rejects_bad_text():
    for bad in ("Xx2", "SO4)", "(SO4", "so4", "C2H5-"):
        with pytest.raises(ValueError):
            expand_formula(bad)


def test_organic_ions_are_even_electron():
    # Every organic ion in the table is closed-shell, so its electron count
    # (sum of Z minus the charge) is even; a single missing or extra H breaks
    # this (the even-electron rule, common practice in mass spectrometry).
    for row in load_rows():
        if row["organic"] != "true":
            continue
        electrons = sum(
            molmass.ELEMENTS[el].number * n for el, n in expand_formula(row["formula"]).items()
        ) - int(row["charge"])
        assert electrons % 2 == 0, row["ion_id"]


def test_imidazolium_series_grows_by_ch2():
    # 1-alkyl-3-methylimidazolium homologues differ by one CH2 per chain step;
    # [C4mim]+ is C8H15N2 (PubChem, 1-butyl-3-methylimidazolium chloride,
    # C8H15ClN2; seen on a reproduced compound listing).
    compositions = [expand_formula(rows_by_id()[f"[C{n}mim](+)"]["formula"]) for n in range(1, 11)]
    assert compositions[3] == Counter({"C": 8, "H": 15, "N": 2})
    for smaller, larger in zip(compositions, compositions[1:]):
        assert larger - smaller == Counter({"C": 1, "H": 2})


# Each entry: ion_ids (with multiplicity) plus an extra formula, the published
# molar mass in g/mol, the tolerance, and where the number comes from.
PUBLISHED_MOLAR_MASSES = [
    ({"[C4mim](+)": 1}, "Cl", 174.67, 0.01,
     "PubChem computed MW, 1-butyl-3-methylimidazolium chloride (seen on a reproduced compound listing)"),
    ({"[C2mim](+)": 1, "BF4(-)": 1}, "", 197.97, 0.01,
     "PubChem computed MW, 1-ethyl-3-methylimidazolium tetrafluoroborate (seen on a reproduced compound listing)"),
    ({"[C2C1mim](+)": 1, "BF4(-)": 1}, "", 212.00, 0.01,
     "PubChem computed MW, 1-ethyl-2,3-dimethylimidazolium tetrafluoroborate (seen on a reproduced compound listing)"),
    ({"[N4444](+)": 1}, "Br", 322.37, 0.01,
     "PubChem computed MW, tetrabutylammonium bromide (seen on a reproduced compound listing)"),
    ({"[N4444](+)": 1}, "I", 369.3716, 0.01, "Wikipedia, 'Tetra-n-butylammonium iodide' infobox"),
    ({"[Ch](+)": 1}, "", 104.173, 0.005, "Wikipedia, 'Choline' infobox"),
    ({"[Ch](+)": 1}, "Cl", 139.62, 0.01, "Wikipedia, 'Choline chloride' infobox"),
    ({"[NTf2](-)": 1}, "", 280.14, 0.01, "Wikipedia, 'Bistriflimide' infobox"),
    ({"[P66614](+)": 1}, "", 483.9, 0.06,
     "Stojanovic et al., ESI+ characterisation of trihexyl(tetradecyl)phosphonium salts, calc. m/z 483.9"),
    ({"PH4(+)": 1}, "", 35.00552, 0.001, "Wikipedia, 'Phosphonium' infobox"),
    ({"[C4mim](+)": 1}, "", 139.22, 0.01, "PubChem, 1-butyl-3-methylimidazolium cation (from memory)"),
    ({"[C4mim](+)": 1, "PF6(-)": 1}, "", 284.18, 0.01,
     "PubChem, 1-butyl-3-methylimidazolium hexafluorophosphate (from memory)"),
    ({"[NTf2](-)": 1}, "", 280.15, 0.01, "PubChem, bis(trifluoromethylsulfonyl)imide anion (from memory)"),
    ({"[OTf](-)": 1}, "H", 150.07, 0.01, "Wikipedia, 'Triflic acid' infobox (from memory)"),
    ({"[OTs](-)": 1}, "H", 172.20, 0.01, "CRC Handbook, p-toluenesulfonic acid (from memory)"),
    ({"C6H5O7(3-)": 1}, "H3", 192.12, 0.01, "CRC Handbook, citric acid (from memory)"),
    ({"[dca](-)": 1}, "Na", 89.03, 0.01, "Wikipedia, 'Sodium dicyanamide' infobox (from memory)"),
    ({"[EtNH3](+)": 1, "NO3(-)": 1}, "", 108.10, 0.01, "Wikipedia, 'Ethylammonium nitrate' infobox (from memory)"),
    ({"Fe(CN)6(3-)": 1}, "K3", 329.24, 0.02, "CRC Handbook, potassium hexacyanoferrate(III) (from memory)"),
    ({"Fe(CN)5NO(2-)": 1}, "Na2", 261.92, 0.02, "CRC Handbook, sodium nitroprusside, anhydrous (from memory)"),
]


@pytest.mark.parametrize(
    "parts, extra, expected, tol, source",
    PUBLISHED_MOLAR_MASSES,
    ids=[f"{'+'.join(p)}{'+' + e if e else ''}" for p, e, *_ in PUBLISHED_MOLAR_MASSES],
)
def test_molar_mass_matches_published_value(parts, extra, expected, tol, source):
    rows = rows_by_id()
    mass = sum(molar_mass(rows[ion_id]["formula"]) * n for ion_id, n in parts.items())
    if extra:
        mass += molar_mass(extra)
    assert mass == pytest.approx(expected, abs=tol), source


def test_published_salts_are_charge_neutral():
    # The counter-ions added above are H+, Na+, K+, Cl-, Br-, I-; a
    # composition check is only meaningful on a neutral formula unit.
    counter_charge = {"": 0, "Cl": -1, "Br": -1, "I": -1, "H": 1, "H3": 3, "Na": 1, "Na2": 2, "K3": 3}
    for parts, extra, expected, *_ in PUBLISHED_MOLAR_MASSES:
        charge = sum(int(rows_by_id()[i]["charge"]) * n for i, n in parts.items()) + counter_charge[extra]
        single_ion = extra == "" and sum(parts.values()) == 1
        assert charge == 0 or single_ion, (parts, extra)


# ---------------------------------------------------------------- oxidation states


def test_oxidation_states_present_exactly_for_inorganic_rows():
    for row in load_rows():
        if row["organic"] == "true":
            assert row["oxidation_states"] == "", row["ion_id"]
        else:
            assert row["oxidation_states"], row["ion_id"]


@pytest.mark.parametrize(
    "row", [r for r in load_rows() if r["oxidation_states"]], ids=lambda r: r["ion_id"]
)
def test_oxidation_states_sum_to_the_charge(row):
    # IUPAC definition of oxidation state (Karen, McArdle & Takats, Pure Appl.
    # Chem. 88 (2016) 831, doi:10.1515/pac-2015-0204): the states of all atoms
    # add up to the charge of the ion. Averages stand in for inequivalent atoms.
    states = parse_oxidation_states(row["oxidation_states"])
    composition = expand_formula(row["formula"])
    assert set(states) == set(composition)
    total = sum(states[el] * n for el, n in composition.items())
    assert total == pytest.approx(int(row["charge"]), abs=1e-4)


def test_oxidation_state_text_is_signed():
    pattern = re.compile(r"^[A-Z][a-z]?:(0|[+-]\d+(\.\d+)?)$")
    for row in load_rows():
        for part in filter(None, row["oxidation_states"].split(";")):
            assert pattern.match(part), (row["ion_id"], part)


@pytest.mark.parametrize(
    "ion_id, element, state",
    [
        # Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997 (from memory).
        ("S2O3(2-)", "S", 2.0),
        ("S4O6(2-)", "S", 2.5),
        ("N3(-)", "N", -1 / 3),
        ("O2(-)", "O", -0.5),
        ("O2(2-)", "O", -1.0),
        ("Hg2(2+)", "Hg", 1.0),
        ("Cr2O7(2-)", "Cr", 6.0),
        ("MnO4(-)", "Mn", 7.0),
        ("MnO4(2-)", "Mn", 6.0),
        ("Fe(CN)6(4-)", "Fe", 2.0),
        ("Fe(CN)6(3-)", "Fe", 3.0),
        ("BH4(-)", "H", -1.0),
        ("H(-)", "H", -1.0),
        ("S2O8(2-)", "S", 6.0),
    ],
)
def test_textbook_oxidation_states(ion_id, element, state):
    states = parse_oxidation_states(rows_by_id()[ion_id]["oxidation_states"])
    assert states[element] == pytest.approx(state, abs=1e-5)


def test_organic_flag_follows_the_documented_rule():
    # Inorganic carbon (carbonate, cyanide, cyanate, thiocyanate, carbides,
    # cyano complexes, dicyanamide, tricyanomethanide, tetracyanoborate) is not
    # organic; anything with an alkyl, aryl, perfluoroalkyl or carboxylate
    # carbon is.
    inorganic_carbon = {
        "CO3(2-)", "HCO3(-)", "CN(-)", "OCN(-)", "SCN(-)", "CNO(-)", "C2(2-)",
        "Fe(CN)6(4-)", "[dca](-)", "[tcm](-)", "B(CN)4(-)",
    }
    organic_examples = {"CH3COO(-)", "C2O4(2-)", "[C4mim](+)", "[NTf2](-)", "[OTf](-)", "CF3COO(-)"}
    rows = rows_by_id()
    for ion_id in inorganic_carbon:
        assert rows[ion_id]["organic"] == "false", ion_id
    for ion_id in organic_examples:
        assert rows[ion_id]["organic"] == "true", ion_id
    for row in load_rows():
        if row["organic"] == "true":
            assert "C" in expand_formula(row["formula"]), row["ion_id"]


def test_sources_name_a_reference():
    for row in load_rows():
        source = row["source"]
        assert len(source) > 10, row["ion_id"]
        assert any(ch.isdigit() for ch in source) or "Wikipedia" in source, row["ion_id"]


# Onium cations added for the melting regression's open training set: each ion with its
# counter-ion must have the composition and molar mass of the registry entry whose name it
# reads (chemicals 1.5.2, chemicals.identifiers.search_chemical(CAS): formula and MW).
REGISTRY_SALTS = [
    ("[C1py](+)", "Cl", "7680-73-1"),     # 1-methylpyridinium chloride
    ("[C8py](+)", "Br", "2534-66-9"),     # 1-octylpyridinium bromide
    ("[C16py](+)", "Cl", "123-03-5"),     # cetylpyridinium chloride
    ("[N5555](+)", "Br", "866-97-7"),     # tetrapentylammonium bromide
    ("[N6666](+)", "Br", "4328-13-6"),    # tetrahexylammonium bromide
    ("[N8888](+)", "Br", "14866-33-2"),   # tetraoctylammonium bromide
    ("[N1222](+)", "Cl", "10052-47-8"),   # triethylmethylammonium chloride
    ("[N11116](+)", "Cl", "112-02-7"),    # hexadecyltrimethylammonium chloride
    ("[P2222](+)", "I", "4317-06-0"),     # tetraethylphosphonium iodide
]


@pytest.mark.parametrize("ion_id, counter, cas", REGISTRY_SALTS)
def test_added_onium_ions_match_the_registry_salt(ion_id, counter, cas):
    identifiers = pytest.importorskip("chemicals.identifiers")
    entry = identifiers.search_chemical(cas)
    ours = molmass.Formula(rows_by_id()[ion_id]["formula"] + counter)
    assert Counter({el: item.count for el, item in ours.composition().items()}) == Counter(
        {el: item.count for el, item in molmass.Formula(entry.formula).composition().items()}), cas
    assert ours.mass == pytest.approx(entry.MW, abs=0.05), cas


# Calcium cyanamide (the fertiliser, Ca(2+) with N=C=N(2-)) and sodium cyanoborohydride
# (Na(+) with [BH3CN](-)) are salts (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed.,
# 1997, ch. 8.6 and 6.7; from memory); their molar masses checked against periodictable.
# Cyanamide itself (H2NCN, CH2N2, also diazomethane) is a molecule, not an acid of CN2(2-).
@pytest.mark.parametrize("formula, anion", [("CaCN2", "CN2(2-)*1"), ("NaBH3CN", "BH3CN(-)*1"), ("Ag2CN2", "CN2(2-)*1")])
def test_cyanamide_and_cyanoborohydride_salts(formula, anion):
    import periodictable
    from ionicity.scorer.record import score_formula
    out = score_formula(formula)
    assert out["substance_class"] == "ionic_salt" and out["anions"] == anion
    assert out["molar_mass_g_mol"] == pytest.approx(periodictable.formula(formula).mass, rel=1e-4)


@pytest.mark.parametrize("formula", ["CH2N2", "H2NCN"])
def test_cyanamide_without_a_metal_is_a_molecule(formula):
    from ionicity.scorer.record import score_formula
    assert score_formula(formula)["substance_class"] == "covalent_molecular"


# Alkali polysulfides up to the hexasulfide, S6(2-) (Greenwood & Earnshaw, 2nd ed., 1997,
# ch. 15.2.4: K2S6, Cs2S6; from memory): sulfur at -1/3 on average.
@pytest.mark.parametrize("formula", ["K2S6", "Cs2S6"])
def test_hexasulfides_read_as_polysulfide_salts(formula):
    from ionicity.scorer.record import score_formula
    out = score_formula(formula)
    assert out["anions"] == "S6(2-)*1" and "S:-0.333" in out["oxidation_states"]


@pytest.mark.parametrize("text, anion, states", [
    # lithium difluorophosphate (an electrolyte additive), sodium bromite, caesium dibromidoiodate(I): the
    # anions' central atoms P(V), Br(III), I(I) (Greenwood & Earnshaw, 2nd ed., 1997, ch. 12, 17; IUPAC Red Book
    # 2005, IR-9; from memory); all three were "no charge-balanced set of ions"
    ("LiPO2F2", "PO2F2(-)*1", {"P": 5.0, "F": -1.0}),
    ("NaBrO2", "BrO2(-)*1", {"Br": 3.0}),
    ("CsIBr2", "IBr2(-)*1", {"I": 1.0, "Br": -1.0}),
])
def test_difluorophosphate_bromite_and_dibromidoiodate_salts(text, anion, states):
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["status"] == "ok" and row["anions"] == anion
    got = {s: float(v) for s, v in (part.split(":") for part in row["oxidation_states"].split(";"))}
    assert all(got[s] == v for s, v in states.items())
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula(text).mass, abs=0.02)


def test_an_organic_bromide_is_no_bromite():
    # acetylcholine bromide, C7H16BrNO2 (the registry package chemicals lists the formula only as that salt)
    from ionicity.scorer.record import score_formula
    assert score_formula("C7H16BrNO2")["anions"] == "Br(-)*1"


@pytest.mark.parametrize("text", ["Na[B(C6H5)4]", "NaBPh4", "sodium tetraphenylborate", "C24H20BNa"])
def test_sodium_tetraphenylborate(text):
    # Na[B(C6H5)4], a reagent for potassium and ammonium (IUPAC Red Book 2005, IR-9, tetraphenylborate(1-); from
    # memory); molar mass from molmass. An error before the anion joined the library
    from ionicity.scorer.record import score_formula
    row = score_formula(text)
    assert row["status"] != "error" and row["anions"] == "B(C6H5)4(-)*1" and row["cations"] == "Na(+)*1"
    assert row["molar_mass_g_mol"] == pytest.approx(molmass.Formula("C24H20BNa").mass, abs=0.02)


@pytest.mark.parametrize("formula, cation", [("Li2B12H12", "Li(+)"), ("Na2B12H12", "Na(+)"), ("Na2B10H10", "Na(+)")])
def test_closo_borane_salts_read_with_their_cluster_anions(formula, cation):
    # closo-dodecaborate and -decaborate, B12H12(2-) and B10H10(2-) (Greenwood & Earnshaw, 2nd ed., 1997, ch. 6;
    # from memory), the anions of borohydride solid electrolytes; these were errors
    from ionicity.scorer.record import score_formula
    out = score_formula(formula)
    assert out["status"] == "ok" and out["cations"].startswith(cation)
    assert out["anions"].split("*")[0] in ("B12H12(2-)", "B10H10(2-)")
