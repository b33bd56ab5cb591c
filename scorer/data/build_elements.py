"""Build ``scorer/data/elements.json`` from the installed mendeleev.

Run ``python -m ionicity.scorer.data.build_elements`` to rewrite the snapshot, or
``python -m ionicity.scorer.data.build_elements --check`` to compare it with a fresh
build (exit status 1 when they differ).

This is the only place in ``scorer`` that imports mendeleev: importing it
costs seconds, so scoring reads the JSON snapshot through
:mod:`scorer.elements` instead.

mendeleev's tables are read in bulk with :func:`mendeleev.fetch.fetch_table`;
building one ``mendeleev.element()`` object per element is far slower and some
of mendeleev's other bulk helpers break with recent SQLAlchemy releases.

Choices made (also listed in ``scorer/data/README.md``):

- Ionization energies: mendeleev 1.3.0 holds exactly one value per
  (atomic number, ion charge). Should a later release hold several, the build
  keeps the experimental one (neither theoretical nor semi-empirical), then
  the one with the smallest uncertainty, then the lowest row id. The list is
  indexed by ion charge (index 0 is the first ionization energy); a charge
  missing in the middle of the series becomes ``null``.
- Floats are rounded to 12 significant digits. That is beyond the precision
  of every source and removes binary noise left by unit conversions upstream
  (a Shannon radius stored as 101.49999999999999 pm is written 101.5).
- Oxidation states are sorted ascending; Shannon entries are sorted by charge,
  coordination number, coordination label and spin.
- mendeleev values are copied as they are, including the few that look like
  upstream errors (see the README); corrections belong in the consumers, where
  they can name their own source.
"""
from __future__ import annotations

import argparse
import json
import math
import re
import sys
from pathlib import Path

__all__ = ["build_snapshot", "render_snapshot", "snapshot_path", "main"]

#: Bump when the layout of the JSON changes (not when the data does).
SNAPSHOT_FORMAT_VERSION = 1

_SIGNIFICANT_DIGITS = 12

ELEMENT_FIELDS = (
    "symbol",
    "name",
    "atomic_number",
    "atomic_weight",
    "period",
    "group",
    "block",
    "series",
    "electronegativity_pauling",
    "electronegativity_allen",
    "ionization_energies_eV",
    "electron_affinity_eV",
    "dipole_polarizability_bohr3",
    "electron_configuration",
    "oxidation_states_main",
    "oxidation_states_extra",
    "shannon_radii",
)

SHANNON_FIELDS = (
    "charge",
    "coordination",
    "coordination_number",
    "spin",
    "ionic_radius_pm",
    "crystal_radius_pm",
    "most_reliable",
)

# Which mendeleev (table, column) each snapshot field is copied from; the
# units and citation keys in "meta" are read from mendeleev's own
# propertymetadata table for these columns, so they cannot drift apart.
_FIELD_ORIGIN = {
    "symbol": ("elements", "symbol"),
    "name": ("elements", "name"),
    "atomic_number": ("elements", "atomic_number"),
    "atomic_weight": ("elements", "atomic_weight"),
    "period": ("elements", "period"),
    "group": ("elements", "group_id"),
    "block": ("elements", "block"),
    "series": ("series", "name"),
    "electronegativity_pauling": ("elements", "en_pauling"),
    "electronegativity_allen": ("elements", "en_allen"),
    "ionization_energies_eV": ("ionizationenergies", "ionization_energy"),
    "electron_affinity_eV": ("elements", "electron_affinity"),
    "dipole_polarizability_bohr3": ("elements", "dipole_polarizability"),
    "electron_configuration": ("elements", "electronic_configuration"),
    "oxidation_states_main": ("oxidationstates", "oxidation_state"),
    "oxidation_states_extra": ("oxidationstates", "oxidation_state"),
    "shannon_radii.ionic_radius_pm": ("ionicradii", "ionic_radius"),
    "shannon_radii.crystal_radius_pm": ("ionicradii", "crystal_radius"),
    "shannon_radii.most_reliable": ("ionicradii", "most_reliable"),
}

# The unit each snapshot field is written in; checked against mendeleev's
# propertymetadata at build time so a silent unit change upstream fails loudly.
_EXPECTED_UNITS = {
    "atomic_weight": "Da",
    "electronegativity_allen": "eV",
    "ionization_energies_eV": "eV",
    "electron_affinity_eV": "eV",
    "dipole_polarizability_bohr3": "bohr^3",
    "shannon_radii.ionic_radius_pm": "pm",
    "shannon_radii.crystal_radius_pm": "pm",
}

# mendeleev's ionizationenergies table carries NIST reference codes per row
# but no citation key in propertymetadata.
_EXTRA_SOURCES = {
    "ionization_energies_eV": (
        "NIST Atomic Spectra Database ionization energies (Kramida, Ralchenko, "
        "Reader and NIST ASD Team), one row per ion with NIST reference codes"
    ),
    "series": "mendeleev's own classification, joined on elements.series_id",
    "group": "null for Ce-Lu and Th-Lr",
}

