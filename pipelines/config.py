"""The options of one scoring run (:class:`ScoreConfig`) and what the run did
(:class:`Summary`).

Every option's allowed values are declared once, in :data:`CONSTRAINTS`, and
checked in one place (:meth:`ScoreConfig.validate`): a bad value raises
:class:`~ionicity.pipelines.errors.InputError` whose message names the
option, the value given and what is allowed. The command line builds a
``ScoreConfig`` from its arguments; :func:`ionicity.pipelines.score_file`
takes one (or builds it from keyword arguments).

Light on purpose (no pyarrow): the command line imports it at start-up.
"""
from __future__ import annotations

import re
from dataclasses import dataclass, field, fields
from typing import Any, Callable

from ionicity.pipelines.errors import InputError
from ionicity.scorer.verdict import FORMULA_STARTS

__all__ = ["ScoreConfig", "Summary", "Constraint", "CONSTRAINTS", "ENGINES"]

ENGINES = ("local", "dask")


def _whole_number(value: Any) -> bool:
    return isinstance(value, int) and not isinstance(value, bool)


def _text_or_none(value: Any) -> bool:
    return value is None or isinstance(value, str)



# [scheme://]host:port, host a name, an IPv4 address or a bracketed IPv6 one
_SCHEDULER_ADDRESS = re.compile(
    r"(?:(?:tcp|tls|ucx|ws|wss)://)?(?:\[[0-9A-Fa-f:.]+\]|[A-Za-z0-9_.-]+):(\d{1,5})"
)


def _scheduler_address(value: Any) -> bool:
    if value is None:
        return True
    match = _SCHEDULER_ADDRESS.fullmatch(value) if isinstance(value, str) else None
    return bool(match) and 1 <= int(match.group(1)) <= 65535


@dataclass(frozen=True)
class Constraint:
    """What one option accepts: ``check(value)`` is true for an allowed value;
    ``allowed`` says so in words, for the error message."""

    flag: str
    check: Callable[[Any], bool]
    allowed: str


CONSTRAINTS: dict[str, Constraint] = {
    "input": Constraint("INPUT", lambda v: isinstance(v, str) and v != "", "a path, or - for standard input"),
    "output": Constraint("--output", lambda v: isinstance(v, str) and v != "", "a path, or - for standard output"),
    "formula_col": Constraint("--formula-col", _text_or_none, "a column name"),
    "name_col": Constraint("--name-col", _text_or_none, "a column name"),
    "prefix": Constraint("--prefix", lambda v: isinstance(v, str) and not v.startswith(FORMULA_STARTS) and v.isprintable(),
                         "printable text (may be empty) not starting with =, +, - or @, which a spreadsheet would"
                         " run as a formula in the header"),
    "batch_rows": Constraint("--batch-rows", lambda v: _whole_number(v) and v >= 1, "a positive whole number"),
    "engine": Constraint("--engine", lambda v: v in ENGINES, "one of " + ", ".join(ENGINES)),
    "workers": Constraint("--workers", lambda v: v is None or (_whole_number(v) and v >= 1),
                          "a whole number of at least 1 (or none given, for every core)"),
    "scheduler": Constraint("--scheduler", _scheduler_address,
                            "an address [tcp|tls|ucx|ws|wss://]HOST:PORT such as tcp://10.0.0.5:8786"),
    "mp_model": Constraint("--mp-model", _text_or_none, "the path of a model file"),
    "partition_rows": Constraint("--partition-rows", lambda v: v is None or (_whole_number(v) and v >= 1),
                                 "a positive whole number (or none given, for the default)"),
    "sep": Constraint("--sep", _text_or_none, "one character such as , ; | or tab"),
    "encoding": Constraint("--encoding", _text_or_none, "one of utf-8, latin-1, cp1252"),
    "sheet": Constraint("--sheet", lambda v: v is None or isinstance(v, (str, int)) and not isinstance(v, bool),
                        "a sheet name or a number from 1"),
    "columns": Constraint("--columns", lambda v: v is None or (isinstance(v, (list, tuple)) and len(v) > 0
                                                               and all(isinstance(x, str) for x in v)),
                          "a non-empty list of column names and groups"),
    "summary": Constraint("--summary", _text_or_none, "the path of a .json file"),
}


