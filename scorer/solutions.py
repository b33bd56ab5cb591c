"""Solutions and grades written after a formula: ``HCl 37%``, ``NaOH 1 M``,
``H2SO4 conc.``, ``NH3 (aq) 25%``, ``HNO3 65 % w/w``, ``KOH 0.1 mol/L``, or before it
as bottle labels write them: ``0.1 M NaCl``, ``37% HCl``, ``conc. HNO3``.

:func:`split_solution` takes the concentration (or grade word) off the end of
the text, as written with its unit, and leaves the solute's formula, which is
scored as a compound. The values of such a row are those of the pure solute,
not of the solution; the row's ``value_notes`` says so, and for a solution of
an acid or a base quotes the one caution text (:mod:`scorer.caution`) with a
pointer to the safety data sheet.

>>> split_solution("HCl 37%")
Solution(solute='HCl', concentration='37 %')
>>> split_solution("NH3 (aq) 25%")
Solution(solute='NH3', concentration='25 %')
>>> split_solution("KOH 0.1 mol/L")
Solution(solute='KOH', concentration='0.1 mol/L')
>>> split_solution("H2SO4 conc.")
Solution(solute='H2SO4', concentration='conc.')
>>> split_solution("0.1 M NaCl"), split_solution("conc. HNO3").concentration
(Solution(solute='NaCl', concentration='0.1 M'), 'conc.')
>>> split_solution("NaCl") is None
True
"""
from __future__ import annotations

import dataclasses
import re
from dataclasses import dataclass, field

from ionicity.scorer.caching import once
from ionicity.scorer.caution import CAUTION
from ionicity.scorer.name_vocabulary import compact
from ionicity.scorer.tables import table

__all__ = ["Solution", "named_solution", "split_solution", "split_in_solvent", "solution_note", "split_grade_words", "CORROSIVE_CLASSES"]

# substance classes whose solutions are corrosive (common practice)
CORROSIVE_CLASSES = frozenset({"acid", "base"})

# a value or a range (95-98 %)
_NUMBER = r"\d+(?:[.,]\d+)?(?:\s*[-–]\s*\d+(?:[.,]\d+)?)?"
_PERCENT = re.compile(rf"(?P<value>{_NUMBER})\s*(?P<pre>(?:wt|vol|mass)\.?\s*)?%\s*"
                      rf"(?P<basis>\(?\s*(?:w/w|w/v|v/v|wt|vol|m/m)\s*\.?\)?)?", re.I)
# molar units as people write them; N (normality) kept as written
_MOLAR = re.compile(
    rf"(?P<value>{_NUMBER})\s*(?P<unit>mol\s*/\s*[lL]|mol\s*[lL]-1|mol\s*dm-3|mmol\s*/\s*[lL]|mol\s*/\s*kg|mol\s*kg-1"
    # molality, mol per kg of solvent, as electrolyte papers write it ("21 m LiTFSI", water-in-salt; common practice)
    rf"|mM|M|N|m)(?![A-Za-z])"
)
_GRADE = re.compile(r"(?P<word>conc(?:\.|entrated)?|dil(?:\.|ute)?|fuming|glacial|sat(?:\.|urated)?)", re.I)
# the pH of a buffer written last ("Tris-HCl pH 8.0", "HEPES, pH 7.5"): a solution of that pH (common practice)
_PH = re.compile(r"(?P<ph>pH\s*=?\s*\d{1,2}(?:[.,]\d+)?)(?![\d.,])")
# a concentration written in brackets at the end: "HCl (37%)"
_BRACKETED_TAIL = re.compile(r"\s*\(\s*([^()]*?)\s*\)\s*$")
_STATE = re.compile(r"\(\s*aq\.?\s*\)|\baq\.?(?=\s|$)|\bsoln\.?|\bsolution\b|\b(?P<form>dispersion|suspension|slurry)\b", re.I)
_TAIL_BEFORE = re.compile(r"[\s,;]+$")
# the basis of a percentage written last, after the solute ("10% H2SO4 v/v")
_TRAILING_BASIS = re.compile(r"\s+(\(?\s*(?:w/w|w/v|v/v|m/m)\s*\)?)\s*$", re.I)


