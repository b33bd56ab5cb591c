"""The audit of one text before it is scored: a solution's concentration
(:mod:`scorer.solutions`) and a typing slip (:mod:`scorer.slips`) decide which
text is scored and change the row (:func:`audited_row`). Kept out of
:mod:`scorer.record` so that the record's own path stays one hook; the
record passes its scoring functions in (no import circle)."""
from __future__ import annotations

import re
from typing import Callable

from ionicity.scorer.formula import FormulaError, laboratory_code, parse_formula
from ionicity.scorer.name_reader import known_word_name, registry_entry
from ionicity.scorer.slips import Slip, find_slip, missing_count_suggestions
from ionicity.scorer.solutions import Solution, solution_note, split_grade_words, split_in_solvent, split_solution
from ionicity.scorer.verdict import Verdict, joined, with_warnings

__all__ = ["slipped_row", "solution_row", "audited_row", "code_like_row", "with_count_suggestion", "material_message",
           "polymer_name"]


def audited_row(text: str, plain_row: Callable[[str], tuple], error_row: Callable[[str], tuple],
                position: dict[str, int], parsed_row: Callable | None = None) -> tuple:
    """The row of ``text``: ``plain_row`` of its solute and of the formula it
    most plausibly meant, with the audit columns and messages set.

    ``plain_row(text)`` scores a text as written; ``error_row(message)`` is
    the row of a failure; ``position`` maps column names to places in a row.
    """
    solution = split_in_solvent(text) or split_solution(text)
    if solution is not None:
        return solution_row(audited_row(solution.solute, plain_row, error_row, position, parsed_row), solution,
                            position)
    if _NO_FORMULA_NAME.fullmatch(text) is not None:
        return error_row(material_message(text))  # "PTFE" is no PtFe, "casein" no CaInSe
    slip = find_slip(text)
    if slip is not None and _formula_then_words(text):
        slip = None  # a formula with grade or form words after it ("ZrO2 monoclinic", "CaCO3 calcite"): no slip
    material = material_message(text) if slip is not None else None
    if material is not None:
        return error_row(material)  # "brass" is no BrAsS
    if slip is not None and parsed_row is not None:
        # one word of letters that the vocabulary or the registry holds as a name ("tin", "Tin", "TIN", "iron",
        # "arsine") is that name, not a formula that lost its case or had I for l (TiN, TlN, IrON, ArSiNe)
        named = known_word_name(text)
        if named is not None:
            return parsed_row(named)
        if " " in text.strip() and registry_entry(text) is not None:
            # a name of the registry's tables written with a space ("Cucurbitacin C"): the name reader's, not a
            # re-casing of its letters into element symbols
            slip = None
    if slip is None:
        if CAPITALS_CODE.fullmatch(text):
            return code_like_row(plain_row(text), text, position, error_row)
        return plain_row(text)
    if slip.suggested:
        row = plain_row(slip.suggested)
    else:
        row = plain_row(text) if slip.kind == "leading_zero" else error_row(slip.message)
    return slipped_row(row, slip, position)


def _formula_then_words(text: str) -> bool:
    """Whether ``text`` is a formula that reads as written followed by grade or form words
    (:func:`scorer.solutions.split_grade_words`), whose letters the slip search would re-case."""
    body, words = split_grade_words(text)
    if words is None or not body:
        return False
    try:
        parse_formula(body)
    except FormulaError:
        return False
    return True


