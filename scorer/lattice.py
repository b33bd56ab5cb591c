"""Lattice energies: Born-Lande, Born-Mayer, Kapustinskii, volume-based
(Glasser-Jenkins) estimates and the Born-Haber cycle.

Every energy here is the lattice potential energy ``U_POT`` of Jenkins's
usage: the energy, in kJ/mol, needed to take one mole of formula units of the
crystal apart into gaseous ions, reported positive.

Two families of estimate:

structure-based (Born-Lande, Born-Mayer)
    need the Madelung constant of the crystal's structure type, computed by
    Ewald summation in :mod:`scorer.madelung`, and the cation-anion distance
    ``r0``, taken as the sum of Shannon ionic radii at the coordination
    numbers of that structure. They apply to binary salts (one cation, one
    anion). The structure type comes from ``scorer/data/structure_prototypes.csv``
    (``structure_type_origin = "known"``), else from the radius-ratio rule
    (``"guessed"``, with a warning), else there is none (``"none"``).
structure-free (Kapustinskii, Glasser-Jenkins volume-based)
    need only charges and ionic radii (Kapustinskii) or the formula-unit
    volume (volume-based thermodynamics, VBT); they apply to any salt, and
    through the ionic strength ``I = 1/2 sum n_i z_i**2`` to salts of several
    ions. VBT also covers organic ionic-liquid ions through their volumes.

Hydrates are scored as the anhydrous salt, which the notes say; lattice
water is not counted in any estimate.

Experimental values come from the Born-Haber cycle; with measured
thermochemical data, :func:`born_haber_lattice_energy_kJ_mol` builds it.

The equations live in :mod:`scorer.lattice_energy` and structure types in
:mod:`scorer.structure_type` (both re-exported here); this module chooses
each compound's inputs (radii, volumes, Madelung constant, Born exponent) and
is the descriptor module of the lattice-energy columns.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ionicity.scorer.caching import once, per_input
from ionicity.scorer.descriptor import protocol, result_class
from ionicity.scorer.elements import get_element
from ionicity.scorer.lattice_energy import (
    BORN_MAYER_RHO_PM,
    COULOMB_KJ_PM_MOL,
    KAPUSTINSKII_CONSTANT_KJ_NM_MOL,
    KAPUSTINSKII_D_PM,
    VBT_COEFFICIENTS,
    VBT_LIMITING_A_KJ_NM_MOL,
    VBT_LIMITING_ABOVE_KJ_MOL,
    born_haber_lattice_energy_kJ_mol,
    born_lande_lattice_energy_kJ_mol,
    born_mayer_lattice_energy_kJ_mol,
    glasser_jenkins_vbt_lattice_energy_kJ_mol,
    glasser_kapustinskii_lattice_energy_kJ_mol,
    kapustinskii_lattice_energy_kJ_mol,
)
from ionicity.scorer.crystal import prototype_structure
from ionicity.scorer.madelung import madelung_details
from ionicity.scorer.model import Column, Decomposition, Ion, IonTerm, RowWarning, format_charge
from ionicity.scorer.radii import ion_radius_pm, ion_volume_nm3
from ionicity.scorer.structure_type import (
    StructureAssignment,
    assign_structure_type,
    cell_volume,
    charges_fit_prototype,
    structure_prototypes,
)
from ionicity.scorer.tables import table

__all__ = [
    "COLUMNS",
    "LatticeEnergies",
    "analyse",
    "describe",
    "explain",
    "COULOMB_KJ_PM_MOL",
    "BORN_MAYER_RHO_PM",
    "KAPUSTINSKII_CONSTANT_KJ_NM_MOL",
    "VBT_COEFFICIENTS",
    "born_lande_lattice_energy_kJ_mol",
    "born_mayer_lattice_energy_kJ_mol",
    "kapustinskii_lattice_energy_kJ_mol",
    "glasser_kapustinskii_lattice_energy_kJ_mol",
    "glasser_jenkins_vbt_lattice_energy_kJ_mol",
    "born_haber_lattice_energy_kJ_mol",
    "born_exponent",
    "assign_structure_type",
    "StructureAssignment",
    "structure_prototypes",
    "formula_unit_volume_nm3",
]

_SOURCE_KAP = "Kapustinskii, Q. Rev. Chem. Soc. 1956, 10, 283; Glasser, Inorg. Chem. 1995, 34, 4935"
_SOURCE_VBT = "Jenkins, Roobottom, Passmore, Glasser, Inorg. Chem. 1999, 38, 3609; Glasser & Jenkins, J. Am. Chem. Soc. 2000, 122, 632"

#: the --columns group of this module's COLUMNS
GROUP = "lattice"

COLUMNS: tuple[Column, ...] = (
    Column(
        "lattice_energy_kapustinskii_kJ_mol", "float64", "kJ/mol",
        "Kapustinskii lattice potential energy; several ions through the ionic strength (Glasser);"
        " Shannon CN VI radii for monatomic ions, thermochemical radii for polyatomic ones; anhydrous salt",
        "kapustinskii_lattice_energy_kJ_mol / glasser_kapustinskii_lattice_energy_kJ_mol", _SOURCE_KAP,
        "count-weighted mean cation radius plus count-weighted mean anion radius",
    ),
    Column(
        "lattice_energy_vbt_kJ_mol", "float64", "kJ/mol",
        "volume-based (Glasser-Jenkins) lattice potential energy from the formula-unit volume; anhydrous salt",
        "glasser_jenkins_vbt_lattice_energy_kJ_mol", _SOURCE_VBT,
        "ionic strength I = 1/2 sum n_i z_i^2 and the summed formula-unit volume",
    ),
    Column(
        "lattice_energy_born_mayer_kJ_mol", "float64", "kJ/mol",
        "Born-Mayer lattice energy with the Ewald-summed Madelung constant of the structure type"
        " (binary salts with a known or guessed structure type)",
        "born_mayer_lattice_energy_kJ_mol", "Born & Mayer, Z. Phys. 1932, 75, 1",
    ),
    Column(
        "lattice_energy_born_lande_kJ_mol", "float64", "kJ/mol",
        "Born-Lande lattice energy with the Ewald-summed Madelung constant and Pauling's Born exponents"
        " (binary salts of monatomic ions with a known or guessed structure type)",
        "born_lande_lattice_energy_kJ_mol", "Born & Lande, Verh. Dtsch. Phys. Ges. 1918, 20, 210; Pauling 1960",
    ),
    Column(
        "structure_type", "string", "",
        "structure-type prototype used by the Born equations: rock-salt, caesium-chloride, zinc-blende,"
        " wurtzite, fluorite, anti-fluorite, rutile or corundum; empty when none",
        "assign_structure_type", "scorer/data/structure_prototypes.csv (sources per row); Pauling radius-ratio rule",
    ),
    Column(
        "structure_type_origin", "string", "",
        "known (prototype table), guessed (radius-ratio rule, common practice) or none; empty for non-ionic entries",
        "assign_structure_type", "common practice",
    ),
)


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
    # Radii sums estimate a mean bond length, so the constant is referred to
    # the mean first-shell distance (identical to r0 for the regular prototypes).
    a = details.constant("common_factor", "mean_first_shell")
    z = float(math.gcd(abs(cation.charge), abs(anion.charge)))
    r_c, why_c = ion_radius_pm(cation, structure.cation_coordination)
    r_a, why_a = ion_radius_pm(anion, structure.anion_coordination)
    r0 = r_c + r_a
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
        r0_text=f"r+ = {r_c:.4g} pm ({why_c}); r- = {r_a:.4g} pm ({why_a})",
        born_exponent=n,
        born_exponent_text=n_text,
        volume_nm3=volume,
    )


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
    if len(cations) == 1 and len(anions) == 1 and cations[0].ion.element and anions[0].ion.element:
        terms = _structure_terms(cations[0].ion, anions[0].ion, cations[0].count, anions[0].count)
        if not math.isnan(terms.volume_nm3):
            return terms.volume_nm3, (
                f"{terms.assignment.structure_type} cell per formula unit scaled to r+ + r- = {terms.r0_pm:.4g} pm"
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
        return {(1, 1): "1:1", (2, 1): "2:1", (1, 2): "1:2"}.get(key, "general")
    return "general"


def _mean_radius(terms) -> tuple[float, list[str]]:
    total_count = sum(t.count for t in terms)
    acc = 0.0
    texts = []
    for t in terms:
        r, why = ion_radius_pm(t.ion)
        if math.isnan(r):
            return math.nan, [why]
        acc += t.count * r
        texts.append(f"r({t.ion.ion_id}) = {r:.4g} pm ({why})")
    return acc / total_count, texts


LatticeEnergies = result_class(
    "LatticeEnergies", COLUMNS, "The lattice energies of one compound (fields named as the columns).",
)


# Each equation's text, written once for the explain lines, from the constants the equations use.
_KAPUSTINSKII_TEXT = (
    f"U = {KAPUSTINSKII_CONSTANT_KJ_NM_MOL} kJ mol^-1 nm x 2I/<r> x (1 - {KAPUSTINSKII_D_PM / 1000:g} nm/<r>)"
)
_BORN_PREFACTOR_TEXT = "U = N_A A z^2 e^2/(4 pi eps0 r0)"
_BORN_MAYER_TEXT = f"{_BORN_PREFACTOR_TEXT} (1 - rho/r0), rho = {BORN_MAYER_RHO_PM:g} pm"
_BORN_LANDE_TEXT = f"{_BORN_PREFACTOR_TEXT} (1 - 1/n)"
_NOT_FOR_ACIDS = "lattice energies: not estimated for an acid (a molecular substance, not an ionic crystal)"


@per_input(maxsize=65536)
def _compute(cations: tuple[IonTerm, ...], anions: tuple[IonTerm, ...], hydrate_water: float) -> LatticeEnergies:
    """The lattice energies of a salt, cached per set of ions (every spelling,
    hydrate and decomposition note of one salt shares them)."""
    values: dict = {}
    notes: list[str] = []
    lines: list[str] = []
    if hydrate_water:
        notes.append(f"lattice energies are for the anhydrous salt ({hydrate_water:g} H2O per formula unit not counted)")
        lines.append(notes[-1])
    ionic_strength = _ionic_strength(cations, anions)

    # Kapustinskii (Glasser's form covers several ions; for a binary salt it is Kapustinskii's).
    r_cat, why_cat = _mean_radius(cations)
    r_an, why_an = _mean_radius(anions)
    if math.isnan(r_cat) or math.isnan(r_an):
        missing = why_cat if math.isnan(r_cat) else why_an
        notes.append("Kapustinskii: " + "; ".join(missing))
    else:
        u = glasser_kapustinskii_lattice_energy_kJ_mol(ionic_strength, r_cat, r_an)
        values["lattice_energy_kapustinskii_kJ_mol"] = u
        r_sum = (r_cat + r_an) / 1000.0
        lines.append(
            f"Kapustinskii: {_KAPUSTINSKII_TEXT} = {KAPUSTINSKII_CONSTANT_KJ_NM_MOL} x {2 * ionic_strength:g}"
            f" / {r_sum:.4f} x (1 - {KAPUSTINSKII_D_PM / 1000:g}/{r_sum:.4f}) = {u:.0f} kJ/mol"
            + (" (Glasser's generalisation, count-weighted mean radii)" if len(cations) + len(anions) > 2 else "")
        )
        lines.extend("  " + t for t in why_cat + why_an)

    # Volume-based thermodynamics.
    volume, why_volume = _formula_unit_volume(cations, anions)
    if math.isnan(volume):
        notes.append(f"VBT: no formula-unit volume ({why_volume})")
    else:
        salt_type = _vbt_salt_type(cations, anions)
        u = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type=salt_type)
        if salt_type == "general":
            limiting = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type="limiting")
            if limiting > VBT_LIMITING_ABOVE_KJ_MOL:
                salt_type, u = "limiting", limiting
        values["lattice_energy_vbt_kJ_mol"] = u
        if salt_type == "limiting":
            a = VBT_LIMITING_A_KJ_NM_MOL
            eq = f"U = {a} x I x (2I/Vm)^(1/3) = {a} x {ionic_strength:g} x ({2 * ionic_strength:g}/{volume:.5f})^(1/3)"
        else:
            alpha, beta = VBT_COEFFICIENTS[salt_type]
            eq = (
                f"U = 2I (alpha/Vm^(1/3) + beta), {salt_type} coefficients alpha = {alpha} kJ mol^-1 nm,"
                f" beta = {beta} kJ/mol: 2 x {ionic_strength:g} x ({alpha}/{volume:.5f}^(1/3) + {beta})"
            )
        lines.append(f"Glasser-Jenkins VBT: {eq} = {u:.0f} kJ/mol")
        lines.append(f"  Vm = {volume:.5f} nm^3: {why_volume}")

    # Structure-based equations.
    if len(cations) == 1 and len(anions) == 1:
        cation, anion = cations[0], anions[0]
        terms = _structure_terms(cation.ion, anion.ion, cation.count, anion.count)
        assignment = terms.assignment
        values["structure_type"] = assignment.structure_type
        values["structure_type_origin"] = assignment.origin
        lines.append(assignment.note)
        if assignment.origin == "guessed":
            # A guessed structure is something to check, so it sets the row's status to warning.
            notes.append(RowWarning(assignment.note))
        if assignment.structure_type is None:
            notes.append(f"Born-Lande/Born-Mayer: {assignment.note}")
        elif math.isnan(terms.r0_pm):
            notes.append(f"Born-Lande/Born-Mayer: no cation-anion distance ({terms.r0_text})")
        else:
            prefix = (
                f"A = {terms.madelung_constant:.5f} ({assignment.structure_type}, Ewald sum; z = {terms.charge_factor:g}),"
                f" r0 = {terms.r0_pm:.4g} pm"
            )
            u_bm = born_mayer_lattice_energy_kJ_mol(terms.madelung_constant, terms.charge_factor, terms.r0_pm)
            values["lattice_energy_born_mayer_kJ_mol"] = u_bm
            lines.append(f"Born-Mayer: {_BORN_MAYER_TEXT}; {prefix} -> {u_bm:.0f} kJ/mol")
            lines.append("  " + terms.r0_text)
            if math.isnan(terms.born_exponent):
                notes.append(f"Born-Lande: {terms.born_exponent_text}")
            else:
                u_bl = born_lande_lattice_energy_kJ_mol(
                    terms.madelung_constant, terms.charge_factor, terms.r0_pm, terms.born_exponent
                )
                values["lattice_energy_born_lande_kJ_mol"] = u_bl
                lines.append(f"Born-Lande: {_BORN_LANDE_TEXT}; {prefix}, n = {terms.born_exponent:g} -> {u_bl:.0f} kJ/mol")
                lines.append("  " + terms.born_exponent_text)
    else:
        values["structure_type_origin"] = "none"
        notes.append("Born-Lande/Born-Mayer: need a binary salt (one cation and one anion)")
    return LatticeEnergies(**values, notes=tuple(notes), steps=tuple(lines))


@protocol(title="Lattice energies (U_POT, kJ/mol):", columns=COLUMNS, result=LatticeEnergies,
          failure="lattice energies not computed")
def analyse(dec: Decomposition) -> LatticeEnergies:
    """The lattice energies of one compound, with notes and explain steps.

    Never raises (see :mod:`scorer.descriptor`): odd input gives NaN and a note.
    Non-ionic entries get no value and no note; acids a note.
    """
    if not dec.is_ionic:
        return LatticeEnergies(steps=("lattice energies: not an ionic compound",))
    if dec.substance_class == "acid":
        return LatticeEnergies(notes=(_NOT_FOR_ACIDS,), steps=(_NOT_FOR_ACIDS,))
    return _compute(tuple(dec.cations), tuple(dec.anions), float(dec.hydrate_water or 0.0))


describe = analyse.describe
explain = analyse.explain