# the same concentrations written before the solute, and a molar amount after "+" (a solute in what precedes)
_LEADING = tuple((p, re.compile(rf"^(?P<c>{p.pattern})\s+(?P<rest>[A-Z(\[].*)$", p.flags)) for p in (_MOLAR, _PERCENT, _GRADE))
_PLUS_MOLAR = re.compile(rf"^(?P<solvent>\S.*?)(?:\s*\+\s*|\s+with\s+)(?P<c>{_MOLAR.pattern})\s+(?P<rest>\S.*)$")
# the same with the molar amount after the solute: "[C4mim][BF4] + LiBF4 0.5 M"
_PLUS_SOLUTE_MOLAR = re.compile(
    rf"^(?P<solvent>\S.*?)(?:\s*\+\s*|\s+with\s+)(?P<rest>[A-Z(\[]\S*)\s+(?P<c>{_MOLAR.pattern})$")
# a concentration written last, after the solvent: "NaCl in water 1 M", "LiTFSI in [C4mpyr][NTf2] 1 M"
_TRAILING_CONCENTRATION = tuple(re.compile(rf"^(?P<solvent>\S.*?)\s+(?P<c>{p.pattern})$", p.flags)
                                for p in (_MOLAR, _PERCENT))


@dataclass(frozen=True)
class Solution:
    """A solute's formula, its concentration as written (``37 %``; empty when none is written)
    and the solvent as written after ``in`` (``EC/DMC``; empty for the plain forms)."""

    solute: str
    concentration: str
    solvent: str = field(default="", repr=False)
    # what the label calls it: a solution, or a dispersion, suspension or slurry ("NaH 60% dispersion in
    # mineral oil")
    form: str = field(default="solution", repr=False)
    # a solution named by a trivial name (scorer/data/solution_names.csv): the name and its caution
    name: str = field(default="", repr=False)
    caution: str = field(default="", repr=False)


@once
def _solution_names() -> dict[str, dict[str, str]]:
    return {compact(row["name"]).replace("'", ""): row for row in table("solution_names.csv")}


def named_solution(text: str) -> Solution | None:
    """The solution a trivial name means ("brine", "bleach", "normal saline", "formalin";
    ``scorer/data/solution_names.csv``), with its usual strength and caution; None for other text.

    >>> s = named_solution("Normal saline")
    >>> s.solute, s.concentration
    ('NaCl', '0.9 % w/v')
    >>> named_solution("bleach").caution[:24], named_solution("NaCl") is None
    ('never mix with acids (it', True)
    """
    if not isinstance(text, str) or len(text) > 60:
        return None
    row = _solution_names().get(compact(text).replace("'", "").replace("’", ""))
    if row is None:
        return None
    return Solution(row["solute"], row["concentration"], name=row["name"], caution=row["caution"])


# a solute in a named solvent, as electrolyte and stock-solution labels write it:
# "1 M LiPF6 in EC/DMC", "LiTFSI (1 M) in DME/DOL", "NaCl in water" (common practice)
_IN_SOLVENT = re.compile(r"^(?P<left>\S.*?)\s+in\s+(?P<solvent>\S.*)$", re.I)
_MOLAR_BEFORE_SOLVENT = re.compile(rf"^(?P<left>[A-Z(\[]\S*)\s+(?P<c>{_MOLAR.pattern})\s+(?P<solvent>[A-Za-z].*)$")
# "1M LiPF6 EC:EMC 3:7": the molar amount first, the solute, then the solvent codes (common practice)
_MOLAR_SOLUTE_SOLVENT = re.compile(rf"^(?P<c>{_MOLAR.pattern})\s+(?P<left>[A-Z(\[]\S*)\s+(?P<solvent>[A-Za-z].*)$")
# what may stand beside the solvents' codes in a blend's description: ratios, percentages and their bases
_RATIO_WORD = re.compile(r"^(?:\d+(?:\.\d+)?%?|v|w|wt%?|vol%?|by|volume|weight|mass)$", re.I)


@once
def _solvent_codes() -> frozenset[str]:
    return frozenset(row["code"].upper() for row in table("solvent_codes.csv"))


