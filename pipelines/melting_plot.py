"""The parity plot of ``ionicity fit-melting``: measured against held-out predicted melting points.

matplotlib (the ``melting`` extra) is imported when the plot is drawn, so
the module imports without it.
"""
from __future__ import annotations

import os
from pathlib import Path

import numpy as np

from ionicity.pipelines.melting_cli import require_extra

__all__ = ["parity_plot"]


def parity_plot(y_true_K, y_pred_K, path, *, families=None, title: str = "") -> None:
    """Measured against predicted melting points, log axes, saved as PNG."""
    matplotlib = require_extra("matplotlib")
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt  # optional extra, checked by require_extra just above

    y_true_K = np.asarray(y_true_K, dtype=float)
    y_pred_K = np.asarray(y_pred_K, dtype=float)
    fig, ax = plt.subplots(figsize=(6.0, 6.0), dpi=120)
    if families is None:
        ax.scatter(y_true_K, y_pred_K, s=10, alpha=0.6)
    else:
        families = np.asarray(families)
        common = [f for f, _ in sorted(((f, int((families == f).sum())) for f in set(families.tolist())),
                                       key=lambda kv: -kv[1])][:8]
        for family in common:
            m = families == family
            ax.scatter(y_true_K[m], y_pred_K[m], s=10, alpha=0.7, label=family)
        rest = ~np.isin(families, common)
        if rest.any():
            ax.scatter(y_true_K[rest], y_pred_K[rest], s=10, alpha=0.5, color="grey", label="other")
        ax.legend(fontsize=7, loc="upper left")
    finite = np.concatenate([y_true_K[np.isfinite(y_true_K)], y_pred_K[np.isfinite(y_pred_K)]])
    lo, hi = float(finite.min()) * 0.8, float(finite.max()) * 1.25
    ax.plot([lo, hi], [lo, hi], color="black", lw=1)
    ax.set_xscale("log")
    ax.set_yscale("log")
    ax.set_xlim(lo, hi)
    ax.set_ylim(lo, hi)
    ax.set_xlabel("measured melting point / K")
    ax.set_ylabel("predicted melting point / K (held-out folds)")
    ax.set_title(title or "melting-point model, grouped cross-validation", fontsize=9)
    fig.text(0.01, 0.005, "Screening estimates only; not for process safety. Check measured data and the SDS.",
             fontsize=6)
    fig.tight_layout()
    path = Path(path)
    tmp = path.with_name(path.name + ".tmp.png")
    fig.savefig(tmp, format="png")
    plt.close(fig)
    os.replace(tmp, path)
