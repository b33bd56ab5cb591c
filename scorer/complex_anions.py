"""Complex anions built by rule where the ion library has none: the last
resort of the charge-balance solver.

A salt such as K2GeF6 or Na4GeO4 has an anion the library does not list
(hexafluoridogermanate(IV), tetraoxidogermanate(IV)), and its centre (Ge) is
not read as a monatomic cation, so no library reading balances. This module
reads such a formula as metal cations with a complex anion [E X_m]^(q-): one
p-block or metalloid centre E (:data:`CENTRES`) at one of its common positive
oxidation states s (the element snapshot's main states, read by
:func:`scorer.substance.listed_states`), m ligands X (F, Cl, Br, I or O, each
of charge x), and the charge

    q = m * |x| - s,

given an additive name in the IUPAC way (Connelly et al., *Nomenclature of
Inorganic Chemistry*, IUPAC Recommendations 2005, IR-7.1 and IR-9.2: ligand
prefixes ``fluorido``, ``chlorido``, ``oxido`` with a multiplier, the centre's
``-ate`` name for an anion, and its oxidation state in Roman numerals, e.g.
``hexafluoridogermanate(IV)``).

Bounds: the rule runs only where the solver found no reading (so it never
changes one that exists), tries at most |CENTRES present| x 5 ligands x the
centre's main states x 6 ligand counts anions, and each cation set is found by
the solver's own walk (:func:`scorer.ion_search._search`) on the composition's
shared work budget.
"""
from __future__ import annotations

from ionicity.scorer.caching import once
from ionicity.scorer.elements import is_metal
from ionicity.scorer.ion_library import get_ion
from ionicity.scorer.ion_penalties import _IONIC_THRESHOLD, _PENALTY_SPECIES, _PENALTY_UNCOMMON_ION, _PEROXO_IONS
from ionicity.scorer.ion_search import _search, _subtract
from ionicity.scorer.model import Ion, format_charge
from ionicity.scorer.substance import listed_states

__all__ = ["CENTRES", "LIGANDS", "CONSTRUCTED_SOURCE", "complex_anion", "complex_anion_readings", "is_constructed"]

# centre -> the stem of its anion name (IR-9.2.2.3, Table X of the Red Book:
# germanate, stannate, plumbate, antimonate, bismuthate ...); p-block and
# metalloid elements whose halido and oxido complexes are common anions
CENTRES = {
    "B": "borate", "Al": "aluminate", "Ga": "gallate", "In": "indate", "Tl": "thallate",
    "Si": "silicate", "Ge": "germanate", "Sn": "stannate", "Pb": "plumbate",
    "P": "phosphate", "As": "arsenate", "Sb": "antimonate", "Bi": "bismuthate",
    "S": "sulfate", "Se": "selenate", "Te": "tellurate",
}
# ligand -> (its charge as a ligand, its IR-7.1.3 ligand name)
LIGANDS = {"F": (-1, "fluorido"), "Cl": (-1, "chlorido"), "Br": (-1, "bromido"), "I": (-1, "iodido"), "O": (-2, "oxido")}
# ligand counts tried: halido complexes with 3 to 6 ligands (SnCl3-, GeF6(2-)),
# oxido anions with 2 to 4 (BO2-, GeO3(2-), GeO4(4-)); common practice
_LIGAND_COUNTS = {"halido": (3, 4, 5, 6), "oxido": (2, 3, 4)}
_MULTIPLIERS = ("", "mono", "di", "tri", "tetra", "penta", "hexa", "hepta", "octa")
_ROMAN = ("0", "I", "II", "III", "IV", "V", "VI", "VII", "VIII")
# a constructed anion costs like an uncommon library ion, so of two
# constructed readings the one with fewer odd choices wins
_PENALTY_CONSTRUCTED = _PENALTY_UNCOMMON_ION
# of two readings otherwise alike (K3GeF7: GeF6(2-) + F(-) or GeF5(-) + 2 F(-)),
# the one with more ligands on the centre wins: fluoro- and chloro-complexes of
# Si(IV), Ge(IV), Sn(IV) are six-coordinate (Greenwood & Earnshaw, Chemistry of
# the Elements, 2nd ed., 1997, ch. 10; from memory); far below any other penalty
_PENALTY_PER_MISSING_LIGAND = 0.01
CONSTRUCTED_SOURCE = (
    "constructed by rule (scorer/complex_anions.py), not from the ion library: additive name after "
    "Connelly et al., Nomenclature of Inorganic Chemistry, IUPAC Recommendations 2005, IR-7/IR-9; "
    "centre oxidation state from the element snapshot (mendeleev)"
)


def _main_positive_states(symbol: str) -> tuple[int, ...]:
    return tuple(s for s, extra in listed_states(symbol) if s > 0 and not extra)