def _solvent_words(text: str) -> bool:
    """Whether ``text`` is a blend of laboratory solvent codes with its ratio (``EC/EMC 3/7``, ``EC:DMC (1:1 v/v)``)."""
    words = [w for w in re.split(r"[\s/:,;()\-]+", text) if w]
    return bool(words) and any(w.upper() in _solvent_codes() or w.lower() == "water" for w in words) and all(
        w.upper() in _solvent_codes() or w.lower() == "water" or _RATIO_WORD.match(w) for w in words)


# the oils reactive metals are kept under ("Na in mineral oil"): a storage medium, not a solvent
_STORAGE_OIL = re.compile(r"^(?:(?:mineral|paraffin|light)\s+)?oil$|^kerosene$|^paraffin$", re.I)
# a solute, then its strength and medium in brackets ("NaH (60% dispersion in mineral oil)", "KH (30% in oil)")
_BRACKETED_MEDIUM = re.compile(r"^\s*(?P<solute>\S+)\s*\((?P<inner>\s*\d[^()]*?\s+in\s+[^()]+)\)\s*$", re.I)


def split_in_solvent(text: str) -> Solution | None:
    """The solute, its concentration (written before or after it) and the solvent of
    ``SOLUTE in SOLVENT``; None for any other text.

    >>> s = split_in_solvent("1 M LiPF6 in EC/DMC (1:1 v/v)")
    >>> s.solute, s.concentration, s.solvent
    ('LiPF6', '1 M', 'EC/DMC (1:1 v/v)')
    >>> s = split_in_solvent("LiTFSI (0.5 mol/L) in DME")
    >>> s.solute, s.concentration
    ('LiTFSI', '0.5 mol/L')
    >>> split_in_solvent("NaCl in water").concentration, split_in_solvent("Sn in") is None
    ('', True)
    >>> s = split_in_solvent("LiPF6 1.0M EC/EMC 3/7")
    >>> s.solute, s.concentration, s.solvent
    ('LiPF6', '1.0 M', 'EC/EMC 3/7')
    >>> s = split_in_solvent("1M LiPF6 EC:EMC 3:7")
    >>> s.solute, s.concentration, s.solvent
    ('LiPF6', '1 M', 'EC:EMC 3:7')
    >>> s = split_in_solvent("[C4mim][BF4] + 0.5 M LiBF4")
    >>> s.solute, s.concentration, s.solvent
    ('LiBF4', '0.5 M', '[C4mim][BF4]')
    >>> s = split_in_solvent("[C4mim][BF4] + LiBF4 0.5 M")
    >>> s.solute, s.concentration, s.solvent
    ('LiBF4', '0.5 M', '[C4mim][BF4]')
    >>> s = split_in_solvent("LiTFSI in [C4mpyr][NTf2] 1 M")
    >>> s.solute, s.concentration, s.solvent
    ('LiTFSI', '1 M', '[C4mpyr][NTf2]')
    >>> s = split_in_solvent("NaH (60% dispersion in mineral oil)")
    >>> s.solute, s.concentration, s.solvent
    ('NaH', '60 %', 'mineral oil')
    """
    if not isinstance(text, str) or len(text) > 200:
        return None
    if text.rstrip().endswith(")"):
        # the strength and medium in brackets after the solute: "NaH (60% dispersion in mineral oil)"
        bracketed = _BRACKETED_MEDIUM.match(text)
        if bracketed is not None:
            return split_in_solvent(f"{bracketed.group('solute')} {bracketed.group('inner')}")
    m = _IN_SOLVENT.match(text.strip())
    if m is None:
        # "LiPF6 1.0M EC/EMC 3/7": a molar amount between the solute and solvent codes, as electrolyte labels write
        bare = _MOLAR_BEFORE_SOLVENT.match(text.strip()) or _MOLAR_SOLUTE_SOLVENT.match(text.strip())
        if bare is not None and _solvent_words(bare.group("solvent")):
            return Solution(bare.group("left"), _as_written(_MOLAR, _MOLAR.match(bare.group("c"))),
                            bare.group("solvent").strip())
        # "[C4mim][BF4] + 0.5 M LiBF4": a molar amount after "+" is a solute in what comes before it
        plus = _PLUS_MOLAR.match(text.strip()) if ("+" in text or " with " in text) else None
        if plus is None and ("+" in text or " with " in text):
            plus = _PLUS_SOLUTE_MOLAR.match(text.strip())
        if plus is None:
            return None
        return Solution(plus.group("rest").strip(), _as_written(_MOLAR, _MOLAR.match(plus.group("c"))),
                        plus.group("solvent").strip())
    left, solvent = m.group("left").strip(), m.group("solvent").strip()
    if _STORAGE_OIL.match(solvent) and not any(p.search(left) for p in (_MOLAR, _PERCENT)):
        # "potassium in mineral oil", "Li in oil": how a reactive metal is kept, not a solution (a dispersion
        # states its strength: "NaH (60% dispersion in mineral oil)"); the grade words take it
        return None
    for pattern in (_MOLAR, _PERCENT):
        lead = re.match(rf"^(?P<c>{pattern.pattern})\s+(?P<rest>\S.*)$", left, pattern.flags)
        if lead:
            inner = pattern.match(lead.group("c"))
            return Solution(lead.group("rest").strip(), _as_written(pattern, inner), solvent)
    trailing = split_solution(left)
    if trailing is not None:
        return Solution(trailing.solute, trailing.concentration, solvent, form=trailing.form)
    for pattern, after in zip((_MOLAR, _PERCENT), _TRAILING_CONCENTRATION):
        last = after.match(solvent)
        if last is not None:
            return Solution(left, _as_written(pattern, pattern.match(last.group("c"))), last.group("solvent").strip())
    return Solution(left, "", solvent)


