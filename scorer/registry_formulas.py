"""What the registry's tables know a Hill formula as: molecules only, or salts too.

``scorer/data/registry_names.csv`` (the CRC Handbook and PubChem tables of the registry package
``chemicals``, built by ``scorer/data/build_registry_names.py``) gives each compound its formula and a
``kind`` read from its SMILES: ``molecule`` for one component, ``salt`` for several. A Hill formula of
carbon, hydrogen and non-metals can often be spelt as one cation and one anion of the ion library
(C6H15NO3 as [N1112][HCO3]; C3H6N6 as guanidinium dicyanamide), while the compounds that formula names in
the registry are molecules (triethanolamine, melamine): :func:`registry_molecule` says so, and the ion
solver then reads the formula as the molecule (:func:`scorer.ions.decompose`).

The table is loaded once per process, only when a formula asks.
"""
from __future__ import annotations

from ionicity.scorer.caching import once
from ionicity.scorer.grammar import hill_text_key, reduced_key
from ionicity.scorer.tables import table

__all__ = ["inorganic_formula_listed", "registry_knows", "registry_molecule", "registry_salt", "registry_names_of"]

_MOLECULE_KINDS = frozenset({"molecule", "acyl_halide", "acid_anhydride", "isocyanate", "zwitterion"})
# the kinds that name a group water attacks
_REACTIVE_KINDS = frozenset({"acyl_halide", "acid_anhydride", "isocyanate"})


@once
def _kinds() -> dict[str, tuple[frozenset, str]]:
    """Hill formula -> (the kinds the registry gives it, the first name it lists)."""
    kinds: dict[str, set] = {}
    first: dict[str, str] = {}
    for row in table("registry_names.csv"):
        kinds.setdefault(row["formula"], set()).add(row["kind"] or "unknown")
        first.setdefault(row["formula"], row["name"])
    return {formula: (frozenset(k), first[formula]) for formula, k in kinds.items()}


def registry_molecule(hill: str) -> str | None:
    """The registry's name of a compound with Hill formula ``hill`` when every compound it lists with that
    formula is one molecule; ``None`` when it lists none, or a salt or an entry without a structure among them.

    >>> registry_molecule("C6H15NO3"), registry_molecule("NaCl")
    ('2-[bis(2-hydroxyethyl)amino]ethanol', None)
    """
    found = _kinds().get(hill)
    if found is None or not found[0] <= _MOLECULE_KINDS:
        return None
    return found[1]


def registry_zwitterion(hill: str) -> str | None:
    """The registry's name of a compound with Hill formula ``hill`` when every compound it lists with that
    formula is a zwitterion in the solid (an amino acid or another inner salt: ``kind`` ``zwitterion``,
    :mod:`scorer.data.smiles_groups`); ``None`` otherwise (C2H5NO2 is glycine and nitroethane).

    >>> registry_zwitterion("C6H14N2O2") is not None, registry_zwitterion("C2H5NO2")
    (True, None)
    """
    found = _kinds().get(hill)
    return found[1] if found is not None and found[0] == {"zwitterion"} else None


def registry_reactive_group(hill: str) -> str | None:
    """The group water attacks (``acyl_halide``, ``acid_anhydride``, ``isocyanate``) when every compound the
    registry lists with Hill formula ``hill`` has that one group; ``None`` otherwise.

    >>> registry_reactive_group("C2Cl2O2"), registry_reactive_group("C2H3ClO")
    ('acyl_halide', None)
    """
    found = _kinds().get(hill)
    if found is None or len(found[0]) != 1:
        return None
    (kind,) = found[0]
    return kind if kind in _REACTIVE_KINDS else None


@once
def _reactive_names() -> dict[str, tuple[str, str]]:
    """Hill formula -> (reactive kind, the first name the registry gives a compound of that kind)."""
    out: dict[str, tuple[str, str]] = {}
    for row in table("registry_names.csv"):
        if row["kind"] in _REACTIVE_KINDS:
            out.setdefault(row["formula"], (row["kind"], row["name"]))
    return out


