"""The descriptor-module protocol, written once.

A descriptor module (:mod:`scorer.character`, :mod:`scorer.fajans`,
:mod:`scorer.hsab`, :mod:`scorer.lattice`, :mod:`scorer.melting`) declares

* ``COLUMNS``: its output columns (:class:`scorer.model.Column`);
* its result: a small frozen dataclass derived from :class:`Result`, made
  from ``COLUMNS`` by :func:`result_class` (one field per column, named as the
  column), plus the ``notes`` and ``steps`` every result has;
* ``analyse(dec) -> that Result``, made with :func:`protocol`, and
  optionally a ``summary(result)`` of explain lines written from the values.

Everything else is a view of the result, provided here and nowhere else:
:meth:`Descriptor.values` (the output columns), :meth:`Descriptor.describe`
(values and notes, what a record needs) and :meth:`Descriptor.explain`
(the lines of ``ionicity explain``). :func:`protocol` adds the two guarantees
every module needs: a result is computed once per :class:`Decomposition`
(``scorer.caching.per_input``), and ``analyse`` never raises: an exception
becomes an empty result whose note names it, so one odd compound never stops
a batch.

A module that needs another's values asks for its result object and reads
its typed fields (:mod:`scorer.melting` reads the lattice energies from
``lattice.analyse(dec)``), never a column out of a dict.

>>> from ionicity.scorer.model import Column
>>> COLUMNS = (Column("atom_count", "float64", "", "", "", ""),)
>>> Size = result_class("Size", COLUMNS, "How many atoms a formula unit holds.")
>>> @protocol(title="Size:", columns=COLUMNS, result=Size, failure="size not computed")
... def analyse(dec):
...     return Size(atom_count=float(sum(n for _, n in dec.composition)), steps=("summed the composition",))
>>> analyse.describe(Decomposition(composition=(("Na", 1.0), ("Cl", 1.0))))
({'atom_count': 2.0}, [])
>>> analyse.describe(None)
({'atom_count': nan}, ["size not computed: AttributeError: 'NoneType' object has no attribute 'composition'"])
"""
from __future__ import annotations

import math
import operator
from dataclasses import dataclass, field, fields, make_dataclass
from typing import Callable

from ionicity.scorer.caching import per_input
from ionicity.scorer.model import Column, Decomposition

__all__ = ["Result", "result_class", "Descriptor", "protocol", "value_lines", "empty_value", "fmt"]


@dataclass(frozen=True, kw_only=True)
class Result:
    """What every descriptor result carries besides its column values.

    ``notes`` are the row's notes (a :class:`scorer.model.RowWarning` turns the
    status into ``warning``; a plain ``str`` goes to ``value_notes``);
    ``steps`` are the lines of ``ionicity explain``: each value with its
    inputs and equation; a step may be a callable of no arguments that
    returns its line, written only when explained (formatting a line for
    every compound scored is a cost the record does not need). ``withheld`` names columns whose value is kept in
    the result for the modules that read it (a trend input fitted on it) but
    written empty in the output, where it would mislead; a note says why.
    """

    notes: tuple[str, ...] = ()
    steps: tuple[str, ...] = ()
    withheld: tuple[str, ...] = ()


def empty_value(column: Column):
    """The value of a column that could not be given: NaN for numbers, None otherwise."""
    return math.nan if column.dtype == "float64" else None


_PYTHON_TYPES = {"float64": "float", "string": "str | None", "bool": "bool | None", "int64": "int | None"}


def result_class(name: str, columns: tuple[Column, ...], doc: str, extra: tuple = ()) -> type[Result]:
    """A module's frozen :class:`Result` subclass: one field per column, named
    as the column, empty by default (:func:`empty_value`), so the column
    declaration is the one place a value's name and type are written.

    ``extra`` adds ``(name, type, default)`` fields that are not columns (the
    inputs another module reads, such as the melting terms).

    >>> Size = result_class("Size", (Column("atom_count", "float64", "", "", "", ""),), "A size.")
    >>> Size(atom_count=2.0).atom_count, Size().atom_count, Size().notes
    (2.0, nan, ())
    """
    specs = [(c.name, _PYTHON_TYPES[c.dtype], field(default=empty_value(c))) for c in columns]
    specs += [(n, t, field(default=d)) for n, t, d in extra]
    cls = make_dataclass(name, specs, bases=(Result,), frozen=True, kw_only=True)
    cls.__doc__ = doc
    return cls


def fmt(value, spec: str = ".2f") -> str:
    """A number for an explain line, formatted by ``spec``; ``nan`` for a missing one.

    >>> fmt(2.2345), fmt(float("nan")), fmt(None), fmt(0.13123, ".3g")
    ('2.23', 'nan', 'nan', '0.131')
    """
    # value != value is NaN's own test, without a call: this runs for every new salt
    if value is None or value != value:
        return "nan"
    return format(value, spec)


