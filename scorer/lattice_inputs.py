"""The inputs of the lattice-energy equations for one salt: Born exponents,
the structure-based terms (structure type, Madelung constant, r0), the
formula-unit volume, the ionic strength and the Kapustinskii mean radius.

:mod:`scorer.lattice` chooses among the estimates and declares the columns;
this module only gathers what each equation of :mod:`scorer.lattice_energy`
needs, with the reason for every choice (the explain lines quote them).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.crystal import prototype_structure
from ionicity.scorer.elements import get_element
from ionicity.scorer.madelung import madelung_details
from ionicity.scorer.model import Decomposition, Ion, IonTerm, format_charge
from ionicity.scorer.radii import ion_radius_pm, ion_volume_nm3, kapustinskii_radius_pm
from ionicity.scorer.structure_type import (
    StructureAssignment,
    assign_structure_type,
    cell_volume,
    charges_fit_prototype,
    measured_structure,
)
from ionicity.scorer.tables import table

__all__ = ["born_exponent", "dispersion_coefficients", "formula_unit_volume_nm3"]


@once
def dispersion_coefficients() -> dict[tuple[str, str], tuple[float, float, str]]:
    """(cation_id, anion_id) -> (C in 1e-60 erg cm^6, D in 1e-76 erg cm^8, source), read once."""
    return {
        (row["cation_id"], row["anion_id"]): (float(row["c_1e60_erg_cm6"]), float(row["d_1e76_erg_cm8"]), row["source"])
        for row in table("dispersion_coefficients.csv")
    }


# --- Born exponents -----------------------------------------------------------------


@once
def _born_exponent_table() -> dict[int, tuple[str, int, str]]:
    return {
        int(row["electrons"]): (row["configuration"], int(row["born_exponent"]), row["source"])
        for row in table("born_exponents.csv")
    }


_NOBLE_CORES = (2, 10, 18, 36, 54)


@per_input(maxsize=1024)
def born_exponent(symbol: str, charge: int) -> tuple[float, str]:
    """Pauling's Born exponent of a monatomic ion, with the reason.

    Closed-shell ions take the value of their configuration (He 5, Ne 7,
    Ar and Cu(+) type 9, Kr and Ag(+) type 10, Xe and Au(+) type 12). Other
    ions (partly filled d shells, inert pairs) take the value of the largest
    noble-gas core they contain, which the reason says (common practice).

    Examples
    --------
    >>> born_exponent("Na", 1)
    (7.0, 'n = 7 for Na(+), a Ne configuration')
    >>> born_exponent("Fe", 2)[0]
    9.0
    """
    try:
        element = get_element(symbol)
    except KeyError as exc:
        return math.nan, str(exc.args[0])
    electrons = element.atomic_number - int(charge)
    name = f"{symbol}({format_charge(int(charge))})"
    table = _born_exponent_table()
    if electrons in table:
        config, n, _ = table[electrons]
        return float(n), f"n = {n} for {name}, a {config} configuration"
    cores = [c for c in _NOBLE_CORES if c <= electrons]
    if not cores or electrons > 86:
        return math.nan, f"no Born exponent for {name} ({electrons} electrons)"
    config, n, _ = table[cores[-1]]
    return float(n), f"n = {n} for {name}: not closed-shell, value of its {config} core (common practice)"


# --- Per-compound work ------------------------------------------------------------------


@dataclass(frozen=True)
class _StructureTerms:
    assignment: StructureAssignment
    madelung_constant: float = math.nan
    charge_factor: float = math.nan
    r0_pm: float = math.nan
    r0_text: str = ""
    r0_measured: bool = False
    born_exponent: float = math.nan
    born_exponent_text: str = ""
    volume_nm3: float = math.nan


def _structure_terms(cation: Ion, anion: Ion, n_cation: float, n_anion: float) -> _StructureTerms:
    assignment = assign_structure_type(cation, anion, n_cation, n_anion)
    if assignment.structure_type is None:
        return _StructureTerms(assignment)
    if not charges_fit_prototype(cation, anion, assignment.structure_type):
        return _StructureTerms(
            StructureAssignment(None, "none", f"the charges do not fit the {assignment.structure_type} prototype")
        )
    structure = prototype_structure(assignment.structure_type)
    details = madelung_details(assignment.structure_type)
    # A measured distance is a first-shell mean and radii sums estimate one, so the
    # constant is referred to the mean first-shell distance (r0 for the regular prototypes).
    a = details.constant("common_factor", "mean_first_shell")
    z = float(math.gcd(abs(cation.charge), abs(anion.charge)))
    measured = assignment.measured
    if measured is not None:
        r0 = measured.nn_distance_pm
        r0_text = f"r0 = {r0:.5g} pm, measured first-shell distance of {measured.compound} (structure table)"
        volume = measured.volume_per_formula_unit_nm3
    else:
        r_c, why_c = ion_radius_pm(cation, structure.cation_coordination)
        r_a, why_a = ion_radius_pm(anion, structure.anion_coordination)
        r0 = r_c + r_a
        r0_text = f"r+ = {r_c:.4g} pm ({why_c}); r- = {r_a:.4g} pm ({why_a})"
        volume = math.nan
        if not math.isnan(r0):
            scale = r0 / 100.0 / details.r_mean_first_shell
            volume = cell_volume(assignment.structure_type) / details.formula_units * scale**3 * 1e-3
    n = math.nan
    n_text = "Born exponents by configuration are defined for monatomic ions only"
    if cation.element is not None and anion.element is not None:
        n_c, t_c = born_exponent(cation.element, cation.charge)
        n_a, t_a = born_exponent(anion.element, anion.charge)
        n = (n_c + n_a) / 2.0
        n_text = f"{t_c}; {t_a}; mean n = {n:g} (Pauling's average over the two ions)"
    return _StructureTerms(
        assignment=assignment,
        madelung_constant=a,
        charge_factor=z,
        r0_pm=r0,
        r0_text=r0_text,
        r0_measured=measured is not None,
        born_exponent=n,
        born_exponent_text=n_text,
        volume_nm3=volume,
    )


def _charges_proportional(terms, structure_type: str) -> float:
    """z of the compound if its distinct cation and anion charges are the
    prototype's scaled as a whole, else NaN."""
    proto = prototype_structure(structure_type)
    own = sorted({t.ion.charge for t in terms})
    theirs = sorted({int(round(q)) for q in proto.charges})
    if len(own) != len(theirs):
        return math.nan
    ratios = {o / t for o, t in zip(own, theirs)}
    if len(ratios) != 1:
        return math.nan
    return float(math.gcd(*(abs(q) for q in own)))


