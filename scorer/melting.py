"""Melting behaviour: a trend index and a melting class for every salt, and
the arithmetic that applies a fitted melting-point model.

Trend index
-----------
``mp_trend_index`` is dimensionless and reads on the scale of log10 of a
temperature in kelvin: higher means a higher expected melting point, a step of
0.1 is about 26 %. It is a ranking aid, not a prediction; its typical scatter
against measured melting points is a factor of about 1.5 (see ``datasets/melting/README.md``
for the figures per anion family). It follows ``T_m = dH_fus / dS_fus`` with
each factor replaced by what the other scoring modules know
(:func:`melting_trend_index`):

* **cohesion**: the lattice potential energy per ion ``u = U / nu``
  (Glasser-Jenkins volume-based estimate, else Kapustinskii; ``nu`` ions per
  formula unit). The heat of fusion is a small, roughly constant share of
  the cohesion of a simple ionic crystal (about 3.6 % for NaCl: 28 kJ/mol of
  787; CRC Handbook, from memory), and a melting point grows with it (the
  Lindemann picture);
* **covalency (Fajans)**: a salt whose contact bond is covalent forms layers,
  chains or molecules that come apart far below what its ionic lattice energy
  suggests (AlCl3, GaCl3, HgCl2 against NaCl). Three measures: the mean
  Pauling electronegativity of the two atoms in contact (van Arkel-Ketelaar's
  x: high means covalent), the Fajans contact index (induced dipole at the
  contact) and Fajans' third rule (an 18 or 18+2 electron cation);
* **entropy of fusion**: polyatomic anions gain orientational freedom on
  melting, many rotate in the solid already (plastic phases), so salts of
  molecular anions melt low for their lattice energy; organic ions add the
  conformational entropy of Dannenfelser and Yalkowsky (Ind. Eng. Chem. Res.
  1996, 35, 1483; from memory), ``R ln Phi`` with ``Phi = 2.435**tau`` for an
  ion with ``tau`` torsional angles, less ``R ln sigma`` for its rotational
  symmetry number ``sigma`` (Carnelley's rule: symmetric ions pack and melt
  higher);
* **charge delocalisation**: an ion whose charge is spread by resonance over
  three or more atoms (imidazolium, pyridinium, [NTf2], sulfonates, [dca])
  holds its counter-ions more weakly than a point charge of its volume,
  which the volume-based energy assumes. Carboxylates and phosphate diesters
  share their charge between two oxygens only and chelate metal ions, so
  they do not count.

The torsion counts, symmetry numbers and delocalisation flags of organic and
ionic-liquid ions are in ``scorer/data/ion_shape.csv``. The weights of the
terms were fitted once by least squares to ln T_m of the open training set
that ``ionicity fit-melting`` builds (``chemicals`` 1.5.2; about 540 inorganic
salts) and rounded; the organic-ion terms were then set by hand so
that known ionic liquids fall below 100 C (:data:`TREND_WEIGHTS`). No fitting
happens at scoring time.

Melting class
-------------
``melting_class`` maps the index through the same log10-kelvin scale
(:func:`melting_class_from_index`, thresholds in :data:`MELTING_CLASSES`):

=====================  ===================  ==========================================================
class                  trend range          origin of the threshold
=====================  ===================  ==========================================================
``ionic_liquid``       below 373.15 K       the trade's definition: a salt melting below 100 C
                                            (Wasserscheid & Welton, Ionic Liquids in Synthesis, 2008;
                                            from memory)
``low_melting_salt``   373.15-573.15 K      up to 300 C: nitrate/nitrite heat-transfer melts, organic
                                            ammonium salts, chloroaluminates (common practice)
``molten_salt``        573.15-1773.15 K     the usual molten-salt range, halides, carbonates,
                                            sulfates and fluorides of the alkali and alkaline-earth
                                            metals (common practice)
``refractory``         1773.15 K and above  refractoriness of at least 1500 C, the ISO 836 definition
                                            of a refractory material (from memory)
=====================  ===================  ==========================================================

Applying a fitted model
-----------------------
``ionicity fit-melting`` (in :mod:`pipelines.melting_fit`) fits gradient-
boosted trees on :data:`MODEL_FEATURES` and writes them as JSON: every tree
as arrays of plain numbers. :func:`model_from_dict` checks such a document
against the expected schema and refuses anything else;
:func:`predict_melting_K` walks the trees in numpy and adds the split-
conformal interval. No pickle is involved, so a model file cannot run code.

Predicted melting points and classes are estimates for screening, not for
process safety: decomposition, hydration and pressure are not modelled.
Check measured data and the safety data sheet before heating anything.
"""
from __future__ import annotations

import csv
import math
import re
from dataclasses import dataclass
from functools import cache, lru_cache
from importlib import resources

import numpy as np

from ionicity.scorer.model import Column, Decomposition, Ion

__all__ = [
    "COLUMNS",
    "MODEL_COLUMNS",
    "MODEL_FEATURES",
    "MELTING_CLASSES",
    "TREND_WEIGHTS",
    "CAUTION",
    "describe",
    "explain",
    "melting_trend_index",
    "melting_class_from_index",
    "trend_temperature_K",
    "dannenfelser_yalkowsky_flexibility_entropy_J_mol_K",
    "ion_shape",
    "melting_terms",
    "model_features_from_record",
    "MeltingModel",
    "ModelFormatError",
    "model_from_dict",
    "model_to_dict",
    "predict_melting_K",
    "outside_training_domain",
]

CAUTION = (
    "estimates for screening, not for process safety: decomposition, hydration and pressure are not"
    " modelled; check measured data and the safety data sheet before heating anything"
)

GAS_CONSTANT_J_MOL_K = 8.314462618

