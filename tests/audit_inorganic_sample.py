"""Draw the inorganic audit sample from the registry package ``chemicals``.

Run ``python tests/audit_inorganic_sample.py draw`` to print the sample rows
(reproducible: the order inside each stratum is the SHA-256 of the CAS number,
so the same package version gives the same rows), and
``python tests/audit_inorganic_sample.py score`` to score the labelled table
``tests/data/inorganic_audit.csv`` and print agreement per half.

Halves: ``A`` (studied: its disagreements may motivate a rule) when the
SHA-256 of the formula ends in an even hex digit, ``B`` (reported only) when
odd.  A rule is never written for a half-B row.
"""
from __future__ import annotations

import csv
import hashlib
import os
import re
import sys
from collections import Counter, defaultdict
from pathlib import Path

AUDIT_CSV = Path(__file__).parent / "data" / "inorganic_audit.csv"
PER_STRATUM = 23
METALS = set(
    "Li Be Na Mg Al K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn "
    "Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po Fr Ra "
    "Ac Th Pa U Np Pu Am".split())
HALOGENS = {"F", "Cl", "Br", "I"}


def half(formula: str) -> str:
    """``A`` or ``B`` by the parity of the last hex digit of SHA-256(formula)."""
    return "A" if int(hashlib.sha256(formula.encode()).hexdigest()[-1], 16) % 2 == 0 else "B"


def _counts(hill: str) -> dict[str, int]:
    out: dict[str, int] = defaultdict(int)
    for el, n in re.findall(r"([A-Z][a-z]?)(\d*)", hill):
        out[el] += int(n) if n else 1
    return dict(out)


def _waters(smiles: str) -> int:
    return sum(1 for part in smiles.split(".") if part in ("O", "[OH2]"))


def written_formula(hill: str, smiles: str) -> str:
    """The Hill formula with hydrate water written apart (``CuO4S.5H2O``)."""
    counts = _counts(hill)
    n = _waters(smiles)
    if n and counts.get("H", 0) >= 2 * n and counts.get("O", 0) >= n and len(counts) > 2:
        counts["H"] -= 2 * n
        counts["O"] -= n
        base = "".join(f"{el}{c if c > 1 else ''}" for el, c in counts.items() if c)
        return f"{base}.{n}H2O"
    return hill


def stratum(counts: dict[str, int], smiles: str) -> str | None:
    els = set(counts)
    metals = els & METALS
    others = els - METALS
    if "C" in els:
        # carbon only as carbonate (O:C 3), cyanide or thiocyanate (N:C 1), or carbide
        c = counts["C"]
        h_left = counts.get("H", 0) - 2 * _waters(smiles)
        if not metals or h_left > 0:
            return None
        if others <= {"C"}:
            return "carbide"
        if others <= {"C", "O"} and counts["O"] >= 3 * c:
            return "carbonate_cyanide"
        if others <= {"C", "N", "S"} and counts.get("N", 0) == c and counts.get("S", c) == c:
            return "carbonate_cyanide"
        return None
    if _waters(smiles) and len(els - {"H", "O"}) + bool(els & {"H", "O"}) < 2:
        return None  # an element "hydrate": a registry artefact
    if _waters(smiles) and not (others - {"H", "O"}) and counts.get("O", 0) <= _waters(smiles):
        return None  # metals "hydrate" with no anion: a registry artefact
    if _waters(smiles) and metals:
        return "hydrate"
    if not metals:
        if els & {"He", "Ne", "Ar", "Kr", "Xe", "Rn"} - {"Xe", "Kr"}:
            return None
        return "molecular" if len(els) > 1 else None
    if not others:
        return "intermetallic" if len(metals) > 1 else None
    if others <= {"B", "Si", "Ge", "As", "Sb", "Te", "Se", "P", "S"} and len(others) == 1:
        return "boride_silicide_pnictide"
    if others == {"N"}:
        return "nitride"
    if others == {"H"}:
        return "hydride"
    if others <= HALOGENS:
        return "double_halide" if len(metals) > 1 else "halide"
    if others == {"O"}:
        return "oxide"
    if "O" in others and others & HALOGENS:
        return "oxyhalide"
    if len(metals) > 1:
        return "double_salt"
    return "oxosalt"