_ROMAN = {"I": 1, "V": 5, "X": 10}
_COORDINATION = re.compile(r"^(?P<roman>[IVX]+)(?P<suffix>[A-Z]*)$")


def coordination_number(label: str) -> int:
    """Coordination number of a Shannon coordination label.

    Shannon writes the coordination as a roman numeral, sometimes followed by
    the geometry (``SQ`` square planar, ``PY`` pyramidal), which is dropped.

    >>> [coordination_number(c) for c in ("VI", "IVSQ", "IIIPY", "XIV", "IX")]
    [6, 4, 3, 14, 9]
    """
    match = _COORDINATION.match(label)
    if match is None:
        raise ValueError(f"not a Shannon coordination label: {label!r}")
    values = [_ROMAN[ch] for ch in match["roman"]]
    total = 0
    for i, value in enumerate(values):
        # Subtractive notation: a smaller numeral before a larger one.
        if i + 1 < len(values) and value < values[i + 1]:
            total -= value
        else:
            total += value
    return total


def _is_missing(value) -> bool:
    if value is None:
        return True
    try:
        return bool(math.isnan(value))
    except TypeError:
        return False


def _float(value) -> float | None:
    if _is_missing(value):
        return None
    return float(format(float(value), f".{_SIGNIFICANT_DIGITS}g"))


def _int(value) -> int | None:
    if _is_missing(value):
        return None
    as_float = float(value)
    if not as_float.is_integer():
        raise ValueError(f"expected an integer, got {value!r}")
    return int(as_float)


def _str(value) -> str | None:
    if _is_missing(value):
        return None
    return str(value)


def _read_tables() -> dict:
    from mendeleev.fetch import fetch_table

    names = (
        "elements",
        "series",
        "ionizationenergies",
        "oxidationstates",
        "ionicradii",
        "propertymetadata",
    )
    return {name: fetch_table(name) for name in names}


def _ionization_energies(table) -> dict[int, list[float | None]]:
    experimental = (table["is_theoretical"] == 0) & (table["is_semi_empirical"] == 0)
    ranked = (
        table.assign(_experimental_first=~experimental)
        .sort_values(
            ["atomic_number", "ion_charge", "_experimental_first", "uncertainty", "id"],
            na_position="last",
            kind="mergesort",
        )
        .drop_duplicates(["atomic_number", "ion_charge"], keep="first")
    )
    by_z: dict[int, list[float | None]] = {}
    for z, rows in ranked.groupby("atomic_number", sort=True):
        values = dict(zip(rows["ion_charge"].astype(int), rows["ionization_energy"]))
        series = [_float(values.get(charge)) for charge in range(max(values) + 1)]
        by_z[int(z)] = series
    return by_z


def _oxidation_states(table) -> dict[int, dict[str, list[int]]]:
    categories = {"main": "oxidation_states_main", "extended": "oxidation_states_extra"}
    unknown = set(table["category"].dropna()) - set(categories)
    if unknown:
        raise ValueError(f"unexpected oxidation-state categories: {sorted(unknown)}")
    by_z: dict[int, dict[str, list[int]]] = {}
    for row in table.itertuples(index=False):
        field = categories[row.category]
        states = by_z.setdefault(int(row.atomic_number), {f: [] for f in categories.values()})
        states[field].append(int(row.oxidation_state))
    for states in by_z.values():
        for field in states:
            states[field] = sorted(set(states[field]))
    return by_z


def _shannon_radii(table) -> dict[int, list[dict]]:
    by_z: dict[int, list[dict]] = {}
    for row in table.itertuples(index=False):
        spin = _str(row.spin) or ""
        if spin not in ("", "HS", "LS"):
            raise ValueError(f"unexpected spin label {spin!r} in ionicradii row {row.id}")
        reliable = None if _is_missing(row.most_reliable) else bool(row.most_reliable)
        entry = {
            "charge": int(row.charge),
            "coordination": str(row.coordination),
            "coordination_number": coordination_number(str(row.coordination)),
            "spin": spin,
            "ionic_radius_pm": _float(row.ionic_radius),
            "crystal_radius_pm": _float(row.crystal_radius),
            "most_reliable": reliable,
        }
        by_z.setdefault(int(row.atomic_number), []).append(entry)
    for entries in by_z.values():
        entries.sort(
            key=lambda e: (e["charge"], e["coordination_number"], e["coordination"], e["spin"])
        )
    return by_z


