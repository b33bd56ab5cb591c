"""Two groups read off a SMILES string, for the build scripts: carboxylic acids and basic nitrogen.

The registry's structures (``chemicals.identifiers``, PubChem SMILES) decide which named molecules are
zwitterions in the solid: the amino acids and their kin, which hold a basic nitrogen and a carboxylic acid
in one molecule and crystallise as inner salts (glycine as H3N(+)-CH2-COO(-); Greenwood & Earnshaw,
Chemistry of the Elements, 2nd ed., 1997, and any organic chemistry text; from memory), and molecules whose
SMILES writes the charges (betaine, ``C[N+](C)(C)CC(=O)[O-]``). Only the build scripts use this (the
scorer reads the result from ``registry_names.csv``); it is no general SMILES parser: atoms, bonds,
branches, ring closures and bracket atoms' charges and hydrogens are read, stereo marks are skipped.
"""
from __future__ import annotations

import re

__all__ = ["smiles_graph", "acid_and_basic_groups", "zwitterion"]

_TOKEN = re.compile(r"\[[^\]]+\]|Br|Cl|[BCNOPSFIbcnops]|[=#$:/\\.()]|%\d\d|\d|-|\*")
_BRACKET = re.compile(r"\[(\d*)([A-Za-z][a-z]?)(@*)(H\d*)?([+-]\d*|\++|-+)?")
_BOND_ORDER = {"=": 2.0, "#": 3.0, "$": 4.0, ":": 1.5}


def smiles_graph(smiles: str) -> tuple[list[tuple[str, bool, int]], dict[tuple[int, int], float]]:
    """(atoms, bonds) of a SMILES: each atom as (element, aromatic, charge), each bond as
    ``{(i, j): order}`` (1.5 between aromatic atoms).

    >>> atoms, bonds = smiles_graph("NCC(=O)O")  # glycine
    >>> [a[0] for a in atoms], sorted(bonds.values())
    (['N', 'C', 'C', 'O', 'O'], [1.0, 1.0, 1.0, 2.0])
    >>> smiles_graph("C[N+](C)(C)CC(=O)[O-]")[0][1], smiles_graph("c1ccccc1")[1][(0, 5)]
    (('N', False, 1), 1.5)
    """
    atoms: list[tuple[str, bool, int]] = []
    bonds: dict[tuple[int, int], float] = {}
    branches: list[int | None] = []
    previous: int | None = None
    order: float | None = None
    rings: dict[str, tuple[int, float | None]] = {}
    for token in _TOKEN.findall(smiles):
        if token == "(":
            branches.append(previous)
        elif token == ")":
            previous = branches.pop() if branches else previous
        elif token in _BOND_ORDER:
            order = _BOND_ORDER[token]
        elif token in ("-", "/", "\\"):
            order = 1.0 if token == "-" else order
        elif token == ".":
            previous = None
        elif token[0].isdigit() or token[0] == "%":
            if previous is None:
                continue
            if token in rings:
                other, opened = rings.pop(token)
                aromatic = atoms[other][1] and atoms[previous][1]
                bonds[(other, previous)] = order or opened or (1.5 if aromatic else 1.0)
            else:
                rings[token] = (previous, order)
            order = None
        elif token == "*":
            atoms.append(("*", False, 0))
            previous = _bond(atoms, bonds, previous, order)
            order = None
        else:
            charge = 0
            symbol = token
            if token.startswith("["):
                match = _BRACKET.match(token)
                if match is None:
                    continue
                symbol, sign = match.group(2), match.group(5) or ""
                if sign:
                    digits = sign[1:]
                    size = int(digits) if digits.isdigit() else len(sign)
                    charge = size if sign[0] == "+" else -size
            aromatic = symbol[0].islower()
            atoms.append((symbol.capitalize() if aromatic else symbol, aromatic, charge))
            previous = _bond(atoms, bonds, previous, order)
            order = None
    return atoms, bonds


def _bond(atoms, bonds, previous, order) -> int:
    """Join the atom just added to ``previous``; its index."""
    index = len(atoms) - 1
    if previous is not None:
        aromatic = atoms[previous][1] and atoms[index][1]
        bonds[(previous, index)] = order or (1.5 if aromatic else 1.0)
    return index