def draw() -> list[dict[str, str]]:
    import chemicals.identifiers as ident
    folder = Path(os.path.dirname(ident.__file__)) / "Identifiers"
    rows: dict[str, dict[str, str]] = {}
    for fname in ("Inorganic db.tsv", "chemical identifiers pubchem large.tsv"):
        with open(folder / fname, encoding="utf-8") as fh:
            for line in fh:
                f = line.rstrip("\n").split("\t")
                if len(f) < 8 or not f[2] or "+" in f[2] or "-" in f[2]:
                    continue
                cas, hill, smiles, name = f[1], f[2], f[4], f[7]
                if cas in rows or not re.fullmatch(r"(?:[A-Z][a-z]?\d*)+", hill):
                    continue
                counts = _counts(hill)
                named = re.findall(r"\(((?:[A-Z][a-z]?\d*){2,})\)", name)
                if any(_counts(n) != counts for n in named):
                    continue  # the name's own formula contradicts the registry formula
                if any(c > 40 for c in counts.values()):
                    continue
                s = stratum(counts, smiles)
                if s:
                    rows[cas] = dict(cas=cas, hill=hill, smiles=smiles, name=name, stratum=s)
    by = defaultdict(list)
    for r in rows.values():
        by[r["stratum"]].append(r)
    sample = []
    for s in sorted(by):
        ranked = sorted(by[s], key=lambda r: hashlib.sha256(r["cas"].encode()).hexdigest())
        seen = set()
        for r in ranked:
            formula = written_formula(r["hill"], r["smiles"])
            if formula in seen:
                continue
            seen.add(formula)
            sample.append(dict(r, formula=formula, half=half(formula)))
            if len(seen) >= PER_STRATUM:
                break
    return sample


def registry_tm_K(cas: str) -> float | None:
    from chemicals.phase_change import Tm
    try:
        value = Tm(cas)
    except Exception:  # the registry raises on CAS numbers it has never seen
        return None
    return float(value) if value else None


def class_band_holds(melting_class: str, tm_K: float) -> bool:
    """Whether a registry melting point lies in the band of a melting class."""
    from ionicity.scorer.melting import MELTING_CLASS_BANDS
    bands = {name: (lo, hi) for name, lo, hi, _ in MELTING_CLASS_BANDS}
    lo, hi = bands[melting_class]
    return lo <= tm_K < hi


def verdicts(formula: str) -> dict[str, str]:
    """ionicity's current verdict on one formula (the columns the audit compares)."""
    from ionicity.scorer.record import score_formula
    out = score_formula(formula)
    return {k: "" if out.get(k) is None else str(out[k])
            for k in ("status", "substance_class", "ionic_model", "melting_class")}


def agreement(rows, prefix: str = "") -> dict[str, dict[str, tuple[int, int]]]:
    """Per half: (agreeing, labelled) for the class, the ionic model and the melting band.

    ``prefix`` "" scores the live verdicts; ``"before_"`` the recorded ones.
    """
    out: dict[str, dict[str, list[int]]] = {}
    for r in rows:
        got = verdicts(r["formula"]) if not prefix else {
            k: r[prefix + k] for k in ("status", "substance_class", "ionic_model", "melting_class")}
        h = out.setdefault(r["half"], {"substance_class": [0, 0], "ionic_model": [0, 0], "melting_band": [0, 0]})
        for key in ("substance_class", "ionic_model"):
            want = r["expected_" + key]
            if want:
                h[key][1] += 1
                h[key][0] += got[key] == want and got["status"] != "error"
        if r["registry_Tm_K"]:
            h["melting_band"][1] += 1
            h["melting_band"][0] += bool(got["melting_class"]) and class_band_holds(
                got["melting_class"], float(r["registry_Tm_K"]))
    return {k: {m: tuple(v) for m, v in d.items()} for k, d in sorted(out.items())}


def read_audit() -> list[dict[str, str]]:
    with open(AUDIT_CSV, encoding="utf-8") as fh:
        return list(csv.DictReader(fh))


if __name__ == "__main__":
    if sys.argv[1:] == ["score"]:
        audit_rows = read_audit()
        for label, prefix in (("before", "before_"), ("now", "")):
            for h, figures in agreement(audit_rows, prefix).items():
                print(label, "half", h, "  ".join(f"{k} {a}/{n} ({a / n:.0%})" for k, (a, n) in figures.items()))
    elif sys.argv[1:] == ["draw"]:
        sample = draw()
        print(Counter(r["stratum"] for r in sample), len(sample), file=sys.stderr)
        w = csv.writer(sys.stdout)
        w.writerow(["formula", "name", "cas", "stratum", "half", "registry_Tm_K"])
        for r in sample:
            tm = registry_tm_K(r["cas"])
            w.writerow([r["formula"], r["name"], r["cas"], r["stratum"], r["half"], "" if tm is None else round(tm, 2)])
