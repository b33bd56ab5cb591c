"""The data-table registry (scorer/tables.py): every CSV under scorer/data/ is
registered, read once, has a source on every row and the row count its README
section states; digests identify each file's exact bytes."""
from __future__ import annotations

import hashlib
from importlib import resources
from pathlib import Path

import pytest

from ionicity.scorer import tables
from ionicity.scorer.caching import registered

DATA = Path(resources.files("ionicity.scorer.data"))

# Row counts as scorer/data/README.md states them (a table that grows must say so there too).
ROWS = {
    "ions.csv": 319,
    "thermochemical_radii.csv": 25,
    "ion_volumes.csv": 23,
    "atomic_volumes.csv": 80,
    "ion_polarisabilities.csv": 24,
    "hsab_classes.csv": 108,
    "radical_hardness.csv": 4,
    "born_exponents.csv": 8,
    "structure_prototypes.csv": 130,
    "ion_shape.csv": 97,
    "madelung_prototypes.csv": 16,
    "structural_families.csv": 27,
    "carboxylate_names.csv": 40,
    "phillips_ionicity.csv": 43,
    "fallback_radii.csv": 7,
    "redox_potentials.csv": 25,
    "goldschmidt_radii.csv": 41,
    "dispersion_coefficients.csv": 20,
    "formation_enthalpies.csv": 20,
    "atomisation_enthalpies.csv": 10,
    "element_melting_points.csv": 80,
    "fluid_element_melting_points.csv": 14,
    "gases.csv": 214,
    "inorganic_formulas.csv": 4502,
    "molecular_coordination.csv": 17,
    "name_words.csv": 241,
    "solvent_codes.csv": 77,
    "material_codes.csv": 44,
    "trivial_names.csv": 257,
    "solution_names.csv": 20,
    "ligands.csv": 34,
    "registry_names.csv": 13388,
    "fusion.csv": 38,
    "blends.csv": 13,
    "eutectics.csv": 20,
    "compound_systems.csv": 11,
    "water_acidity.csv": 59,
}


def test_every_csv_of_the_data_folder_is_registered():
    on_disk = {p.name for p in DATA.glob("*.csv")}
    assert on_disk == set(tables.TABLES)
    assert set(ROWS) == set(tables.TABLES)


@pytest.mark.parametrize("name", sorted(ROWS))
def test_row_count_and_a_source_on_every_row(name):
    rows = tables.table(name)
    assert len(rows) == ROWS[name]
    assert all(row["source"].strip() for row in rows)
    assert set(tables.TABLES[name].columns) <= set(rows[0])


def test_readme_states_the_row_counts():
    readme = (DATA / "README.md").read_text(encoding="utf-8")
    for name, count in ROWS.items():
        section = readme.split(f"## {name}", 1)
        assert len(section) == 2, f"no README section for {name}"
        assert f"{count} rows" in section[1].split("\n## ", 1)[0], name


def test_tables_load_once_per_process():
    assert "ionicity.scorer.tables.table" in registered("once")
    assert tables.table("born_exponents.csv") is tables.table("born_exponents.csv")


def test_a_row_without_a_source_is_refused(monkeypatch):
    class Fake:
        def read_text(self, encoding):
            return "configuration,electrons,born_exponent,source\nHe,2,5,Pauling 1960\nNe,10,7,\n"

    monkeypatch.setattr(tables, "_resource", lambda name: Fake())
    with pytest.raises(tables.TableError, match="line 3"):
        tables.table.__wrapped__("born_exponents.csv")


def test_an_unknown_table_names_the_registered_ones():
    with pytest.raises(KeyError, match="ions.csv"):
        tables.table("nope.csv")


def test_digests_are_sha256_of_each_file():
    digests = tables.digests()
    assert set(digests) == {*tables.TABLES, "elements.json"}
    for name, digest in digests.items():
        assert digest == hashlib.sha256((DATA / name).read_bytes()).hexdigest(), name
    digests["ions.csv"] = "changed"
    assert tables.digests()["ions.csv"] != "changed"  # a copy each time