@once
def complex_anion(centre: str, ligand: str, count: int, state: int) -> Ion | None:
    """The complex anion [centre ligand_count] with the centre at ``state``,
    or None where the charge is not negative.

    The library's own ion is returned where it lists this composition and charge.

    Examples
    --------
    >>> ion = complex_anion("Ge", "F", 6, 4)
    >>> ion.ion_id, ion.name, ion.family
    ('GeF6(2-)', 'hexafluoridogermanate(IV)', 'halo-complex')
    >>> complex_anion("Ge", "O", 4, 4).name
    'tetraoxidogermanate(IV)'
    >>> complex_anion("Ge", "F", 4, 4) is None
    True
    """
    ligand_charge, ligand_name = LIGANDS[ligand]
    charge = count * ligand_charge + state
    if charge >= 0:
        return None
    label = f"{centre}{ligand}{count}"
    ion_id = f"{label}({format_charge(charge)})"
    try:
        return get_ion(ion_id)
    except KeyError:
        pass
    # IR-7.1.3: an anion takes the -ate form of the centre; the oxidation
    # state follows in Roman numerals (IR-9.2.2.2, the Stock number)
    name = f"{_MULTIPLIERS[count]}{ligand_name}{CENTRES[centre]}({_ROMAN[state]})"
    return Ion(
        ion_id=ion_id,
        label=label,
        charge=charge,
        composition=tuple(sorted(((centre, 1.0), (ligand, float(count))))),
        family="oxoanion" if ligand == "O" else "halo-complex",
        name=name,
        organic=False,
        element=None,
        oxidation_states=((centre, float(state)), (ligand, float(ligand_charge))),
        source=CONSTRUCTED_SOURCE,
    )


def is_constructed(ion: Ion) -> bool:
    """Whether ``ion`` was built by :func:`complex_anion` rather than read from the library."""
    return ion.source == CONSTRUCTED_SOURCE


def complex_anion_readings(remaining: dict[str, float], budget: list[int]) -> tuple[list, list[str]]:
    """Charge-balanced readings of ``remaining`` (element -> count) as metal
    cations with one constructed complex anion, and the note that says so.

    Only for compositions with a metal and no library reading: the caller
    (:mod:`scorer.ions`) asks only then.

    Returns
    -------
    readings : list of (penalty, [(Ion, count), ...])
        Each below the solver's ionic threshold; empty where none balances.
    notes : list of str
        One note naming the constructed anions of the most plausible readings.

    Examples
    --------
    >>> readings, notes = complex_anion_readings({"K": 2.0, "Ge": 1.0, "F": 6.0}, [10_000])
    >>> sorted(f"{ion.ion_id}*{n:g}" for ion, n in min(readings, key=lambda r: r[0])[1])
    ['GeF6(2-)*1', 'K(+)*2']
    """
    readings = []
    if not any(is_metal(s) for s in remaining):
        return readings, []
    for centre in sorted(set(remaining) & set(CENTRES)):
        anions_per_formula = remaining[centre]
        if anions_per_formula != int(anions_per_formula) or not 0 < anions_per_formula <= 4:
            continue
        for ligand in sorted(set(remaining) & set(LIGANDS)):
            counts = _LIGAND_COUNTS["oxido" if ligand == "O" else "halido"]
            for count in counts:
                if count * anions_per_formula > remaining[ligand] + 1e-9:
                    continue
                for state in _main_positive_states(centre):
                    anion = complex_anion(centre, ligand, count, state)
                    if anion is None:
                        continue
                    rest = _subtract(remaining, anion.composition, anions_per_formula)
                    if not rest:
                        continue
                    extra = _PENALTY_CONSTRUCTED + _PENALTY_SPECIES + _PENALTY_PER_MISSING_LIGAND * (counts[-1] - count)
                    # a reading is kept only under the ionic threshold: the walk needs look for no dearer one
                    found, _ = _search(rest, -anion.charge * anions_per_formula, frozenset(), budget,
                                       _IONIC_THRESHOLD - extra)
                    for penalty, terms in found:
                        total = (penalty + _PENALTY_CONSTRUCTED + _PENALTY_SPECIES
                                 + _PENALTY_PER_MISSING_LIGAND * (counts[-1] - count))
                        if total < _IONIC_THRESHOLD and any(ion.charge > 0 for ion, _ in terms) and not any(
                                ion.ion_id in _PEROXO_IONS for ion, _ in terms):
                            # (no peroxide, superoxide or ozonide beside a built oxoanion: the oxygen it leaves is a
                            # count mistyped, CaPO4 for Ca3(PO4)2, not calcium superoxide dioxidophosphate(III))
                            readings.append((total, [(anion, anions_per_formula)] + list(terms)))
    if not readings:
        return readings, []
    best = min(p for p, _ in readings)
    if not any(is_constructed(ion) for p, terms in readings if p <= best + 1e-9 for ion, _ in terms):
        # the best reading holds library ions only (a complex anion the rule built is one of the library's,
        # SO4(2-)): the walk has judged it already, and no note names an ion that was not built
        return [], []
    built = sorted({ion.ion_id + " (" + ion.name + ")" for p, terms in readings if p <= best + 1e-9
                    for ion, _ in terms if is_constructed(ion)})
    note = ("no library reading balances: complex anion " + ", ".join(built) +
            " constructed by rule from the centre's common oxidation state, not taken from the ion library")
    return readings, [note]
