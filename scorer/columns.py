"""The registry of output columns: every generated column declared once.

The table writer, ``ionicity columns`` and the README's column table are all
driven by :func:`output_columns`. The composition columns are declared here;
each descriptor module (:mod:`scorer.character`, :mod:`scorer.fajans`,
:mod:`scorer.hsab`, :mod:`scorer.lattice`, ...) declares its own ``COLUMNS``
and is listed in :data:`DESCRIPTOR_MODULES`.
"""
from __future__ import annotations

import importlib

from ionicity.scorer.caching import once
from ionicity.scorer.mixture_rules import with_mixture_rule
from ionicity.scorer.model import Column

__all__ = [
    "Column", "BASE_COLUMNS", "DESCRIPTOR_MODULES", "RECORD_COLUMN_MODULES", "output_columns", "column_names", "descriptor_modules", "descriptors",
]

_PARSER = "scorer.formula grammar"
_SOLVER = "scorer.ions charge-balance solver"

BASE_COLUMNS: tuple[Column, ...] = (
    Column("status", "string", "", "ok, warning or error", "", ""),
    Column("message", "string", "", "why, for warning and error rows; empty when ok", "", ""),
    Column(
        "value_notes", "string", "",
        "why some generated values are empty or estimated for this row (an ion no published table covers,"
        " a quantity that does not apply); informational, does not change status", "", "",
    ),
    Column(
        "formula_normalized", "string", "",
        "the parsed formula written canonically: ions in order (cations, then anions) for ionic entries,"
        " Hill order otherwise; lattice water as ·nH2O; a lone ion's charge as ^2-",
        _PARSER, "Hill, J. Am. Chem. Soc. 1900, 22, 478 (Hill order); IUPAC Red Book 2005, IR-4 (ion order)",
    ),
    Column(
        "substance_class", "string", "",
        "ionic_salt, ionic_liquid_pair, acid, base, covalent_molecular, covalent_network, metallic,"
        " element, ion or unknown (definitions in scorer.ions)",
        _SOLVER, "common practice",
    ),
    Column(
        "cations", "string", "", "cations per formula unit as ION(CHARGE)*COUNT joined by ';'",
        _SOLVER, "ion library scorer/data/ions.csv (sources per row)",
    ),
    Column(
        "anions", "string", "", "anions per formula unit as ION(CHARGE)*COUNT joined by ';'",
        _SOLVER, "ion library scorer/data/ions.csv (sources per row)",
    ),
    Column(
        "oxidation_states", "string", "",
        "formal oxidation state per element, e.g. Fe:+3;S:+6;O:-2; the average where an element has"
        " several (Fe3O4 gives Fe:+2.667); elements of organic ions are omitted",
        _SOLVER, "IUPAC Red Book 2005, IR-4.6.1 (oxidation number)",
    ),
    Column(
        "hydrate_water", "float64", "mol H2O per mol", "lattice water per formula unit (0 when anhydrous)",
        _PARSER, "",
    ),
    Column(
        "molar_mass_g_mol", "float64", "g/mol", "molar mass of the formula unit including lattice water",
        "sum of standard atomic weights", "IUPAC standard atomic weights via the mendeleev snapshot",
    ),
)

DESCRIPTOR_MODULES: tuple[str, ...] = ("ionicity.scorer.character", "ionicity.scorer.fajans", "ionicity.scorer.hsab", "ionicity.scorer.lattice", "ionicity.scorer.melting")

# modules whose COLUMNS the record fills itself, not a descriptor's analyse(dec)
# (empty for every compound): the mixture columns
RECORD_COLUMN_MODULES: tuple[str, ...] = ("ionicity.scorer.mixture",)


@once
def descriptor_modules() -> tuple:
    return tuple(importlib.import_module(name) for name in DESCRIPTOR_MODULES)


@once
def descriptors() -> tuple:
    """Each descriptor module's ``analyse`` (a :class:`scorer.descriptor.Descriptor`), in column order."""
    return tuple(module.analyse for module in descriptor_modules())


@once
def output_columns() -> tuple[Column, ...]:
    """Every generated column, in output order; names are unique."""
    columns = list(BASE_COLUMNS)
    for descriptor in descriptors():
        columns.extend(descriptor.columns)
    for name in RECORD_COLUMN_MODULES:
        columns.extend(importlib.import_module(name).COLUMNS)
    names = [c.name for c in columns]
    duplicates = {n for n in names if names.count(n) > 1}
    if duplicates:
        raise RuntimeError(f"output columns declared twice: {sorted(duplicates)}")
    return tuple(with_mixture_rule(c) for c in columns)


@once
def column_names() -> tuple[str, ...]:
    return tuple(c.name for c in output_columns())