_REACTIVE_KINDS = frozenset({"acyl_halide", "acid_anhydride", "isocyanate"})
# the elements of an acyl halide's Hill formula: only formulas of these are asked about (scorer.ions) and kept
# from the organic shortcut (scorer.organic), so that both paths read them alike
ACYL_HALOGENS = frozenset({"F", "Cl", "Br", "I"})
ACYL_HALIDE_ELEMENTS = frozenset({"C", "H", "O"}) | ACYL_HALOGENS


def registry_reactive_isomer(hill: str) -> tuple[str, str] | None:
    """(kind, name) of a compound with Hill formula ``hill`` that has a group water attacks, where the registry
    also lists compounds of that formula without one (C2H3ClO: acetyl chloride beside chloroacetaldehyde);
    ``None`` otherwise.

    >>> registry_reactive_isomer("C2H3ClO")[0], registry_reactive_isomer("C2Cl2O2")
    ('acyl_halide', None)
    """
    found = _kinds().get(hill)
    if found is None or len(found[0]) < 2 or not found[0] & _REACTIVE_KINDS:
        return None
    return _reactive_names().get(hill)


@once
def _names() -> dict[str, tuple[str, ...]]:
    """Hill formula -> every name the registry lists with it, in its order."""
    names: dict[str, list[str]] = {}
    for row in table("registry_names.csv"):
        names.setdefault(row["formula"], []).append(row["name"])
    return {formula: tuple(found) for formula, found in names.items()}


def registry_names_of(hill: str) -> tuple[str, ...]:
    """The names the registry lists for the Hill formula ``hill`` (none: an empty tuple).

    >>> registry_names_of("H6N2O3S")
    ('Ammonium sulfamate',)
    """
    return _names().get(hill, ())


def registry_salt(hill: str) -> str | None:
    """The registry's name of a compound with Hill formula ``hill`` when every compound it lists with that
    formula is a salt (several components in its SMILES); ``None`` otherwise.

    >>> registry_salt("C2H10Cl2N2"), registry_salt("C6H15NO3")
    ('1,2-Dimethylhydrazine dihydrochloride', None)
    """
    found = _kinds().get(hill)
    if found is None or found[0] != {"salt"}:
        return None
    return found[1]


@once
def _compositions() -> frozenset:
    """Reduced compositions of the registry's formulas (Hill formulas, no brackets)."""
    return frozenset(hill_text_key(formula) for formula in _kinds())


def registry_knows(counts) -> bool:
    """Whether the registry lists a compound of this composition or a whole multiple of it (HgCl is Hg2Cl2).

    >>> registry_knows({"P": 1.0, "O": 1.0, "Cl": 3.0}), registry_knows({"P": 1.0, "O": 1.0, "Cl": 1.0})
    (True, False)
    """
    return reduced_key(counts) in _compositions()


@once
def _inorganic_compositions() -> frozenset:
    """Reduced compositions of ``inorganic_formulas.csv`` (every formula without carbon-hydrogen of the
    registry's identifier tables) and of ``registry_names.csv``."""
    return frozenset(hill_text_key(row["formula"]) for row in table("inorganic_formulas.csv")) | _compositions()


def inorganic_formula_listed(counts) -> bool:
    """Whether the registry's identifier tables list a compound of this composition or a whole multiple of it:
    :func:`registry_knows` over the wider table of formulas (``scorer/data/inorganic_formulas.csv``), which
    holds real compounds the name table lacks (NbCl3, KO2, K2MnO4). Asked before a row says that no compound of
    its formula is listed.

    >>> inorganic_formula_listed({"Nb": 1.0, "Cl": 3.0}), registry_knows({"Nb": 1.0, "Cl": 3.0})
    (True, False)
    >>> inorganic_formula_listed({"S": 1.0, "O": 4.0})
    False
    """
    return reduced_key(counts) in _inorganic_compositions()
