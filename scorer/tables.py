"""The data-table registry: every CSV under ``scorer/data/``, read one way.

Each table is declared once in :data:`TABLES` (file name, what it holds, the
module that reads it). :func:`table` reads a table on first use, once per
process (``scorer.caching.once``), and checks it: the declared columns are
present and every row names its ``source`` (the data policy of
``scorer/data/README.md``). The reading modules build their typed lookups
from these rows, each once. :func:`digests` gives a SHA-256 per data file
(the CSV tables and ``elements.json``) for provenance records.

>>> rows = table("born_exponents.csv")
>>> rows[0]["configuration"], rows[0]["born_exponent"]
('He', '5')
>>> len(digests()["ions.csv"])
64
"""
from __future__ import annotations

import csv
import hashlib
from dataclasses import dataclass

from ionicity.scorer.caching import once

__all__ = ["TableSpec", "TABLES", "TableError", "table", "data_bytes", "digests", "data_files"]

_PACKAGE = "ionicity.scorer.data"


@dataclass(frozen=True)
class TableSpec:
    """One data table: its file, the columns it must have, and what reads it."""

    name: str
    columns: tuple[str, ...]
    used_by: str


TABLES: dict[str, TableSpec] = {
    spec.name: spec
    for spec in (
        TableSpec(
            "ions.csv",
            ("ion_id", "label", "formula", "charge", "family", "name", "organic", "aliases",
             "oxidation_states", "source"),
            "scorer.ion_library",
        ),
        TableSpec("thermochemical_radii.csv", ("ion_id", "radius_pm", "source"), "scorer.radii"),
        TableSpec("ion_volumes.csv", ("ion_id", "volume_nm3", "source"), "scorer.radii"),
        TableSpec("atomic_volumes.csv", ("symbol", "volume_A3", "source"), "scorer.radii"),
        TableSpec(
            "ion_polarisabilities.csv",
            ("ion_id", "polarisability_A3", "range_low_A3", "range_high_A3", "source", "note"),
            "scorer.fajans",
        ),
        TableSpec("hsab_classes.csv", ("ion_id", "hsab_class", "role", "source", "note"), "scorer.hsab"),
        TableSpec(
            "radical_hardness.csv",
            ("anion_id", "radical", "ionization_energy_eV", "electron_affinity_eV", "source"),
            "scorer.hsab",
        ),
        TableSpec(
            "born_exponents.csv", ("configuration", "electrons", "born_exponent", "source"), "scorer.lattice_inputs"
        ),
        TableSpec(
            "structure_prototypes.csv",
            ("cation_id", "anion_id", "compound", "structure_type", "a_pm", "b_pm", "c_pm", "beta_deg",
             "nn_distance_pm", "source"),
            "scorer.structure_type",
        ),
        TableSpec(
            "formation_enthalpies.csv",
            ("cation_id", "anion_id", "compound", "enthalpy_of_formation_kJ_mol", "source"),
            "scorer.thermochemistry",
        ),
        TableSpec(
            "atomisation_enthalpies.csv", ("symbol", "atomisation_enthalpy_kJ_mol", "source"), "scorer.thermochemistry"
        ),
        TableSpec("goldschmidt_radii.csv", ("ion_id", "radius_pm", "source"), "scorer.radii"),
        TableSpec(
            "dispersion_coefficients.csv",
            ("cation_id", "anion_id", "c_1e60_erg_cm6", "d_1e76_erg_cm8", "source"),
            "scorer.lattice_inputs",
        ),
        TableSpec(
            "ion_shape.csv",
            ("ion_id", "torsions_tau", "symmetry_number", "charge_delocalised", "source"),
            "scorer.melting",
        ),
        TableSpec("element_melting_points.csv", ("symbol", "mp_K", "source"), "scorer.melting_routes"),
        TableSpec("fluid_element_melting_points.csv", ("substance", "mp_K", "source"), "scorer.melting_routes"),
        TableSpec("gases.csv", ("formula", "boiling_point_K", "name", "cas", "source"), "scorer.melting_routes"),
        TableSpec("inorganic_formulas.csv", ("formula", "source"), "scorer.registry_formulas"),
        TableSpec("molecular_coordination.csv",
                  ("formula", "coordination_number", "secondary_contacts", "structure", "source"),
                  "scorer.melting_routes"),
        TableSpec(
            "structural_families.csv", ("formula", "substance_class", "ionic_model", "structure", "source"),
            "scorer.applicability",
        ),
        TableSpec("carboxylate_names.csv", ("word", "group", "source"), "scorer.carboxylates"),
        TableSpec("fallback_radii.csv", ("ion_id", "radius_pm", "source"), "scorer.radii"),
        TableSpec("phillips_ionicity.csv", ("formula", "ionicity_fi", "coordination", "source"), "scorer.applicability"),
        TableSpec(
            "redox_potentials.csv",
            ("couple", "ion_id", "role", "product", "partner_anion_id", "E0_V", "source"),
            "scorer.applicability",
        ),
        TableSpec("name_words.csv", ("kind", "word", "value", "charge", "number", "source"), "scorer.name_vocabulary"),
        TableSpec("trivial_names.csv", ("name", "formula", "source"), "scorer.name_reader"),
        TableSpec("solution_names.csv", ("name", "solute", "concentration", "caution", "source"), "scorer.solutions"),
        TableSpec("ligands.csv", ("abbreviation", "formula", "name", "donor", "denticity", "aliases", "source"),
                  "scorer.coordination"),
        TableSpec("registry_names.csv", ("name", "formula", "cas", "kind", "source"), "scorer.name_reader"),
        TableSpec("solvent_codes.csv", ("code", "formula", "name", "source"), "scorer.formula"),
        TableSpec("material_codes.csv", ("code", "formula", "name", "source"), "scorer.formula"),
        TableSpec(
            "madelung_prototypes.csv",
            ("prototype", "energy_per_cell", "r0", "r_mean_first_shell", "formula_units", "total",
             "common_factor", "charge_product", "ionic_strength", "source"),
            "scorer.madelung",
        ),
        TableSpec(
            "fusion.csv",
            ("component", "formula", "names", "kind", "melting_point_K", "enthalpy_fusion_kJ_mol", "cas", "source"),
            "scorer.mixture",
        ),
        TableSpec("blends.csv", ("name", "mixture", "source"), "scorer.mixture"),
        TableSpec("eutectics.csv", ("system", "mole_fractions", "liquidus_K", "set", "kind", "source"), "scorer.mixture"),
        TableSpec("compound_systems.csv", ("component_a", "component_b", "compounds", "source"), "scorer.mixture"),
        TableSpec("water_acidity.csv", ("ion_id", "kind", "pKa", "pKa2", "source"), "scorer.water_ph"),
    )
}