# materials a stock list names that have no one formula, and whose names the slip search would re-case into
# element symbols ("brass" as BrAsS; common practice)
_MATERIALS = {
    "brass": "an alloy of copper and zinc", "bronze": "an alloy of copper and tin", "steel": "an alloy of iron",
    "stainless steel": "an alloy of iron, chromium and nickel", "solder": "an alloy of tin (with lead or silver)",
    "glass": "a silicate glass", "cement": "a mixture of calcium silicates and aluminates",
    "concrete": "cement with sand and gravel", "seawater": "a solution of several salts",
    "petroleum ether": "a mixture of light alkanes",
    # mineral groups and laboratory materials of varying composition (common practice)
    "garnet": "a mineral group (A3B2(SiO4)3: pyrope Mg3Al2Si3O12, almandine Fe3Al2Si3O12...)",
    "olivine": "a solid solution of forsterite Mg2SiO4 and fayalite Fe2SiO4",
    "feldspar": "a mineral group (orthoclase KAlSi3O8, albite NaAlSi3O8, anorthite CaAl2Si2O8)",
    "mica": "a mineral group of layered aluminosilicates (muscovite KAl2(AlSi3O10)(OH)2...)",
    "apatite": "a mineral group (fluorapatite Ca5(PO4)3F, chlorapatite, hydroxylapatite Ca5(PO4)3(OH))",
    "zeolite": "a family of hydrated aluminosilicate frameworks",
    "zeolites": "a family of hydrated aluminosilicate frameworks",
    "molecular sieves": "a zeolite, a hydrated aluminosilicate framework of varying composition",
    "asbestos": "a group of fibrous silicate minerals (chrysotile Mg3Si2O5(OH)4, the amphiboles)",
    "montmorillonite": "a clay of varying composition (a smectite)",
    "bentonite": "a clay, mostly montmorillonite, of varying composition",
    "diatomaceous earth": "mostly amorphous silica with other oxides",
    "portland cement": "a mixture of calcium silicates and aluminates",
    "bioactive glass": "a soda-lime phosphosilicate glass (45S5: SiO2, Na2O, CaO, P2O5)",
    "alnico": "an alloy of aluminium, nickel and cobalt with iron",
}

# laboratory media a stock list names by abbreviation (common practice): solutions of several solutes; "PBS" read
# as the formula BPS
_MEDIA = {
    "pbs": "phosphate-buffered saline, a solution of NaCl, KCl, Na2HPO4 and KH2PO4 in water",
    "dpbs": "phosphate-buffered saline, a solution of NaCl, KCl, Na2HPO4 and KH2PO4 in water",
    "phosphate-buffered saline": "a solution of NaCl, KCl, Na2HPO4 and KH2PO4 in water",
    "phosphate buffered saline": "a solution of NaCl, KCl, Na2HPO4 and KH2PO4 in water",
    "lb broth": "a growth medium (tryptone, yeast extract, NaCl)",
    "lb medium": "a growth medium (tryptone, yeast extract, NaCl)",
}

# polymers and natural macromolecules a stock list names, with the formula of their repeat unit where they have
# one (IUPAC Purple Book 2008 names; common practice): no one formula either, and their abbreviations read as
# element symbols ("PTFE" as PtFe, "PVC" as P, V, C; "casein" as CaInSe, "chitin" as TiHICN)
_POLYMERS = {
    "ptfe": ("poly(tetrafluoroethylene), a polymer", "C2F4"),
    "polytetrafluoroethylene": ("poly(tetrafluoroethylene), a polymer", "C2F4"),
    "pvc": ("poly(vinyl chloride), a polymer", "C2H3Cl"),
    "polyvinyl chloride": ("poly(vinyl chloride), a polymer", "C2H3Cl"),
    "pvdf": ("poly(vinylidene fluoride), a polymer", "C2H2F2"),
    "pmma": ("poly(methyl methacrylate), a polymer", "C5H8O2"),
    "pdms": ("poly(dimethylsiloxane), a silicone polymer", "C2H6OSi"),
    "silicone oil": ("a poly(dimethylsiloxane) liquid", "C2H6OSi"),
    "hdpe": ("polyethylene, a polymer", "C2H4"), "ldpe": ("polyethylene, a polymer", "C2H4"),
    "polyethylene": ("polyethylene, a polymer", "C2H4"),
    "polypropylene": ("polypropylene, a polymer", "C3H6"),
    "polystyrene": ("polystyrene, a polymer", "C8H8"),
    "peg": ("poly(ethylene glycol), a polymer", "C2H4O"),
    "polyethylene glycol": ("poly(ethylene glycol), a polymer", "C2H4O"),
    "nylon": ("a polyamide (nylon 6: C6H11NO; nylon 6,6: C12H22N2O2 per repeat unit)", None),
    "cellulose": ("a polysaccharide of glucose", "C6H10O5"),
    "starch": ("a polysaccharide of glucose (amylose and amylopectin)", "C6H10O5"),
    "dextran": ("a polysaccharide of glucose", "C6H10O5"),
    "maltodextrin": ("a mixture of glucose oligomers", "C6H10O5"),
    "inulin": ("a polysaccharide of fructose", "C6H10O5"),
    "agar": ("a mixture of galactose polysaccharides (agarose and agaropectin)", None),
    "agarose": ("a polysaccharide of galactose and anhydrogalactose", None),
    "pectin": ("a polysaccharide of galacturonic acid", None),
    "chitin": ("a polysaccharide of N-acetylglucosamine", "C8H13NO5"),
    "chitosan": ("a polysaccharide of glucosamine", "C6H11NO4"),
    "lignin": ("a polymer of phenylpropanoid units", None),
    "gelatin": ("a protein mixture (from collagen)", None), "gelatine": ("a protein mixture (from collagen)", None),
    "collagen": ("a protein", None), "casein": ("a family of milk proteins", None), "keratin": ("a protein", None),
    "albumin": ("a protein", None),
    "lecithin": ("a mixture of phospholipids", None),
    "paraffin": ("a mixture of long-chain alkanes", None), "paraffin wax": ("a mixture of long-chain alkanes", None),
    "mineral oil": ("a mixture of alkanes", None), "petroleum jelly": ("a mixture of alkanes", None),
}

