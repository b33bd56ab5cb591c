"""Streaming aggregates of a scored table, for ``ionicity report``.

The report never holds the table: :func:`aggregate` reads only the columns it
uses, batch by batch (Parquet: as stored, text columns dictionary-encoded;
CSV/TSV: as text, numbers parsed per batch), and keeps counts, fixed-bin
histograms, the first rows of each kind that needs a person, and a uniform
random sample of at most :data:`SAMPLE_ROWS` rows for the scatter plots
(bottom-k sampling: every row draws a random key and the k smallest keys are
kept, which is a uniform sample without replacement). Memory is bounded by
the batch size, the bins and the caps below, not by the number of rows.

Columns that other parts of ionicity may or may not have written
(``formula_suggested``, ``name_check``/``name_formula``,
``first_row_same_compound``, ``liquidus_estimate_K`` ...) are read when
present; the page says "not checked in this run" when they are absent.
"""
from __future__ import annotations

import functools
import json
import os
import re
import time
from collections import Counter
from dataclasses import dataclass, field

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

from ionicity.pipelines.arrow_columns import int_array, int_numpy
from ionicity.pipelines.errors import InputError
from ionicity.pipelines.io import _parquet_paths, format_of
from ionicity.scorer import melting
from ionicity.scorer.columns import column_names
from ionicity.scorer.verdict import STATUSES

__all__ = [
    "SAMPLE_ROWS", "FIRST_ROWS", "ROLES", "OPTIONAL_ROLES", "Bins", "ReportData",
    "melting_bands", "classes_melting_below", "plan", "aggregate", "reason_of", "used_columns",
]

#: rows kept for the scatter plots (a uniform random sample when the table is larger)
SAMPLE_ROWS = 3000
#: rows listed per kind of row that needs a person
FIRST_ROWS = 12
#: distinct values kept per counter (messages, compounds); the rest are counted as "other"
MAX_KEYS = 500
#: 100 C in kelvin: the trade's line for an ionic liquid
HUNDRED_C_K = 373.15

#: generated columns the report reads (name without --prefix); all written by today's scorer
ROLES = (
    "status", "message", "formula_normalized", "substance_class", "mean_chi_pauling", "delta_chi_pauling",
    "bond_type", "cation_hsab_class", "anion_hsab_class", "lattice_energy_vbt_kJ_mol", "mp_trend_index",
    "melting_class",
)
#: columns written by other features when they are on (contracts between branches); read when present
OPTIONAL_ROLES = (
    "formula_suggested", "name_check", "name_formula", "first_row_same_compound",
    "mixture_components", "liquidus_estimate_K", "liquidus_method",
)
_NUMERIC = {"mean_chi_pauling", "delta_chi_pauling", "lattice_energy_vbt_kJ_mol", "mp_trend_index", "liquidus_estimate_K"}


