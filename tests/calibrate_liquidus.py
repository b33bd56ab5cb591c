"""Print the calibration scan of the liquidus coefficients (not a test).

``python tests/calibrate_liquidus.py`` scores the published points of
``scorer/data/eutectics.csv`` over a grid of the two hand-set coefficients of
:mod:`scorer.liquidus` (``SIZE_MISMATCH_OMEGA_J_A_MOL``,
``IONIC_POTENTIAL_K_J_A_MOL``) and prints the median absolute error (% of
kelvin) on the calibration set, which chose them, and, for information only,
on the validation set, which must not be used to choose them.
"""
from __future__ import annotations

import statistics

from ionicity.scorer.liquidus import IONIC_POTENTIAL_K_J_A_MOL, SIZE_MISMATCH_OMEGA_J_A_MOL
from ionicity.scorer.mixture import published_liquidus_errors


def medians(omega, k):
    rows = published_liquidus_errors(omega, k)
    return tuple(statistics.median(r["error_pct"] for r in rows if r["set"] == s) for s in ("calibration", "validation"))


def calibration_mean(omega, k):
    """Mean absolute error (%) over the calibration set's ionic melts: the figure the coefficients minimise
    (with four points, the median moves in steps; the deep eutectic solvent does not depend on them)."""
    rows = published_liquidus_errors(omega, k)
    return statistics.mean(r["error_pct"] for r in rows if r["set"] == "calibration" and r["kind"] != "deep eutectic solvent")


def main() -> None:
    print("omega_J_A_mol k_J_A_mol calibration_mean_ionic_pct calibration_median_pct")
    best = None
    for omega in (0.0, 1.0e5, 1.25e5, 1.5e5, 1.75e5, 2.0e5, 2.5e5, 3.0e5):
        for k in (0.0, 1.0e4, 1.5e4, 2.0e4, 2.5e4, 3.0e4, 3.5e4, 4.0e4):
            mean = calibration_mean(omega, k)
            best = min(best or (mean, omega, k), (mean, omega, k))
            print(f"{omega:.3g} {k:.3g} {mean:.1f} {medians(omega, k)[0]:.1f}")
    print(f"lowest calibration mean: omega {best[1]:.3g}, k {best[2]:.3g} ({best[0]:.1f} %)")
    print("calibration set, ionic-melt systems (each error %, chosen values):")
    for r in published_liquidus_errors():
        if r["set"] == "calibration":
            print(f"  {r['system']}: published {r['published_K']:.0f} K, estimate {r['estimate_K']:.0f} K,"
                  f" ideal {r['ideal_K']:.0f} K, error {r['error_pct']:.1f} %")
    cal, val = medians(SIZE_MISMATCH_OMEGA_J_A_MOL, IONIC_POTENTIAL_K_J_A_MOL)
    print(f"chosen omega {SIZE_MISMATCH_OMEGA_J_A_MOL:.3g}, k {IONIC_POTENTIAL_K_J_A_MOL:.3g}:"
          f" calibration median {cal:.1f} %, validation median {val:.1f} % (validation not used to choose)")


if __name__ == "__main__":
    main()
