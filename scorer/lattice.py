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
is the descriptor module of the lattice-energy columns; the inputs are
gathered in :mod:`scorer.lattice_inputs`.
"""
from __future__ import annotations

import math

from ionicity.scorer.caching import per_input
from ionicity.scorer.descriptor import protocol, result_class
from ionicity.scorer.lattice_energy import (
    BORN_MAYER_RHO_PM,
    COULOMB_KJ_PM_MOL,
    BMH_RHO_PM,
    KAPUSTINSKII_CONSTANT_KJ_NM_MOL,
    KAPUSTINSKII_D_PM,
    VBT_COEFFICIENTS,
    VBT_LIMITING_A_KJ_NM_MOL,
    VBT_LIMITING_ABOVE_KJ_MOL,
    born_haber_lattice_energy_kJ_mol,
    born_lande_lattice_energy_kJ_mol,
    born_mayer_huggins_lattice_energy_kJ_mol,
    born_mayer_lattice_energy_kJ_mol,
    glasser_jenkins_vbt_lattice_energy_kJ_mol,
    glasser_kapustinskii_lattice_energy_kJ_mol,
    kapustinskii_lattice_energy_kJ_mol,
)
from ionicity.scorer.lattice_inputs import (  # re-exported: born_exponent, dispersion_coefficients, formula_unit_volume_nm3
    _formula_unit_volume,
    _ionic_strength,
    _mean_radius,
    _StructureTerms,
    _terms_of,
    _vbt_salt_type,
    born_exponent,
    dispersion_coefficients,
    formula_unit_volume_nm3,
)
from ionicity.scorer.model import Column, Decomposition, IonTerm
from ionicity.scorer.structure_type import StructureAssignment, assign_structure_type, structure_prototypes
from ionicity.scorer.thermochemistry import CYCLE_METHOD, cycle_lattice_energy_kJ_mol

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
    "born_mayer_huggins_lattice_energy_kJ_mol",
    "dispersion_coefficients",
    "BEST_METHOD_RULE",
    "kapustinskii_lattice_energy_kJ_mol",
    "glasser_kapustinskii_lattice_energy_kJ_mol",
    "glasser_jenkins_vbt_lattice_energy_kJ_mol",
    "whole_unit_factor",
    "born_haber_lattice_energy_kJ_mol",
    "born_exponent",
    "assign_structure_type",
    "StructureAssignment",
    "structure_prototypes",
    "formula_unit_volume_nm3",
]

_SOURCE_KAP = "Kapustinskii, Q. Rev. Chem. Soc. 1956, 10, 283; Glasser, Inorg. Chem. 1995, 34, 4935"
_SOURCE_VBT = "Jenkins, Roobottom, Passmore, Glasser, Inorg. Chem. 1999, 38, 3609; Glasser & Jenkins, J. Am. Chem. Soc. 2000, 122, 632"

_SOURCE_BMH = "Mayer, J. Chem. Phys. 1933, 1, 270; Tosi & Fumi, J. Phys. Chem. Solids 1964, 25, 45"

BEST_METHOD_RULE = (
    "first that applies: the thermochemical cycle (halides of Ag, Cu(I), Tl(I), Zn, Cd, Pb(II) with tabulated"
    " enthalpies; the point-charge columns are then withheld);"
    " Born-Mayer-Huggins (alkali halides: Mayer's C and D, measured distance); Kapustinskii as published"
    " (Goldschmidt and thermochemical radii); Glasser-Jenkins VBT. Chosen on the calibration salts of"
    " tests/data/lattice_reference.csv, where Kapustinskii had the smallest median error outside the alkali"
    " halides (Born-Mayer with measured distances next); a guessed structure never feeds it"
)

#: the --columns group of this module's COLUMNS
GROUP = "lattice"

COLUMNS: tuple[Column, ...] = (
    Column(
        "lattice_energy_kapustinskii_kJ_mol", "float64", "kJ/mol",
        "Kapustinskii lattice potential energy as published (his constant 120.25 kJ mol^-1 nm, Goldschmidt radii"
        " for monatomic ions, thermochemical radii for polyatomic ones); several ions through the ionic strength"
        " (Glasser); anhydrous salt; empty where lattice_energy_cycle_kJ_mol is given (covalent salts, see value_notes)",
        "kapustinskii_lattice_energy_kJ_mol / glasser_kapustinskii_lattice_energy_kJ_mol", _SOURCE_KAP,
        "count-weighted mean cation radius plus count-weighted mean anion radius",
    ),
    Column(
        "lattice_energy_vbt_kJ_mol", "float64", "kJ/mol",
        "volume-based (Glasser-Jenkins) lattice potential energy from the formula-unit volume (the measured cell"
        " where tabulated; coefficients per charge type 1:1, 2:1, 1:2, 2:2, else general or limiting); anhydrous salt;"
        " empty where lattice_energy_cycle_kJ_mol is given",
        "glasser_jenkins_vbt_lattice_energy_kJ_mol", _SOURCE_VBT,
        "ionic strength I = 1/2 sum n_i z_i^2 and the formula-unit volume",
    ),
    Column(
        "lattice_energy_born_mayer_kJ_mol", "float64", "kJ/mol",
        "Born-Mayer lattice energy with the Ewald-summed Madelung constant of the structure type and the measured"
        " nearest-neighbour distance where tabulated (else the sum of Shannon radii); salts with a measured"
        " structure, binary salts with a guessed one (see structure_type_origin); empty where lattice_energy_cycle_kJ_mol"
        " is given",
        "born_mayer_lattice_energy_kJ_mol", "Born & Mayer, Z. Phys. 1932, 75, 1",
    ),
    Column(
        "lattice_energy_born_lande_kJ_mol", "float64", "kJ/mol",
        "Born-Lande lattice energy with the Ewald-summed Madelung constant and Pauling's Born exponents"
        " (binary salts of monatomic ions with a measured or guessed structure type); empty where"
        " lattice_energy_cycle_kJ_mol is given",
        "born_lande_lattice_energy_kJ_mol", "Born & Lande, Verh. Dtsch. Phys. Ges. 1918, 20, 210; Pauling 1960",
    ),
    Column(
        "lattice_energy_born_mayer_huggins_kJ_mol", "float64", "kJ/mol",
        "Born-Mayer-Huggins lattice energy: Born-Mayer plus the van der Waals C/r^6 and D/r^8 terms with Mayer's"
        f" coefficients, measured distance, repulsion range {BMH_RHO_PM:g} pm set on calibration salts (alkali halides)",
        "born_mayer_huggins_lattice_energy_kJ_mol", _SOURCE_BMH,
    ),
    Column(
        "lattice_energy_cycle_kJ_mol", "float64", "kJ/mol",
        "lattice potential energy from the " + CYCLE_METHOD + "; halides of Ag, Cu(I), Tl(I) and chlorides,"
        " bromides and iodides of Zn, Cd, Pb(II), whose covalency the point-charge estimates miss (a cycle, not a"
        " model; where it is given, the point-charge columns are withheld with a note)",
        "cycle_lattice_energy_kJ_mol", "Wagman et al., J. Phys. Chem. Ref. Data 1982, 11, suppl. 2; Born 1919; Haber 1919",
    ),
    Column(
        "lattice_energy_best_kJ_mol", "float64", "kJ/mol",
        "the lattice potential energy of the method named in lattice_energy_best_method, chosen per compound: "
        + BEST_METHOD_RULE,
        "BEST_METHOD_RULE", f"{_SOURCE_BMH}; Born & Mayer 1932; {_SOURCE_VBT}",
    ),
    Column(
        "lattice_energy_best_method", "string", "",
        "which method lattice_energy_best_kJ_mol comes from: thermochemical_cycle, born_mayer_huggins,"
        " kapustinskii or vbt;"
        " empty when none",
        "BEST_METHOD_RULE", "this project",
    ),
    Column(
        "structure_type", "string", "",
        "structure-type prototype used by the Born equations: rock-salt, caesium-chloride, zinc-blende, wurtzite,"
        " fluorite, anti-fluorite, rutile, corundum, cuprite, cadmium-iodide, cadmium-chloride, perovskite,"
        " spinel, tenorite, litharge or cotunnite; empty when none",
        "assign_structure_type", "scorer/data/structure_prototypes.csv (sources per row); Pauling radius-ratio rule",
    ),
    Column(
        "structure_type_origin", "string", "",
        "measured (structure table, lattice parameters and distance measured), guessed (radius-ratio rule, common"
        " practice: the Born values then rest on a guess) or none; empty for non-ionic entries",
        "assign_structure_type", "common practice",
    ),
)


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
_BMH_TEXT = (
    f"{_BORN_PREFACTOR_TEXT} (1 - rho/r0) + C/r0^6 (1 - 6 rho/r0) + D/r0^8 (1 - 8 rho/r0), rho = {BMH_RHO_PM:g} pm"
)


def _best(values: dict, terms: _StructureTerms) -> tuple[str, float]:
    """The best estimate by :data:`BEST_METHOD_RULE` (which method, value)."""
    for key, name in (
        ("lattice_energy_cycle_kJ_mol", "thermochemical_cycle"),
        ("lattice_energy_born_mayer_huggins_kJ_mol", "born_mayer_huggins"),
        ("lattice_energy_kapustinskii_kJ_mol", "kapustinskii"),
        ("lattice_energy_vbt_kJ_mol", "vbt"),
    ):
        if key in values:
            return name, values[key]
    return "", math.nan


# Set on the calibration halides AgF, CuBr and TlBr of tests/data/lattice_reference.csv, where every
# point-charge method ran 5.6-22.5 % low against the Born-Haber value (Kapustinskii 13.7-21.3 %).
_POINT_CHARGE_COLUMNS = (
    "lattice_energy_kapustinskii_kJ_mol",
    "lattice_energy_vbt_kJ_mol",
    "lattice_energy_born_mayer_kJ_mol",
    "lattice_energy_born_lande_kJ_mol",
    "lattice_energy_born_mayer_huggins_kJ_mol",
)
_WITHHELD_NOTE = (
    "point-charge lattice energies (Kapustinskii, VBT, Born-Mayer, Born-Lande) withheld: they miss this salt's"
    " covalency (d10 or 6s2 cation, 6-23 % low on the calibration halides AgF, CuBr, TlBr);"
    " lattice_energy_best_kJ_mol is its thermochemical cycle"
)
_COVALENT_MONOVALENT = frozenset({"Cu(+)", "Ag(+)", "Au(+)", "Tl(+)"})
_RUNS_LOW_NOTE = (
    "point-charge lattice energies of Cu(I), Ag(I), Au(I) and Tl(I) salts run low (covalency: 6-23 % on the"
    " calibration halides AgF, CuBr, TlBr), and no thermochemical cycle is tabulated for this salt"
)

_NOT_FOR_ACIDS = "lattice energies: not estimated for an acid (a molecular substance, not an ionic crystal)"


def whole_unit_factor(cations, anions) -> int:
    """2 when doubling makes every ion count whole and some count is a half; else 1.

    A reading with half counts (GaCl2 as Ga(+)*0.5 with GaCl4(-)*0.5, a mixed valence split
    half and half) is a whole unit written at half size. Finer fractions are
    non-stoichiometric compositions (TiO1.9, La0.7Sr0.3MnO3), taken as written.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [whole_unit_factor(d.cations, d.anions) for d in map(decompose, map(parse_formula, ("NaCl", "GaCl2", "Fe3O4", "TiO1.9")))]
    [1, 2, 1, 1]
    """
    counts = [t.count for t in (*cations, *anions)]
    for k in (1, 2):
        if all(abs(c * k - round(c * k)) < 1e-9 for c in counts):
            return k
    return 1


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
        # VBT is fitted on whole formula units and is not linear in their size (the beta term,
        # Vm^(-1/3)): a reading with half counts (Ga(+)*0.5 with GaCl4(-)*0.5 for GaCl2) is taken
        # at its smallest whole unit and the energy divided back
        whole = whole_unit_factor(cations, anions)
        ionic_strength, volume = ionic_strength * whole, volume * whole
        u = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type=salt_type)
        if salt_type == "general":
            limiting = glasser_jenkins_vbt_lattice_energy_kJ_mol(ionic_strength, volume, salt_type="limiting")
            if limiting > VBT_LIMITING_ABOVE_KJ_MOL:
                salt_type, u = "limiting", limiting
        u /= whole
        ionic_strength, volume = ionic_strength / whole, volume / whole
        if whole != 1:
            lines.append(f"Glasser-Jenkins VBT: taken for {whole} formula units as written (whole ion counts),"
                         f" the energy divided by {whole}")
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
    terms = _terms_of(cations, anions)
    assignment = terms.assignment
    values["structure_type"] = assignment.structure_type
    values["structure_type_origin"] = assignment.origin
    lines.append(assignment.note)
    binary = len(cations) == 1 and len(anions) == 1
    if assignment.origin == "guessed":
        # A value note, not a row warning: the guess is named in structure_type_origin,
        # and the best-estimate column never rests on it.
        notes.append(f"Born-Lande/Born-Mayer rest on a guessed structure: {assignment.note}")
    if assignment.structure_type is None:
        notes.append(
            f"Born-Lande/Born-Mayer: {assignment.note}" if binary
            else "Born-Lande/Born-Mayer: need a binary salt (one cation and one anion) or a measured structure"
        )
    elif math.isnan(terms.r0_pm):
        notes.append(f"Born-Lande/Born-Mayer: no cation-anion distance ({terms.r0_text})")
    else:
        prefix = (
            f"A = {terms.madelung_constant:.5f} ({assignment.structure_type}, Ewald sum; z = {terms.charge_factor:g}),"
            f" r0 = {terms.r0_pm:.5g} pm"
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
        dispersion = dispersion_coefficients().get((cations[0].ion.ion_id, anions[0].ion.ion_id)) if binary else None
        if dispersion is not None and terms.r0_measured:
            c6, d8, _ = dispersion
            u_bmh = born_mayer_huggins_lattice_energy_kJ_mol(
                terms.madelung_constant, terms.charge_factor, terms.r0_pm, c6, d8
            )
            values["lattice_energy_born_mayer_huggins_kJ_mol"] = u_bmh
            lines.append(
                f"Born-Mayer-Huggins: {_BMH_TEXT}; {prefix}, C = {c6:g}e-60 erg cm^6, D = {d8:g}e-76 erg cm^8"
                f" (Mayer 1933) -> {u_bmh:.0f} kJ/mol"
            )

    withheld: tuple[str, ...] = ()
    if binary:
        u_cycle, cycle_text = cycle_lattice_energy_kJ_mol(cations[0].ion, anions[0].ion, cations[0].count, anions[0].count)
        if not math.isnan(u_cycle):
            values["lattice_energy_cycle_kJ_mol"] = u_cycle
            lines.append(f"thermochemical cycle: {cycle_text}")
            withheld = tuple(c for c in _POINT_CHARGE_COLUMNS if c in values)
            notes.append(_WITHHELD_NOTE)
            lines.append(_WITHHELD_NOTE + " (the values above are kept for the melting index, which was fitted on them)")
    if not withheld and any(t.ion.ion_id in _COVALENT_MONOVALENT for t in cations):
        notes.append(_RUNS_LOW_NOTE)

    best_method, best = _best({k: v for k, v in values.items() if k not in withheld}, terms)
    if best_method:
        values["lattice_energy_best_kJ_mol"] = best
        values["lattice_energy_best_method"] = best_method
        lines.append(
            f"best estimate: {best_method} = {best:.0f} kJ/mol (the first that applies of thermochemical cycle,"
            " Born-Mayer-Huggins, Kapustinskii, VBT; ionicity columns gives the rule)"
        )
    return LatticeEnergies(**values, notes=tuple(notes), steps=tuple(lines), withheld=withheld)


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
    if dec.ionic_model == "not_applicable":
        # scorer.applicability: a Zintl phase keeps its formal ions, not a point-ion lattice
        why = (f"lattice energies and structure type: the ionic model does not apply to a"
               f" {dec.substance_class.replace('_', ' ')} (see ionic_model)")
        return LatticeEnergies(notes=(why,), steps=(why,))
    return _compute(tuple(dec.cations), tuple(dec.anions), float(dec.hydrate_water or 0.0))


describe = analyse.describe
explain = analyse.explain
