"""The liquidus plot of ``ionicity eutectic``: matplotlib (the ``melting`` extra), imported when drawn."""
from __future__ import annotations

import os
from pathlib import Path

from ionicity.pipelines.melting_cli import require_extra
from ionicity.scorer.liquidus import liquidus_K

__all__ = ["liquidus_plot"]

_NOTE = "Screening estimate; decomposition, volatility and container corrosion are not modelled. Check measured data and the SDS."


def liquidus_plot(melts, fractions, result, published, path) -> None:
    """The estimated liquidus across a binary (a line) or a ternary (filled contours), saved as PNG or SVG.

    Marks the estimated minimum, each component's melting point and the
    published point of ``scorer/data/eutectics.csv`` where there is one.
    """
    matplotlib = require_extra("matplotlib")
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt  # optional extra, checked by require_extra just above

    names = [m.name for m in melts]
    fig, ax = plt.subplots(figsize=(6.4, 4.8), dpi=120)
    if len(melts) == 2:
        xs = [i / 400 for i in range(1, 400)]
        temps = [liquidus_K(melts, (1 - x, x)).temperature_K for x in xs]
        ax.plot([0.0, *xs, 1.0], [melts[0].melting_point_K, *temps, melts[1].melting_point_K], color="C0",
                label="estimated liquidus")
        ax.scatter([0.0, 1.0], [melts[0].melting_point_K, melts[1].melting_point_K], color="black", zorder=3,
                   label="melting points (fusion.csv)")
        ax.scatter([fractions[1]], [result.temperature_K], color="C0", marker="v", s=60, zorder=3,
                   label=f"estimated minimum {result.temperature_K:.0f} K")
        if published is not None:
            ax.scatter([published["fractions"][1]], [published["liquidus_K"]], color="C3", marker="*", s=120, zorder=4,
                       label=f"published {published['liquidus_K']:.0f} K")
        ax.set_xlabel(f"mole fraction {names[1]} (rest {names[0]})")
        ax.set_ylabel("temperature / K")
        ax.set_xlim(0.0, 1.0)
    else:
        points, temps = [], []
        steps = 60
        for i in range(steps + 1):
            for j in range(steps + 1 - i):
                x = (i / steps, j / steps, (steps - i - j) / steps)
                points.append(x)
                temps.append(liquidus_K(melts, x).temperature_K)

        def xy(x):
            return x[1] + 0.5 * x[2], 0.8660254 * x[2]

        px, py = zip(*(xy(p) for p in points))
        contour = ax.tricontourf(px, py, temps, levels=14, cmap="viridis")
        fig.colorbar(contour, ax=ax, label="estimated liquidus / K")
        ax.plot([0, 1, 0.5, 0], [0, 0, 0.8660254, 0], color="black", lw=1)
        for corner, melt in zip(((0, 1, 0), (0, 0, 1), (1, 0, 0)), (melts[1], melts[2], melts[0])):
            cx, cy = xy(corner)
            ax.annotate(f"{melt.name}\n{melt.melting_point_K:.0f} K", (cx, cy), ha="center", fontsize=8)
        mx, my = xy(fractions)
        ax.scatter([mx], [my], color="white", edgecolor="black", marker="v", s=60,
                   label=f"estimated minimum {result.temperature_K:.0f} K")
        if published is not None:
            qx, qy = xy(published["fractions"])
            ax.scatter([qx], [qy], color="C3", marker="*", s=120, label=f"published {published['liquidus_K']:.0f} K")
        ax.set_aspect("equal")
        ax.axis("off")
    ax.set_title(f"{'-'.join(names)}: estimated liquidus", fontsize=10)
    ax.legend(fontsize=7, loc="best")
    fig.text(0.01, 0.005, _NOTE, fontsize=6)
    fig.tight_layout()
    path = Path(path)
    tmp = path.with_name(path.name + ".tmp" + path.suffix)
    fig.savefig(tmp, format=path.suffix.lower().lstrip("."))
    plt.close(fig)
    os.replace(tmp, path)