def split_solution(text: str) -> Solution | None:
    """The solute and the concentration written after it, or None when the
    text names no concentration or grade. A solution's trivial name
    (:func:`named_solution`), alone or with a strength ("bleach 5 %"), is that solution.

    Parameters
    ----------
    text : str
        Formula text as typed.

    Returns
    -------
    Solution or None
        ``concentration`` as written, spaced canonically: ``37 %``,
        ``65 % w/w``, ``1 M``, ``0.1 mol/L``, ``conc.``.
    """
    if not isinstance(text, str) or len(text) > 200:
        return None
    named = named_solution(text)
    if named is not None:
        return named
    found = _split_solution(text)
    if found is not None and not found.name:
        inner = named_solution(found.solute)
        if inner is not None:
            return Solution(inner.solute, found.concentration or inner.concentration, name=inner.name,
                            caution=inner.caution)
    return found


def _split_solution(text: str) -> Solution | None:
    found = _split_solution_text(text)
    form = next((m.group("form").lower() for m in _STATE.finditer(text) if m.group("form")), None)
    if found is None or form is None:
        return found
    return dataclasses.replace(found, form=form)


def _split_solution_text(text: str) -> Solution | None:
    body = _STATE.sub(" ", text).strip()
    stated = body != text.strip()  # "solution", "soln.", "(aq)", "aq." was written
    tail = _BRACKETED_TAIL.search(body)
    if tail and any(p.fullmatch(tail.group(1)) for p in (_PERCENT, _MOLAR, _GRADE)):
        body = body[:tail.start()] + " " + tail.group(1)
    for pattern, leading in _LEADING:
        # or the first, before a space, as bottle labels write it: "0.1 M NaCl", "37% HCl", "conc. HNO3"
        lead = leading.match(body)
        if lead and pattern is _PERCENT:
            # the basis of a leading percentage may follow the solute: "10% H2SO4 v/v"
            basis = _TRAILING_BASIS.search(lead.group("rest"))
            if basis and basis.start() > 0 and not pattern.match(lead.group("c")).group("basis"):
                rest = lead.group("rest")[:basis.start()]
                written = pattern.match(f"{lead.group('c')} {basis.group(1)}")
                if split_solution(rest) is None:
                    return Solution(rest.strip(), _as_written(pattern, written))
        if lead and split_solution(lead.group("rest")) is None:
            return Solution(lead.group("rest").strip(), _as_written(pattern, pattern.match(lead.group("c"))))
    for pattern in (_PERCENT, _MOLAR, _GRADE, _PH):
        # the concentration is the last thing written, after a space
        for m in pattern.finditer(body):
            if m.end() != len(body) or m.start() == 0 or not body[m.start() - 1].isspace():
                continue
            solute = _TAIL_BEFORE.sub("", body[:m.start()])
            if not solute or not solute[0].isalpha() and solute[0] not in "([":
                return None
            return Solution(solute, _as_written(pattern, m))
    body = " ".join(body.split())
    if stated and body and (body[0].isalpha() or body[0] in "([") and not _TAIL_BEFORE.search(body):
        # a solution of unstated strength: "NaOCl solution", "sodium hypochlorite solution", "NH3 (aq)"; its words
        # are no formula ("solution" was re-cased into S, O, Lu, Ti, O, N)
        return Solution(body.rstrip(" ,;"), "")
    return None


