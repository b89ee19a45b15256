"""Atomic file output: write to a temporary file in the target directory, then rename.

A reader never sees a partial file: either the old state (no file, or the old file when
overwriting) or the complete new file. ``os.replace`` is atomic on POSIX and Windows when source
and target are on the same file system, hence the temporary file in the same directory.
"""

from __future__ import annotations

import contextlib
import os
import pathlib
import tempfile
from collections.abc import Callable, Iterator

from similitude.errors import InputError


class OutputExistsError(InputError, FileExistsError):
    """The output file exists and overwriting was not asked for."""


def check_target(path, overwrite: bool = False) -> pathlib.Path:
    """Resolve ``path`` and refuse an existing file unless ``overwrite``.

    Raises
    ------
    OutputExistsError
        (an InputError and a FileExistsError) naming the path and ``--force``.
    InputError
        When the parent directory does not exist or the path is a directory.
    """
    p = pathlib.Path(path).expanduser()
    if p.is_dir():
        raise InputError(f"output: {str(p)!r} is a directory; expected a file path")
    if p.exists() and not overwrite:
        raise OutputExistsError(
            f"output: {str(p)!r} exists; not overwritten (use --force or overwrite=True)")
    if not p.parent.is_dir():
        raise InputError(f"output: directory {str(p.parent)!r} does not exist; expected an "
                         "existing directory")
    return p


@contextlib.contextmanager
def atomic_path(path, overwrite: bool = False) -> Iterator[pathlib.Path]:
    """Context manager yielding a temporary path beside ``path``; renamed onto it on success.

    On any exception (including KeyboardInterrupt) the temporary file is removed and the
    target is left untouched.
    """
    target = check_target(path, overwrite)
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".part", dir=target.parent)
    os.close(fd)
    tmp_path = pathlib.Path(tmp)
    try:
        yield tmp_path
        if target.exists() and not overwrite:
            # created by someone else meanwhile: still never clobber it
            raise OutputExistsError(
                f"output: {str(target)!r} exists; not overwritten (use --force or "
                "overwrite=True)")
        os.replace(tmp_path, target)
    except BaseException:
        with contextlib.suppress(FileNotFoundError):
            tmp_path.unlink()
        raise


def write_atomic(path, writer: Callable[[pathlib.Path], None],
                 overwrite: bool = False) -> pathlib.Path:
    """Call ``writer(temporary_path)`` and move the result onto ``path`` atomically.

    Returns
    -------
    pathlib.Path
        The path written.
    """
    with atomic_path(path, overwrite) as tmp:
        writer(tmp)
    return pathlib.Path(path).expanduser()


def write_text_atomic(path, text: str, overwrite: bool = False,
                      encoding: str = "utf-8") -> pathlib.Path:
    """Write a text file atomically (used for CSV and JSON outputs)."""
    return write_atomic(path, lambda p: p.write_text(text, encoding=encoding), overwrite)
