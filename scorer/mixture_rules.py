"""How a mixture's value of each output column is formed from its components.

One table (:data:`MIXTURE_RULES`) read by two places: the mixture record
(:mod:`scorer.mixture`) forms the values by it, and the column registry
(:mod:`scorer.columns`) appends the rule to each column's method, so
``ionicity columns`` and the README state it beside every column. A column
not named here (a column added later) is left empty for a mixture, and its
method says so.

Kept apart from :mod:`scorer.mixture`, which imports the registry: this
module imports nothing of the scorer but the column model.

>>> with_mixture_rule(Column("molar_mass_g_mol", "float64", "", "", "sum of weights", "")).method
'sum of weights; mixture: mole-fraction average over the components that have a value (a neutral molecule has no ion-based values)'
>>> with_mixture_rule(Column("structure_type", "string", "", "", "", "")).method
'mixture: empty (a mixture is not one crystal; see each component in ionicity explain)'
"""
from __future__ import annotations

from dataclasses import replace

from ionicity.scorer.model import Column

__all__ = ["MIXTURE_RULES", "RULE_TEXT", "mixture_rule", "with_mixture_rule"]

# rule -> the words appended to a column's method
RULE_TEXT: dict[str, str] = {
    "mean": "mole-fraction average over the components that have a value (a neutral molecule has no ion-based values)",
    "min": "minimum over the components",
    "max": "maximum over the components",
    "shared": "the components' shared value, or mixed",
    "any": "true if any component's value is true",
    "ions": "every component's ions, counts times mole fraction (per mole of mixture)",
    "states": "every component's oxidation states, joined (an element with two states keeps both)",
    "own": "set for the mixture itself (see the column's description)",
    "empty": "empty (a mixture is not one crystal; see each component in ionicity explain)",
    "each": "every component's value in component order, equal values once, joined by ';'",
}

MIXTURE_RULES: dict[str, str] = {
    "status": "own", "message": "own", "value_notes": "own", "formula_normalized": "own", "substance_class": "own",
    "cations": "ions", "anions": "ions", "oxidation_states": "states",
    "hydrate_water": "mean", "molar_mass_g_mol": "mean",
    "delta_chi_pauling": "mean", "ionic_character_pauling_pct": "mean", "ionic_character_hannay_smyth_pct": "mean",
    "ionic_character_pauling_min_pct": "min", "mean_chi_pauling": "mean", "bond_type": "shared",
    "cation_polarising_power_e_per_A2": "mean", "cation_polarising_power_max_e_per_A2": "max",
    "anion_polarisability_A3": "mean", "anion_polarisability_max_A3": "max", "anion_polarisability_basis": "shared",
    "cation_pseudo_noble_gas": "any", "fajans_contact_index": "mean", "covalency_risk": "shared",
    "cation_hsab_class": "shared", "anion_hsab_class": "shared", "cation_hardness_eV": "mean",
    "anion_hardness_eV": "mean", "hsab_pairing": "shared", "hsab_pairing_score": "mean",
    # a mixture has no single lattice: the energies, the structure and the
    # melting trend of one crystal do not apply (the liquidus columns replace the last)
    "lattice_energy_kapustinskii_kJ_mol": "empty", "lattice_energy_vbt_kJ_mol": "empty",
    "lattice_energy_born_mayer_kJ_mol": "empty", "lattice_energy_born_lande_kJ_mol": "empty",
    "structure_type": "empty", "structure_type_origin": "empty", "mp_trend_index": "empty",
    # the band of the mixture's liquidus estimate (scorer.mixture)
    "melting_class": "own",
    "water_behaviour": "each", "solution_ph": "each", "water_reaction_products": "each",
    "mixture_components": "own", "mixture_mole_fractions": "own", "liquidus_estimate_K": "own", "liquidus_method": "own",
}


def mixture_rule(name: str) -> str:
    """The rule of column ``name`` (``"empty"`` for a column not in the table)."""
    return MIXTURE_RULES.get(name, "empty")


def with_mixture_rule(column: Column) -> Column:
    """The column with its mixture rule appended to its method (own columns unchanged)."""
    rule = mixture_rule(column.name)
    if rule == "own":
        return column
    text = "mixture: " + RULE_TEXT[rule]
    return replace(column, method=f"{column.method}; {text}" if column.method else text)
