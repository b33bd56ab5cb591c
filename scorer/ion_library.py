"""The ion library: polyatomic, complex and ionic-liquid ions from
``scorer/data/ions.csv``, and monatomic ions made on demand from the element
snapshot.

The CSV has one row per ion with a ``source`` on every row; see
``scorer/data/README.md``. It is read once per process, on first use.
"""
from __future__ import annotations

from ionicity.scorer.caching import once
from ionicity.scorer.elements import get_element, is_element_symbol
from ionicity.scorer.grammar import FormulaError, hill_order, parse_element_groups
from ionicity.scorer.model import Ion, format_charge
from ionicity.scorer.onium_codes import canonical_quaternary_code, onium_from_code
from ionicity.scorer.tables import table

__all__ = [
    "ion_library",
    "exact_aliases",
    "get_ion",
    "monatomic_ion",
    "find_alias",
    "find_abbreviation",
    "same_label_ions",
    "is_known_ion",
    "ions_by_composition",
]

ION_LIBRARY_FILE = "ions.csv"


def _parse_oxidation_states(text: str) -> tuple[tuple[str, float], ...]:
    if not text:
        return ()
    pairs = []
    for item in text.split(";"):
        symbol, _, value = item.partition(":")
        pairs.append((symbol.strip(), float(value)))
    return tuple(pairs)


@once
def _load() -> tuple[tuple[Ion, ...], dict[str, Ion], dict[str, Ion], dict[str, Ion], dict[tuple, list[Ion]]]:
    ions: list[Ion] = []
    by_id: dict[str, Ion] = {}
    alias_exact: dict[str, Ion] = {}
    alias_folded: dict[str, Ion] = {}
    by_composition: dict[tuple, list[Ion]] = {}
    for row in table(ION_LIBRARY_FILE):
        counts, _ = parse_element_groups(row["formula"])
        composition = tuple((s, counts[s]) for s in hill_order(counts))
        ion = Ion(
            ion_id=row["ion_id"],
            label=row["label"],
            charge=int(row["charge"]),
            composition=composition,
            family=row["family"],
            name=row["name"],
            organic=row["organic"].strip().lower() == "true",
            element=None,
            oxidation_states=_parse_oxidation_states(row.get("oxidation_states", "")),
            source=row["source"],
        )
        ions.append(ion)
        by_id[ion.ion_id] = ion
        by_composition.setdefault((composition, ion.charge), []).append(ion)
        names = [ion.label, ion.label.strip("[]"), row["formula"]]
        names += [a.strip() for a in row.get("aliases", "").split(";") if a.strip()]
        for name in names:
            alias_exact.setdefault(name, ion)
            alias_exact.setdefault(name.strip("[]"), ion)
            alias_folded.setdefault(name.strip("[]").casefold(), ion)
    return tuple(ions), by_id, alias_exact, alias_folded, by_composition


def exact_aliases() -> dict[str, Ion]:
    """Every name a library ion is written by (label, formula, trade aliases), exact case, to its ion (the first
    ion of the file where two share one)."""
    return _load()[2]


def ion_library() -> tuple[Ion, ...]:
    """Every ion of ``scorer/data/ions.csv``, in file order."""
    return _load()[0]


@once
def monatomic_ion(symbol: str, charge: int) -> Ion:
    """A monatomic ion such as ``Na(+)`` or ``Fe(3+)``.

    >>> monatomic_ion("Fe", 3).ion_id
    'Fe(3+)'
    """
    element = get_element(symbol)
    return Ion(
        ion_id=f"{symbol}({format_charge(charge)})",
        label=symbol,
        charge=int(charge),
        composition=((symbol, 1.0),),
        family="monatomic",
        name=element.name,
        organic=False,
        element=symbol,
        oxidation_states=((symbol, float(charge)),),
        source="element snapshot (mendeleev)",
    )


def get_ion(ion_id: str) -> Ion:
    """Look an ion up by its id, e.g. ``"SO4(2-)"``, ``"[C4mim](+)"`` or the
    monatomic ``"Fe(3+)"``.

    Raises ``KeyError`` naming the id when it is neither in the library nor a
    monatomic ion of a known element.
    """
    by_id = _load()[1]
    if ion_id in by_id:
        return by_id[ion_id]
    label, _, rest = ion_id.partition("(")
    charge_text = rest.rstrip(")")
    if label and charge_text and charge_text[-1] in "+-":
        digits = charge_text[:-1] or "1"
        if digits.isdigit():
            if is_element_symbol(label):
                return monatomic_ion(label, int(digits) * (1 if charge_text[-1] == "+" else -1))
    built = onium_from_code(label) if label.startswith("[") else None
    if built is not None and built.ion_id == ion_id:
        return built
    raise KeyError(f"unknown ion {ion_id!r}; ids look like 'SO4(2-)', 'Fe(3+)' or '[C4mim](+)'")


def same_label_ions(ion: Ion) -> list[Ion]:
    """The library ions written with the same label as ``ion`` (e.g. both
    hexacyanoferrates), ``ion`` first."""
    variants = [ion] + [other for other in ion_library() if other.label == ion.label and other is not ion]
    return variants


@once
def _abbreviations() -> dict[str, Ion]:
    """Aliases that are not formulas of their ion (``OAc``, ``NTf2``, ``OTf``):
    where one appears inside a formula it names the ion."""
    _, _, exact, _, _ = _load()
    out = {}
    for name, ion in exact.items():
        if name.startswith("[") or not name[:1].isupper():
            continue
        try:
            counts, _ = parse_element_groups(name)
        except FormulaError:
            out[name] = ion
            continue
        if dict(ion.composition) != counts:
            out[name] = ion
    return out


def find_abbreviation(text: str) -> Ion | None:
    """The ion that ``text`` abbreviates where it is not a formula (``OAc``)."""
    return _abbreviations().get(text)


def find_alias(text: str, exact_case: bool = False) -> Ion | None:
    """The library ion that ``text`` names (label, formula or trade alias)."""
    if not text:
        return None
    _, _, exact, folded, _ = _load()
    ion = exact.get(text)
    if ion is None and not exact_case:
        ion = folded.get(text.strip("[]").casefold())
    if ion is None:
        # chains written apart (P14,6,6,6): the library's code for the same cation
        canonical = canonical_quaternary_code(text)
        if canonical is not None:
            return find_alias(canonical, exact_case)
        # an onium code the library does not list, built by rule ([C16mim], [P4441]; scorer.onium_codes)
        ion = onium_from_code(text)
    return ion


def ions_by_composition(counts: dict[str, float], charge: int) -> list[Ion]:
    """Library ions with exactly this composition and charge."""
    key = (tuple((s, float(counts[s])) for s in hill_order(counts)), int(charge))
    return list(_load()[4].get(key, ()))


def is_known_ion(counts: dict[str, float], charge: int) -> bool:
    """Whether ``counts`` with ``charge`` is a library ion or a monatomic ion in
    one of its element's listed oxidation states."""
    if not counts or charge == 0:
        return False
    if len(counts) == 1:
        ((symbol, n),) = counts.items()
        if n == 1:
            element = get_element(symbol)
            if charge in element.oxidation_states_main or charge in element.oxidation_states_extra:
                return True
    return bool(ions_by_composition(counts, charge))
