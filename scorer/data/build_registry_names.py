"""Rebuild ``registry_names.csv``: names of the compounds the registry's handbook tables list, with formulas.

usage: python -m ionicity.scorer.data.build_registry_names [--check]

Rows, from the registry package ``chemicals`` (its version is written in the README section):

* ``CRC organic`` and ``CRC inorganic``: the name and CAS number of every compound of the CRC
  Handbook's "Physical Constants of Organic Compounds" and "... of Inorganic Compounds" tables as the
  package ships them (``Misc/Physical Constants of *.csv``: Hexane, Acetone, D-Glucose, Ammonia), the
  formula from the package's identifier tables by CAS number (``chemicals.identifiers.search_chemical``);
* ``common practice``: the names of :data:`SYNONYMS` that stock lists use (methylene chloride, glycerin,
  dextrose, tris), each with the CAS number it means; the formula of that CAS number, checked against the
  registry's own lookup of the name;
* ``PubChem``: the first two names of each compound of the package's table of common chemicals
  (``Identifiers/chemical identifiers pubchem small.tsv``): the IUPAC-style name and the common name
  (``propan-2-one``, ``acetone``). Later synonyms are not taken: they mix trade names and wrong
  assignments (``dichloroethylene`` listed for 1,2-dichloroethane).

``kind``: ``molecule`` when the registry's SMILES of the CAS number is one component (``acyl_halide`` when
that molecule holds a carbonyl halide group, ``acid_anhydride`` a carboxylic anhydride, ``isocyanate`` an
N=C=O group: water reactions a Hill formula cannot show; ``zwitterion`` an amino acid or another inner salt,
:mod:`scorer.data.smiles_groups`), ``salt`` when it is several (``[Na+].[Cl-]``), empty without a SMILES; the name reader keeps a molecule of carbon and non-metals
from being read as an ion pair (tris, C4H11NO3, is no propylammonium hydrogencarbonate).

Left out: CRC names whose formula by CAS number the package's own lookup of the name contradicts (another
neutral formula), or a hydride's name with a one-element formula (Stibine read as Sb); names longer than 40 characters or not in ASCII, hydrates (the tables write their formulas without
the water apart, CuH10O9S; the name grammar reads hydrate names itself), names that are CAS numbers or hold ``;`` or ``$`` (ion-pair and lambda-convention names),
names of fewer than four lower-case letters, formulas with a charge or that the formula grammar does not
read, and every name whose compact key (:func:`scorer.name_vocabulary.compact`: case, spaces and hyphens
dropped) means two different formulas. Names are written as the source writes them; the first source
in the order above keeps the row. ``--check`` exits 1 when the file differs from a rebuild.
"""
from __future__ import annotations

import csv
import io
import os
import re
import sys
from pathlib import Path

from ionicity.scorer.data.smiles_groups import zwitterion

OUT = Path(__file__).with_name("registry_names.csv")
CRC_TABLES = (("CRC organic", "Physical Constants of Organic Compounds.csv"),
              ("CRC inorganic", "Physical Constants of Inorganic Compounds.csv"))