def _field_metadata(metadata) -> tuple[dict, dict]:
    lookup = {
        (row.table_name, row.column_name): row for row in metadata.itertuples(index=False)
    }
    units: dict[str, str | None] = {}
    sources: dict[str, str] = {}
    for field, key in _FIELD_ORIGIN.items():
        row = lookup.get(key)
        unit = None if row is None else _str(row.unit)
        if field in _EXPECTED_UNITS and unit != _EXPECTED_UNITS[field]:
            raise ValueError(
                f"mendeleev gives {key[0]}.{key[1]} in {unit!r}, the snapshot field "
                f"{field!r} expects {_EXPECTED_UNITS[field]!r}; convert it in the build"
            )
        units[field] = unit
        citation = None if row is None else _str(row.citation_keys)
        text = f"mendeleev {key[0]}.{key[1]}"
        if field in _EXTRA_SOURCES:
            text += f"; {_EXTRA_SOURCES[field]}"
        if citation:
            text += f"; upstream citation keys: {citation}"
        sources[field] = text
    units["shannon_radii.charge"] = "e"
    return units, sources


def build_snapshot() -> dict:
    """Read mendeleev's tables and return the snapshot as a plain dict.

    Returns
    -------
    dict
        ``{"meta": {...}, "elements": [...]}`` with the elements ordered by
        atomic number; missing values are ``None``. The same installed
        mendeleev always gives the same dict.
    """
    import mendeleev

    tables = _read_tables()
    elements = tables["elements"].sort_values("atomic_number", kind="mergesort")
    series_names = dict(zip(tables["series"]["id"].astype(int), tables["series"]["name"]))
    ionization = _ionization_energies(tables["ionizationenergies"])
    oxidation = _oxidation_states(tables["oxidationstates"])
    radii = _shannon_radii(tables["ionicradii"])

    records = []
    for row in elements.itertuples(index=False):
        z = int(row.atomic_number)
        states = oxidation.get(z, {})
        records.append(
            {
                "symbol": str(row.symbol),
                "name": str(row.name),
                "atomic_number": z,
                "atomic_weight": _float(row.atomic_weight),
                "period": _int(row.period),
                "group": _int(row.group_id),
                "block": _str(row.block),
                "series": series_names.get(_int(row.series_id)),
                "electronegativity_pauling": _float(row.en_pauling),
                "electronegativity_allen": _float(row.en_allen),
                "ionization_energies_eV": ionization.get(z, []),
                "electron_affinity_eV": _float(row.electron_affinity),
                "dipole_polarizability_bohr3": _float(row.dipole_polarizability),
                "electron_configuration": _str(row.electronic_configuration),
                "oxidation_states_main": states.get("oxidation_states_main", []),
                "oxidation_states_extra": states.get("oxidation_states_extra", []),
                "shannon_radii": radii.get(z, []),
            }
        )

    units, sources = _field_metadata(tables["propertymetadata"])
    meta = {
        "format_version": SNAPSHOT_FORMAT_VERSION,
        "mendeleev_version": mendeleev.__version__,
        "fields": list(ELEMENT_FIELDS),
        "shannon_fields": list(SHANNON_FIELDS),
        "units": units,
        "sources": sources,
        "counts": {
            "elements": len(records),
            "shannon_radii": sum(len(r["shannon_radii"]) for r in records),
            "ionization_energies": sum(
                sum(v is not None for v in r["ionization_energies_eV"]) for r in records
            ),
            "oxidation_states": sum(
                len(r["oxidation_states_main"]) + len(r["oxidation_states_extra"])
                for r in records
            ),
        },
        "float_significant_digits": _SIGNIFICANT_DIGITS,
        "ionization_energy_choice": (
            "one value per ion charge; if mendeleev holds several, the "
            "experimental one, then the smallest uncertainty, then the lowest row id"
        ),
    }
    return {"meta": meta, "elements": records}


def render_snapshot(snapshot: dict) -> str:
    """Serialise a snapshot the one way the committed file is written.

    Sorted keys, one-space indent, no NaN (missing values must already be
    ``None``), trailing newline: the same dict always gives the same bytes.
    """
    text = json.dumps(snapshot, sort_keys=True, indent=1, ensure_ascii=False, allow_nan=False)
    return text + "\n"


def snapshot_path() -> Path:
    """Where the committed snapshot lives (next to this script)."""
    return Path(__file__).resolve().with_name("elements.json")


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(
        prog="python -m ionicity.scorer.data.build_elements",
        description="Rebuild scorer/data/elements.json from the installed mendeleev.",
    )
    parser.add_argument(
        "--check",
        action="store_true",
        help="compare a fresh build with the committed file instead of writing it",
    )
    args = parser.parse_args(argv)
    text = render_snapshot(build_snapshot())
    path = snapshot_path()
    if args.check:
        current = path.read_text(encoding="utf-8") if path.exists() else None
        if current == text:
            print(f"{path} is up to date", file=sys.stderr)
            return 0
        print(
            f"{path} differs from a fresh build; run python -m ionicity.scorer.data.build_elements",
            file=sys.stderr,
        )
        return 1
    path.write_text(text, encoding="utf-8", newline="\n")
    print(f"wrote {path} ({len(text.encode('utf-8'))} bytes)", file=sys.stderr)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
