"""Which salts may train the melting model: the consensus of sources, the name check, the salt screen.

The rules ``ionicity fit-melting`` applies to every candidate before it joins
the training set (:mod:`pipelines.melting_data` applies them and logs each
decision): :func:`consensus_melting_point_K` settles disagreeing sources,
:func:`name_agrees_with_ions` checks a compound's name against the ions its
formula was read as, :func:`screen_salt` keeps anhydrous, charge-balanced,
simple salts, and :func:`anion_family` / :func:`cation_element` give the
groups of the cross-validation. Pure functions of a
:class:`scorer.model.Decomposition` and text; nothing here reads files.
"""
from __future__ import annotations

import math
import re

import numpy as np

from ionicity.pipelines.melting_cli import TOLERANCE_K
from ionicity.scorer.bond_class_rules import keeps_formal_salt_reading
from ionicity.scorer.elements import get_element, is_metal
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.lattice import whole_unit_factor
from ionicity.scorer.melting import formal_salt_reading

__all__ = [
    "consensus_melting_point_K",
    "target_flags",
    "name_agrees_with_ions",
    "screen_salt",
    "melts_as_hydroxide",
    "anion_family",
    "cation_element",
]


# ----------------------------------------------------------------- consensus


def consensus_melting_point_K(values: dict[str, float], tolerance_K: float = TOLERANCE_K) -> tuple[float, str]:
    """One melting point from several sources, or NaN when they disagree.

    Rule (defined here): values within ``tolerance_K`` of each other form a
    cluster. If every value lies within the tolerance of the median, the
    median is kept (``agree``). Otherwise the largest cluster is kept when it
    holds more than half of the sources (``consensus``); else the entry is
    dropped (``disagree``). One source alone is kept (``single``).

    Parameters
    ----------
    values : dict of str to float
        Melting point in K per source name; NaN values are ignored.
    tolerance_K : float, default=20.0
        Largest spread, in K, that counts as agreement (the issue's "about 20 K").

    Returns
    -------
    (float, str)
        The melting point in K (NaN when dropped) and a decision text naming
        the rule and the sources.

    Examples
    --------
    >>> consensus_melting_point_K({"a": 1074.0, "b": 1073.8})
    (1073.9, 'agree: a=1074.0, b=1073.8')
    >>> consensus_melting_point_K({"a": 1000.0, "b": 1005.0, "c": 1300.0})[0]
    1002.5
    >>> consensus_melting_point_K({"a": 1000.0, "b": 1300.0})[1]
    'disagree (spread 300 K > 20 K): a=1000.0, b=1300.0'
    """
    clean = {k: float(v) for k, v in values.items() if v is not None and not math.isnan(float(v))}
    text = ", ".join(f"{k}={v:.1f}" for k, v in clean.items())
    if not clean:
        return math.nan, "no value"
    if len(clean) == 1:
        return round(next(iter(clean.values())), 2), f"single: {text}"
    numbers = np.array(sorted(clean.values()))
    median = float(np.median(numbers))
    if np.all(np.abs(numbers - median) <= tolerance_K / 2 + 1e-9) or numbers[-1] - numbers[0] <= tolerance_K:
        return round(median, 2), f"agree: {text}"
    best: list[float] = []
    for start in range(len(numbers)):
        cluster = [x for x in numbers[start:] if x - numbers[start] <= tolerance_K]
        if len(cluster) > len(best):
            best = cluster
    spread = numbers[-1] - numbers[0]
    if len(best) * 2 > len(numbers):
        value = round(float(np.median(best)), 2)
        return value, f"consensus ({len(best)} of {len(numbers)} within {tolerance_K:g} K): {text}"
    return math.nan, f"disagree (spread {spread:.0f} K > {tolerance_K:g} K): {text}"


_HYDRATE_WORDS = re.compile(r"hydrat|\bhydrous\b|\bx ?h2o\b|[.\u00b7*] ?\d*\s*h2o", re.IGNORECASE)
_LOWEST_INORGANIC_SINGLE_K = 373.15


