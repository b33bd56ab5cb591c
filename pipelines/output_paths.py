"""Output paths: where a run writes, what it may replace, and what it keeps beside.

Temporary outputs are named ``.ionicity-PID@HOST.TOKEN.partial`` and sit
beside the output. An interrupted run removes its own (Ctrl-C, SIGTERM); one
that was killed outright cannot, so every later run first removes the
partials of this host whose process is gone (:func:`clean_stale_partials`).

What is at the output path is never replaced unless ``--overwrite`` asked
for it: without it the result is hard-linked into place (which fails if the
path appeared meanwhile; the result is then kept beside it, :func:`kept_path`),
and with it only a regular file, or a dataset folder carrying
:data:`DATASET_MARKER`, is replaced.
"""
from __future__ import annotations

import errno
import os
import re
import secrets
import shutil
import socket
import stat

from ionicity.pipelines.errors import InputError

__all__ = [
    "partial_path",
    "clean_stale_partials",
    "check_output_path",
    "kept_path",
    "keep_beside",
    "backup_path",
    "DATASET_MARKER",
    "is_ionicity_dataset",
    "exchange_paths",
    "write_failure",
]

_PARTIAL_PREFIX = ".ionicity-"
_PARTIAL_SUFFIX = ".partial"
_PARTIAL_RE = re.compile(r"^\.ionicity-(\d+)@([A-Za-z0-9-]+)\.[0-9a-f]{8}\.partial$")
# an old dataset folder moved aside while the new one is renamed into place
_BACKUP_RE = re.compile(r"^\.(.+)\.ionicity-(\d+)@([A-Za-z0-9-]+)\.backup$")
#: the file ionicity writes into every dataset folder it creates; --overwrite
#: replaces only a folder that carries it
DATASET_MARKER = "_ionicity_dataset"



# --------------------------------------------------------------------------- partial files


def _host_tag() -> str:
    return re.sub(r"[^A-Za-z0-9-]", "-", socket.gethostname())[:60] or "host"


def partial_path(directory: str) -> str:
    """A fresh temporary path in ``directory`` named after this process and host."""
    name = f"{_PARTIAL_PREFIX}{os.getpid()}@{_host_tag()}.{secrets.token_hex(4)}{_PARTIAL_SUFFIX}"
    return os.path.join(directory, name)


def _pid_alive(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OSError):
        return True
    return True


def clean_stale_partials(directory: str) -> list[str]:
    """Remove partial outputs left in ``directory`` by killed runs on this host.

    Only names of our own pattern whose process id is no longer running here
    are removed, so a run in progress (on this host or, on a shared disk,
    another one) is never touched. A dataset folder that a killed run had
    moved aside to replace it (:func:`backup_path`) is renamed back when
    nothing took its place, and removed only when the new dataset was already
    in place. Returns the paths removed.
    """
    if os.name != "posix":
        return []
    removed = []
    host = _host_tag()
    try:
        names = os.listdir(directory or ".")
    except OSError:
        return []
    for name in names:
        backup = _BACKUP_RE.match(name)
        if backup and backup.group(3) == host and not _pid_alive(int(backup.group(2))):
            _settle_backup(os.path.join(directory, name), os.path.join(directory, backup.group(1)))
            continue
        match = _PARTIAL_RE.match(name)
        if not match or match.group(2) != host or _pid_alive(int(match.group(1))):
            continue
        path = os.path.join(directory, name)
        try:
            if os.path.isdir(path) and not os.path.islink(path):
                shutil.rmtree(path)
            else:
                os.remove(path)
            removed.append(path)
        except OSError:  # another run removed it first
            pass
    return removed


def backup_path(path: str) -> str:
    """Where the dataset folder ``path`` waits while its replacement moves in."""
    directory, base = os.path.split(os.path.abspath(path))
    return os.path.join(directory, f".{base}.ionicity-{os.getpid()}@{_host_tag()}.backup")


def is_ionicity_dataset(path: str) -> bool:
    """Whether ``path`` is a real folder (no symlink) holding :data:`DATASET_MARKER`."""
    try:
        return stat.S_ISDIR(os.lstat(path).st_mode) and stat.S_ISREG(os.lstat(os.path.join(path, DATASET_MARKER)).st_mode)
    except OSError:
        return False


def _settle_backup(backup: str, output: str) -> None:
    """A killed run's moved-aside dataset: back into place if the path is
    free, removed if the run's new dataset got there, else left alone."""
    try:
        if not os.path.lexists(output):
            if is_ionicity_dataset(backup):
                os.rename(backup, output)
        elif is_ionicity_dataset(output):
            shutil.rmtree(backup)
    except OSError:  # another run got there first
        pass