# (name, upper bound in K, origin); the last class is open-ended.
MELTING_CLASSES: tuple[tuple[str, float, str], ...] = (
    ("ionic_liquid", 373.15, "melts below 100 C, the trade's definition (Wasserscheid & Welton 2008, from memory)"),
    ("low_melting_salt", 573.15, "100-300 C (common practice)"),
    ("molten_salt", 1773.15, "300-1500 C, the usual molten-salt range (common practice)"),
    ("refractory", math.inf, "1500 C and above, ISO 836 refractoriness (from memory)"),
)

# Weights of the terms of melting_trend_index. The inorganic weights are a
# least-squares fit of ln T_m over the open training set (chemicals 1.5.2),
# rounded; the organic-ion weights were set by hand (few organic salts in open
# data) so that [C2mim][BF4], [C4mim][PF6] and [C4mim][NTf2] fall below 100 C.
TREND_WEIGHTS: dict[str, float] = {
    "intercept": 3.03,  # log10 K at the reference energy and chi with no other term
    "reference_energy_per_ion_kJ_mol": 381.0,  # NaCl: volume-based 762 kJ/mol over 2 ions
    "reference_contact_chi": 2.0,  # the fit's centring value (NaCl: (0.93 + 3.16) / 2 = 2.045)
    "cohesion_exponent": 0.58,
    "contact_chi": 0.17,
    "contact_index": 0.32,
    "pseudo_noble_gas": 0.10,
    "polyatomic_anion": 0.15,
    "ions_per_formula_unit": 0.15,
    "entropy_per_ion_J_mol_K": 12.5,  # NaCl: dS_fus 26 J/(mol K) over 2 ions (CRC Handbook, from memory)
    "flexibility": 0.5,
    "chain_melting_K": 414.6,  # polyethylene, the long-chain limit (Wunderlich 1980, from memory)
    "packing_free_torsions": 4.5,  # tau of a hexyl chain: longer chains pack
    "delocalised": 0.30,
}


# ------------------------------------------------------------------ equations


def dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(torsions_tau, symmetry_number=1.0):
    """Conformational and symmetry part of the entropy of fusion of one molecule or ion.

    ``dS = R ln Phi - R ln sigma`` with the flexibility number
    ``Phi = 2.435**tau``: the molecule-specific part of Dannenfelser and
    Yalkowsky's entropy of melting, ``dS_m = 56.5 - R ln sigma + R ln Phi``
    J/(mol K), without the constant 56.5 (the positional part, which this
    module counts per ion instead).

    Parameters
    ----------
    torsions_tau : float or array-like
        ``tau = SP3 + 0.5 SP2 + 0.5 RING - 1`` (at least 0): non-terminal,
        non-ring sp3 and sp2 heavy atoms and ring systems.
    symmetry_number : float or array-like, default=1.0
        Rotational symmetry number ``sigma`` (>= 1).

    Returns
    -------
    float or ndarray
        Entropy in J/(mol K).

    References
    ----------
    R. M. Dannenfelser and S. H. Yalkowsky, Ind. Eng. Chem. Res. 1996, 35,
    1483-1486, doi:10.1021/ie940581z (from memory).

    Examples
    --------
    n-butyl on an imidazolium ring (tau = 3 + 0.5 - 1 = 2.5), sigma = 1:

    >>> round(dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(2.5), 1)
    18.5
    >>> round(dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(0.0, 12), 1)
    -20.7
    """
    tau = np.asarray(torsions_tau, dtype=float)
    sigma = np.asarray(symmetry_number, dtype=float)
    value = GAS_CONSTANT_J_MOL_K * (np.maximum(tau, 0.0) * math.log(2.435) - np.log(np.maximum(sigma, 1.0)))
    return float(value) if value.ndim == 0 else value