def target_flags(names, how: str, value_K: float, dec) -> tuple[str, ...]:
    """Why a kept melting point may be a hydrate's or a decomposition's: rules on the data, blind to the index.

    * a name of the entry says hydrate (``hydrate``, ``hydrated``, ``x H2O``);
    * one source only, below 100 C, for a salt with no organic ion: inorganic
      salts that melt there are few, and a lone value there is most often a
      hydrate melting in its own water (Na2SO4.10H2O 305 K, the alums near
      365 K; CRC Handbook, from memory) or a decomposition.

    The rows stay in the training set; the flags go into the decision text
    (``target flagged: ...``) so the decision log shows them and
    ``pipelines.melting_weights`` can print figures without them beside the
    full ones.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> target_flags(["aluminum sodium disulfate"], "single: CRC_INORG=333.1", 333.15,
    ...              decompose(parse_formula("NaAl(SO4)2")))
    ('one source, below 100 C for an inorganic salt',)
    >>> target_flags(["sodium sulfate decahydrate"], "agree: A=305.1, B=305.4", 305.3,
    ...              decompose(parse_formula("Na2SO4")))
    ('a name says hydrate',)
    """
    flags = []
    if any(_HYDRATE_WORDS.search(n or "") for n in names):
        flags.append("a name says hydrate")
    organic = any(t.ion.organic or t.ion.label.startswith("[") for t in dec.cations + dec.anions)
    if how.startswith("single") and value_K < _LOWEST_INORGANIC_SINGLE_K and not organic:
        flags.append("one source, below 100 C for an inorganic salt")
    return tuple(flags)


# ------------------------------------------------------------ name agreement

# Latin stems used in trade names (ferric, cuprous, stannic...), common practice.
_LATIN_STEMS = {
    "Fe": ("ferr",), "Cu": ("cupr",), "Sn": ("stann",), "Pb": ("plumb",), "Ag": ("argent",), "Au": ("aur",),
    "Hg": ("mercur",), "Sb": ("stib", "antimon"), "K": ("kal",), "Na": ("natr",), "W": ("tungst", "wolfram"),
}
_ANION_WORDS = {
    "F": ("fluorid", "fluoro"), "Cl": ("chlorid", "chloro"), "Br": ("bromid", "bromo"), "I": ("iodid", "iodo"),
    "O": ("oxid", "oxo"), "S": ("sulfid", "thio"), "Se": ("selenid",), "Te": ("tellurid",), "N": ("nitrid",),
    "H": ("hydrid",),
}
# Monatomic anions that make salts; carbides, silicides, borides, phosphides
# and arsenides of metals are covalent or metallic solids, not salts.
_SALT_ANION_ELEMENTS = frozenset(_ANION_WORDS)
_EXCLUDED_FAMILIES = frozenset({"oxocation"})
_METAL_OXOCATIONS = frozenset({"UO2(2+)", "VO(2+)", "VO2(+)"})


def _fold(text: str) -> str:
    text = text.lower()
    for old, new in (("sulph", "sulf"), ("aluminium", "aluminum"), ("caesium", "cesium"), ("ide", "id")):
        text = text.replace(old, new)
    return re.sub(r"[^a-z0-9]", "", text)


def _element_stems(symbol: str) -> tuple[str, ...]:
    name = _fold(get_element(symbol).name)
    stems = {name}
    for suffix in ("ium", "um", "ese", "on", "en", "ine"):
        if name.endswith(suffix) and len(name) - len(suffix) >= 4:
            stems.add(name[: -len(suffix)])
    stems.update(_LATIN_STEMS.get(symbol, ()))
    return tuple(stems)


def _ion_names(ion) -> tuple[str, ...]:
    """The ion's library name and each alternative in its brackets, folded."""
    parts = re.split(r"[();]|,\s", ion.name)
    names = {_fold(p) for p in parts if len(_fold(p)) >= 4}
    if ion.label.startswith("["):
        names.add(_fold(ion.label))
    return tuple(sorted(names))


