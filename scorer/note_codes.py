"""Short codes for the notes of ``value_notes`` in output files.

A ``value_notes`` cell joins a row's notes with ``; `` and can run to
hundreds of characters. Output files write each registered note as a short
code (with the ion it names in brackets: ``hsab_no_IA(SO4(2-))``), explained
once by ``ionicity columns --notes``; ``ionicity explain`` and the Python API
keep the long text. A note no entry matches is written unchanged, so a new
or reworded note is never lost, only left long: register it here (one line)
to shorten it. The descriptor modules' wording is not touched.
"""
from __future__ import annotations

import re

from ionicity.scorer.caching import once

__all__ = ["NOTE_CODES", "short_notes", "notes_table"]

#: (code, the note's text as a regular expression, what it means). ``{ion}``
#: in a pattern (or a group named ``ion``) captures the ion or figure it
#: names, written in brackets after the code.
NOTE_CODES: tuple[tuple[str, str, str], ...] = (
    ("hydrate_anhydrous",
     r"descriptors are for the anhydrous salt \(its lattice water, counted in hydrate_water, is not modelled;"
     r" a hydrate usually melts or loses its water far lower\)",
     "descriptors are for the anhydrous salt; lattice water is counted in hydrate_water but not modelled,"
     " and a hydrate usually melts or loses its water far lower"),
    ("not_ionic", r"[a-z_ ]+: ion-based values do not apply",
     "no ions (see substance_class): the ion-based values do not apply"),
    # the combined notes first: a shorter entry would otherwise take their first part
    ("hsab_unlisted_no_IA",
     r"no HSAB class or hardness for {ion}: ion not in Pearson's lists; no I and A tabulated here for its parent"
     r" radical",
     "no HSAB class or hardness for the ion: not in Pearson's lists, and no ionization energy and electron affinity"
     " tabulated for its parent radical"),
    ("hsab_unlisted_polyatomic_cation",
     r"no HSAB class or hardness for {ion}: ion not in Pearson's lists; polyatomic cation: no ionization energies"
     r" to apply \(I - A\)/2",
     "no HSAB class or hardness for the polyatomic cation: not in Pearson's lists, and no ionization energies to"
     " apply (I - A)/2"),
    ("hsab_organic_unlisted_no_IA",
     r"no HSAB class or hardness for {ion}: organic ion not in Pearson's lists; no I and A tabulated here for its"
     r" parent radical",
     "no HSAB class or hardness for the organic ion: not in Pearson's lists, and no ionization energy and electron"
     " affinity tabulated for its parent radical"),
    ("hsab_organic_unlisted_polyatomic_cation",
     r"no HSAB class or hardness for {ion}: organic ion not in Pearson's lists; polyatomic cation: no ionization"
     r" energies to apply \(I - A\)/2",
     "no HSAB class or hardness for the organic polyatomic cation: not in Pearson's lists, and no ionization"
     " energies to apply (I - A)/2"),
    ("hsab_no_IA", r"no HSAB hardness for {ion}: no I and A tabulated here for its parent radical",
     "no HSAB hardness for the ion: no ionization energy and electron affinity tabulated for its parent radical"),
    ("hsab_unlisted", r"no HSAB class or hardness for {ion}: ion not in Pearson's lists",
     "no HSAB class or hardness for the ion: it is not in Pearson's lists"),
    ("hsab_class_unlisted", r"no HSAB class for {ion}: ion not in Pearson's lists",
     "no HSAB class for the ion: it is not in Pearson's lists"),
    ("hsab_organic_unlisted", r"no HSAB class or hardness for {ion}: organic ion not in Pearson's lists",
     "no HSAB class or hardness for the organic ion: it is not in Pearson's lists"),
    ("hsab_polyatomic_cation", r"no HSAB hardness for {ion}: polyatomic cation: no ionization energies to apply \(I - A\)/2",
     "no HSAB hardness for the polyatomic cation: no ionization energies to apply (I - A)/2"),
    ("hsab_pairing_unassessed", r"hsab_pairing not assessed: no cation-anion pair has both classes in Pearson's lists",
     "hsab_pairing not assessed: no cation-anion pair has both classes in Pearson's lists"),
    ("fajans_unassessed",
     r"fajans_contact_index and covalency_risk not assessed: no cation-anion pair has both radii and an anion"
     r" polarisability",
     "fajans_contact_index and covalency_risk not assessed: no cation-anion pair has both radii and an anion"
     " polarisability"),
    ("fajans_no_radius",
     r"no radius for {ion} \(Shannon \(1976\) lists no \(positive\) ionic radius for [^)\s]+(?:\([^)]*\))?\):"
     r" its polarising power is left out",
     "no Shannon (1976) radius for the ion: its polarising power is left out"),
    ("kapustinskii_no_radius", r"Kapustinskii: Shannon \(1976\) lists no \(positive\) ionic radius for {ion}",
     "Kapustinskii not computed: Shannon (1976) lists no (positive) ionic radius for the ion"),
    ("vbt_no_volume", r"VBT: no formula-unit volume \(Shannon \(1976\) lists no \(positive\) ionic radius for {ion}\)",
     "VBT not computed: no formula-unit volume, as Shannon (1976) lists no (positive) ionic radius for the ion"),
    ("born_polyatomic", r"Born-Lande/Born-Mayer: no measured structure; the radius-ratio rule needs monatomic ions",
     "Born-Lande/Born-Mayer not computed: no measured structure, and the radius-ratio rule needs monatomic ions"),
    ("born_no_structure",
     r"Born-Lande/Born-Mayer: no measured structure and no radius-ratio rule for this formula type",
     "Born-Lande/Born-Mayer not computed: no measured structure and no radius-ratio rule for this formula type"),
    ("born_no_radius_ratio",
     r"Born-Lande/Born-Mayer: no measured structure and no Shannon radius for the radius ratio",
     "Born-Lande/Born-Mayer not computed: no measured structure and no Shannon radius for the radius ratio"),
    ("born_not_binary",
     r"Born-Lande/Born-Mayer: need a binary salt \(one cation and one anion\) or a measured structure",
     "Born-Lande/Born-Mayer not computed: they need a binary salt (one cation and one anion) or a measured structure"),
    ("born_guessed",
     r"Born-Lande/Born-Mayer rest on a guessed structure: structure type (?P<ion>[a-z-]+) guessed from the radius"
     r" ratio r\+/r- = [0-9.]+ \(Shannon CN VI radii; Pauling's limiting ratios, common practice\): not a measured"
     r" structure",
     "Born-Lande/Born-Mayer rest on the structure type in brackets, guessed from the radius ratio (Shannon CN VI"
     " radii, Pauling's limiting ratios): not a measured structure"),
    ("ionic_model_strained",
     r"ionic model strained \(.*?\): ionic values are estimates for a partly covalent solid",
     "the ionic model is strained (polar covalent bonding; ionic_model and ionicity explain give the reasons):"
     " ionic values are estimates for a partly covalent solid"),
    ("point_charge_withheld",
     r"point-charge lattice energies \(Kapustinskii, VBT, Born-Mayer, Born-Lande\) withheld: they miss this salt's"
     r" covalency \([^;]*\)",
     "point-charge lattice energies (Kapustinskii, VBT, Born-Mayer, Born-Lande) withheld: they miss the covalency"
     " of this salt of a d10 or 6s2 cation (ionicity explain gives the figures and what they would be)"),
    ("point_charge_low_coinage",
     r"point-charge lattice energies of Cu\(I\), Ag\(I\), Au\(I\) and Tl\(I\) salts run low \([^;]*\), and no"
     r" thermochemical cycle is tabulated for this salt",
     "point-charge lattice energies of Cu(I), Ag(I), Au(I) and Tl(I) salts run low (covalency), and no"
     " thermochemical cycle is tabulated for this salt"),
    ("lattice_best_is_cycle", r"lattice_energy_best_kJ_mol is its thermochemical cycle",
     "lattice_energy_best_kJ_mol is the salt's Born-Haber (thermochemical) cycle from tabulated enthalpies"),
    ("hsab_proton", r"no HSAB hardness for H\(\+\): H\+ has no electrons: its hardness is infinite \(Parr & Pearson 1983\)",
     "no HSAB hardness for H+: it has no electrons, so its hardness is infinite (Parr & Pearson 1983)"),
    ("lattice_acid", r"lattice energies: not estimated for an acid \(a molecular substance, not an ionic crystal\)",
     "lattice energies not estimated for an acid: a molecular substance, not an ionic crystal"),
    ("melting_acid", r"melting trend: not estimated for an acid \(a molecular substance, not an ionic crystal\)",
     "melting trend not estimated for an acid: a molecular substance, not an ionic crystal"),
    ("born_ratio_unmatched",
     r"Born-Lande/Born-Mayer: radius ratio r\+/r- = (?P<ion>[0-9.]+) fits none of the built-in prototypes for this"
     r" formula type",
     "Born-Lande/Born-Mayer not computed: the radius ratio r+/r- (in brackets) fits none of the built-in prototypes"
     " for this formula type"),
    ("melting_no_lattice_energy", r"melting trend: no lattice energy for this salt \(see the lattice-energy notes\)",
     "melting trend not computed: no lattice energy for this salt (see the lattice-energy notes)"),
    ("melting_no_fajans_term", r"melting trend: no Fajans contact index, its covalency term left out",
     "melting trend without its covalency term: no Fajans contact index"),
    ("melting_radius_stand_in", r"melting trend: {ion} has no Shannon radius: lattice energy with [^;]*",
     "melting trend: the ion (in brackets) has no Shannon radius; the lattice energy takes a stand-in cation of"
     " the same charge (ionicity explain names it)"),
    ("melting_gas",
     r"a gas at 25 C: [^;]*? boils \(or sublimes\) at [0-9.]+ K \(registry package chemicals, scorer/data/gases.csv\):"
     r" store and handle it as the safety data sheet says for a gas",
     "a gas at 25 C: every registry compound of its formula boils or sublimes below 25 C (scorer/data/gases.csv,"
     " ionicity explain gives the temperature); store and handle it as the safety data sheet says for a gas"),
    ("melting_decomposes",
     r"melting trend: {ion} decomposes on heating \(giving off oxygen, carbon dioxide, sulfur dioxide or chlorine"
     r" compounds\): the trend is of the decomposition, the salt may never melt",
     "melting trend: the anion (in brackets) decomposes on heating, giving off a gas; the trend is of the"
     " decomposition and the salt may never melt (the caution that follows is written in full)"),
    ("melting_energetic",
     r"melting trend: {ion} salts decompose on heating, and heavy-metal ones explode on heating, shock or friction:"
     r" the trend is not a temperature to heat towards",
     "melting trend: salts of the anion (in brackets) decompose on heating, and heavy-metal ones explode on heating,"
     " shock or friction; the trend is not a temperature to heat towards (the caution that follows is written in full)"),
    ("melting_oxidiser_fuel",
     r"melting trend: {ion} with [^ ;]+ is fuel and oxidiser in one salt: it decomposes exothermically on heating and"
     r" can explode; the trend is not a temperature to heat towards",
     "melting trend: an ammonium-like cation (in brackets) with an oxidising anion is fuel and oxidiser in one"
     " salt: it decomposes exothermically on heating and can explode; the trend is not a temperature to heat towards"
     " (the caution that follows is written in full)"),
    ("melting_oxidiser",
     r"melting trend: {ion} salts are oxidisers: hot or molten they can ignite organic matter, reducing agents and"
     r" powdered metals, and give off oxygen as they decompose; keep them apart \(see the safety data sheet\)",
     "melting trend: salts of the anion (in brackets) are oxidisers: hot or molten they can ignite organic matter,"
     " reducing agents and powdered metals, and give off oxygen as they decompose; keep them apart (see the safety"
     " data sheet)"),
    ("melting_ammonium_decomposes",
     r"melting trend: an ammonium salt of this kind melts with decomposition or decomposes \(NH4X -> NH3 \+ HX\):"
     r" ammonia and the acid are given off on heating; the trend is not a temperature to heat towards: see the"
     r" safety data sheet",
     "melting trend: an ammonium salt of a polyatomic anion melts with decomposition or decomposes (NH4X -> NH3 +"
     " HX): ammonia and the acid are given off on heating; the trend is not a temperature to heat towards (see the"
     " safety data sheet)"),
    ("melting_metal_hydride",
     r"melting trend: a metal hydride gives off its hydrogen \(a flammable gas\) on heating, far below the metal's"
     r" melting point: the class is that of the metal left behind, not a temperature to heat the hydride to",
     "melting trend: a metal hydride gives off its hydrogen (a flammable gas) on heating, far below the metal's"
     " melting point; the class is that of the metal left behind, not a temperature to heat the hydride to"),
    ("mixture_per_component",
     r"a mixture: each column formed from its components as its method says \(lattice energies, structure type and"
     r" melting trend per component: ionicity explain\)",
     "a mixture: each column is formed from its components as its method says (lattice energies, structure type"
     " and melting trend per component: ionicity explain)"),
    ("lattice_not_applicable", r"lattice energies and structure type: the ionic model does not apply to an? (?P<ion>[a-z_ ]+?) \(see ionic_model\)",
     "lattice energies and structure type not given: the ionic model does not apply to this class (in brackets;"
     " see ionic_model)"),
    ("water_no_rule", r"water_behaviour: no rule of scorer\.water applies",
     "water_behaviour empty: no rule of scorer.water applies to this compound"),
    ("born_configuration_monatomic", r"Born-Lande: Born exponents by configuration are defined for monatomic ions only",
     "Born-Lande not computed: Born exponents by electron configuration are defined for monatomic ions only"),
    # the water caution itself is never shortened: a reader of the file sees it in full
    ("water_no_ph_insoluble", r"solution_ph empty: insoluble, no solution to take the pH of",
     "solution_ph empty: the compound is insoluble, there is no solution to take the pH of"),
    ("water_no_ph_constant", r"solution_ph empty: no hydrolysis constant or rule here gives the pH",
     "solution_ph empty: no hydrolysis constant or rule of scorer.water gives the pH (ionicity explain says why)"),
)