@dataclass
class ScoreConfig:
    """Options of one scoring run; the CLI builds one from its arguments.

    Parameters
    ----------
    input, output : str
        Paths (``-`` for CSV on stdin / stdout). The output format follows
        the output's extension; the Dask engine writes a folder of Parquet
        parts.
    formula_col, name_col : str or None
        Column holding the formulas (default: the one named ``formula`` in any
        case) and an optional column quoted in the message of failed rows.
    prefix : str, default=""
        Prefix for every generated column name.
    batch_rows : int, default=65536
        Rows per batch, at least 1.
    engine : {"local", "dask"}, default="local"
    workers : int or None, default=None
        Processes scoring distinct formulas (local engine) or Dask workers of
        the local cluster, at least 1; ``None`` means every core.
    scheduler : str or None
        Address of a running Dask scheduler (``engine="dask"`` only).
    mp_model : str or None
        A melting-point model written by ``ionicity fit-melting``; adds
        ``mp_predicted_K``, ``mp_interval_low_K`` and ``mp_interval_high_K``.
    partition_rows : int or None
        ``engine="dask"``: rows per partition (one task each); default
        :data:`ionicity.pipelines.dask_partitions.DEFAULT_PARTITION_ROWS`.
    sep, encoding : str or None
        A CSV's delimiter (default: found from the header line) and text
        encoding (``utf-8``, ``latin-1`` or ``cp1252``; default UTF-8).
    sheet : str or int or None
        The sheet of an ``.xlsx`` input: a name, or a number from 1.
    keep_text : bool, default=False
        Keep every CSV or ``.xlsx`` input column as text in a Parquet or
        ``.xlsx`` output (default: numbers and booleans get their type).
    columns : list of str or None
        Generated columns and groups to write (``ionicity columns`` lists
        them); ``status`` and ``message`` always. None: all.
    full_precision : bool, default=False
        Write floats with every digit instead of each column's ``digits``.
    summary : str or None
        A ``.json`` path for the audit summary (:mod:`ionicity.pipelines.audit_summary`).

    See Also
    --------
    CONSTRAINTS : the allowed values of each option, checked by :meth:`validate`.

    Examples
    --------
    >>> ScoreConfig(input="in.csv", output="out.csv", workers=0).validate()
    Traceback (most recent call last):
    ...
    ionicity.pipelines.errors.InputError: --workers must be a whole number of at least 1 (or none given, for every core), not 0
    """

    input: str
    output: str
    formula_col: str | None = None
    name_col: str | None = None
    prefix: str = ""
    overwrite: bool = False
    strict: bool = False
    quiet: bool = False
    batch_rows: int = 65536
    engine: str = "local"
    workers: int | None = None
    scheduler: str | None = None
    mp_model: str | None = None
    partition_rows: int | None = None
    sep: str | None = None
    encoding: str | None = None
    sheet: str | int | None = None
    keep_text: bool = False
    columns: list | tuple | None = None
    full_precision: bool = False
    summary: str | None = None

    def validate(self) -> None:
        """Raise :class:`InputError` for the first option outside its
        :data:`CONSTRAINTS`, or for options that cannot work together."""
        for option in fields(self):
            constraint = CONSTRAINTS.get(option.name)
            value = getattr(self, option.name)
            if constraint is not None and not constraint.check(value):
                raise InputError(f"{constraint.flag} must be {constraint.allowed}, not {value!r}")
        if self.partition_rows is not None and self.engine != "dask":
            raise InputError(f"--partition-rows needs --engine dask (the engine is {self.engine!r})")
        if self.scheduler is not None and self.engine != "dask":
            raise InputError(f"--scheduler {self.scheduler!r} needs --engine dask (the engine is {self.engine!r})")


@dataclass
class Summary:
    """What a run did; ``str()`` is the one-line summary printed at the end."""

    rows: int = 0
    ok: int = 0
    warning: int = 0
    error: int = 0
    distinct_formulas: int = 0
    seconds: float = 0.0
    output: str = ""
    partitions: int = 0  # --engine dask: the tasks the table was cut into
    #: what the run decided for the user to know (a column kept as text, say)
    notes: list = field(default_factory=list)

    def __str__(self) -> str:
        partitions = f", partitions: {self.partitions}" if self.partitions else ""
        return (
            f"rows: {self.rows}, ok: {self.ok}, warning: {self.warning}, error: {self.error},"
            f" distinct formulas: {self.distinct_formulas}{partitions}, seconds: {self.seconds:.2f}"
        ) + "".join(f"\nnote: {n}" for n in self.notes)
