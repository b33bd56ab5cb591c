"""``ionicity explain`` for a mixture: the mixture's own values, then every component's own scores."""
from __future__ import annotations

import math

from ionicity.pipelines.eutectic_cli import CAUTION
from ionicity.scorer.mixture import COLUMNS, SameCompound, read_mixture
from ionicity.scorer.record import score_formula, score_row

__all__ = ["explain_mixture"]

_SHOWN = ("status", "message", "formula_normalized", "substance_class", "cations", "anions", "molar_mass_g_mol",
          "delta_chi_pauling", "ionic_character_pauling_pct", "value_notes")


def _text(value) -> str:
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return "-"
    return f"{value:.6g}" if isinstance(value, float) else (str(value) or "-")


def explain_mixture(text: str, explain_compound) -> str | None:
    """The explain text of a mixture, or None when ``text`` is a compound.

    ``explain_compound`` is :func:`ionicity.pipelines.explain.explain_formula`,
    used for each component (passed in: that module calls this one).
    """
    found = read_mixture(text, score_row)
    if found is None or isinstance(found, SameCompound):
        return None  # a compound (written twice, or with its name): explained as one
    record = score_formula(text)
    lines = [f"formula: {text}", "mixture"]
    for name in _SHOWN + tuple(c.name for c in COLUMNS):
        lines.append(f"  {name}: {_text(record[name])}")
    if isinstance(found, str):
        return "\n".join(lines)
    for component, fraction in zip(found.components, found.fractions):
        lines.append("")
        lines.append(f"component {component.name} (mole fraction {fraction:.4g})")
        own = explain_compound(component.formula) if component.fusion is None or component.fusion["kind"] == "ionic" else (
            f"formula: {component.formula}\n{component.name}: neutral molecule; ion-based values do not apply"
        )
        # the component's block without its own closing caution: one caution closes the whole text
        lines.extend("  " + line for line in own.splitlines()[:-1] if line)
        if component.fusion is not None:
            f = component.fusion
            lines.append(f"  fusion: melts at {float(f['melting_point_K']):.1f} K, dHfus {f['enthalpy_fusion_kJ_mol']} kJ/mol"
                         f" ({f['source']})")
    lines.append("")
    lines.append(CAUTION)
    return "\n".join(lines)
