"""Opening the files a user names: only regular files, only up to a stated size, refused before
anything is read.

A path may name a folder, a FIFO (reading it waits for a writer forever), a device such as
``/dev/zero`` or ``/dev/urandom`` (endless), or a file far larger than any case or measured
file. Each is refused here with one line naming the file and what was expected. The file is
opened without blocking and checked on the open descriptor (``fstat``), so a file swapped in
after a check cannot slip past it.
"""

from __future__ import annotations

import os
import stat
from pathlib import Path

from similitude.errors import InputError

#: Largest case, facility or campaign file read [bytes] (a case file is a few kB).
TEXT_FILE_LIMIT = 1_000_000
#: Largest measured-data file read [bytes]: a 10^6-row CSV of runs is about 50 MB.
DATA_FILE_LIMIT = 100_000_000
#: Largest unpacked content of an xlsx file of measured data [bytes] (a zip holding far more
#: than it weighs is refused before it is unpacked).
UNPACKED_LIMIT = 500_000_000


def shown_path(path) -> str:
    """A path as written in a message; a long one keeps its end (the file name)."""
    text = repr(str(path))
    return text if len(text) <= 80 else "'..." + text[-76:]


def size_text(n: float) -> str:
    """A number of bytes for a person: ``1.5 MB``."""
    for unit, size in (("GB", 1e9), ("MB", 1e6), ("kB", 1e3)):
        if n >= size:
            return f"{n / size:.3g} {unit}"
    return f"{int(n)} bytes"


def _kind(mode: int) -> str:
    if stat.S_ISFIFO(mode):
        return "a FIFO (named pipe)"
    if stat.S_ISCHR(mode) or stat.S_ISBLK(mode):
        return "a device"
    if stat.S_ISSOCK(mode):
        return "a socket"
    return "not a regular file"


def read_limited(path, label: str, limit: int, expected: str) -> bytes:
    """The bytes of a regular file of at most ``limit`` bytes.

    Parameters
    ----------
    path : str or Path
    label : str
        The file as named in messages, e.g. ``"case file 'ferry.toml'"``.
    limit : int
        Largest size accepted [bytes].
    expected : str
        What the file should be, for messages ("a TOML case file").

    Raises
    ------
    InputError
        Missing, a folder, not a regular file (FIFO, device, socket), larger than ``limit``,
        or unreadable; one line naming the file.
    """
    try:
        fd = os.open(Path(path), os.O_RDONLY | getattr(os, "O_NONBLOCK", 0)
                     | getattr(os, "O_CLOEXEC", 0))
    except (FileNotFoundError, NotADirectoryError):
        raise InputError(f"{label}: not found; expected an existing file ({expected})") \
            from None
    except IsADirectoryError:
        raise InputError(f"{label}: is a folder; expected {expected}") from None
    except OSError as exc:
        raise InputError(f"{label}: cannot be opened ({exc.strerror or exc}); expected a "
                         f"readable file ({expected})") from None
    except ValueError:  # a NUL character in the path
        raise InputError(f"{label}: is not a usable path; expected a file name") from None
    try:
        st = os.fstat(fd)
        if stat.S_ISDIR(st.st_mode):
            raise InputError(f"{label}: is a folder; expected {expected}")
        if not stat.S_ISREG(st.st_mode):
            raise InputError(f"{label}: is {_kind(st.st_mode)}; expected a regular file "
                             f"({expected})")
        if st.st_size > limit:
            raise InputError(f"{label}: is {size_text(st.st_size)}; expected {expected} of at "
                             f"most {size_text(limit)}")
        with os.fdopen(os.dup(fd), "rb") as fh:
            data = fh.read(limit + 1)
    except OSError as exc:
        raise InputError(f"{label}: cannot be read ({exc.strerror or exc}); expected a "
                         f"readable file ({expected})") from None
    finally:
        os.close(fd)
    if len(data) > limit:  # grew while being read
        raise InputError(f"{label}: is larger than {size_text(limit)}; expected {expected} "
                         f"of at most {size_text(limit)}")
    return data


__all__ = ["DATA_FILE_LIMIT", "TEXT_FILE_LIMIT", "UNPACKED_LIMIT", "read_limited",
           "shown_path", "size_text"]
