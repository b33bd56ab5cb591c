"""``ionicity score --aliases FILE.csv``: a user's own blend names.

The file is a CSV (UTF-8) with a header and the columns

* ``name``: the blend name as it appears in the formula column (matched
  ignoring case and spacing), e.g. ``our bath A``; it must not read as a
  formula itself;
* ``mixture``: the blend in mixture notation, e.g. ``LiCl-KCl (58.8-41.2 mol%)``;
* ``source`` (optional): where the composition comes from.

Names given here take precedence over ``scorer/data/blends.csv``. Anything
wrong with the file is an :class:`InputError` naming the file, the line and
the problem (exit code 2 on the command line).

Worker processes learn the names through the environment variable
:data:`ENVIRONMENT_VARIABLE` (set before they start, read once by
:func:`ionicity.scorer.mixture.set_user_blends` callers in
:func:`load_aliases_from_environment`), since a forked worker does not share
the parent's memory after it starts.
"""
from __future__ import annotations

import csv
import json
import os

from ionicity.pipelines.errors import InputError
from ionicity.scorer.formula import FormulaError, parse_formula
from ionicity.scorer.mixture import set_user_blends
from ionicity.scorer.mixture_notation import MixtureNotationError, blend_key, read_mixture_text

__all__ = ["read_aliases", "load_aliases", "load_aliases_from_environment", "ENVIRONMENT_VARIABLE", "MAX_ALIASES"]

ENVIRONMENT_VARIABLE = "IONICITY_USER_BLENDS"
MAX_ALIASES = 10_000
_REQUIRED = ("name", "mixture")


def read_aliases(path: str) -> list[tuple[str, str, str]]:
    """``(name, mixture, source)`` rows of an aliases file, checked.

    Raises
    ------
    InputError
        The file cannot be read, lacks a column, or a row is unusable (the
        message names the line).
    """
    try:
        with open(path, newline="", encoding="utf-8") as handle:
            reader = csv.DictReader(handle)
            header = [h.strip().lower() for h in (reader.fieldnames or [])]
            missing = [c for c in _REQUIRED if c not in header]
            if missing:
                raise InputError(
                    f"--aliases {path}: the header lacks {', '.join(missing)}; expected the columns name, mixture"
                    f" and optionally source (found: {', '.join(reader.fieldnames or []) or 'no header'})"
                )
            reader.fieldnames = header
            rows = []
            seen: dict[str, int] = {}
            for line, row in enumerate(reader, start=2):
                if line - 1 > MAX_ALIASES:
                    raise InputError(f"--aliases {path}: more than {MAX_ALIASES} names")
                rows.append(_checked(path, line, row, seen))
    except OSError as exc:
        raise InputError(f"--aliases {path}: cannot read the file ({exc.strerror or exc})") from None
    except UnicodeDecodeError:
        raise InputError(f"--aliases {path}: the file is not UTF-8 text") from None
    except csv.Error as exc:
        raise InputError(f"--aliases {path}: not a readable CSV ({exc})") from None
    if not rows:
        raise InputError(f"--aliases {path}: no names in the file")
    return rows


def _checked(path: str, line: int, row: dict, seen: dict) -> tuple[str, str, str]:
    name = (row.get("name") or "").strip()
    mixture = (row.get("mixture") or "").strip()
    source = (row.get("source") or "").strip() or f"--aliases {path}, line {line}"
    where = f"--aliases {path}, line {line}"
    if not name or not mixture:
        raise InputError(f"{where}: name and mixture must both be given")
    key = blend_key(name)
    if key in seen:
        raise InputError(f"{where}: the name {name!r} is given again (first on line {seen[key]})")
    seen[key] = line
    try:
        parse_formula(name)
    except FormulaError:
        pass
    else:
        raise InputError(f"{where}: the name {name!r} reads as a formula; choose a name that does not")
    try:
        if read_mixture_text(mixture) is None:
            raise InputError(
                f"{where}: {mixture!r} is not mixture notation; write components joined by '-', ':' or ' + ',"
                " e.g. 'LiCl-KCl (58.8-41.2 mol%)'"
            )
    except MixtureNotationError as exc:
        raise InputError(f"{where}: {exc}") from None
    return name, mixture, source


def load_aliases(path: str) -> int:
    """Read and check an aliases file, use it in this process, and pass it to
    worker processes started from now on. Returns the number of names."""
    rows = read_aliases(path)
    set_user_blends(rows)
    os.environ[ENVIRONMENT_VARIABLE] = json.dumps(rows)
    return len(rows)


def load_aliases_from_environment() -> None:
    """In a worker: use the names its parent loaded (nothing when there are none)."""
    text = os.environ.get(ENVIRONMENT_VARIABLE)
    if text:
        set_user_blends(tuple(tuple(r) for r in json.loads(text)))