PUBCHEM_TABLE = "chemical identifiers pubchem small.tsv"
# names a stock list uses that the two tables write otherwise (common practice), each with the CAS number
# it means (from memory; xylene, a mixture of isomers, takes o-xylene's, the registry's own reading of
# the name: every isomer is C8H10); the build takes the formula of that CAS number and, where the registry's own name
# lookup (chemicals.identifiers.search_chemical) resolves the name, requires the same formula
SYNONYMS = (
    ("n-butanol", "71-36-3"), ("xylene", "95-47-6"), ("xylenes", "95-47-6"), ("methylene chloride", "75-09-2"),
    ("ether", "60-29-7"), ("dimethylformamide", "68-12-2"), ("glucose", "50-99-7"), ("D-glucose", "50-99-7"),
    ("dextrose", "50-99-7"), ("fructose", "57-48-7"), ("D-fructose", "57-48-7"), ("lactose", "63-42-3"),
    ("maltose", "69-79-4"), ("glycerin", "56-81-5"), ("glycerine", "56-81-5"), ("propylene glycol", "57-55-6"),
    ("EDTA", "60-00-4"), ("alanine", "56-41-7"), ("L-alanine", "56-41-7"), ("valine", "72-18-4"),
    ("leucine", "61-90-5"), ("lysine", "56-87-1"), ("serine", "56-45-1"), ("glutamic acid", "56-86-0"),
    ("tris", "77-86-1"), ("HEPES", "7365-45-9"), ("MOPS", "1132-61-2"), ("methyl ethyl ketone", "78-93-3"),
    ("hexanes", "110-54-3"), ("isooctane", "540-84-1"), ("dioxane", "123-91-1"),
    ("N-methyl-2-pyrrolidone", "872-50-4"), ("N-methylpyrrolidone", "872-50-4"), ("isobutanol", "78-83-1"),
    ("sec-butanol", "78-92-2"), ("isoamyl alcohol", "123-51-3"), ("acetylacetone", "123-54-6"),
    ("tris base", "77-86-1"), ("potassium tert-butoxide", "865-47-4"), ("sodium tert-butoxide", "865-48-5"),
    ("lithium tert-butoxide", "1907-33-1"),
    # common names of a pharmacy or food shelf (INN and pharmacopoeia names; common practice)
    ("aspirin", "50-78-2"), ("acetylsalicylic acid", "50-78-2"), ("paracetamol", "103-90-2"),
    ("menthol", "89-78-1"), ("mannitol", "69-65-8"), ("sorbitol", "50-70-4"), ("niacin", "59-67-6"),
    ("nicotinamide", "98-92-0"), ("vitamin C", "50-81-7"), ("sucralose", "56038-13-2"),
    ("beta-mercaptoethanol", "60-24-2"), ("mercaptoethanol", "60-24-2"),
)
_CAS = re.compile(r"\d{2,7}-\d\d-\d")
# longer names (stereo descriptors, CAS index inversions) are not what an inventory cell holds; nor are
# names with Greek letters, typed in ASCII ("alpha-pinene") where they are typed at all
MAX_NAME_CHARS = 40


# a carbonyl halide group in a SMILES: CC(=O)Cl, C(=O)(Cl)Cl, ClC(=O)C, O=C(Cl)C
_ACYL_HALIDE_SMILES = re.compile(r"C\(=O\)\(?(?:Cl|Br|I|F)|(?:Cl|Br|I|F)C\(=O\)|O=C\((?:Cl|Br|I|F)\)|C\((?:Cl|Br|I|F)\)=O")


# a carboxylic anhydride (CC(=O)OC(=O)C) and an isocyanate (CN=C=O) in a SMILES
_ANHYDRIDE_SMILES = re.compile(r"C\(=O\)OC\(=O\)|O=C\d?OC\(=O\)|C\(=O\)OC\d?=O")
_ISOCYANATE_SMILES = re.compile(r"N=C=O|O=C=N")


def _kind(smiles: str) -> str:
    """``molecule`` for a SMILES of one component, ``acyl_halide`` for such a molecule with a carbonyl halide
    group (CC(=O)Cl: water cleaves it, which its Hill formula C2H3ClO cannot show), ``salt`` for several
    components (``[Na+].[Cl-]``), ``zwitterion`` for a molecule with a basic nitrogen and a carboxylic or
    sulfonic acid, or with its charges written (:func:`scorer.data.smiles_groups.zwitterion`), empty when
    unknown."""
    if not smiles:
        return ""
    if "." in smiles:
        return "salt"
    if _ACYL_HALIDE_SMILES.search(smiles):
        return "acyl_halide"
    if _ANHYDRIDE_SMILES.search(smiles):
        return "acid_anhydride"
    if _ISOCYANATE_SMILES.search(smiles):
        return "isocyanate"
    if zwitterion(smiles):
        # an amino acid or another inner salt (glycine, betaine, taurine): an ionic crystal of one molecule
        return "zwitterion"
    return "molecule"


# words of inorganic names that say the compound holds hydrogen (hydroxide, hydrogen..., acids, ammonium, amides,
# the -ane and -ine hydrides, phosphonium); an inorganic name without one whose formula by CAS holds hydrogen is
# the identifier table's mistake (Iron(II,III) oxide: Fe3H8O4; Magnesium germanide: GeH4Mg2; Platinum silicide:
# H3PtSi)
_HYDROGEN_WORDS = re.compile(r"hydr|acid|ammon|ammin|amin|amid|imid|azan|azin|hydrazin|ane\b|ine\b|onium|water|aqua",
                             re.I)