def acid_and_basic_groups(smiles: str) -> tuple[int, int]:
    """(carboxylic and sulfonic acid groups, basic nitrogen atoms) of a SMILES.

    An acid group is an O-H (an uncharged oxygen with one single bond) on a carbon that also holds a
    double-bonded O or S, or on a sulfur that holds a double-bonded O (sulfonic acids). A basic nitrogen is an uncharged, non-aromatic amine nitrogen of single bonds
    whose neighbours are neither aromatic or alkene carbons (anilines, enamines), nor a carbonyl carbon
    (amides), nor N, O or S; or a nitrogen of an amidine or guanidine group (N=C-N). Pyridine-type ring
    nitrogens, anilines and amides are weak bases that stay uncharged beside a carboxylic acid (common
    practice).

    >>> acid_and_basic_groups("NCC(=O)O"), acid_and_basic_groups("CC(=O)NCC(=O)O")  # glycine, aceturic acid
    ((1, 1), (1, 0))
    >>> acid_and_basic_groups("NC1=CC=C(C=C1)C(=O)O"), acid_and_basic_groups("C1=CN=CC=C1C(=O)O")
    ((1, 0), (1, 0))
    >>> acid_and_basic_groups("C(C(=O)O)N=C(N)N")  # guanidinoacetic acid
    (1, 3)
    """
    atoms, bonds = smiles_graph(smiles)
    neighbours: dict[int, list[tuple[int, float]]] = {i: [] for i in range(len(atoms))}
    for (i, j), order in bonds.items():
        neighbours[i].append((j, order))
        neighbours[j].append((i, order))

    def carbonyl(c: int) -> bool:
        return atoms[c][0] == "C" and any(atoms[k][0] in ("O", "S") and o == 2.0 for k, o in neighbours[c])

    def acid_centre(c: int) -> bool:
        # a carboxylic acid's carbon, or a sulfonic acid's sulfur (S(=O)(=O)O: taurine, HEPES)
        return carbonyl(c) or atoms[c][0] == "S" and any(
            atoms[k][0] == "O" and o == 2.0 for k, o in neighbours[c])

    def unsaturated_carbon(c: int) -> bool:
        return atoms[c][1] or atoms[c][0] == "C" and any(
            o == 2.0 and atoms[k][0] == "C" for k, o in neighbours[c])

    def amidine_carbon(c: int) -> bool:
        return atoms[c][0] == "C" and any(o == 2.0 and atoms[k][0] == "N" for k, o in neighbours[c]) and sum(
            atoms[k][0] == "N" for k, _ in neighbours[c]) >= 2

    acids = sum(1 for i, (symbol, aromatic, charge) in enumerate(atoms)
                if symbol == "O" and not aromatic and charge == 0 and len(neighbours[i]) == 1
                and neighbours[i][0][1] == 1.0 and acid_centre(neighbours[i][0][0]))
    basic = 0
    for i, (symbol, aromatic, charge) in enumerate(atoms):
        if symbol != "N" or aromatic or charge:
            continue
        around = neighbours[i]
        if any(o != 1.0 for _, o in around):
            basic += any(o == 2.0 and amidine_carbon(k) for k, o in around)
            continue
        if any(amidine_carbon(k) for k, _ in around):
            basic += 1
        elif not any(unsaturated_carbon(k) or carbonyl(k) or atoms[k][0] in ("N", "O", "S") for k, _ in around):
            basic += 1
    return acids, basic


def zwitterion(smiles: str) -> bool:
    """Whether a SMILES is one molecule that is a zwitterion in the solid: a basic nitrogen and a
    carboxylic acid (:func:`acid_and_basic_groups`), or an N(+) and an O(-) written in it.

    >>> zwitterion("NCC(=O)O"), zwitterion("C[N+](C)(C)CC(=O)[O-]"), zwitterion("CC(=O)Nc1ccccc1")
    (True, True, False)
    >>> zwitterion("[Na+].[O-]C(=O)CN"), zwitterion("CC[N+](=O)[O-]")  # a salt; nitroethane
    (False, False)
    >>> zwitterion("C(CS(=O)(=O)O)N")  # taurine
    True
    """
    if not smiles or "." in smiles:
        return False
    atoms, bonds = smiles_graph(smiles)
    neighbours: dict[int, list[int]] = {i: [] for i in range(len(atoms))}
    for i, j in bonds:
        neighbours[i].append(j)
        neighbours[j].append(i)
    # an ammonium nitrogen (no oxygen on it: a nitro group or an N-oxide writes N(+) beside O(-) too) and an
    # oxygen anion on carbon or sulfur (a carboxylate or a sulfonate)
    onium = any(a[0] == "N" and a[2] > 0 and not any(atoms[k][0] == "O" for k in neighbours[i])
                for i, a in enumerate(atoms))
    oxo_anion = any(a[0] == "O" and a[2] < 0 and any(atoms[k][0] in ("C", "S") for k in neighbours[i])
                    for i, a in enumerate(atoms))
    if onium and oxo_anion:
        return True
    acids, basic = acid_and_basic_groups(smiles)
    return acids > 0 and basic > 0