def _as_written(pattern, m: re.Match) -> str:
    if pattern is _PERCENT:
        basis = (m.group("basis") or "").strip(" ()").lower() or {"wt": "w/w", "mass": "w/w", "vol": "v/v"}.get(
            (m.group("pre") or "").strip(" .").lower(), "")
        value = re.sub(r"\s*[-–]\s*", "-", m.group("value"))
        return f"{value} %" + (f" {basis}" if basis else "")
    if pattern is _MOLAR:
        unit = re.sub(r"\s+", "", m.group("unit"))
        value = re.sub(r"\s*[-–]\s*", "-", m.group("value"))
        return f"{value} {unit}"
    if pattern is _PH:
        return "pH " + re.sub(r"^pH\s*=?\s*", "", m.group("ph")).replace(",", ".")
    word = m.group("word").lower()
    return {"concentrated": "conc.", "conc": "conc.", "dilute": "dil.", "dil": "dil.", "saturated": "sat.",
            "sat": "sat."}.get(word, word)


def solution_note(solution: Solution, substance_class: str) -> str:
    """What the row's ``value_notes`` says about a solution: the values are
    the pure solute's, and, for an acid or a base, the caution.

    >>> solution_note(Solution("NaCl", "1 M"), "ionic_salt")
    'a solution (1 M): the values are for the pure solute, not for the solution'
    """
    strength = f" ({solution.concentration})" if solution.concentration else ""
    solvent = f" in {solution.solvent}" if solution.solvent else ""
    named = f" ('{solution.name}' read as a solution of {solution.solute})" if solution.name else ""
    form = solution.form
    note = f"a {form}{strength}{solvent}{named}: the values are for the pure solute, not for the {form}"
    if solution.solvent:
        note += "; the solvent is not scored"
    if solution.caution:
        note += f"; caution: {solution.caution} (read the safety data sheet before handling it)"
    if substance_class in CORROSIVE_CLASSES:
        note += (
            f"; a solution of {'an' if substance_class[0] in 'aeiou' else 'a'} {substance_class} is corrosive:"
            " read the safety data sheet before handling,"
            f" diluting or mixing it ({CAUTION})"
        )
    return note


# a stock line's lot, catalogue and expiry fields and where the bottle stands ("KCl, 99%, Lot 12345",
# "NaCl cat. no. S7653", "CuSO4 exp. 2027-03", "KNO3 shelf B3"; common practice)
_STOCK_FIELD_WORD = (
    # (the keyword whole, and a number in the field: "Wilkinson's catalyst" and "room temperature" are no fields)
    r"(?:lot|batch|cat|catalog(?:ue)?|product|item|art|ref|order)(?![a-z])\.?\s*(?:no\.?|number|nr\.?|#)?\s*[:#]?\s*"
    r"[A-Za-z]*\d[\w./-]*"
    r"|(?:exp(?:iry|ires|iration)?|best\s+before|received|opened)(?![a-z])\.?\s*(?:date)?\s*:?\s*\d[\d./-]*"
    r"|\#\s*[A-Za-z]*\d[\w./-]*"
    r"|(?:shelf|cabinet|cupboard|room|rack|bin|fridge|freezer|store|location)(?![a-z])\s*:?\s*[A-Za-z]*\d[\w./-]*"
)
_STOCK_FIELD = re.compile(rf"(?:^|[\s,;])(?:{_STOCK_FIELD_WORD})", re.I)


