"""The registry of output columns: every generated column declared once.

The table writer, ``ionicity columns`` and the README's column table are all
driven by :func:`output_columns`. The composition columns are declared here;
each descriptor module (:mod:`scorer.character`, :mod:`scorer.fajans`,
:mod:`scorer.hsab`, :mod:`scorer.lattice`, ...) declares its own ``COLUMNS``
and is listed in :data:`DESCRIPTOR_MODULES`.
"""
from __future__ import annotations

import dataclasses
import importlib

from ionicity.scorer.caching import once
from ionicity.scorer.mixture_rules import with_mixture_rule
from ionicity.scorer.model import Column
from ionicity.scorer.precision import digits_for

__all__ = [
    "Column", "BASE_COLUMNS", "DESCRIPTOR_MODULES", "RECORD_COLUMN_MODULES", "output_columns", "column_names",
    "descriptor_modules", "descriptors", "column_groups", "GROUP",
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
        " otherwise IUPAC order without carbon (electropositive element first: TiCl4, SiO2, SF6) and Hill order"
        " for carbon compounds (CCl4, C6H12O6); lattice water as ·nH2O; a lone ion's charge as ^2-",
        _PARSER, "Hill, J. Am. Chem. Soc. 1900, 22, 478 (Hill order); IUPAC Red Book 2005, IR-4 (ion order),"
        " IR-4.4.2.1 and Table VI (element sequence)",
    ),
    Column(
        "substance_class", "string", "",
        "ionic_salt, ionic_liquid_pair, acid, base, covalent_molecular, chain_layer_solid, covalent_network,"
        " semiconductor, intermetallic, zintl_phase, metallic, element, ion, mixture or unknown (definitions in"
        " scorer.substance)",
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

DESCRIPTOR_MODULES: tuple[str, ...] = ("ionicity.scorer.applicability", "ionicity.scorer.character", "ionicity.scorer.fajans", "ionicity.scorer.hsab", "ionicity.scorer.lattice", "ionicity.scorer.melting", "ionicity.scorer.systematic_name", "ionicity.scorer.water")
# modules whose COLUMNS the record fills itself, not a descriptor's analyse(dec):
# the audit's (slips, solutions, duplicates) and the mixture columns (empty for
# every compound); after the descriptors'
RECORD_COLUMN_MODULES: tuple[str, ...] = ("ionicity.scorer.audit", "ionicity.scorer.mixture")


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
    return tuple(_with_digits(with_mixture_rule(c)) for c in columns)


def _with_digits(column: Column) -> Column:
    """A float column's significant digits from :mod:`scorer.precision` when it declares none."""
    if column.dtype != "float64" or column.digits is not None:
        return column
    return dataclasses.replace(column, digits=digits_for(column.name))


#: the group of :data:`BASE_COLUMNS` for ``--columns``; each descriptor module names its own ``GROUP``
GROUP = "composition"


@once
def column_groups() -> dict[str, tuple[str, ...]]:
    """Group name -> its column names, in output order: ``composition`` for
    :data:`BASE_COLUMNS`, then each descriptor module's ``GROUP``, then each
    of :data:`RECORD_COLUMN_MODULES`' ``GROUP``."""
    groups: dict[str, list[str]] = {GROUP: [c.name for c in BASE_COLUMNS]}
    for module in descriptor_modules():
        groups.setdefault(getattr(module, "GROUP", module.__name__.rsplit(".", 1)[-1]), []).extend(
            c.name for c in module.analyse.columns)
    for name in RECORD_COLUMN_MODULES:
        module = importlib.import_module(name)
        groups.setdefault(getattr(module, "GROUP", name.rsplit(".", 1)[-1]), []).extend(c.name for c in module.COLUMNS)
    return {g: tuple(names) for g, names in groups.items()}


@once
def column_names() -> tuple[str, ...]:
    return tuple(c.name for c in output_columns())