_RENAME_EXCHANGE = 2  # linux/fs.h
_AT_FDCWD = -100


def exchange_paths(a: str, b: str) -> bool:
    """Swap what ``a`` and ``b`` name in one step (Linux ``renameat2`` with
    ``RENAME_EXCHANGE``), so that ``b`` is never missing; False, with nothing
    changed, where the system or the file system cannot (the caller then
    renames twice)."""
    if not hasattr(os, "fork") or not os.uname().sysname == "Linux":
        return False
    try:
        # ctypes and libc cost about 1 ms; only a Dask run that replaces a dataset gets here
        import ctypes

        libc = ctypes.CDLL(None, use_errno=True)
        renameat2 = libc.renameat2
    except (OSError, AttributeError):  # glibc before 2.28, or another libc
        return False
    renameat2.argtypes = [ctypes.c_int, ctypes.c_char_p, ctypes.c_int, ctypes.c_char_p, ctypes.c_uint]
    if renameat2(_AT_FDCWD, os.fsencode(a), _AT_FDCWD, os.fsencode(b), _RENAME_EXCHANGE) == 0:
        return True
    number = ctypes.get_errno()
    if number in (errno.ENOSYS, errno.EINVAL, errno.EOPNOTSUPP, errno.ENOTSUP):
        return False
    raise OSError(number, os.strerror(number), b)


def kept_path(path: str) -> str:
    """A fresh name beside ``path`` (``out.new-1a2b3c4d.parquet``) for a
    result that could not take ``path`` without replacing what is there."""
    stem, suffix = os.path.splitext(path)
    return f"{stem}.new-{secrets.token_hex(4)}{suffix}"


def keep_beside(tmp: str, path: str, reason: str) -> InputError:
    """Move the finished result ``tmp`` to :func:`kept_path` of ``path`` and
    return the error that says where it is (one line)."""
    kept = kept_path(path)
    os.rename(tmp, kept)  # a fresh random name: nothing there to replace
    return InputError(f"output {path!r} {reason}; this run's result is in {kept!r}")


def _remove(path: str | None) -> None:
    if path is None:
        return
    try:
        if os.path.isdir(path) and not os.path.islink(path):
            shutil.rmtree(path)
        elif os.path.exists(path):
            os.remove(path)
    except OSError:
        pass


def check_output_path(path: str, overwrite: bool, inputs: tuple[str, ...] = (), dataset: bool = False) -> str:
    """Refuse outputs that would replace the input, an existing path without
    ``overwrite``, or with it anything but a regular file (``dataset``: a
    folder of Parquet parts carrying :data:`DATASET_MARKER`); returns the
    output's folder. A dangling symlink counts as existing."""
    if os.path.isdir(path) and not dataset:
        raise InputError(f"output {path!r} is a directory; give a file name ending .csv, .tsv or .parquet")
    if os.path.lexists(path) and not overwrite:
        raise InputError(f"output {path!r} exists; pass --overwrite to replace it")
    if os.path.lexists(path):
        target = os.path.realpath(path)
        for source in inputs:
            real = os.path.realpath(source)
            if source != "-" and (real == target or real.startswith(target + os.sep)):
                raise InputError(f"output {path!r} is (or holds) the input; choose another output path")
        if dataset and not is_ionicity_dataset(path):
            raise InputError(f"output {path!r} is not a dataset folder written by ionicity (it has no"
                             f" {DATASET_MARKER} file), so --overwrite will not replace it; remove it or choose another path")
        if not dataset and not stat.S_ISREG(os.lstat(path).st_mode):
            raise InputError(f"output {path!r} is not a regular file (a symlink, device or the like), so --overwrite"
                             " will not replace it; remove it or choose another path")
    directory = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(directory):
        raise InputError(f"output folder {directory!r} does not exist")
    return directory


def write_failure(exc: OSError, path: str) -> OSError:
    """The error of a failed write, naming the output ``path`` (``-``: standard
    output). Arrow's errors carry neither path nor errno (a full disk or a
    file-size limit was an anonymous line): the number is read from their text.

    >>> write_failure(OSError("Error writing bytes to file. Detail: [errno 27] File too large"), "out.parquet")
    OSError(27, 'cannot write the output: File too large')
    """
    number = exc.errno
    if number is None:
        found = re.search(r"\[errno (\d+)\]", str(exc))
        number = int(found.group(1)) if found else None
    text = str(exc).strip()
    what = os.strerror(number) if number else exc.strerror or (text.splitlines()[0] if text else type(exc).__name__)
    return OSError(number, f"cannot write the output: {what}", "standard output" if path == "-" else path)
