"""Ion descriptors of the melting regression that matter for ionic liquids.

The melting points of organic-cation salts follow the size, shape and
flexibility of their ions more than the lattice energy: large and asymmetric
ions, long flexible chains, low cation symmetry and a delocalised anion charge
lower the melting point; hydrogen-bond donors on the cation (protic salts)
raise it (Krossing, Slattery, Daguenet, Dyson, Oleinikova & Weingaertner,
J. Am. Chem. Soc. 2006, 128, 13427, doi:10.1021/ja0619612, volume-based
thermodynamics of ionic-liquid melting; Dannenfelser & Yalkowsky, Ind. Eng.
Chem. Res. 1996, 35, 1483, symmetry and flexibility of melting entropy; both
from memory). :func:`ionic_liquid_descriptors` reads them from the
decomposition and the ion tables the trend index already uses
(``scorer/data/ion_volumes.csv`` through :func:`scorer.radii.ion_volume_nm3`,
``scorer/data/ion_shape.csv`` through :func:`scorer.melting.ion_shape`).
Every value is a count-weighted mean over the cations or the anions of one
formula unit, so a formula with one cation and one anion gets that ion's value.
"""
from __future__ import annotations

import math

from ionicity.scorer.melting import ion_shape
from ionicity.scorer.melting_model_format import ION_FEATURES  # the names, in order, owned by the model layout
from ionicity.scorer.model import Decomposition, Ion
from ionicity.scorer.radii import ion_volume_nm3

__all__ = ["ION_FEATURES", "HBOND_DONOR_FAMILIES", "ionic_liquid_descriptors", "is_hbond_donor_cation"]


#: cation families whose ions carry N-H or O-H hydrogen-bond donors (protic salts;
#: cholinium through its OH group; the ammonium-like inorganic ions NH4+, H3O+,
#: N2H5+, NH3OH+ and, weakly, PH4+): common practice
HBOND_DONOR_FAMILIES = frozenset({"ammonium-protic", "amidinium", "cholinium", "ammonium-like"})


def is_hbond_donor_cation(ion: Ion) -> bool:
    """True when a cation carries an N-H or O-H donor (a protic salt's cation).

    By family (:data:`HBOND_DONOR_FAMILIES`), or an ion the library names
    protic (1-methylimidazolium, ``[HC1im]``).

    >>> from ionicity.scorer.ion_library import get_ion
    >>> is_hbond_donor_cation(get_ion("[EtNH3](+)")), is_hbond_donor_cation(get_ion("[C4mim](+)"))
    (True, False)
    >>> is_hbond_donor_cation(get_ion("[HC1im](+)"))
    True
    """
    return ion.family in HBOND_DONOR_FAMILIES or "protic" in ion.name


def _mean(terms, value) -> float:
    total = sum(t.count for t in terms)
    return float(sum(t.count * value(t.ion) for t in terms) / total)


def ionic_liquid_descriptors(dec: Decomposition | None) -> tuple[float, ...]:
    """The :data:`ION_FEATURES` of one compound (all NaN without a cation and an anion).

    ``cation_volume_nm3``, ``anion_volume_nm3``: ion volumes [nm^3]
    (Jenkins-Glasser table, else Hofmann atomic volumes);
    ``cation_anion_volume_ratio``: their ratio, the size asymmetry;
    ``cation_torsions_tau``, ``anion_torsions_tau``: the Dannenfelser-Yalkowsky
    torsion count tau (chain length and flexibility: rotatable bonds);
    ``cation_symmetry_number``: the rotational symmetry number sigma (branching
    and symmetry: [N4444]+ 12, [C4mim]+ 1); ``cation_charge_delocalised``,
    ``anion_charge_delocalised``: share of ions whose charge is spread over
    a conjugated system (imidazolium, [NTf2]-); ``cation_hbond_donor``: share
    of cations with an N-H or O-H donor (:func:`is_hbond_donor_cation`);
    ``cation_carbon_atoms``: carbon atoms per cation (alkyl chain length).

    Parameters
    ----------
    dec : Decomposition or None
        :func:`scorer.ions.decompose` of the parsed formula.

    Returns
    -------
    tuple of float
        One value per name of :data:`ION_FEATURES`.

    Examples
    --------
    [C4mim][BF4]: [C4mim]+ is 0.196 nm^3 (Slattery, Daguenet, Dyson, Schubert
    & Krossing, Angew. Chem. Int. Ed. 2007, 46, 5384) and BF4- 0.073 nm^3
    (Jenkins, Roobottom, Passmore & Glasser, Inorg. Chem. 1999, 38, 3609), both
    from memory as tabulated in ``scorer/data/ion_volumes.csv``; the ratio is
    0.196 / 0.073 = 2.685; tau 2.5 and sigma 1 are the counts of
    ``scorer/data/ion_shape.csv`` (C4 chain: 3 chain torsions less half for the
    ring end, Dannenfelser & Yalkowsky 1996); C8H15N2+ has 8 carbon atoms.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> x = dict(zip(ION_FEATURES, ionic_liquid_descriptors(decompose(parse_formula("[C4mim][BF4]")))))
    >>> x["cation_volume_nm3"], x["anion_volume_nm3"], round(x["cation_anion_volume_ratio"], 3)
    (0.196, 0.073, 2.685)
    >>> x["cation_torsions_tau"], x["cation_symmetry_number"], x["anion_charge_delocalised"]
    (2.5, 1.0, 0.0)
    >>> x["cation_charge_delocalised"], x["cation_hbond_donor"], x["cation_carbon_atoms"]
    (1.0, 0.0, 8.0)
    >>> all(math.isnan(v) for v in ionic_liquid_descriptors(None))
    True
    """
    if dec is None or not dec.cations or not dec.anions:
        return (math.nan,) * len(ION_FEATURES)
    v_cation = _mean(dec.cations, lambda ion: ion_volume_nm3(ion)[0])
    v_anion = _mean(dec.anions, lambda ion: ion_volume_nm3(ion)[0])
    ratio = v_cation / v_anion if v_anion > 0 else math.nan
    return (
        v_cation,
        v_anion,
        ratio,
        _mean(dec.cations, lambda ion: ion_shape(ion)[0]),
        _mean(dec.anions, lambda ion: ion_shape(ion)[0]),
        _mean(dec.cations, lambda ion: ion_shape(ion)[1]),
        _mean(dec.cations, lambda ion: float(ion_shape(ion)[2])),
        _mean(dec.anions, lambda ion: float(ion_shape(ion)[2])),
        _mean(dec.cations, lambda ion: float(is_hbond_donor_cation(ion))),
        _mean(dec.cations, lambda ion: float(dict(ion.composition).get("C", 0.0))),
    )