# an ion as the notes write it: SO4(2-), [C4mim](+), Fe(3+), Cu(NH3)4(2+)
_ION = r"(?P<ion>\S+?\([0-9]*[+-]\))"


@once
def _compiled():
    """The patterns, compiled on first use (not at import: the command line
    imports this module at start-up), each with the literal text every match
    of it begins with (:func:`_literal_prefix`)."""
    compiled = []
    for code, pattern, _ in NOTE_CODES:
        # a whole note: after the start of the cell or a "; ", up to a ";" or the end
        regex = re.compile(r"(?:^|(?<=; ))" + pattern.replace("{ion}", _ION) + r"(?=;|$)")
        compiled.append((code, regex, _literal_prefix(pattern)))
    return compiled


_SPECIAL = frozenset(".^$*+?{}[]|()")


def _literal_prefix(pattern: str) -> str:
    r"""The text every match of ``pattern`` starts with: its leading literal
    characters (escaped punctuation included), less the last one where a
    quantifier follows it; "" for a pattern with a bar (an alternative).

    >>> _literal_prefix(r"no HSAB class for {ion}: ion"), _literal_prefix(r"VBT: no \(x\)"), _literal_prefix("ab?c")
    ('no HSAB class for ', 'VBT: no (x)', 'a')
    >>> _literal_prefix("[a-z]+: ion"), _literal_prefix("ab|cd")
    ('', '')
    """
    if "|" in pattern:
        return ""  # an alternative may start otherwise (an escaped bar is taken as one too: no harm)
    prefix: list[str] = []
    i = 0
    while i < len(pattern):
        if pattern.startswith("{ion}", i):
            break  # the ion placeholder, not a repeat count
        char = pattern[i]
        if char == "\\":
            if i + 1 >= len(pattern) or pattern[i + 1].isalnum():
                break  # a class such as \d or \s: no longer literal
            prefix.append(pattern[i + 1])
            i += 2
            continue
        if char in _SPECIAL:
            if char in "*?{" and prefix:
                prefix.pop()  # the character before may be absent (or repeated)
            break
        prefix.append(char)
        i += 1
    return "".join(prefix)



def _code(code: str):
    def replace(match: re.Match) -> str:
        ion = match.groupdict().get("ion")
        return f"{code}({ion})" if ion else code
    return replace


def short_notes(text: str | None) -> str | None:
    """A ``value_notes`` cell with each registered note replaced by its code;
    notes no entry matches stay as written.

    >>> short_notes("no HSAB hardness for SO4(2-): no I and A tabulated here for its parent radical;"
    ...             " a new note; Born-Lande/Born-Mayer: need a binary salt (one cation and one anion) or a measured structure")
    'hsab_no_IA(SO4(2-)); a new note; born_not_binary'
    >>> short_notes("covalent molecular: ion-based values do not apply")
    'not_ionic'
    """
    if not text:
        return text
    for code, regex, prefix in _compiled():
        # a pattern whose leading text is absent cannot match: 30-odd
        # substitutions per distinct cell were most of an output's note
        # conversion (0.11 s of CPU for the 934 cells of the benchmark's 20,000 formulas)
        if prefix in text:
            text = regex.sub(_code(code), text)
    return text


def notes_table() -> list[tuple[str, str]]:
    """(code, meaning) of every registered note, for ``ionicity columns --notes``."""
    return [(code, meaning) for code, _, meaning in NOTE_CODES]
