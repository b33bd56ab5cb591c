"""Block sizes for reading a CSV: long header lines and long fields.

Arrow's streaming CSV reader parses the input in blocks of a fixed size and
fails on a row longer than a block ("straddling object straddles two block
boundaries"); it also needs the whole header line in its first block (a
100,000-column header is several MB). So the head of the file is read until
it holds the header line (:func:`head_with_header_line`), the first block is
sized to hold it (:func:`block_for_header`), and a row longer than the block
met later restarts the reader on the file with a block four times larger,
skipping the rows already handed out (:func:`growing_batches`), up to
:data:`MAX_BLOCK_BYTES`. Standard input cannot be read twice: there the
error names the limit and what to do.
"""
from __future__ import annotations

from typing import Callable, Iterator

import pyarrow as pa

from ionicity.pipelines.errors import InputError

__all__ = ["MAX_BLOCK_BYTES", "head_with_header_line", "block_for_header", "growing_batches", "is_block_too_small",
           "header_line_end"]

#: the longest row (and header line) ionicity reads: a block this large is
#: held in memory, with the few blocks Arrow reads ahead
MAX_BLOCK_BYTES = 1 << 28


def _mib(size: int) -> str:
    return f"{size / (1 << 20):g} MiB"


def is_block_too_small(exc: BaseException) -> bool:
    """Whether Arrow failed because a row (or the header) did not fit one block."""
    text = str(exc)
    return "straddl" in text or "Empty CSV file or block" in text


def head_with_header_line(raw, head: bytes, complete: bool, label: str) -> tuple[bytes, bool]:
    """``head`` read on (doubling) until it holds a line end, so that the
    header line is whole; (head, whether it is the whole input)."""
    while not complete and b"\n" not in head and b"\r" not in head:
        if len(head) >= MAX_BLOCK_BYTES:
            raise InputError(f"input {label}: the header line is longer than {_mib(MAX_BLOCK_BYTES)}, the longest"
                             " line ionicity reads")
        more = raw.read(len(head))
        complete = len(more) < len(head)
        head += more
    return head, complete


def header_line_end(head: bytes) -> int:
    """Where the first line ends (past its line end), or the head's length."""
    ends = [i for i in (head.find(b"\n"), head.find(b"\r")) if i >= 0]
    return min(ends) + 1 if ends else len(head)


def block_for_header(head: bytes, smallest: int) -> int:
    """A block size of at least ``smallest`` that holds the header line twice over."""
    line = header_line_end(head)
    block = smallest
    while block < 2 * line:
        block *= 2
    return block


def growing_batches(open_reader: Callable[[int, int], object], block: int, label: str,
                    can_restart: bool) -> Iterator[pa.RecordBatch]:
    """Record batches of ``open_reader(block_size, rows_to_skip)``; a row longer
    than the block restarts it with a block four times larger after the rows
    already given, while the file can be read again and the block stays
    within :data:`MAX_BLOCK_BYTES`. Other errors propagate."""
    given = 0
    reader = None
    while True:
        try:
            if reader is None:
                reader = open_reader(block, given)
            batch = reader.read_next_batch()
        except StopIteration:
            return
        except pa.ArrowInvalid as exc:
            if not is_block_too_small(exc):
                raise
            if not can_restart:
                raise InputError(f"input {label}: a row after row {given} is longer than the {_mib(block)} block"
                                 " read from standard input; save the table to a file and give its path (files"
                                 f" are read again with blocks up to {_mib(MAX_BLOCK_BYTES)})") from None
            if block >= MAX_BLOCK_BYTES:
                raise InputError(f"input {label}: a row after row {given} is longer than {_mib(MAX_BLOCK_BYTES)},"
                                 " the longest row ionicity reads") from None
            block = min(block * 4, MAX_BLOCK_BYTES)
            reader = None
            continue
        given += batch.num_rows
        yield batch