def material_message(text: str) -> str | None:
    """The error of a cell naming a material of no one formula (:data:`_MATERIALS`); None for any other text."""
    key = " ".join(text.lower().split())
    # a pore size or grade after a material's name ("Molecular sieves 4A", "Silica gel 60") names the same material
    glass = _GLASSES.get(text.strip())
    if glass is not None:
        return f"{text.strip()!r} is {glass}, of no one formula: write the composition of your film as a formula"
    bare = re.sub(r"\s+\d+\s*(?:a|å|angstrom|x)?$", "", key)
    if bare in _CODES and not text.strip()[:len(bare)].isupper():
        return None  # an abbreviation counts in capitals only: "pbs" may be PbS typed in lower case
    medium = _MEDIA.get(key) or _MEDIA.get(bare)
    if medium is not None:
        return (f"{text.strip()!r} is {medium}, of no one formula: score its components as a mixture or one by one"
                " (e.g. NaCl, KCl, Na2HPO4, KH2PO4)")
    polymer = _POLYMERS.get(key) or _POLYMERS.get(bare)
    if polymer is not None:
        what, unit = polymer
        return (f"{text.strip()!r} is {what}, of no one formula" + (
            f": its repeat unit {unit} can be scored as a formula (a small molecule's values, not the polymer's)"
            if unit else ": score a defined component as a formula or a name"))
    material = _MATERIALS.get(key) or _MATERIALS.get(bare)
    if material is None:
        return None
    return (f"{text.strip()!r} is {material}, of no one formula: write its composition as a formula or a mixture"
            " (e.g. Cu-37Zn for a brass, Fe-18Cr-8Ni for a stainless steel)")


def _keys_pattern(keys) -> str:
    return "|".join(re.escape(k).replace("\\ ", r"\s+") for k in sorted(keys, key=len, reverse=True))


# the abbreviations in capitals as written (PbS is lead sulfide, not PBS), the names in any case; a grade number
# after them ("PEG 400", "PBS 10x"); one regular-expression call per cell
_CODES = {k for k in (*_POLYMERS, *_MEDIA) if k.isalpha() and len(k) <= 5 and k not in ("agar", "nylon")}
# glasses of varying composition named by an abbreviation in mixed case, matched as written
_GLASSES = {"LiPON": "lithium phosphorus oxynitride, an amorphous thin-film electrolyte of varying composition"
                     " (about Li2.9PO3.3N0.46; common practice)"}
GLASS_CODES = frozenset(_GLASSES)
_NO_FORMULA_NAME = re.compile(
    r"\s*(?:" + _keys_pattern(_GLASSES) + "|" + _keys_pattern(k.upper() for k in _CODES) + "|(?i:"
    + _keys_pattern(k for k in (*_POLYMERS, *_MEDIA) if k not in _CODES) + r"))(?:\s+\d+x?)?\s*")


def polymer_name(text: str) -> bool:
    """Whether ``text`` names a polymer or natural macromolecule of :data:`_POLYMERS` (a grade number after it
    allowed: "PEG 400"), or a laboratory medium of :data:`_MEDIA` ("PBS", "PBS 10x"): names whose letters read
    as element symbols, checked before any other reading. Abbreviations count in capitals only.

    >>> polymer_name("PTFE"), polymer_name("PEG 400"), polymer_name("PBS 10x"), polymer_name("Casein")
    (True, True, True, True)
    >>> polymer_name("PbS"), polymer_name("NaCl")
    (False, False)
    """
    return _NO_FORMULA_NAME.fullmatch(text) is not None