def _halo_complex_named(ion, folded: str, cation_elements) -> bool:
    """A halo-complex anion of a metal that is also a cation of the reading, named as that metal's
    halide (``gallium dichloride`` for Ga(+)[GaCl4](-), ``indium dichloride`` for In(+)[InCl4](-)).
    Double salts of two metals (K2PtCl6, Li3AlF6) are not taken this way: their names must name the
    complex."""
    if ion.family != "halo-complex":
        return False
    elements = dict(ion.composition)
    halides = [s for s in elements if s in ("F", "Cl", "Br", "I")]
    metals = [s for s in elements if s not in halides]
    return (len(halides) == 1 and len(metals) == 1 and metals[0] in cation_elements
            and any(w in folded for w in _ANION_WORDS[halides[0]])
            and any(stem in folded for stem in _element_stems(metals[0])))


def name_agrees_with_ions(name: str, dec) -> tuple[bool, str]:
    """Whether a compound's name mentions every ion the formula was read as.

    A monatomic cation must appear as its element name or stem (``iron``,
    ``ferric``), a monatomic anion as its ``-ide`` word (``chloride``) or,
    for oxide ions, as an ``-ate`` of a cation present (``barium titanate``),
    a polyatomic or organic ion as its library name or one of the names in
    brackets (``tetrafluoroborate``, ``1-ethyl-3-methylimidazolium``).
    Spelling variants (sulph/sulf, aluminium/aluminum, caesium/cesium) are
    folded first.

    Parameters
    ----------
    name : str
        A compound name, e.g. from the ``chemicals`` identifier table.
    dec : Decomposition
        The formula's reading by :func:`scorer.ions.decompose`.

    Returns
    -------
    (bool, str)
        Agreement, and the first ion the name does not mention (empty when it agrees).

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> name_agrees_with_ions("sodium sulphate", decompose(parse_formula("Na2SO4")))
    (True, '')
    >>> name_agrees_with_ions("benzoxonium chloride", decompose(parse_formula("NaCl")))
    (False, 'Na(+) not named')
    """
    folded = _fold(name or "")
    if not folded:
        return False, "no name"
    cation_stems = [s for t in dec.cations if t.ion.monatomic for s in _element_stems(t.ion.element)]
    cation_stems += [n for t in dec.cations if not t.ion.monatomic for n in _ion_names(t.ion)]
    for term in dec.cations + dec.anions:
        ion = term.ion
        if ion.monatomic and ion.charge > 0:
            ok = any(s in folded for s in _element_stems(ion.element))
        elif ion.monatomic:
            ok = any(w in folded for w in _ANION_WORDS.get(ion.element, ()))
            if not ok and ion.element == "O":
                ok = any(s[:5] + "at" in folded for s in cation_stems if len(s) >= 4)
        else:
            ok = any(n in folded for n in _ion_names(ion)) or _halo_complex_named(
                ion, folded, {t.ion.element for t in dec.cations if t.ion.monatomic})
        if not ok:
            return False, f"{ion.ion_id} not named"
    return True, ""