# grade, purity and form words that catalogues and stock lists write after a formula or a
# name ("NaOH pellets", "Na2SO4 anhydrous", "NaCl ACS reagent, 99.5%"; common practice)
_GRADE_WORD = (
    r"anhydrous|anhydr\.?|anhyd\.?|pellets?|powder(?:ed)?|flakes?|granular|granules?|crystals?|crystalline|cryst\.?"
    r"|beads?|lumps?|pieces?|chips?|shot|wire|foil|sticks?|rods?|ingots?|turnings|dust|fine|coarse|dried|fused"
    r"|filings|shavings|swarf|mossy|sponge|needles|pastilles|prills"
    r"|precipitated|sublimed|resublimed|purified|recrystalli[sz]ed|distilled|redistilled|ACS|reagent|grade|technical|tech\.?|pure|puriss\.?|p\.\s?a\.|extra|ultrapure|analytical"
    r"|for\s+analysis|AR|LR|GR|USP|BP|EP|Ph\.?\s?Eur\.?|FCC|HPLC|min\.?|approx\.?|ca\.?"
    # a solvent's grades ("ethanol absolute", "acetonitrile for HPLC", "chloroform stabilised")
    r"|absolute|dry|spectroscopic|spectrophotometric|GC|for\s+(?:synthesis|HPLC|spectroscopy)|stabili[sz]ed"
    # alcohol strength in US proof ("ethanol 200 proof", "190 proof": twice the volume percent)
    r"|\d{2,3}\s*proof"
    # a metal as the metal ("sodium metal", "lithium metal, ribbon"), and how a reactive metal is kept
    # ("Na metal under oil", "potassium in mineral oil", "lithium under argon"; common practice)
    r"|metal|ribbon|granulate"
    r"|(?:under|in)\s+(?:mineral\s+|paraffin\s+|light\s+)?oil|(?:under|in)\s+(?:kerosene|paraffin)|under\s+(?:argon|nitrogen)"
    # a gas cylinder's label ("argon gas", "nitrogen, compressed", "ammonia, anhydrous, liquefied")
    r"|gas|gaseous|compressed|liquefied|cylinder"
    r"|(?:[≥>]=?\s*)?\d+(?:[.,]\d+)?\s*%"
    # more catalogue grades ("KBr IR grade", "KCl 99.999% trace metals basis", "NaCl BioXtra")
    r"|IR|trace\s+metals?\s+basis|metals\s+basis|basis|ReagentPlus|BioXtra|BioReagent|BioUltra|SigmaUltra|Emsure"
    r"|optical|semiconductor|electronic|battery|puratronic|spectrosil|nanopowder|nanoparticles?|mesh|\d+\s*mesh|-\d+\s*mesh"
    # the package size of a stock list ("NaCl 500g", "NaCl, 500 g", "KCl 2.5 kg", "HCl 2.5 L", "NaCl - 2 bottles")
    r"|\d+(?:[.,]\d+)?\s*(?:kg|g|mg|L|l|mL|ml|lb|lbs|oz)\.?(?![A-Za-z])|x\s*\d+|\d+\s*(?:bottles?|jars?|packs?|units?|pcs)"
    # the container a stock line names ("KNO3 500 g bottle"), and the activity grade of chromatography alumina
    r"|bottles?|jars?|cans?|drums?|bags?|ampoules?|ampules?|vials?|tins?|sachets?|neutral|acidic"
    rf"|{_STOCK_FIELD_WORD}"
)
# the crystal form a materials table writes after the formula ("TiO2 rutile", "SiO2 amorphous", "BN hexagonal",
# "ZrO2-monoclinic", "Fe2O3 alpha phase"): the composition is scored, not the polymorph (common practice)
_FORM_WORD = (
    r"rutile|anatase|brookite|amorphous|monoclinic|tetragonal|cubic|hexagonal|orthorhombic|trigonal|rhombohedral"
    r"|triclinic|wurtzite|zinc[\s-]?blende|sphalerite|rock[\s-]?salt|corundum|spinel|perovskite|fluorite|quartz"
    r"|cristobalite|tridymite|coesite|hematite|magnetite|maghemite|calcite|aragonite|vaterite|gibbsite|boehmite"
    r"|goethite|scheelite|olivine|garnet|kesterite|chalcopyrite|pyrite|marcasite|zircon|baddeleyite"
    # (a Greek letter and "phase" are two words: "alpha phase" has one reading, not two, so no pattern backtracks)
    r"|alpha|beta|gamma|delta|theta|kappa|eta|α|β|γ|δ|θ|κ|η|phase|polymorph"
    r"|nanocrystalline|polycrystalline|single[\s-]crystals?|thin[\s-]films?|films?|bulk|glassy|sintered|ceramic"
    r"|nanorods?|nanowires?|nanotubes?|nanosheets?|whiskers?|fib(?:er|re)s?|microspheres?|nano"
)
# the words may also stand in brackets: "NaCl (ACS reagent)", "KCl (99.5 %, AR)"
_GRADE_ITEM = (rf"(?:{_GRADE_WORD}|{_FORM_WORD}|\(\s*(?:{_GRADE_WORD}|{_FORM_WORD})"
               rf"(?:[\s,;]+(?:{_GRADE_WORD}|{_FORM_WORD}))*\s*\))")