def melting_trend_index(
    lattice_energy_per_ion_kJ_mol,
    contact_chi_pauling,
    contact_index,
    pseudo_noble_gas,
    polyatomic_anion_fraction,
    ions_per_formula_unit,
    flexibility_entropy_J_mol_K=0.0,
    chain_packing_entropy_J_mol_K=0.0,
    delocalised_fraction=0.0,
    *,
    weights=None,
):
    r"""The melting trend index: log10 of a trend temperature in K (dimensionless).

    Ionic part, a sum of logarithmic terms:

    .. math::

        I_\mathrm{ion} = c_0 + a \log_{10}(u/u_\mathrm{ref})
            - w_\chi (\bar\chi - \bar\chi_\mathrm{ref}) - w_f f - w_p p
            - w_a f_\mathrm{poly} - w_\nu \log_{10}(\nu/2) - w_d f_\mathrm{deloc}

    then the organic ions' entropy and chain packing, as ``T = dH / dS`` with
    the ionic part carrying ``dS_ion = nu s0`` and ``dH_ion = 10**I_ion dS_ion``:

    .. math::

        T = \frac{10^{I_\mathrm{ion}} \nu s_0 + T_\mathrm{PE}\, w_s S_\mathrm{pack}}
                 {\nu s_0 + w_s S_\mathrm{flex}}, \qquad I = \log_{10} T

    ``u`` lattice energy per ion, ``chi`` mean Pauling electronegativity of the
    atoms in contact, ``f`` Fajans contact index, ``p`` 1 for an 18 or 18+2
    electron cation, ``f_poly`` the share of anions that are polyatomic,
    ``nu`` ions per formula unit, ``f_deloc`` the share of ions whose charge
    is delocalised, ``s0`` the entropy of fusion per ion of a simple salt,
    ``S_flex`` the Dannenfelser-Yalkowsky conformational entropy of the organic
    ions per formula unit (:func:`dannenfelser_yalkowsky_flexibility_entropy_J_mol_K`)
    and ``S_pack`` the part of it from torsions beyond the sixth carbon of a
    chain, which pack like polyethylene and bring their own heat of fusion:
    long-chain salts (soaps) tend to the polyethylene melting point
    ``T_PE = 414.6 K`` (Wunderlich, Macromolecular Physics vol. 3, 1980; from
    memory) instead of melting ever lower. Weights: :data:`TREND_WEIGHTS`.

    Parameters
    ----------
    lattice_energy_per_ion_kJ_mol : float or array-like
        Lattice potential energy over ions per formula unit [kJ/mol].
    contact_chi_pauling : float or array-like
        Mean Pauling electronegativity of the cation-anion contact atoms.
    contact_index : float or array-like
        Fajans contact index (dimensionless); NaN counts as 0.
    pseudo_noble_gas : bool or array-like
        An 18 or 18+2 electron cation is present.
    polyatomic_anion_fraction : float or array-like
        Count share of polyatomic anions, 0 to 1.
    ions_per_formula_unit : float or array-like
        ``nu``.
    flexibility_entropy_J_mol_K : float or array-like, default=0.0
        ``S_flex``: sum over organic ions of count times their flexibility entropy [J/(mol K)].
    chain_packing_entropy_J_mol_K : float or array-like, default=0.0
        ``S_pack`` [J/(mol K)].
    delocalised_fraction : float or array-like, default=0.0
        Count share of ions with a resonance-delocalised charge, 0 to 1.
    weights : dict, optional
        Replaces entries of :data:`TREND_WEIGHTS` (sensitivity studies).

    Returns
    -------
    float or ndarray
        The index; ``10**I`` is the trend temperature in K.

    Notes
    -----
    The intercept and the inorganic weights come from the least-squares fit
    described in the module docstring, not from one reference salt: NaCl
    (u = 381 kJ/mol per ion from its volume-based 762 kJ/mol, contact chi
    2.045, contact index 0.131) lands at 2.98, a trend temperature of 955 K,
    against 1074 K measured (CRC Handbook, from memory).

    Examples
    --------
    >>> round(melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2), 3)
    2.98
    >>> round(float(10 ** melting_trend_index(380.9, 2.045, 0.131, False, 0.0, 2)))
    956
    """
    w = TREND_WEIGHTS if weights is None else {**TREND_WEIGHTS, **weights}
    u = np.asarray(lattice_energy_per_ion_kJ_mol, dtype=float)
    chi = np.asarray(contact_chi_pauling, dtype=float)
    kappa = np.nan_to_num(np.asarray(contact_index, dtype=float), nan=0.0)
    png = np.asarray(pseudo_noble_gas, dtype=float)
    poly = np.asarray(polyatomic_anion_fraction, dtype=float)
    nu = np.asarray(ions_per_formula_unit, dtype=float)
    flex = np.asarray(flexibility_entropy_J_mol_K, dtype=float)
    pack = np.asarray(chain_packing_entropy_J_mol_K, dtype=float)
    deloc = np.asarray(delocalised_fraction, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        ionic = (
            w["intercept"]
            + w["cohesion_exponent"] * np.log10(u / w["reference_energy_per_ion_kJ_mol"])
            - w["contact_chi"] * (chi - w["reference_contact_chi"])
            - w["contact_index"] * kappa
            - w["pseudo_noble_gas"] * png
            - w["polyatomic_anion"] * poly
            - w["ions_per_formula_unit"] * np.log10(nu / 2.0)
            - w["delocalised"] * deloc
        )
        s_ion = nu * w["entropy_per_ion_J_mol_K"]
        # symmetric rigid ions may lower the entropy, but never below half the ionic part
        s_total = np.maximum(s_ion + w["flexibility"] * flex, 0.5 * s_ion)
        h_total = np.power(10.0, ionic) * s_ion + w["chain_melting_K"] * w["flexibility"] * pack
        value = np.log10(h_total / s_total)
    return float(value) if value.ndim == 0 else value


def trend_temperature_K(index):
    """``10**index``: the index read back on the kelvin scale (for classes and people).

    >>> round(trend_temperature_K(3.0))
    1000
    """
    value = np.power(10.0, np.asarray(index, dtype=float))
    return float(value) if value.ndim == 0 else value


def melting_class_from_index(index) -> str | None:
    """The melting class of a trend index (thresholds in :data:`MELTING_CLASSES`).

    Parameters
    ----------
    index : float
        :func:`melting_trend_index`.

    Returns
    -------
    str or None
        ``ionic_liquid``, ``low_melting_salt``, ``molten_salt`` or
        ``refractory``; None for NaN.

    Examples
    --------
    >>> [melting_class_from_index(x) for x in (2.4, 2.6, 3.0, 3.4, float("nan"))]
    ['ionic_liquid', 'low_melting_salt', 'molten_salt', 'refractory', None]
    """
    if index is None or math.isnan(float(index)):
        return None
    temperature = trend_temperature_K(float(index))
    for name, upper, _ in MELTING_CLASSES:
        if temperature < upper:
            return name
    return MELTING_CLASSES[-1][0]


# --------------------------------------------------------------------- inputs


@cache
def _shape_table() -> dict[str, tuple[float, float, bool, str]]:
    text = resources.files("ionicity.scorer.data").joinpath("ion_shape.csv").read_text(encoding="utf-8")
    table = {}
    for row in csv.DictReader(text.splitlines()):
        table[row["ion_id"]] = (
            float(row["torsions_tau"]),
            float(row["symmetry_number"]),
            row["charge_delocalised"].strip().lower() == "true",
            row["source"],
        )
    return table


def ion_shape(ion: Ion) -> tuple[float, float, bool, str]:
    """(tau, sigma, charge delocalised, basis) of an ion.

    Tabulated ions come from ``scorer/data/ion_shape.csv``. An organic ion
    missing there gets an estimate from its composition: every carbon, nitrogen,
    oxygen, sulfur or phosphorus atom beyond the fifth counted as half a
    torsion, sigma 1, charge localised (common practice, said in the basis).
    Inorganic ions not in the table are rigid: tau 0, sigma 1.

    >>> from scorer.ion_library import get_ion
    >>> ion_shape(get_ion("[C4mim](+)"))[:3]
    (2.5, 1.0, True)
    """
    table = _shape_table()
    if ion.ion_id in table:
        tau, sigma, deloc, _ = table[ion.ion_id]
        return tau, sigma, deloc, "scorer/data/ion_shape.csv"
    if ion.organic:
        heavy = sum(n for s, n in ion.composition if s in ("C", "N", "O", "S", "P"))
        return max(0.0, (heavy - 5) * 0.5), 1.0, False, "estimated from the composition (no ion_shape.csv entry)"
    return 0.0, 1.0, False, "rigid inorganic ion"


@dataclass(frozen=True)
class MeltingTerms:
    """The inputs of :func:`melting_trend_index` for one compound, with their origins."""

    lattice_energy_kJ_mol: float
    lattice_energy_basis: str
    ions_per_formula_unit: float
    contact_chi_pauling: float
    contact_index: float
    pseudo_noble_gas: bool
    polyatomic_anion_fraction: float
    flexibility_entropy_J_mol_K: float
    chain_packing_entropy_J_mol_K: float
    delocalised_fraction: float
    organic: bool
    notes: tuple[str, ...] = ()

    @property
    def lattice_energy_per_ion_kJ_mol(self) -> float:
        return self.lattice_energy_kJ_mol / self.ions_per_formula_unit

    def index(self) -> float:
        return melting_trend_index(
            self.lattice_energy_per_ion_kJ_mol, self.contact_chi_pauling, self.contact_index,
            self.pseudo_noble_gas, self.polyatomic_anion_fraction, self.ions_per_formula_unit,
            self.flexibility_entropy_J_mol_K, self.chain_packing_entropy_J_mol_K, self.delocalised_fraction,
        )


def _contact_chi(dec: Decomposition) -> float:
    from ionicity.scorer.character import contact_atom, contact_pairs, pauling_electronegativity, weighted_mean

    values = []
    for cation, anion, weight in contact_pairs(dec):
        c_atom, _ = contact_atom(cation.ion)
        a_atom, _ = contact_atom(anion.ion)
        if c_atom is None or a_atom is None:
            continue
        values.append(((pauling_electronegativity(c_atom) + pauling_electronegativity(a_atom)) / 2.0, weight))
    return weighted_mean(values)


@lru_cache(maxsize=16384)
def melting_terms(dec: Decomposition) -> MeltingTerms | None:
    """Gather the index inputs of an ionic decomposition; None when it is not ionic.

    Lattice energy: the Glasser-Jenkins volume-based estimate of
    :mod:`scorer.lattice`, else its Kapustinskii estimate. Covalency: the
    contact electronegativities of :mod:`scorer.character` and the Fajans
    contact index and 18/18+2-electron flag of :mod:`scorer.fajans`.
    """
    if not dec.is_ionic:
        return None
    from ionicity.scorer import fajans, lattice

    notes: list[str] = []
    lat, _ = lattice.describe(dec)
    energy = lat.get("lattice_energy_vbt_kJ_mol", math.nan)
    basis = "Glasser-Jenkins volume-based lattice energy"
    if energy is None or not math.isfinite(energy):
        energy = lat.get("lattice_energy_kapustinskii_kJ_mol", math.nan)
        basis = "Kapustinskii lattice energy (no formula-unit volume for the volume-based one)"
    if energy is None or not math.isfinite(energy):
        energy, basis = math.nan, "none"
    faj, _ = fajans.describe(dec)
    contact_index = faj.get("fajans_contact_index", math.nan)
    if contact_index is None or not math.isfinite(contact_index):
        contact_index = math.nan
        notes.append("melting trend: no Fajans contact index, its covalency term left out")
    png = bool(faj.get("cation_pseudo_noble_gas") or False)
    chi = _contact_chi(dec)
    if not math.isfinite(chi):
        notes.append("melting trend: no Pauling electronegativity for a contact atom, covalency term at the reference")
        chi = TREND_WEIGHTS["reference_contact_chi"]
    terms = dec.cations + dec.anions
    nu = float(sum(t.count for t in terms))
    anion_total = sum(t.count for t in dec.anions)
    poly = sum(t.count for t in dec.anions if not t.ion.monatomic) / anion_total if anion_total else 0.0
    flex = 0.0
    pack = 0.0
    deloc = 0.0
    free = TREND_WEIGHTS["packing_free_torsions"]
    for t in terms:
        tau, sigma, delocalised, _ = ion_shape(t.ion)
        if t.ion.organic or t.ion.ion_id in _shape_table():
            flex += t.count * dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(tau, sigma)
            pack += t.count * dannenfelser_yalkowsky_flexibility_entropy_J_mol_K(max(tau - free, 0.0))
        if delocalised:
            deloc += t.count
    return MeltingTerms(
        lattice_energy_kJ_mol=float(energy),
        lattice_energy_basis=basis,
        ions_per_formula_unit=nu,
        contact_chi_pauling=float(chi),
        contact_index=float(contact_index),
        pseudo_noble_gas=png,
        polyatomic_anion_fraction=float(poly),
        flexibility_entropy_J_mol_K=float(flex),
        chain_packing_entropy_J_mol_K=float(pack),
        delocalised_fraction=float(deloc / nu) if nu else 0.0,
        organic=any(t.ion.organic for t in terms),
        notes=tuple(notes),
    )


# ------------------------------------------------------------ module protocol

_SOURCE_INDEX = (
    "defined here (scorer.melting.melting_trend_index): lattice energy per ion (Glasser-Jenkins VBT or"
    " Kapustinskii), Fajans covalency, Dannenfelser & Yalkowsky, Ind. Eng. Chem. Res. 1996, 35, 1483 (flexibility);"
    " weights fitted to open melting points (chemicals 1.5.2) and rounded"
)

COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_trend_index", "float64", "dimensionless (log10 K scale)",
        "melting trend index: higher means a higher expected melting point; reads as log10 of a trend"
        " temperature in K (a step of 0.1 is about 26 %), a ranking aid with a typical scatter of a factor 1.5,"
        " not a prediction; anhydrous salt; "
        + CAUTION,
        "melting_trend_index: lattice energy per ion, contact electronegativity, Fajans contact index,"
        " 18/18+2-electron cation, polyatomic-anion share, ions per formula unit, organic-ion flexibility"
        " and symmetry (Dannenfelser-Yalkowsky), chain packing, charge delocalisation",
        _SOURCE_INDEX,
        "several ions: lattice energy of the whole formula unit over its ion count; contact terms averaged over"
        " cation-anion pairs weighted by the product of stoichiometric fractions; entropy terms summed over ions",
    ),
    Column(
        "melting_class", "string", "",
        "ionic_liquid (trend below 100 C, the trade's definition), low_melting_salt (100-300 C), molten_salt"
        " (300-1500 C) or refractory (1500 C and above); from mp_trend_index, so as rough as it; " + CAUTION,
        "melting_class_from_index: thresholds on 10**mp_trend_index in K",
        "ionic liquid: Wasserscheid & Welton, Ionic Liquids in Synthesis, 2008 (from memory); refractory: ISO 836"
        " (from memory); low-melting and molten-salt bounds common practice",
    ),
)