def screen_salt(dec, name: str) -> tuple[bool, str]:
    """Whether a scored entry may enter the training set, and why not.

    Kept: anhydrous, charge-balanced ``ionic_salt`` or ``ionic_liquid_pair``
    readings without an ambiguity and with whole ion counts (or half counts of a doubled
    formula unit without a metal split over two lone cations: GaCl2 as Ga(+)[GaCl4](-)), with metal
    cations (a +1 state only where the element has one in common use) or
    polyatomic/organic cations,
    halide, chalcogenide, nitride or hydride monatomic anions, no molecular
    oxocation (NO+, NO2+), and a name that agrees with the ions
    (:func:`name_agrees_with_ions`) and with any formula it writes in brackets
    (``neodymium sulfide (Nd2S3)`` against the formula NdS).

    Examples
    --------
    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> screen_salt(decompose(parse_formula("CuSO4.5H2O")), "copper sulfate pentahydrate")
    (False, 'hydrate')
    """
    if dec.substance_class not in ("ionic_salt", "ionic_liquid_pair") and not melts_as_hydroxide(dec):
        return False, f"not a salt ({dec.substance_class})"
    if dec.hydrate_water or "hydrat" in (name or "").lower():
        return False, "hydrate"
    if dec.alternatives:
        return False, "ambiguous ion reading"
    # half counts of a whole formula without a metal split over two lone cations are its unit written
    # at half size (GaCl2 = Ga(+)*0.5 with GaCl4(-)*0.5, InCl2 = In(+)*0.5 with InCl4(-)*0.5), which the index
    # takes whole; a metal split half and half over two lone cations stays out, a mixed-valence reading
    lone = [t.ion.element for t in dec.cations if t.ion.monatomic]
    whole = whole_unit_factor(dec.cations, dec.anions) if len(lone) == len(set(lone)) else 1
    for term in dec.cations + dec.anions:
        if abs(term.count * whole - round(term.count * whole)) > 1e-6:
            return False, f"fractional ion count ({term}): a mixed-valence or non-stoichiometric reading"
    for term in dec.cations:
        ion = term.ion
        if ion.monatomic and not is_metal(ion.element):
            return False, f"non-metal cation {ion.ion_id}"
        if ion.monatomic and ion.charge == 1 and 1 not in _main_states(ion.element) \
                and ion.element not in _MONOVALENT_OK:
            # identifier formulas that lost their counts (BaOZr for BaZrO3, AgMoO
            # for Ag2MoO4) resolve only through a +1 state of a metal that has none
            return False, f"uncommon oxidation state {ion.ion_id}: formula likely incomplete, or not a simple salt"
        if ion.family in _EXCLUDED_FAMILIES and ion.ion_id not in _METAL_OXOCATIONS:
            return False, f"molecular oxocation {ion.ion_id}"
    written = _formula_in_name(name)
    if written is not None and written != _ratio(dec.composition):
        return False, "the name gives another formula in brackets"
    for term in dec.anions:
        ion = term.ion
        if ion.monatomic and ion.element not in _SALT_ANION_ELEMENTS:
            return False, f"{ion.ion_id}: carbide/silicide/boride/pnictide, not a salt"
    agrees, why = name_agrees_with_ions(name, dec)
    if not agrees:
        return False, f"name and formula disagree: {why}"
    return True, ""


# metals whose hydroxides melt as salts: those of the alkali metals and of strontium and barium melt without
# losing water (LiOH 744 K, NaOH 596 K, KOH 679 K, Ba(OH)2 681 K); the others (Mg, Ca, Be, Al and the
# transition metals) give off water and leave the oxide first, so their registry "melting points" are
# decomposition temperatures (Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed., 1997, ch. 4.3.6 and
# 5.3.5; from memory)
_MELTING_HYDROXIDE_CATIONS = frozenset({"Li", "Na", "K", "Rb", "Cs", "Sr", "Ba"})


def melts_as_hydroxide(dec) -> bool:
    """A metal hydroxide that melts as a salt (:data:`_MELTING_HYDROXIDE_CATIONS`): a ``base`` reading of
    those metals' lone cations with hydroxide alone.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> [melts_as_hydroxide(decompose(parse_formula(f))) for f in ("NaOH", "Ba(OH)2", "Mg(OH)2", "NH3")]
    [True, True, False, False]
    """
    return (dec.substance_class == "base" and bool(dec.cations) and bool(dec.anions)
            and all(t.ion.monatomic and t.ion.element in _MELTING_HYDROXIDE_CATIONS for t in dec.cations)
            and all(t.ion.ion_id == "OH(-)" for t in dec.anions))


# metals whose +1 salts are real though mendeleev lists +1 as an extra state
# (CuCl, AuCl, InCl, GaCl in Ga[GaCl4]); common practice
_MONOVALENT_OK = frozenset({"Cu", "Ag", "Au", "Ga", "In", "Tl", "Hg"})
_BRACKETED_FORMULA = re.compile(r"\(([A-Z][A-Za-z0-9]*)\)")


