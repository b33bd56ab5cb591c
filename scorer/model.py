"""The compound model shared by every scoring module.

A formula is parsed into a :class:`scorer.formula.ParsedFormula`; the ion solver
(:mod:`scorer.ions`) turns it into a :class:`Decomposition`, and each
descriptor module (character, fajans, hsab, lattice, melting) reads a
``Decomposition`` and returns plain values for its columns.
"""
from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field
from functools import cached_property

__all__ = ["Column", "Ion", "IonTerm", "Decomposition", "RowWarning", "format_charge"]


def format_charge(charge: int) -> str:
    """Write an ion charge the way the output columns do.

    >>> [format_charge(c) for c in (1, -1, 2, -3)]
    ['+', '-', '2+', '3-']
    """
    if charge == 0:
        return "0"
    sign = "+" if charge > 0 else "-"
    magnitude = abs(int(charge))
    return sign if magnitude == 1 else f"{magnitude}{sign}"


@dataclass(frozen=True)
class Ion:
    """One ion: monatomic (``Fe(3+)``), inorganic polyatomic (``SO4(2-)``) or
    organic (``[C4mim](+)``).

    ``ion_id`` is the unique key used by every data table under
    ``scorer/data/``: ``LABEL(CHARGE)`` with the charge written by
    :func:`format_charge`.
    """

    ion_id: str
    label: str
    charge: int
    composition: tuple[tuple[str, float], ...]
    family: str
    name: str = ""
    organic: bool = False
    element: str | None = None
    oxidation_states: tuple[tuple[str, float], ...] = ()
    source: str = ""

    def __hash__(self) -> int:
        # ion_id is unique; hashing every field on each cache lookup is the
        # hot path of scoring
        return hash(self.ion_id)

    @property
    def monatomic(self) -> bool:
        return self.element is not None

    @property
    def atom_count(self) -> float:
        return sum(n for _, n in self.composition)


@dataclass(frozen=True)
class IonTerm:
    """An ion and how many of it one formula unit holds."""

    ion: Ion
    count: float

    def __str__(self) -> str:
        count = self.count
        text = f"{count:g}" if count != int(count) else str(int(count))
        return f"{self.ion.ion_id}*{text}"


@dataclass(frozen=True)
class Decomposition:
    """What a formula unit is made of, as ions where it is ionic.

    ``composition`` is the flat element count of one formula unit without
    its lattice water, in canonical order. ``cations`` and ``anions`` are empty for covalent and metallic
    substances; ``oxidation_states`` then still holds the formal states where
    they could be assigned. ``hydrate_water`` counts lattice water per formula
    unit, kept apart from the ions. ``alternatives`` lists other assignments
    that were equally plausible (written like the ``cations``/``anions``
    columns) and ``notes`` the warnings for the row. ``ionic_model`` says
    whether the ionic model applies (``applies``, ``strained`` or
    ``not_applicable``, decided in :mod:`scorer.applicability`) and
    ``ionic_model_reasons`` why.
    """

    composition: tuple[tuple[str, float], ...] = ()
    cations: tuple[IonTerm, ...] = ()
    anions: tuple[IonTerm, ...] = ()
    neutral_parts: tuple[str, ...] = ()
    hydrate_water: float = 0.0
    oxidation_states: tuple[tuple[str, float], ...] = ()
    substance_class: str = "unknown"
    alternatives: tuple[str, ...] = ()
    notes: tuple[str, ...] = field(default=())
    # does the ionic model apply (scorer.applicability): "applies", "strained"
    # or "not_applicable"; the reasons are the explain lines of that decision.
    # The solver always decides; a Decomposition built by hand is taken as ionic.
    # Neither takes part in equality or the hash: the decision is a function of
    # the other fields, and the character and Fajans results the decision reads
    # (cached per decomposition) are then found again by the descriptors.
    ionic_model: str = field(default="applies", compare=False)
    ionic_model_reasons: tuple[str, ...] = field(default=(), compare=False)
    # the formal ions (cations, anions) dropped where the ionic model does not
    # apply: the melting routes of chain and layer solids and of polar
    # networks still weigh the ionic reading (scorer.melting)
    formal_ions: tuple = field(default=(), compare=False)
    # functional groups the written formula shows and the counts cannot ("acyl_halide" for
    # CH3COCl); part of equality, as the parser's structure hint is
    written_groups: tuple[str, ...] = ()

    @property
    def is_ionic(self) -> bool:
        return bool(self.cations) and bool(self.anions)

    def __hash__(self) -> int:
        return self._hash

    @cached_property
    def _hash(self) -> int:
        # every descriptor's cache looks the decomposition up: hash its fields once, not once per module
        return hash((
            self.composition, self.cations, self.anions, self.neutral_parts, self.hydrate_water,
            self.oxidation_states, self.substance_class, self.alternatives, self.notes,
        ))

    def __getstate__(self) -> dict:
        # string hashes differ between processes: a pickled copy hashes itself again
        state = dict(self.__dict__)
        state.pop("_hash", None)
        return state

    def with_fields(self, **changes) -> Decomposition:
        """``dataclasses.replace(self, **changes)`` at a fifth of its cost: every
        formula's decomposition is settled this way once (scorer.applicability),
        and replace's field checks and the frozen ``__init__`` were 4 us of a
        molecule's 130 us. The class has no ``__post_init__`` and every field
        is an init field, so the copy is the same object replace builds.

        >>> d = Decomposition(composition=(("C", 1.0), ("O", 2.0)))
        >>> e = d.with_fields(substance_class="covalent_molecular")
        >>> e == dataclasses.replace(d, substance_class="covalent_molecular"), e.composition, d.substance_class
        (True, (('C', 1.0), ('O', 2.0)), 'unknown')
        """
        unknown = changes.keys() - _DECOMPOSITION_FIELDS
        if unknown:
            raise TypeError(f"Decomposition has no field {sorted(unknown)[0]!r}")
        state = self.__dict__
        new = object.__new__(Decomposition)
        # the cached hash (a non-field entry of __dict__) is not carried over
        new.__dict__.update({name: changes[name] if name in changes else state[name]
                             for name in _DECOMPOSITION_FIELDS})
        return new


_DECOMPOSITION_FIELDS = tuple(f.name for f in dataclasses.fields(Decomposition))


@dataclass(frozen=True)
class Column:
    """One generated output column, declared once.

    The registry in :mod:`scorer.columns` collects these from every scoring
    module; it drives the table writer, ``ionicity columns`` and the README
    table.

    ``dtype`` is one of ``"string"``, ``"float64"``, ``"int64"``, ``"bool"``.
    ``aggregation`` says how several cations or anions are combined (empty
    where the column is per compound). ``digits``: for a float column, the
    significant digits its method supports, to which output files round it
    (``None``: the registry's table in :mod:`scorer.precision` decides).
    """

    name: str
    dtype: str
    unit: str
    description: str
    method: str
    source: str
    aggregation: str = ""
    digits: int | None = None


class RowWarning(str):
    """A descriptor note that turns its row's status into ``warning``.

    Descriptor modules return notes with their values. A plain ``str`` note
    explains a value left empty or estimated by design (an ion no published
    table covers, a quantity that does not apply) and goes to the ``value_notes``
    column without changing the status. A ``RowWarning`` says something the
    user should check (a structure type guessed, an input read in one of two
    ways) and goes to ``message`` with status ``warning``.
    """