@dataclass(frozen=True)
class Bins:
    """Fixed, equal-width bins on [lo, hi); values outside are counted apart."""

    lo: float
    hi: float
    n: int

    def edges(self) -> np.ndarray:
        return np.linspace(self.lo, self.hi, self.n + 1)

    def index(self, values: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Bin numbers of the finite values inside the range, and that mask."""
        inside = np.isfinite(values) & (values >= self.lo) & (values < self.hi)
        v = values[inside]
        # (v - lo) / width, then moved by one where it disagrees with the edges themselves: Pauling values
        # such as 1.65 sit on the edges, where the division alone puts some in the bin below. Same bins as
        # numpy.histogram, 4x faster than searchsorted (cProfile, 10^6 rows)
        edges = self.edges()
        idx = np.clip(((v - self.lo) * (self.n / (self.hi - self.lo))).astype(np.int64), 0, self.n - 1)
        idx -= v < edges[idx]
        idx += (v >= edges[idx + 1]) & (idx < self.n - 1)
        return idx, inside


# Bins of the figures. Electronegativities on the Pauling scale run from 0.79 (Cs) to 3.98 (F).
CHI_MEAN_BINS = Bins(0.6, 4.2, 72)
CHI_DELTA_BINS = Bins(0.0, 3.6, 72)
TREND_BINS = Bins(1.5, 4.0, 100)          # mp_trend_index = log10 of the trend temperature in K
LATTICE_LOG_BINS = Bins(2.0, 5.0, 60)     # log10 of the lattice energy in kJ/mol
LIQUIDUS_BINS = Bins(0.0, 2500.0, 100)    # K


def melting_bands() -> tuple[tuple[str, float, float, str], ...]:
    """(melting_class, lower_K, upper_K, description) for every melting class.

    The one place the report learns the classes: ``scorer.melting`` is to
    export ``MELTING_CLASS_BANDS`` in this form; until it does, the bands
    come from today's ``MELTING_CLASSES`` (name, upper bound in K, origin),
    each class starting where the one before it ends.

    >>> melting_bands()[0][:3]
    ('ionic_liquid', 0.0, 373.15)
    """
    bands = getattr(melting, "MELTING_CLASS_BANDS", None)
    if bands is not None:
        return tuple((str(n), float(lo), float(hi), str(d)) for n, lo, hi, d in bands)
    out, lower = [], 0.0
    for name, upper, origin in melting.MELTING_CLASSES:
        out.append((name, lower, float(upper), origin))
        lower = float(upper)
    return tuple(out)


def classes_melting_below(limit_K: float = HUNDRED_C_K) -> tuple[str, ...]:
    """Melting classes whose whole band lies below ``limit_K``.

    >>> classes_melting_below()
    ('ionic_liquid', 'liquid_at_room_temperature', 'gas_at_room_temperature', 'melts_below_100C', 'melts_in_own_water')
    """
    return tuple(name for name, _, upper, _ in melting_bands() if upper <= limit_K + 1e-9)


_QUOTED = re.compile(r"'[^']*'|\"[^\"]*\"")
_NUMBER = re.compile(r"\d+(\.\d+)?")
_ROW_NAME = re.compile(r" \(row named '.*'\)$")


@functools.lru_cache(maxsize=4096)
def reason_of(message: str) -> str:
    """A message with its particulars (quoted text, numbers, the row's name)
    blanked, so that rows failing for the same reason count together.

    >>> reason_of("unknown element 'Xx' at position 1 of 'Xx2O' (row named 'old jar')")
    "unknown element '…' at position # of '…'"
    """
    text = _ROW_NAME.sub("", message or "")
    text = _QUOTED.sub("'…'", text)
    return _NUMBER.sub("#", text).strip() or "(no message)"


@dataclass
class ReportData:
    """Everything the page shows, gathered in one pass."""

    source: str
    fmt: str
    columns: dict[str, str]                    # role -> column name found in the table
    id_col: str | None = None
    name_col: str | None = None
    formula_col: str | None = None
    metadata: dict = field(default_factory=dict)
    file_bytes: int = 0
    file_modified: float | None = None
    rows: int = 0
    counts: dict[str, Counter] = field(default_factory=dict)   # role -> value -> rows
    hsab_pairs: Counter = field(default_factory=Counter)       # (cation class, anion class) -> rows
    reasons: dict[str, Counter] = field(default_factory=dict)  # "error"/"warning" -> reason -> rows
    first_rows: dict[str, list[dict]] = field(default_factory=dict)
    kind_rows: Counter = field(default_factory=Counter)        # kind of row that needs a person -> rows
    bond_map: np.ndarray = field(default_factory=lambda: np.zeros((CHI_MEAN_BINS.n, CHI_DELTA_BINS.n), np.int64))
    trend_by_class: dict[str, np.ndarray] = field(default_factory=dict)
    lattice_trend: np.ndarray = field(default_factory=lambda: np.zeros((TREND_BINS.n, LATTICE_LOG_BINS.n), np.int64))
    liquidus: np.ndarray = field(default_factory=lambda: np.zeros(LIQUIDUS_BINS.n, np.int64))
    low_melting: dict[str, dict] = field(default_factory=dict)  # formula_normalized -> {rows, name, first_row}
    low_melting_rows: int = 0
    sample: dict[str, np.ndarray] = field(default_factory=dict)
    seconds: float = 0.0

    def has(self, role: str) -> bool:
        return role in self.columns


def _metadata(path: str, fmt: str) -> dict:
    if fmt != "parquet":
        return {}
    try:
        meta = pq.read_schema(_parquet_paths(path)[0]).metadata or {}
    except (pa.ArrowInvalid, OSError):
        return {}
    out = {}
    for key, value in meta.items():
        k = key.decode("utf-8", "replace")
        if not k.startswith("ionicity."):
            continue
        v = value.decode("utf-8", "replace")
        try:
            out[k] = json.loads(v) if v[:1] in "{[" else v
        except ValueError:
            out[k] = v
    return out


def _schema_names(path: str, fmt: str) -> list[str]:
    if fmt == "parquet":
        try:
            return list(pq.read_schema(_parquet_paths(path)[0]).names)
        except (pa.ArrowInvalid, OSError) as exc:
            raise InputError(f"cannot read {path!r} as Parquet: {str(exc).splitlines()[0]}") from None
    if path == "-":
        raise InputError("the report reads a file, not standard input; score into a file first")
    if not os.path.isfile(path):
        raise InputError(f"scored table {path!r} does not exist")
    with open(path, "rb") as f:
        head = f.readline().decode("utf-8-sig", "replace")
    delimiter = "\t" if fmt == "tsv" else ","
    try:
        return list(pacsv.read_csv(pa.py_buffer(head.encode()), parse_options=pacsv.ParseOptions(delimiter=delimiter)).schema.names)
    except pa.ArrowInvalid:
        raise InputError(f"cannot read the header of {path!r} as {fmt.upper()}") from None


def used_columns(names: list[str], prefix: str = "") -> dict[str, str]:
    """role -> column name, for the roles found (``prefix`` as given to score)."""
    return {role: prefix + role for role in ROLES + OPTIONAL_ROLES if prefix + role in names}


def _pick_input_columns(names, generated, options, id_col, name_col):
    formula_col = options.get("formula_col") if isinstance(options, dict) else None
    if name_col is None and isinstance(options, dict):
        name_col = options.get("name_col")
    inputs = [n for n in names if n not in generated]
    if formula_col not in inputs:
        formula_col = next((n for n in inputs if n.lower() == "formula"), None)
    for label, col in (("--id-col", id_col), ("--name-col", name_col)):
        if col is not None and col not in names:
            raise InputError(f"{label} {col!r} is not a column of the table; columns found: {', '.join(inputs[:20])}")
    if name_col is None:
        name_col = next((n for n in inputs if n.lower() == "name"), None)
    if id_col is None:
        id_col = next((n for n in inputs if n not in (formula_col, name_col)), None)
    return id_col, (name_col if name_col in names else None), formula_col


def _batches(path: str, fmt: str, columns: list[str], batch_rows: int, text_cols: set[str]):
    if fmt == "parquet":
        for part in _parquet_paths(path):
            f = pq.ParquetFile(part, read_dictionary=[c for c in columns if c in text_cols])
            try:
                yield from f.iter_batches(batch_size=batch_rows, columns=columns)
            finally:
                f.close()
        return
    reader = pacsv.open_csv(
        path,
        read_options=pacsv.ReadOptions(block_size=1 << 22),
        parse_options=pacsv.ParseOptions(delimiter="\t" if fmt == "tsv" else ",", newlines_in_values=True),
        convert_options=pacsv.ConvertOptions(
            include_columns=columns, strings_can_be_null=False, null_values=["", "nan", "NaN", "null"],
            column_types={c: pa.string() if c in text_cols else pa.float64() for c in columns}),
    )
    for batch in reader:
        yield batch


def _valid(arr: pa.Array) -> np.ndarray | None:
    """The validity of ``arr`` as a bool array, or None when it has no nulls."""
    if not arr.null_count:
        return None
    bits = np.unpackbits(np.frombuffer(arr.buffers()[0], dtype=np.uint8), bitorder="little")
    return bits[arr.offset:arr.offset + len(arr)].astype(bool)


def _floats(arr: pa.Array) -> np.ndarray:
    """float64 values, NaN for nulls, read from the buffers: pyarrow's own
    conversions of arrays with nulls (and pa.scalar) import pandas, 1.3 s (cProfile)."""
    if pa.types.is_dictionary(arr.type):
        arr = arr.dictionary_decode()
    if arr.type != pa.float64():
        try:
            arr = pc.cast(arr, pa.float64())
        except (pa.ArrowInvalid, pa.ArrowNotImplementedError):
            return np.full(len(arr), np.nan)
    values = np.frombuffer(arr.buffers()[1], dtype=np.float64, count=len(arr), offset=arr.offset * 8) if len(arr) else np.empty(0)
    valid = _valid(arr)
    return values if valid is None else np.where(valid, values, np.nan)


def _codes(arr: pa.Array, values: bool = True) -> tuple[np.ndarray, list | None]:
    """Integer codes (-1 for null or empty) and the values they stand for
    (``values=False``: codes only, for a column of many distinct texts)."""
    if not pa.types.is_dictionary(arr.type):
        arr = pc.dictionary_encode(arr)
    codes = int_numpy(arr.indices).astype(np.int64)
    valid = _valid(arr.indices)
    if valid is not None:
        codes[~valid] = -1
    lengths = pc.utf8_length(arr.dictionary)
    empty = int_numpy(lengths) == 0
    valid = _valid(lengths)
    if valid is not None:
        empty |= ~valid
    if empty.any():
        codes[empty[np.maximum(codes, 0)] & (codes >= 0)] = -1
    return codes, (arr.dictionary.to_pylist() if values else None)


def _count_into(counter: Counter, codes: np.ndarray, values: list, mask: np.ndarray | None = None) -> None:
    c = codes if mask is None else codes[mask]
    c = c[c >= 0]
    for i, n in enumerate(np.bincount(c, minlength=len(values))):
        if n:
            _add_capped(counter, values[i], int(n))


def _add_capped(counter: Counter, key, n: int) -> None:
    if key in counter or len(counter) < MAX_KEYS:
        counter[key] += n
    else:
        counter["(other values)"] += n


def _text(arr: pa.Array, rows: np.ndarray) -> list:
    return arr.take(int_array(rows)).cast(pa.string()).to_pylist() if len(rows) else []


class _Aggregator:
    def __init__(self, data: ReportData, sample_rows: int, seed: int):
        self.d = data
        self.rng = np.random.default_rng(seed)
        self.k = sample_rows
        self.keys = np.empty(0)
        self.below = set(classes_melting_below())
        for role in ("status", "substance_class", "melting_class", "bond_type", "name_check", "liquidus_method"):
            data.counts[role] = Counter()
        data.reasons = {"error": Counter(), "warning": Counter()}

    def _first(self, kind: str, batch: pa.RecordBatch, start: int, mask: np.ndarray, detail_role: str | None, extra=None):
        d = self.d
        hits = np.flatnonzero(mask)
        d.kind_rows[kind] += len(hits)
        kept = d.first_rows.setdefault(kind, [])
        take = hits[: max(0, FIRST_ROWS - len(kept))]
        if not len(take):
            return
        col = lambda name: _text(batch.column(name), take) if name else [None] * len(take)  # noqa: E731
        ids, names = col(d.id_col), col(d.name_col)
        formulas = col(d.formula_col)
        details = col(d.columns.get(detail_role)) if detail_role else [None] * len(take)
        extras = col(d.columns.get(extra)) if extra else [None] * len(take)
        for j, r in enumerate(take):
            kept.append({"row": start + int(r) + 1, "id": ids[j], "name": names[j], "formula": formulas[j],
                         "detail": details[j], "extra": extras[j]})

    def add(self, batch: pa.RecordBatch, start: int) -> None:
        d, c = self.d, self.d.columns
        n = batch.num_rows
        d.rows += n
        col = {role: batch.column(name) for role, name in c.items()}
        codes = {}
        for role in ("status", "substance_class", "melting_class", "bond_type", "name_check", "liquidus_method",
                     "cation_hsab_class", "anion_hsab_class"):
            if role in col:
                codes[role] = _codes(col[role])
                if role in d.counts:
                    _count_into(d.counts[role], *codes[role])
        status_codes, status_values = codes["status"]
        message = None
        for status in ("error", "warning"):
            if status not in status_values:
                continue
            mask = status_codes == status_values.index(status)
            if mask.any():
                if message is None:  # codes once per batch; the texts only of the messages counted
                    message = col["message"] if pa.types.is_dictionary(col["message"].type) else pc.dictionary_encode(col["message"])
                    mcodes, _ = _codes(message, values=False)
                counts = np.bincount(mcodes[mask & (mcodes >= 0)], minlength=len(message.dictionary))
                for i in np.flatnonzero(counts):
                    _add_capped(d.reasons[status], reason_of(message.dictionary[int(i)].as_py()), int(counts[i]))
                self._first(status, batch, start, mask, "message")
        if "formula_suggested" in col:
            sc, sv = _codes(col["formula_suggested"])
            self._first("slip", batch, start, sc >= 0, "formula_suggested")
        if "name_check" in codes:
            nc, nv = codes["name_check"]
            bad = [i for i, v in enumerate(nv) if v in ("mismatch", "hydrate_differs")]
            self._first("name_mismatch", batch, start, np.isin(nc, bad), "name_check", "name_formula")
        if "first_row_same_compound" in col:
            dup = col["first_row_same_compound"]
            valid = _valid(dup)
            mask = np.ones(len(dup), bool) if valid is None else valid
            if pa.types.is_string(dup.type) or pa.types.is_dictionary(dup.type):
                mask &= _codes(dup)[0] >= 0
            self._first("duplicate", batch, start, mask, "first_row_same_compound")
        self._hsab(codes)
        # the numeric columns are binned once per distinct formula text of the batch, weighted by its rows:
        # the scorer scores each distinct text once, so its rows carry the same values (DEVELOPERS.md)
        rep, pos, weight = self._representatives(batch)
        x = _floats(col["mean_chi_pauling"].take(int_array(rep)))
        y = _floats(col["delta_chi_pauling"].take(int_array(rep)))
        self._bond_map(x, y, weight)
        trend = _floats(col["mp_trend_index"].take(int_array(rep)))
        lattice = _floats(col["lattice_energy_vbt_kJ_mol"].take(int_array(rep)))
        self._melting(trend, lattice, weight, rep, codes["melting_class"], batch, start)
        if "liquidus_estimate_K" in col:
            liq = _floats(col["liquidus_estimate_K"])
            idx, _ = LIQUIDUS_BINS.index(liq)
            d.liquidus += np.bincount(idx, minlength=LIQUIDUS_BINS.n)
            self._first("mixture", batch, start, np.isfinite(liq), "liquidus_estimate_K", "mixture_components")
        self._sample(n, start, pos, (x, y, trend, lattice), codes["substance_class"])

    def _representatives(self, batch: pa.RecordBatch) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """One row of each distinct formula text in the batch, each row's
        position among them, and each one's number of rows. Without a
        formula column every row stands for itself."""
        n = batch.num_rows
        if self.d.formula_col is None:
            every = np.arange(n)
            return every, every, np.ones(n, np.int64)
        fc, _ = _codes(batch.column(self.d.formula_col), values=False)
        k = int(fc.max()) + 2 if n else 1
        fc = np.where(fc < 0, k - 1, fc)  # empty and null cells: one group of their own
        weight = np.bincount(fc, minlength=k)
        present = np.flatnonzero(weight)
        # any row of a formula stands for it (all carry the same values), so the row written last by this
        # fancy assignment will do: no sort needed
        any_row = np.zeros(k, np.int64)
        any_row[fc] = np.arange(n)
        slot = np.zeros(k, np.int64)
        slot[present] = np.arange(len(present))
        return any_row[present], slot[fc], weight[present]

    def _hsab(self, codes) -> None:
        if "cation_hsab_class" not in codes or "anion_hsab_class" not in codes:
            return
        (a, av), (b, bv) = codes["cation_hsab_class"], codes["anion_hsab_class"]
        ok = (a >= 0) & (b >= 0)
        pair = np.bincount(a[ok] * len(bv) + b[ok], minlength=len(av) * len(bv))
        for k in np.flatnonzero(pair):
            self.d.hsab_pairs[(av[k // len(bv)], bv[k % len(bv)])] += int(pair[k])

    def _bond_map(self, x, y, weight) -> None:
        both = CHI_MEAN_BINS.index(x)[1] & CHI_DELTA_BINS.index(y)[1]
        flat = CHI_MEAN_BINS.index(x[both])[0] * CHI_DELTA_BINS.n + CHI_DELTA_BINS.index(y[both])[0]
        counts = np.bincount(flat, weights=weight[both], minlength=CHI_MEAN_BINS.n * CHI_DELTA_BINS.n)
        self.d.bond_map += counts.astype(np.int64).reshape(self.d.bond_map.shape)

    def _melting(self, trend, lattice, weight, rep, melting_codes, batch, start) -> None:
        """Histograms from the batch's representative rows (``trend``, ``lattice``, ``weight`` and the
        melting class at ``rep``); the compounds below 100 C from every row."""
        d = self.d
        mc, mv = melting_codes
        idx, inside = TREND_BINS.index(trend)
        classes = mc[rep][inside]
        keep = classes >= 0
        by_class = np.bincount((classes * TREND_BINS.n + idx)[keep], weights=weight[inside][keep],
                               minlength=len(mv) * TREND_BINS.n).astype(np.int64).reshape(len(mv), TREND_BINS.n)
        for i, name in enumerate(mv):
            if name not in (None, "") and by_class[i].any():
                d.trend_by_class.setdefault(name, np.zeros(TREND_BINS.n, np.int64))
                d.trend_by_class[name] += by_class[i]
        with np.errstate(divide="ignore", invalid="ignore"):
            loglat = np.log10(lattice)
        both = np.isfinite(trend) & np.isfinite(loglat)
        t, inside_t = TREND_BINS.index(trend[both])
        l, inside_l = LATTICE_LOG_BINS.index(loglat[both][inside_t])
        flat = t[inside_l] * LATTICE_LOG_BINS.n + l
        w = weight[both][inside_t][inside_l]
        d.lattice_trend += np.bincount(flat, weights=w, minlength=TREND_BINS.n * LATTICE_LOG_BINS.n).astype(
            np.int64).reshape(d.lattice_trend.shape)
        low = [i for i, v in enumerate(mv) if v in self.below]
        if not low:
            return
        is_low = np.zeros(len(mv) + 1, bool)  # a lookup by code (-1, no class, is the last): np.isin sorts, 15x slower
        is_low[low] = True
        rows = np.flatnonzero(is_low[mc])
        d.low_melting_rows += len(rows)
        if not len(rows) or "formula_normalized" not in d.columns:
            return
        texts = batch.column(d.columns["formula_normalized"]).take(int_array(rows))
        if pa.types.is_dictionary(texts.type):
            # a take keeps the batch's whole dictionary (one text per compound): listing it was 3 ms a batch
            texts = texts.dictionary_decode()
        fc, fv = _codes(texts)
        counts = np.bincount(fc[fc >= 0], minlength=len(fv))
        uniq, first = np.unique(fc, return_index=True)
        new = [(u, f) for u, f in zip(uniq, first) if u >= 0 and fv[u] not in d.low_melting]
        room = max(0, MAX_KEYS - len(d.low_melting))
        names = _text(batch.column(d.name_col), rows[[f for _, f in new[:room]]]) if d.name_col else [None] * room
        for (u, f), name in zip(new[:room], names):
            d.low_melting[fv[u]] = {"rows": 0, "name": name, "first_row": start + int(rows[f]) + 1}
        for u in np.flatnonzero(counts):
            if fv[u] in d.low_melting:
                d.low_melting[fv[u]]["rows"] += int(counts[u])

    def _sample(self, n, start, pos, values, class_codes) -> None:
        """Bottom-k: ``values`` are per distinct formula (x, y, trend, lattice), ``pos`` maps rows to them."""
        keys = self.rng.random(n)
        cc, cv = class_codes
        # once the sample is full, only rows whose key beats its largest can enter: few, late in a big table
        take = np.flatnonzero(keys < self.keys.max()) if len(self.keys) >= self.k else np.arange(n)
        if not len(take):
            return
        keys = keys[take]
        names = np.array([""] + list(cv), dtype=object)
        at = pos[take]
        x, y, trend, lattice = (v[at] for v in values)
        new = {"x": x, "y": y, "trend": trend, "lattice": lattice,
               "substance_class": names[cc[take] + 1], "row": take + start + 1}
        if self.d.sample:
            keys = np.concatenate([self.keys, keys])
            new = {k: np.concatenate([self.d.sample[k], v]) for k, v in new.items()}
        if len(keys) > self.k:
            keep = np.argpartition(keys, self.k)[: self.k]
            keys = keys[keep]
            new = {k: v[keep] for k, v in new.items()}
        self.keys, self.d.sample = keys, new


def plan(path: str, *, id_col: str | None = None, name_col: str | None = None,
         prefix: str | None = None) -> tuple[ReportData, list[str], set[str]]:
    """An empty :class:`ReportData` for ``path`` (columns found, metadata),
    the columns to read and which of them are text; raises :class:`InputError`
    when the file is not a table written by ``ionicity score``."""
    fmt = format_of(path)
    names = _schema_names(path, fmt)
    meta = _metadata(path, fmt)
    options = meta.get("ionicity.options") if isinstance(meta.get("ionicity.options"), dict) else {}
    if prefix is None:
        prefix = options.get("prefix") or ""
    columns = used_columns(names, prefix)
    missing = [prefix + r for r in ROLES if r not in columns]
    if missing:
        raise InputError(f"{path!r} is not a table scored by ionicity score: columns {', '.join(missing[:6])}"
                         f"{' ...' if len(missing) > 6 else ''} are missing (score it first; --prefix if it was scored with one)")
    generated = {prefix + c for c in column_names()} | set(columns.values())
    id_col, name_col, formula_col = _pick_input_columns(names, generated, options, id_col, name_col)
    data = ReportData(source=path, fmt=fmt, columns=columns, id_col=id_col, name_col=name_col,
                      formula_col=formula_col, metadata=meta)
    files = _parquet_paths(path) if fmt == "parquet" else [path]
    data.file_bytes = sum(os.path.getsize(p) for p in files)
    data.file_modified = max(os.path.getmtime(p) for p in files)
    read = list(dict.fromkeys([*columns.values(), *(c for c in (id_col, name_col, formula_col) if c)]))
    text = {c for c in read if c not in {columns.get(r) for r in _NUMERIC}}
    return data, read, text


def aggregate(path: str, *, id_col: str | None = None, name_col: str | None = None, prefix: str | None = None,
              batch_rows: int = 65536, sample_rows: int = SAMPLE_ROWS, seed: int = 18) -> ReportData:
    """Read a scored table (CSV, TSV, Parquet or Parquet parts) once, in
    batches of the columns used (:func:`plan`), into a :class:`ReportData`.

    Raises :class:`InputError` when the file cannot be read or is not a
    table written by ``ionicity score`` (its status column is missing).
    """
    began = time.perf_counter()
    data, read, text = plan(path, id_col=id_col, name_col=name_col, prefix=prefix)
    agg = _Aggregator(data, sample_rows, seed)
    start = 0
    try:
        for batch in _batches(path, data.fmt, read, batch_rows, text):
            agg.add(batch, start)
            start += batch.num_rows
    except (pa.ArrowInvalid, OSError, UnicodeDecodeError) as exc:
        raise InputError(f"cannot read {path!r}: {str(exc).splitlines()[0]}") from None
    data.seconds = time.perf_counter() - began
    for status in STATUSES:
        data.counts["status"].setdefault(status, 0)
    return data