def _ratio(composition) -> tuple:
    counts = dict(composition)
    smallest = min(counts.values())
    return tuple(sorted((s, round(n / smallest, 3)) for s, n in counts.items()))


def _formula_in_name(name: str):
    """The element ratio of a formula written in brackets in a name (``neodymium sulfide (Nd2S3)``), or None."""
    for token in _BRACKETED_FORMULA.findall(name or ""):
        try:
            comp = parse_formula(token)
        except FormulaError:
            continue
        counts = comp.as_dict()
        if len(counts) >= 2:
            return _ratio(counts.items())
    return None


def _main_states(symbol: str) -> tuple:
    return tuple(int(s) for s in get_element(symbol).oxidation_states_main)


def _main_ion(terms):
    """The ion of ``terms`` carrying most charge (ties broken by ion id, so the choice is stable)."""
    return max(terms, key=lambda t: (abs(t.ion.charge) * t.count, t.ion.ion_id)).ion


def anion_family(dec) -> str:
    """The family of a salt's main anion, for grouping and per-family figures.

    Monatomic anions: ``halide``, ``oxide``, ``chalcogenide`` (S, Se, Te),
    ``nitride``, ``hydride``; polyatomic anions: the ion library's family
    (``oxoanion``, ``halo-complex``, ``carboxylate``...), with sulfate and
    nitrate split out of ``oxoanion`` because they are common. The main anion
    is the one carrying most negative charge.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> anion_family(decompose(parse_formula("K2SO4"))), anion_family(decompose(parse_formula("CaF2")))
    ('sulfate', 'halide')
    """
    if not dec.anions:
        return "none"
    main = _main_ion(dec.anions)
    if main.monatomic:
        return {"F": "halide", "Cl": "halide", "Br": "halide", "I": "halide", "O": "oxide", "N": "nitride",
                "H": "hydride"}.get(main.element, "chalcogenide" if main.element in ("S", "Se", "Te") else "other")
    if main.ion_id == "SO4(2-)":
        return "sulfate"
    if main.ion_id in ("NO3(-)", "NO2(-)"):
        return "nitrate"
    if main.ion_id == "CO3(2-)":
        return "carbonate"
    return main.family


def cation_element(dec) -> str:
    """The main cation's element (``Na``), or ``NH4``/``organic`` for others, for grouping."""
    if not dec.cations:
        return "none"
    main = _main_ion(dec.cations)
    if main.monatomic:
        return main.element
    if main.organic:
        return "organic"
    metals = [s for s, _ in main.composition if is_metal(s)]
    return metals[0] if metals else main.label


def cation_family(dec) -> str:
    """The main cation's family for grouping: an organic cation's ion family, else its element.

    Cross-validation grouped by it holds out whole ionic-liquid families
    (imidazolium, pyrrolidinium, ammonium-protic...) at once.

    A compound read without ions whose formal reading the salt index keeps
    (interstitial nitrides, layered dichalcogenides:
    :func:`scorer.bond_class_rules.keeps_formal_salt_reading`) takes its
    formal cation's element, as the training screen reads it
    (:func:`pipelines.melting_data.build_open_training_set`), so TiN groups
    with the other titanium salts rather than with every compound read
    without ions.

    >>> from ionicity.scorer.formula import parse_formula
    >>> from ionicity.scorer.ions import decompose
    >>> cation_family(decompose(parse_formula("[C4mim][BF4]"))), cation_family(decompose(parse_formula("NaCl")))
    ('imidazolium', 'Na')
    >>> cation_family(decompose(parse_formula("TiN"))), cation_family(decompose(parse_formula("WTe2")))
    ('Ti', 'W')
    """
    if not dec.cations:
        reading = formal_salt_reading(dec) if keeps_formal_salt_reading(dict(dec.composition)) else None
        if reading is None or not reading.cations:
            return "none"
        dec = reading
    main = _main_ion(dec.cations)
    return main.family if main.organic else cation_element(dec)