# a whole cell of three to six capitals, which reads as one-letter element symbols: the shape of a laboratory
# abbreviation (PBS, NBS, BPO) as much as of a formula (KCN, KOH, KSCN)
CAPITALS_CODE = re.compile(r"\s*[A-Z]{3,6}\s*")
# the classes a formula of capitals usually means (KCN, HCN, KOH, KSCN, KOCN); any other reading of an
# abbreviation-shaped text is said (common practice)
_FORMULA_CLASSES = frozenset({"ionic_salt", "acid", "base", "ionic_liquid_pair"})
# hydrogen isotopes where a capital code may mean them: semi-heavy water HDO, DTO
_HYDROGEN_AND_OXYGEN = frozenset({"H", "D", "T", "O"})


def code_like_row(row: tuple, text: str, position: dict[str, int], error_row: Callable[[str], tuple]) -> tuple:
    """The row of a text of capitals alone that reads as a formula: an error where only deuterium or
    tritium make it read ("SDS" as DS2, "DTT" as DT2, "BHT" as B, H, T: abbreviations, not isotopes), a
    warning where the reading is neither a salt nor an acid or base ("PBS" as BPS, "NCS" as CNS); the
    row unchanged otherwise (KCN, KOH, KSCN)."""
    status, normalized = row[position["status"]], row[position["formula_normalized"]]
    if status == "error" or not normalized or laboratory_code(text) is not None:
        return row
    symbols = set(_SYMBOLS.findall(normalized))
    stripped = text.strip()
    if symbols <= _HYDROGEN_AND_OXYGEN:
        return row  # water of the hydrogen isotopes (HDO, D2O)
    if symbols & {"D", "T"}:
        return error_row(
            f"{stripped!r} reads as a formula only with deuterium or tritium ({normalized}): it looks like an"
            " abbreviation the code table does not hold; write the formula or the name")
    if row[position["substance_class"]] in _FORMULA_CLASSES or stripped.startswith("CH"):
        return row  # a salt, acid or base (KCN, KOH), or an organic formula in Hill order (CHFO)
    row = list(row)
    verdict = with_warnings(Verdict(status, row[position["message"]] or "", row[position["value_notes"]] or ""), [
        f"{stripped!r} read as the formula {normalized}; if it is an abbreviation, write the formula or the name"])
    row[position["status"]], row[position["message"]] = verdict.status, verdict.message
    return tuple(row)


_SYMBOLS = re.compile(r"[A-Z][a-z]?")

# the messages of rows whose formula most likely lost a count (scorer.substance, scorer.applicability)
_COUNT_MESSAGES = ("no charge-balanced set of ions found", "missing from the formula as written")


def with_count_suggestion(row: tuple, text: str, position: dict[str, int]) -> tuple:
    """``row`` with the formulas one count away that read as a salt, acid or base
    (:func:`scorer.slips.missing_count_suggestions`) named in its message, where the message says a
    count may be missing or no ions balance: "did you mean Na2SO4?" for NaSO4. The row's values and
    status stay those of the text as written."""
    message = row[position["message"]]
    if not message or (_COUNT_MESSAGES[0] not in message and _COUNT_MESSAGES[1] not in message):
        return row
    suggestions = missing_count_suggestions(text.strip())
    if not suggestions:
        return row
    row = list(row)
    row[position["message"]] = f"{message} (did you mean {' or '.join(suggestions)}?)"
    return tuple(row)


def slipped_row(row: tuple, slip: Slip, position: dict[str, int]) -> tuple:
    """``row`` (the suggested formula's, or an error) with the slip named in
    its message and the suggestion in ``formula_suggested``: never ``ok``."""
    row = list(row)
    verdict = Verdict(row[position["status"]], row[position["message"]] or "", row[position["value_notes"]] or "")
    if verdict.status == "error":
        message = joined([slip.message, verdict.message]) if slip.suggested else verdict.message or slip.message
        row[position["message"]] = message
        return tuple(row)
    verdict = with_warnings(Verdict(verdict.status, "", verdict.value_notes), [slip.message, verdict.message])
    row[position["status"]] = verdict.status
    row[position["message"]] = verdict.message
    row[position["formula_suggested"]] = slip.suggested or None
    return tuple(row)


def solution_row(row: tuple, solution: Solution, position: dict[str, int]) -> tuple:
    """``row`` (the solute's) with the concentration as written and the
    solution's note (and, for an acid or a base, the caution)."""
    row = list(row)
    row[position["concentration_as_written"]] = solution.concentration or None
    if row[position["status"]] != "error":
        note = solution_note(solution, row[position["substance_class"]] or "")
        row[position["value_notes"]] = joined([note, row[position["value_notes"]] or ""])
    return tuple(row)