_GRADE_TAIL = re.compile(
    rf"(?:(?:[\s,;]+|\s+-\s+)(?:{_GRADE_ITEM})|-(?:{_FORM_WORD})(?![A-Za-z]))+\s*[.,;]?\s*$", re.I)
# the same words before the name, as cylinder and dewar labels write them ("liquid nitrogen", "compressed air",
# "anhydrous ammonia"; common practice)
_GRADE_HEAD = re.compile(r"^\s*(?:(?:liquid|liquefied|compressed|anhydrous|gaseous|cryogenic|refrigerated"
                         r"|amorphous|crystalline|nanocrystalline|polycrystalline|fused|nano|sintered|glassy)\s+)+",
                         re.I)


def split_stock_fields(text: str) -> tuple[str, str] | None:
    """(the text before them, the words) where the grade and form words at the end of ``text`` hold a stock
    line's lot, catalogue, expiry or location field; None otherwise. Read before the mixture reader, whose
    separators (":" in "lot: 1234") such a field would otherwise split.

    >>> split_stock_fields("sodium chloride, lot: 1234-56, exp 03/2027")
    ('sodium chloride', 'lot: 1234-56, exp 03/2027')
    >>> split_stock_fields("NaCl, 99%") is None, split_stock_fields("NaCl:KCl 1:1") is None
    (True, True)
    """
    if not isinstance(text, str) or _STOCK_FIELD.search(text) is None:
        return None
    body, words = split_grade_words(text)
    if words is None or not body or _STOCK_FIELD.search(" " + words) is None:
        return None
    return body, words


def split_grade_words(text: str) -> tuple[str, str | None]:
    """(text without the grade and form words at its end, the words as written or None).

    >>> split_grade_words("NaOH pellets")
    ('NaOH', 'pellets')
    >>> split_grade_words("Sodium chloride, ACS reagent, 99.5%")
    ('Sodium chloride', 'ACS reagent, 99.5%')
    >>> split_grade_words("NaCl")
    ('NaCl', None)
    >>> split_grade_words("NaCl (ACS reagent)"), split_grade_words("KCl 99.999% trace metals basis")[0]
    (('NaCl', '(ACS reagent)'), 'KCl')
    >>> split_grade_words("NaCl, 500 g"), split_grade_words("NaCl - 2 bottles")[0], split_grade_words("NaCl-KCl")
    (('NaCl', '500 g'), 'NaCl', ('NaCl-KCl', None))
    >>> split_grade_words("KCl, 99%, Lot 12345"), split_grade_words("NaCl cat. no. S7653 shelf B3")[0]
    (('KCl', '99%, Lot 12345'), 'NaCl')
    >>> split_grade_words("liquid nitrogen"), split_grade_words("argon gas")
    (('nitrogen', 'liquid'), ('argon', 'gas'))
    """
    if not isinstance(text, str):
        return text, None
    head = _GRADE_HEAD.match(text)
    if head is not None and head.end() < len(text):
        body, words = split_grade_words(text[head.end():])
        lead = head.group().strip()
        return body, f"{lead}, {words}" if words else lead
    m = _GRADE_TAIL.search(text)
    if m is None or m.start() == 0:
        return text, None
    return text[:m.start()].rstrip(" ,;"), re.sub(r"^-(?=\s|[^\W\d_])\s*", "", text[m.start():].strip(" ,;.")) or None