# Not a CSV (one JSON document, sources per field in its meta block; see
# scorer/data/README.md), read by scorer.elements, but part of the provenance.
_OTHER_DATA_FILES = ("elements.json",)


class TableError(ValueError):
    """A data table breaks the data policy (a missing column or source)."""


def _resource(name: str):
    # The one function-local import of the scorer: importlib.resources (with
    # tempfile, zipfile ...) costs about 10 ms (python -X importtime, measured
    # here), which importing the scorer should not pay before a file is read.
    from importlib import resources

    return resources.files(_PACKAGE).joinpath(name)


@once
def table(name: str) -> tuple[dict[str, str], ...]:
    """The rows of the data table ``name`` as dicts of text, read once and checked.

    Parameters
    ----------
    name : str
        A file name of :data:`TABLES`, e.g. ``"ions.csv"``.

    Returns
    -------
    tuple of dict
        One dict per row, keyed by the header; values are the file's text.

    Raises
    ------
    KeyError
        For a name that is not a registered table (the message lists them).
    TableError
        When a declared column is missing or a row has an empty ``source``.
    """
    spec = TABLES.get(name)
    if spec is None:
        raise KeyError(f"unknown data table {name!r}; registered: {', '.join(TABLES)}")
    text = _resource(name).read_text(encoding="utf-8")
    reader = csv.DictReader(text.splitlines())
    missing = [c for c in spec.columns if c not in (reader.fieldnames or ())]
    if missing:
        raise TableError(f"scorer/data/{name} lacks the columns {missing}")
    rows = tuple(reader)
    for number, row in enumerate(rows, start=2):
        if not (row.get("source") or "").strip():
            raise TableError(f"scorer/data/{name}, line {number}: every row needs a source")
    return rows


def data_bytes(name: str) -> bytes:
    """The bytes of a data file that is not a table (``elements.json``), unchecked.

    The file's own reader checks it (:mod:`scorer.elements`); read once there.
    """
    if name not in _OTHER_DATA_FILES:
        raise KeyError(f"unknown data file {name!r}; tables are read with table(), others: {', '.join(_OTHER_DATA_FILES)}")
    return _resource(name).read_bytes()


def data_files() -> tuple[str, ...]:
    """Every data file with provenance: the registered tables and ``elements.json``."""
    return (*TABLES, *_OTHER_DATA_FILES)


def digests() -> dict[str, str]:
    """SHA-256 (hex) of every data file, by file name, for provenance records (a copy)."""
    return dict(_digests())


@once
def _digests() -> dict[str, str]:
    return {name: hashlib.sha256(_resource(name).read_bytes()).hexdigest() for name in data_files()}