def _disagrees(ident, name: str, formula: str, inorganic: bool = False) -> bool:
    """Whether the package's own lookup of ``name`` gives another neutral formula than its CAS number does
    (Bismuth titanate: BiOTi by CAS, Bi2O7Ti2 by name), a hydride's name (-ane, -ine) has no hydrogen
    (Stibine: Sb by CAS), or an inorganic name that says nothing of hydrogen has a formula that holds some
    (:data:`_HYDROGEN_WORDS`): either table may be wrong, so the name is left out."""
    elements = re.findall(r"[A-Z][a-z]?", formula)
    if re.search(r"(?:ane|ine)$", name.lower()) and "H" not in elements:
        if len(elements) == 1:
            return True
    if inorganic and "H" in elements and "C" not in elements and not _HYDROGEN_WORDS.search(name):
        return True
    try:
        by_name = ident.search_chemical(name).formula
    except Exception:  # the lookup does not know the name: nothing to disagree with
        return False
    return by_name != formula and "-" not in by_name and "+" not in by_name


def _entries():
    """(source, name, formula, CAS, kind) of every candidate row, in the order of the sources."""
    import chemicals.identifiers as ident

    root = Path(os.path.dirname(ident.__file__))
    for source, file in CRC_TABLES:
        with open(root / "Misc" / file, encoding="utf-8") as handle:
            for row in csv.DictReader(handle, delimiter="\t"):
                name = row.get("Name") or row.get("Chemical") or ""
                try:
                    found = ident.search_chemical(row["CAS"])
                except Exception:  # a CAS number the identifier tables do not hold: no formula, no row
                    continue
                if _disagrees(ident, name, found.formula, source == "CRC inorganic"):
                    continue
                yield source, name, found.formula, row["CAS"], _kind(found.smiles)
    for name, cas in SYNONYMS:
        found = ident.search_chemical(cas)
        formula = found.formula
        try:
            by_name = ident.search_chemical(name).formula
        except Exception:  # a name the registry's lookup does not know: the CAS number stands
            by_name = formula
        if by_name != formula and "-" not in by_name and "+" not in by_name:  # "N-methyl-2-pyrrolidone": "N-3"
            raise ValueError(f"{name!r}: CAS {cas} is {formula}, the registry's name lookup says {by_name}")
        yield "common practice", name, formula, cas, _kind(found.smiles)
    with open(root / "Identifiers" / PUBCHEM_TABLE, encoding="utf-8") as handle:
        for line in handle:
            fields = line.rstrip("\n").split("\t")
            if len(fields) >= 9:
                for name in fields[7:9]:
                    yield "PubChem", name, fields[2], fields[1], _kind(fields[4])


def build() -> str:
    from ionicity.scorer.formula import FormulaError, parse_formula
    from ionicity.scorer.name_vocabulary import compact

    formulas: dict[str, set[str]] = {}
    first: dict[str, tuple[str, str, str, str, str]] = {}
    readable: dict[str, bool] = {}
    for source, name, formula, cas, kind in _entries():
        name = " ".join(name.split())
        if (not name or len(name) > MAX_NAME_CHARS or not name.isascii() or not formula or "+" in formula
                or "-" in formula or _CAS.fullmatch(name) or ";" in name or "$" in name
                or len(re.findall(r"[a-z]", name)) < 4 or "hydrate" in name.lower()):
            continue
        if formula not in readable:
            try:
                parse_formula(formula)
                readable[formula] = True
            except FormulaError:
                readable[formula] = False
        if not readable[formula]:
            continue
        key = compact(name)
        formulas.setdefault(key, set()).add(formula)
        first.setdefault(key, (name, formula, cas, kind, source))
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["name", "formula", "cas", "kind", "source"])
    for key in sorted(first):
        if len(formulas[key]) == 1:
            writer.writerow(first[key])
    return buf.getvalue()


if __name__ == "__main__":
    text = build()
    if "--check" in sys.argv:
        same = OUT.read_text(encoding="utf-8") == text
        print("registry_names.csv is up to date" if same else "registry_names.csv is stale: rebuild it")
        sys.exit(0 if same else 1)
    OUT.write_text(text, encoding="utf-8")
    print(f"wrote {OUT} ({text.count(chr(10)) - 1} rows)")