MODEL_COLUMNS: tuple[Column, ...] = (
    Column(
        "mp_predicted_K", "float64", "K",
        "melting point predicted by the model given with --mp-model (ionicity fit-melting); " + CAUTION,
        "gradient-boosted trees on log melting point over ionicity's own columns (MODEL_FEATURES)",
        "the model file's training data; see its metadata",
    ),
    Column(
        "mp_interval_low_K", "float64", "K",
        "lower end of the split-conformal prediction interval (coverage in the model file, 90 % by default)",
        "prediction / exp(q), q the conformal quantile of absolute log residuals on calibration rows",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
    Column(
        "mp_interval_high_K", "float64", "K",
        "upper end of the split-conformal prediction interval",
        "prediction * exp(q)",
        "Lei et al., J. Am. Stat. Assoc. 2018, 113, 1094, doi:10.1080/01621459.2017.1307116",
    ),
)


def _nan_values() -> dict[str, object]:
    return {"mp_trend_index": math.nan, "melting_class": None}


def _why_not(dec: Decomposition) -> str | None:
    if not dec.is_ionic:
        return None  # covalent, metallic, elements: the index does not apply, no note needed
    if dec.substance_class == "acid":
        return "melting trend: not estimated for an acid (a molecular substance, not an ionic crystal)"
    if dec.substance_class == "ion":
        return "melting trend: a lone ion has no melting point"
    return None


def describe(dec: Decomposition) -> tuple[dict[str, object], list[str]]:
    """``mp_trend_index`` and ``melting_class`` for one compound, and notes.

    Never raises: odd input gives NaN/None and a note.

    Examples
    --------
    >>> from scorer.formula import parse_formula
    >>> from scorer.ions import decompose
    >>> values, notes = describe(decompose(parse_formula("[C2mim][BF4]")))
    >>> values["melting_class"]
    'ionic_liquid'
    >>> describe(decompose(parse_formula("MgO")))[0]["melting_class"]
    'refractory'
    """
    try:
        values = _nan_values()
        reason = _why_not(dec)
        if reason is not None:
            return values, [reason]
        terms = melting_terms(dec)
        if terms is None:
            return values, []
        notes = list(terms.notes)
        if not math.isfinite(terms.lattice_energy_kJ_mol):
            return values, notes + ["melting trend: no lattice energy for this salt (see the lattice-energy notes)"]
        index = terms.index()
        if not math.isfinite(index):
            return values, notes + ["melting trend: the index could not be formed from these inputs"]
        values["mp_trend_index"] = round(float(index), 4)
        values["melting_class"] = melting_class_from_index(index)
        if dec.hydrate_water:
            notes.append("melting trend of the anhydrous salt: a hydrate melts in its own water of crystallisation,"
                         " usually far lower")
        for t in dec.cations + dec.anions:
            if t.ion.organic and t.ion.ion_id not in _shape_table():
                notes.append(f"melting trend: flexibility of {t.ion.ion_id} estimated from its composition")
        return values, notes
    except Exception as exc:  # noqa: BLE001 - the protocol promises no exceptions
        return _nan_values(), [f"melting trend not computed: {type(exc).__name__}: {exc}"]


def _fmt(value: float, digits: int = 3) -> str:
    return "nan" if value is None or not math.isfinite(value) else f"{value:.{digits}f}"


def explain(dec: Decomposition) -> list[str]:
    """Lines for ``ionicity explain``: the index, its class and every term with its input."""
    reason = _why_not(dec)
    if reason is not None:
        return [reason]
    try:
        terms = melting_terms(dec)
    except Exception as exc:  # noqa: BLE001
        return [f"melting trend not computed: {type(exc).__name__}: {exc}"]
    if terms is None:
        return ["melting trend: not an ionic compound"]
    if not math.isfinite(terms.lattice_energy_kJ_mol):
        return ["melting trend: no lattice energy for this salt (see the lattice-energy notes)"]
    w = TREND_WEIGHTS
    index = terms.index()
    u = terms.lattice_energy_per_ion_kJ_mol
    kappa = 0.0 if not math.isfinite(terms.contact_index) else terms.contact_index
    lines = [
        f"mp_trend_index = {_fmt(index)} (trend temperature {trend_temperature_K(index):.0f} K; a ranking aid,"
        " typical scatter a factor 1.5)",
        f"melting_class = {melting_class_from_index(index)} (thresholds on the trend temperature:"
        + ", ".join(f" {name} < {upper:g} K" for name, upper, _ in MELTING_CLASSES[:-1]) + ")",
        "  T = (10**I_ion * nu*s0 + T_PE*w_s*S_pack) / (nu*s0 + w_s*S_flex), I = log10 T (melting_trend_index)",
        f"  cohesion: {w['cohesion_exponent']} * log10(u / {w['reference_energy_per_ion_kJ_mol']:g}) with"
        f" u = {terms.lattice_energy_kJ_mol:.0f} kJ/mol / {terms.ions_per_formula_unit:g} ions = {u:.0f} kJ/mol"
        f" ({terms.lattice_energy_basis})",
        f"  covalency: -{w['contact_chi']} * (contact chi {terms.contact_chi_pauling:.3f} - {w['reference_contact_chi']})"
        f", -{w['contact_index']} * Fajans contact index {kappa:.3f}"
        f", -{w['pseudo_noble_gas']} * 18/18+2-electron cation ({'yes' if terms.pseudo_noble_gas else 'no'})",
        f"  entropy: -{w['polyatomic_anion']} * polyatomic-anion share {terms.polyatomic_anion_fraction:.2f}"
        f", -{w['ions_per_formula_unit']} * log10(nu/2), nu = {terms.ions_per_formula_unit:g}",
        f"  organic ions: S_flex = {terms.flexibility_entropy_J_mol_K:.1f} J/(mol K), S_pack ="
        f" {terms.chain_packing_entropy_J_mol_K:.1f} J/(mol K) (Dannenfelser-Yalkowsky, w_s = {w['flexibility']},"
        f" s0 = {w['entropy_per_ion_J_mol_K']} J/(mol K) per ion, T_PE = {w['chain_melting_K']} K)",
        f"  charge delocalisation: -{w['delocalised']} * share of delocalised ions {terms.delocalised_fraction:.2f}",
        "  caution: " + CAUTION,
    ]
    lines += [f"  note: {n}" for n in terms.notes]
    if dec.hydrate_water:
        lines.append("  note: index of the anhydrous salt; a hydrate melts in its own water, usually far lower")
    return lines


# ------------------------------------------------------- applying a fitted model

# Numeric output columns the regression reads, and a few counts derived from
# the cations/anions columns; every one is a column of the scored record or a
# function of one, so a model applies to any scored table.
_RECORD_FEATURES = (
    "mp_trend_index",
    "lattice_energy_vbt_kJ_mol",
    "lattice_energy_kapustinskii_kJ_mol",
    "delta_chi_pauling",
    "ionic_character_pauling_pct",
    "mean_chi_pauling",
    "cation_polarising_power_e_per_A2",
    "cation_polarising_power_max_e_per_A2",
    "anion_polarisability_A3",
    "fajans_contact_index",
    "cation_pseudo_noble_gas",
    "hsab_pairing_score",
    "cation_hardness_eV",
    "anion_hardness_eV",
    "molar_mass_g_mol",
)
_DERIVED_FEATURES = (
    "ions_per_formula_unit",
    "max_cation_charge",
    "max_anion_charge",
    "polyatomic_anion_fraction",
    "organic_ion_fraction",
)
MODEL_FEATURES: tuple[str, ...] = _RECORD_FEATURES + _DERIVED_FEATURES

MODEL_FORMAT = "ionicity-melting-model"
MODEL_FORMAT_VERSION = 1
MODEL_TYPES = ("gradient_boosted_trees",)
_TOP_KEYS = frozenset({
    "format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain",
    "training", "metrics", "caution",
})
_REQUIRED_KEYS = frozenset({"format", "format_version", "model_type", "target", "features", "baseline", "trees", "interval", "domain"})
_TREE_KEYS = frozenset({"feature", "threshold", "left", "right", "missing_left", "leaf", "value"})
_MAX_TREES = 5000
_MAX_NODES = 100_000
_TERM = re.compile(r"^(.*)\((\d*)([+-])\)\*([0-9.eE+-]+)$")


def _parse_terms(text) -> list[tuple[str, int, float]]:
    """(ion id, signed charge, count) from a ``cations``/``anions`` cell."""
    out = []
    if not isinstance(text, str) or not text:
        return out
    for part in text.split(";"):
        match = _TERM.match(part.strip())
        if not match:
            continue
        label, magnitude, sign, count = match.groups()
        charge = int(magnitude or 1) * (1 if sign == "+" else -1)
        out.append((label, charge, float(count)))
    return out


def _is_monatomic_label(label: str) -> bool:
    from ionicity.scorer.elements import is_element_symbol

    return is_element_symbol(label)


def model_features_from_record(record: dict) -> np.ndarray:
    """The :data:`MODEL_FEATURES` vector of one scored record (NaN where missing).

    Parameters
    ----------
    record : dict
        A record of :func:`scorer.score_formula` (or a table row with the same columns).

    Returns
    -------
    ndarray of shape (len(MODEL_FEATURES),)

    Examples
    --------
    >>> x = model_features_from_record({"cations": "Al(3+)*2", "anions": "SO4(2-)*3", "molar_mass_g_mol": 342.1})
    >>> named = dict(zip(MODEL_FEATURES, x.tolist()))
    >>> named["ions_per_formula_unit"], named["max_cation_charge"], named["polyatomic_anion_fraction"]
    (5.0, 3.0, 1.0)
    """
    values = []
    for name in _RECORD_FEATURES:
        value = record.get(name)
        try:
            value = float(value) if value is not None else math.nan
        except (TypeError, ValueError):
            value = math.nan
        values.append(value)
    cations = _parse_terms(record.get("cations"))
    anions = _parse_terms(record.get("anions"))
    if cations and anions:
        nu = sum(n for _, _, n in cations + anions)
        total_anions = sum(n for _, _, n in anions)
        poly = sum(n for label, _, n in anions if not _is_monatomic_label(label)) / total_anions
        organic = sum(n for label, _, n in cations + anions if label.startswith("[")) / nu
        values += [nu, float(max(q for _, q, _ in cations)), float(max(-q for _, q, _ in anions)), poly, organic]
    else:
        values += [math.nan] * len(_DERIVED_FEATURES)
    return np.array(values, dtype=float)


class ModelFormatError(ValueError):
    """A melting-model document that is not one :func:`model_from_dict` accepts."""


@dataclass(frozen=True)
class MeltingModel:
    """A fitted melting-point model, as plain arrays (see :func:`model_from_dict`)."""

    features: tuple[str, ...]
    baseline: float
    trees: tuple[tuple[np.ndarray, ...], ...]  # (feature, threshold, left, right, missing_left, leaf, value)
    interval_log_halfwidth: float
    interval_coverage: float
    feature_min: np.ndarray
    feature_max: np.ndarray
    substance_classes: tuple[str, ...]
    document: dict

    @property
    def feature_indices(self) -> np.ndarray:
        position = {name: i for i, name in enumerate(MODEL_FEATURES)}
        return np.array([position[name] for name in self.features], dtype=int)


def _need(condition: bool, message: str) -> None:
    if not condition:
        raise ModelFormatError(message)


def _number_list(value, name: str, *, integer: bool = False, length: int | None = None) -> np.ndarray:
    _need(isinstance(value, list), f"'{name}' must be a list of numbers")
    _need(length is None or len(value) == length, f"'{name}' must have {length} entries, not {len(value)}")
    for item in value:
        _need(isinstance(item, (int, float)) and not isinstance(item, bool),
              f"'{name}' must hold only numbers (found {type(item).__name__})")
        _need(math.isfinite(item), f"'{name}' must hold only finite numbers")
        _need(not integer or float(item) == int(item), f"'{name}' must hold only whole numbers")
    return np.array(value, dtype=np.int64 if integer else float)


def _plain_json(value, depth: int = 0) -> bool:
    if depth > 6:
        return False
    if value is None or isinstance(value, (bool, int, float, str)):
        return True
    if isinstance(value, list):
        return all(_plain_json(v, depth + 1) for v in value)
    if isinstance(value, dict):
        return all(isinstance(k, str) and _plain_json(v, depth + 1) for k, v in value.items())
    return False


def model_from_dict(document) -> MeltingModel:
    """Check a parsed model document against the expected schema and build the model.

    Anything but the expected layout is refused with :class:`ModelFormatError`:
    an unknown ``format`` or ``model_type``, unknown keys, a feature ionicity
    does not compute, non-numeric or non-finite arrays, child indices that do
    not point forward inside the tree (so a tree cannot loop). The document is
    plain JSON data; nothing in it is executed.

    Parameters
    ----------
    document : dict
        ``json.load`` of a file written by ``ionicity fit-melting``.

    Returns
    -------
    MeltingModel

    Raises
    ------
    ModelFormatError
        With a message that names the offending part.

    Examples
    --------
    >>> model_from_dict({"format": "something-else"})
    Traceback (most recent call last):
    ...
    ionicity.scorer.melting.ModelFormatError: not an ionicity melting model: 'format' is 'something-else', expected 'ionicity-melting-model'
    """
    _need(isinstance(document, dict), "a melting model must be a JSON object")
    fmt = document.get("format")
    _need(fmt == MODEL_FORMAT, f"not an ionicity melting model: 'format' is {fmt!r}, expected {MODEL_FORMAT!r}")
    _need(document.get("format_version") == MODEL_FORMAT_VERSION,
          f"unsupported format_version {document.get('format_version')!r}; this ionicity reads {MODEL_FORMAT_VERSION}")
    model_type = document.get("model_type")
    _need(model_type in MODEL_TYPES, f"model_type {model_type!r} is not accepted; allowed: {', '.join(MODEL_TYPES)}")
    unknown = sorted(set(document) - _TOP_KEYS)
    _need(not unknown, f"unexpected keys in the model: {unknown}")
    missing = sorted(_REQUIRED_KEYS - set(document))
    _need(not missing, f"missing keys in the model: {missing}")
    _need(document["target"] == "ln_mp_K", f"target {document['target']!r} is not accepted; allowed: ln_mp_K")
    features = document["features"]
    _need(isinstance(features, list) and features and all(isinstance(f, str) for f in features),
          "'features' must be a non-empty list of column names")
    strange = [f for f in features if f not in MODEL_FEATURES]
    _need(not strange, f"features ionicity does not compute: {strange}; allowed: {', '.join(MODEL_FEATURES)}")
    _need(len(set(features)) == len(features), "'features' lists a column twice")
    baseline = document["baseline"]
    _need(isinstance(baseline, (int, float)) and not isinstance(baseline, bool) and math.isfinite(baseline),
          "'baseline' must be a finite number")
    trees_in = document["trees"]
    _need(isinstance(trees_in, list) and 0 < len(trees_in) <= _MAX_TREES, f"'trees' must be a list of 1 to {_MAX_TREES} trees")
    trees = []
    n_features = len(features)
    for k, tree in enumerate(trees_in):
        _need(isinstance(tree, dict) and set(tree) == _TREE_KEYS,
              f"tree {k} must have exactly the keys {sorted(_TREE_KEYS)}")
        n = len(tree["value"]) if isinstance(tree["value"], list) else 0
        _need(0 < n <= _MAX_NODES, f"tree {k}: between 1 and {_MAX_NODES} nodes expected")
        feature = _number_list(tree["feature"], f"trees[{k}].feature", integer=True, length=n)
        threshold = _number_list(tree["threshold"], f"trees[{k}].threshold", length=n)
        left = _number_list(tree["left"], f"trees[{k}].left", integer=True, length=n)
        right = _number_list(tree["right"], f"trees[{k}].right", integer=True, length=n)
        missing_left = _number_list(tree["missing_left"], f"trees[{k}].missing_left", integer=True, length=n)
        leaf = _number_list(tree["leaf"], f"trees[{k}].leaf", integer=True, length=n)
        value = _number_list(tree["value"], f"trees[{k}].value", length=n)
        inner = leaf == 0
        nodes = np.arange(n)
        _need(bool(np.all(np.isin(leaf, (0, 1))) and np.all(np.isin(missing_left, (0, 1)))),
              f"tree {k}: 'leaf' and 'missing_left' must be 0 or 1")
        _need(bool(np.all((feature[inner] >= 0) & (feature[inner] < n_features))),
              f"tree {k}: a split names a feature outside 0..{n_features - 1}")
        _need(bool(np.all((left[inner] > nodes[inner]) & (left[inner] < n) & (right[inner] > nodes[inner]) & (right[inner] < n))),
              f"tree {k}: child indices must point forward inside the tree")
        trees.append((feature, threshold, left, right, missing_left.astype(bool), leaf.astype(bool), value))
    interval = document["interval"]
    _need(isinstance(interval, dict), "'interval' must be an object")
    halfwidth = interval.get("log_halfwidth")
    coverage = interval.get("coverage", 0.9)
    _need(isinstance(halfwidth, (int, float)) and not isinstance(halfwidth, bool) and math.isfinite(halfwidth)
          and halfwidth >= 0, "'interval.log_halfwidth' must be a finite number >= 0")
    _need(isinstance(coverage, (int, float)) and 0 < coverage < 1, "'interval.coverage' must lie between 0 and 1")
    domain = document["domain"]
    _need(isinstance(domain, dict), "'domain' must be an object")
    fmin = _number_list(domain.get("feature_min"), "domain.feature_min", length=n_features)
    fmax = _number_list(domain.get("feature_max"), "domain.feature_max", length=n_features)
    classes = domain.get("substance_classes", [])
    _need(isinstance(classes, list) and all(isinstance(c, str) for c in classes),
          "'domain.substance_classes' must be a list of strings")
    for key in ("training", "metrics"):
        _need(_plain_json(document.get(key, {})), f"'{key}' must hold plain JSON values only")
    return MeltingModel(
        features=tuple(features),
        baseline=float(baseline),
        trees=tuple(trees),
        interval_log_halfwidth=float(halfwidth),
        interval_coverage=float(coverage),
        feature_min=fmin,
        feature_max=fmax,
        substance_classes=tuple(classes),
        document=document,
    )


def model_to_dict(model: MeltingModel) -> dict:
    """The JSON document of a model (the inverse of :func:`model_from_dict`)."""
    return model.document


def _predict_ln(model: MeltingModel, x: np.ndarray) -> np.ndarray:
    """Sum of tree outputs plus baseline for rows of ``x`` (columns in ``model.features`` order)."""
    n = x.shape[0]
    total = np.full(n, model.baseline, dtype=float)
    rows = np.arange(n)
    for feature, threshold, left, right, missing_left, leaf, value in model.trees:
        node = np.zeros(n, dtype=np.int64)
        # children point forward, so depth <= node count; the loop ends
        for _ in range(len(value)):
            active = ~leaf[node]
            if not active.any():
                break
            f = feature[node]
            v = x[rows, np.where(active, f, 0)]
            go_left = np.where(np.isnan(v), missing_left[node], v <= threshold[node])
            node = np.where(active, np.where(go_left, left[node], right[node]), node)
        total += value[node]
    return total


def predict_melting_K(model: MeltingModel, features) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Predicted melting point and its conformal interval, in K.

    Parameters
    ----------
    model : MeltingModel
    features : array-like of shape (n_samples, len(MODEL_FEATURES))
        Rows of :func:`model_features_from_record`.

    Returns
    -------
    (prediction, low, high) : three ndarrays of shape (n_samples,)
        NaN where the row has no ions at all (every derived feature NaN).
    """
    x_all = np.atleast_2d(np.asarray(features, dtype=float))
    x = x_all[:, model.feature_indices]
    ln_pred = _predict_ln(model, x)
    unusable = np.all(np.isnan(x_all[:, len(_RECORD_FEATURES):]), axis=1)
    ln_pred[unusable] = np.nan
    q = model.interval_log_halfwidth
    return np.exp(ln_pred), np.exp(ln_pred - q), np.exp(ln_pred + q)


def outside_training_domain(model: MeltingModel, features, substance_class: str | None = None) -> list[str]:
    """Why one row lies outside the model's training domain (empty when inside).

    A feature beyond the training range by more than 10 % of that range, or a
    substance class the training set did not hold, counts as outside.
    """
    x = np.asarray(features, dtype=float)[model.feature_indices]
    reasons = []
    span = np.maximum(model.feature_max - model.feature_min, 1e-12)
    for name, value, lo, hi, width in zip(model.features, x, model.feature_min, model.feature_max, span):
        if math.isnan(value):
            continue
        if value < lo - 0.1 * width or value > hi + 0.1 * width:
            reasons.append(f"{name} = {value:.3g} outside the training range {lo:.3g} to {hi:.3g}")
    if substance_class and model.substance_classes and substance_class not in model.substance_classes:
        reasons.append(f"substance class {substance_class} not in the training set")
    return reasons