def _several_ion_terms(cations, anions) -> _StructureTerms:
    """Born-Mayer inputs for a salt of several ions with a measured structure
    (spinel, perovskite): the prototype's whole Ewald sum, scaled to the measured cell."""
    row = measured_structure([t.ion.ion_id for t in cations], [t.ion.ion_id for t in anions])
    if row is None:
        return _StructureTerms(StructureAssignment(None, "none", "no measured structure for this salt of several ions"))
    assignment = StructureAssignment(
        row.structure_type, "measured", f"structure type {row.structure_type} (measured, {row.compound}): {row.source}", row,
    )
    z = _charges_proportional(tuple(cations) + tuple(anions), row.structure_type)
    if math.isnan(z):
        return _StructureTerms(
            StructureAssignment(None, "none", f"the charges do not fit the {row.structure_type} prototype")
        )
    details = madelung_details(row.structure_type)
    return _StructureTerms(
        assignment=assignment,
        madelung_constant=details.constant("common_factor", "mean_first_shell"),
        charge_factor=z,
        r0_pm=row.nn_distance_pm,
        r0_text=f"r0 = {row.nn_distance_pm:.5g} pm, mean measured first-shell distance of {row.compound} (structure table)",
        r0_measured=True,
        volume_nm3=row.volume_per_formula_unit_nm3,
    )


@per_input(maxsize=65536)
def _terms_of(cations: tuple[IonTerm, ...], anions: tuple[IonTerm, ...]) -> _StructureTerms | None:
    if len(cations) == 1 and len(anions) == 1:
        return _structure_terms(cations[0].ion, anions[0].ion, cations[0].count, anions[0].count)
    return _several_ion_terms(cations, anions)


def formula_unit_volume_nm3(dec: Decomposition) -> tuple[float, str]:
    """Formula-unit volume Vm for the volume-based equation, with its origin.

    1. A binary salt of monatomic ions with a known or guessed structure
       type: the prototype cell per formula unit, scaled so its mean
       first-shell cation-anion distance equals the sum of Shannon radii at
       that structure's coordination numbers (this reproduces measured
       volumes: NaCl 0.0453 nm^3 against 0.0449 from a = 564 pm).
    2. Otherwise the sum of the ion volumes of :func:`scorer.radii.ion_volume_nm3`
       (Jenkins's additivity), ions counted per formula unit; lattice water is
       not counted.
    """
    return _formula_unit_volume(dec.cations, dec.anions)


@per_input(maxsize=65536)
def _formula_unit_volume(cations: tuple[IonTerm, ...], anions: tuple[IonTerm, ...]) -> tuple[float, str]:
    terms = _terms_of(cations, anions)
    if terms.r0_measured:
        row = terms.assignment.measured
        return terms.volume_nm3, f"measured cell of {row.compound} ({row.structure_type}) per formula unit"
    if len(cations) == 1 and len(anions) == 1 and cations[0].ion.element and anions[0].ion.element:
        if not math.isnan(terms.volume_nm3):
            return terms.volume_nm3, (
                f"{terms.assignment.structure_type} cell per formula unit scaled to r+ + r- = {terms.r0_pm:.4g} pm"
                f" ({terms.assignment.origin} structure)"
            )
    total = 0.0
    parts = []
    for term in cations + anions:
        v, why = ion_volume_nm3(term.ion)
        if math.isnan(v):
            return math.nan, why
        total += term.count * v
        parts.append(f"{term.ion.ion_id} {v:.5f} nm^3 ({why})")
    return total, "sum of ion volumes: " + "; ".join(parts)


def _ionic_strength(cations, anions) -> float:
    return 0.5 * sum(t.count * t.ion.charge**2 for t in cations + anions)


def _vbt_salt_type(cations, anions) -> str:
    if len(cations) == 1 and len(anions) == 1:
        key = (abs(cations[0].ion.charge), abs(anions[0].ion.charge))
        return {(1, 1): "1:1", (2, 1): "2:1", (1, 2): "1:2", (2, 2): "2:2"}.get(key, "general")
    return "general"


def _mean_radius(terms) -> tuple[float, list[str]]:
    total_count = sum(t.count for t in terms)
    acc = 0.0
    texts = []
    for t in terms:
        r, why = kapustinskii_radius_pm(t.ion)
        if math.isnan(r):
            return math.nan, [why]
        acc += t.count * r
        texts.append(f"r({t.ion.ion_id}) = {r:.4g} pm ({why})")
    return acc / total_count, texts