class Descriptor:
    """One descriptor module's ``analyse``, with the views every module shares.

    Call it like the function it wraps: ``analyse(dec)`` returns the module's
    result, cached per decomposition, and never raises.

    Parameters
    ----------
    analyse : callable
        ``analyse(dec) -> result``, the module's own work.
    title : str
        First line of the module's ``ionicity explain`` block ("" for none).
    columns : tuple of Column
        The module's ``COLUMNS``; each must be a field of ``result``.
    result : type
        The module's frozen :class:`Result` subclass (:func:`result_class`).
    failure : str
        Start of the note written when ``analyse`` raises.
    summary : callable, optional
        ``summary(result) -> lines``: explain lines written from the result's
        values alone (:func:`value_lines`). Formatted only when a person asks
        (``ionicity explain``), not for every salt scored; ``steps`` keep what
        needs the intermediate inputs (per ion, per pair).
    maxsize : int, default=65536
        Size of the per-decomposition cache.
    """

    def __init__(
        self,
        analyse: Callable[[Decomposition], Result],
        *,
        title: str,
        columns: tuple[Column, ...],
        result: type[Result],
        failure: str,
        summary: Callable[[Result], list[str]] | None = None,
        maxsize: int = 65536,
    ):
        names = {f.name for f in fields(result)}
        missing = [c.name for c in columns if c.name not in names]
        if missing:
            raise TypeError(f"{result.__name__} has no field for the columns {missing}")
        self.title = title
        self.columns = tuple(columns)
        self.result_type = result
        self.failure = failure
        self._summary = summary
        self._names = tuple(c.name for c in columns)
        self._by_name = {c.name: c for c in columns}
        # one C-level getter for every column: this runs once per new salt and module
        self._getter = operator.attrgetter(*self._names) if len(self._names) > 1 else (
            lambda result, _get=operator.attrgetter(self._names[0]): (_get(result),)
        )
        self._cached = per_input(maxsize=maxsize)(analyse)
        self.__wrapped__ = analyse
        self.__doc__ = analyse.__doc__
        self.__name__ = analyse.__name__
        self.__qualname__ = analyse.__qualname__
        self.__module__ = analyse.__module__

    def __call__(self, dec: Decomposition) -> Result:
        try:
            return self._cached(dec)
        except Exception as exc:  # noqa: BLE001 - the one place of the protocol's never-raise promise
            text = f"{self.failure}: {type(exc).__name__}: {exc}"
            return self.result_type(notes=(text,), steps=(text,))

    def cache_clear(self) -> None:
        self._cached.cache_clear()

    def values(self, result: Result) -> dict[str, object]:
        """The output columns of ``result``, in ``COLUMNS`` order (``result.withheld`` written empty)."""
        out = dict(zip(self._names, self._getter(result)))
        for name in result.withheld:
            out[name] = empty_value(self._by_name[name])
        return out

    def describe(self, dec: Decomposition) -> tuple[dict[str, object], list[str]]:
        """Values for every column and the notes for the row; never raises."""
        result = self(dec)
        return self.values(result), list(result.notes)

    def explain(self, dec: Decomposition) -> list[str]:
        """Lines for ``ionicity explain``: the title (if any), each step, the
        summary of the values, then the notes that no step already says."""
        result = self(dec)
        # without a title the steps stand at the left margin
        indent = "  " if self.title else ""
        lines = [self.title] if self.title else []
        steps = [step if isinstance(step, str) else step() for step in result.steps]
        lines += [indent + step for step in steps]
        if self._summary is not None:
            lines += [indent + line for line in self._summary(result)]
        lines += ["  note: " + note for note in result.notes if note not in steps]
        return lines


def protocol(**options):
    """Decorator: make a module's ``analyse`` a :class:`Descriptor`; the
    keyword options are those of :class:`Descriptor`."""

    def wrap(analyse):
        return Descriptor(analyse, **options)

    return wrap


def value_lines(annotations: dict[str, tuple[str, str]]) -> Callable[[Result], list[str]]:
    """A ``summary`` for :class:`Descriptor`: one explain line per column,
    ``name = value [how]``.

    ``annotations`` maps a column name to (format spec for :func:`fmt`, or ""
    to print the value as it is; how the value was formed, or "").

    >>> Size = result_class("Size", (Column("atom_count", "float64", "", "", "", ""),), "A size.")
    >>> value_lines({"atom_count": (".1f", "sum of counts")})(Size(atom_count=2.0))
    ['atom_count = 2.0 [sum of counts]']
    """

    def summary(result: Result) -> list[str]:
        lines = []
        for name, (spec, how) in annotations.items():
            value = getattr(result, name)
            line = f"{name} = {fmt(value, spec) if spec else value}"
            lines.append(f"{line} [{how}]" if how else line)
        return lines

    return summary
