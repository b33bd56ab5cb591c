"""A text table's dialect: its delimiter (found from the header line, or
``--sep``) and its encoding (``--encoding``: UTF-8, Latin-1 or Windows-1252),
with the one-line errors that name the option to use. Light: no pyarrow.
"""
from __future__ import annotations

import codecs

from ionicity.pipelines.errors import InputError

__all__ = ["ENCODINGS", "ENCODING_HINT", "SPELLED", "check_encoding", "encoding_problem", "check_delimiter",
           "sniff_delimiter"]

#: --encoding: the codec names accepted (Python's spelling after codecs.lookup)
ENCODINGS = {"utf-8": "utf-8", "iso8859-1": "latin-1", "cp1252": "cp1252"}

ENCODING_HINT = {
    "utf-8": "pass --encoding latin-1 (or --encoding cp1252 for Windows files), or re-save it as UTF-8",
    "cp1252": "pass --encoding latin-1, or re-save it as UTF-8",
    "latin-1": "re-save it as UTF-8",
}


def check_encoding(encoding: str | None) -> str:
    """The codec for ``--encoding`` (``None`` is UTF-8); :class:`InputError` for others.

    >>> check_encoding("Latin1"), check_encoding("windows-1252"), check_encoding(None)
    ('latin-1', 'cp1252', 'utf-8')
    """
    if encoding is None:
        return "utf-8"
    try:
        name = codecs.lookup(encoding).name
    except LookupError:
        name = None
    if name not in ENCODINGS:
        raise InputError(f"--encoding must be one of utf-8, latin-1, cp1252, not {encoding!r}")
    return ENCODINGS[name]


def encoding_problem(head: bytes, complete: bool, encoding: str = "utf-8") -> str | None:
    if head.startswith((codecs.BOM_UTF16_LE, codecs.BOM_UTF16_BE)) or b"\x00" in head[:4096]:
        return "looks like UTF-16 or binary, not text; re-save it as UTF-8 CSV"
    try:
        codecs.getincrementaldecoder(encoding)().decode(head, final=complete)
    except UnicodeDecodeError as exc:
        return f"is not valid {SPELLED[encoding]} text (byte {exc.start + 1}); {ENCODING_HINT[encoding]}"
    return None


SPELLED = {"utf-8": "UTF-8", "latin-1": "Latin-1", "cp1252": "Windows-1252"}


def check_delimiter(sep: str | None) -> str | None:
    """The delimiter of ``--sep`` (``tab`` or ``\\t`` for a tab); ``None`` finds it.

    >>> check_delimiter(";"), check_delimiter("tab"), check_delimiter(None)
    (';', '\\t', None)
    """
    if sep is None:
        return None
    sep = {"tab": "\t", "\\t": "\t", "comma": ",", "semicolon": ";"}.get(sep.lower(), sep)
    if len(sep) != 1 or sep in "\"\r\n" or sep.isalnum():
        raise InputError(f"--sep must be one character such as , ; | or tab, not {sep!r}")
    return sep


def sniff_delimiter(head: str, default: str) -> str:
    """The delimiter of a CSV: whichever of comma, semicolon and tab occurs
    most often outside quotes in its header line; ``default`` when none does.

    >>> sniff_delimiter('name;formula;"a,b"\\nx;NaCl;1', ","), sniff_delimiter("formula\\nNaCl", ",")
    (';', ',')
    """
    counts = dict.fromkeys(",;\t", 0)
    quoted = False
    for ch in head:
        if ch == '"':
            quoted = not quoted
        elif not quoted:
            if ch in "\r\n":
                break
            if ch in counts:
                counts[ch] += 1
    best = max(counts, key=lambda c: (counts[c], c == default))
    return best if counts[best] else default
