"""File output: every file of one command written as a set, atomically, never over an existing
file unless asked.

Each file is first written to a temporary file beside its target (same folder, so the same file
system), then published: with ``os.link`` when nothing may be overwritten (the link fails if
anything, a dangling symbolic link included, holds the name: no check-then-rename gap between
two processes writing the same path), with ``os.replace`` when overwriting was asked for. A
reader never sees a partial file.

:class:`OutputSet` publishes its files only after all of them were written; when one fails to
write or to publish, the ones already published are taken back (an overwritten file gets its old
content back), so a command leaves all of its outputs or none.

Temporary files are named ``.<target name>.<pid>-<random>.similitude-tmp``. They are removed on
any exception, on SIGTERM and SIGHUP (:func:`signals_cleanup`), and, after a SIGKILL or a power
cut, by the next write of the same target (the writing process no longer exists). New files get
the mode the umask gives (0666 minus the umask), as any other program's files.
"""

from __future__ import annotations

import contextlib
import errno
import os
import pathlib
import secrets
import signal
import threading
from collections.abc import Callable, Iterator
from dataclasses import dataclass

from similitude.errors import InputError

#: Ending of the name of every temporary file this module makes.
TEMP_SUFFIX = ".similitude-tmp"
#: ``os.link`` errors meaning the file system has no hard links: publish by exclusive create.
_NO_LINKS = {errno.EPERM, errno.ENOTSUP, errno.EOPNOTSUPP, errno.ENOSYS, errno.EMLINK,
             errno.EXDEV}


class OutputExistsError(InputError, FileExistsError):
    """The output file exists and overwriting was not asked for."""


def _exists_error(p: pathlib.Path) -> OutputExistsError:
    what = "is a symbolic link" if p.is_symlink() else "exists"
    return OutputExistsError(f"output: {str(p)!r} {what}; not overwritten (use --force or "
                             "overwrite=True)")


def _folder_error(folder: pathlib.Path, exc: OSError) -> InputError:
    return InputError(f"output: cannot write in folder {str(folder)!r} ({exc.strerror or exc}); "
                      "expected an existing folder you can write to")


def check_target(path, overwrite: bool = False) -> pathlib.Path:
    """Refuse an output path that cannot be written, before any work.

    A symbolic link at the path counts as an existing file (also when it points nowhere).

    Returns
    -------
    pathlib.Path
        The path, ``~`` expanded.

    Raises
    ------
    OutputExistsError
        (an InputError and a FileExistsError) naming the path and ``--force``.
    InputError
        When the path is a folder, or its folder is missing or not writable.
    """
    p = pathlib.Path(path).expanduser()
    if p.is_dir():
        raise InputError(f"output: {str(p)!r} is a folder; expected a file path")
    if os.path.lexists(p) and not overwrite:
        raise _exists_error(p)
    if not p.parent.is_dir():
        raise InputError(f"output: folder {str(p.parent)!r} does not exist; expected an "
                         "existing folder")
    if not os.access(p.parent, os.W_OK | os.X_OK):
        raise _folder_error(p.parent, PermissionError(errno.EACCES, "permission denied"))
    return p


def temp_path(target: pathlib.Path) -> pathlib.Path:
    """A new temporary name beside ``target`` (this process's id and a random part)."""
    return target.with_name(f".{target.name}.{os.getpid()}-{secrets.token_hex(4)}{TEMP_SUFFIX}")


def remove_stale(target: pathlib.Path) -> list[pathlib.Path]:
    """Remove the temporary files of ``target`` left by processes that no longer run.

    Returns
    -------
    list of pathlib.Path
        The files removed.
    """
    removed = []
    with contextlib.suppress(OSError):
        for tmp in target.parent.glob(f".{_glob_escape(target.name)}.*{TEMP_SUFFIX}"):
            pid_text = tmp.name[len(target.name) + 2:].split("-", 1)[0]
            if pid_text.isdigit() and not _running(int(pid_text)):
                with contextlib.suppress(FileNotFoundError):
                    tmp.unlink()
                    removed.append(tmp)
    return removed


def _glob_escape(name: str) -> str:
    return "".join(f"[{c}]" if c in "*?[" else c for c in name)


def _running(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except (PermissionError, OverflowError, OSError):
        return True  # someone else's process, or cannot tell: keep its file
    return True


def _create(tmp: pathlib.Path) -> None:
    """Create ``tmp`` empty and exclusively, with mode 0666 minus the umask."""
    fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o666)
    os.close(fd)


def _sync(path: pathlib.Path) -> None:
    """Flush a written file to the disk, so a published file is complete after a crash."""
    with contextlib.suppress(OSError):
        fd = os.open(path, os.O_RDONLY)
        try:
            os.fsync(fd)
        finally:
            os.close(fd)


@dataclass
class _Staged:
    target: pathlib.Path
    tmp: pathlib.Path
    backup: pathlib.Path | None = None
    published: bool = False


class OutputSet:
    """Files written together: all published, or none.

    Parameters
    ----------
    overwrite : bool
        Replace existing files (``--force``); otherwise an existing file, or a symbolic link,
        at any target makes the whole set fail with :class:`OutputExistsError`.

    Examples
    --------
    >>> with OutputSet() as out:                                        # doctest: +SKIP
    ...     out.add("plan.xlsx", lambda tmp: wb.save(tmp))
    ...     out.add("runs.csv", lambda tmp: tmp.write_text(text))
    >>> out.written                                                     # doctest: +SKIP
    [PosixPath('plan.xlsx'), PosixPath('runs.csv')]
    """

    def __init__(self, overwrite: bool = False) -> None:
        self.overwrite = overwrite
        self.written: list[pathlib.Path] = []
        self._staged: list[_Staged] = []
        self._folders: list[pathlib.Path] = []

    def folder(self, path, option: str = "output") -> pathlib.Path:
        """The folder ``path``, made (with its missing parents) if absent; folders made here
        are removed again when the set fails. ``option`` names it in messages (``--csv``)."""
        folder = pathlib.Path(path).expanduser()
        missing = []
        p = folder
        while not p.exists() and p != p.parent:
            missing.append(p)
            p = p.parent
        for p in reversed(missing):
            try:
                p.mkdir()
            except FileExistsError:
                continue
            except OSError as exc:
                raise InputError(f"{option}: cannot make folder {str(folder)!r} "
                                 f"({exc.strerror or exc}); expected a folder path you can "
                                 "write in") from None
            self._folders.append(p)
        if not folder.is_dir():
            raise InputError(f"{option}: {str(folder)!r} is a file; expected a folder")
        return folder

    def add(self, path, writer: Callable[[pathlib.Path], None]) -> pathlib.Path:
        """Write one file of the set: ``writer(temporary path)`` now, published later.

        Returns
        -------
        pathlib.Path
            The target path.
        """
        target = check_target(path, self.overwrite)
        remove_stale(target)
        tmp = temp_path(target)
        try:
            _create(tmp)
        except OSError as exc:
            raise _folder_error(target.parent, exc) from None
        staged = _Staged(target, tmp)
        self._staged.append(staged)
        writer(tmp)
        _sync(tmp)
        return target

    def commit(self) -> list[pathlib.Path]:
        """Publish every file written; on a failure take back those already published."""
        try:
            for staged in self._staged:
                self._publish(staged)
        except BaseException:
            self.discard()
            raise
        for staged in self._staged:
            if staged.backup is not None:
                with contextlib.suppress(OSError):
                    staged.backup.unlink()
        self.written = [s.target for s in self._staged]
        self._staged, self._folders = [], []
        return self.written

    def _publish(self, staged: _Staged) -> None:
        target, tmp = staged.target, staged.tmp
        if self.overwrite:
            if os.path.lexists(target) and not target.is_dir():
                # keep the old file under a temporary name until the whole set is published
                backup = temp_path(target)
                os.link(target, backup, follow_symlinks=False)
                staged.backup = backup
            os.replace(tmp, target)
        else:
            _link_new(tmp, target)
        staged.published = True

    def discard(self) -> None:
        """Remove the temporary files, take back the published files and remove the folders
        made by this set."""
        for staged in reversed(self._staged):
            with contextlib.suppress(OSError):
                if staged.published:
                    if staged.backup is not None:
                        os.replace(staged.backup, staged.target)
                    else:
                        staged.target.unlink()
                else:
                    staged.tmp.unlink(missing_ok=True)
                    if staged.backup is not None:
                        staged.backup.unlink(missing_ok=True)
        for folder in reversed(self._folders):
            with contextlib.suppress(OSError):
                folder.rmdir()  # only when empty: never a file someone else put there
        self._staged, self._folders = [], []

    def __enter__(self) -> OutputSet:
        return self

    def __exit__(self, exc_type, exc, tb) -> None:
        if exc_type is None:
            self.commit()
        else:
            self.discard()


def _link_new(tmp: pathlib.Path, target: pathlib.Path) -> None:
    """Publish ``tmp`` as ``target`` only if nothing holds that name, atomically."""
    try:
        os.link(tmp, target, follow_symlinks=False)
    except FileExistsError:
        raise _exists_error(target) from None
    except OSError as exc:
        if exc.errno not in _NO_LINKS:
            raise
        # no hard links here: reserve the name by exclusive creation, then move onto it
        try:
            _create(target)
        except FileExistsError:
            raise _exists_error(target) from None
        os.replace(tmp, target)
        return
    tmp.unlink()


@contextlib.contextmanager
def signals_cleanup() -> Iterator[None]:
    """While inside, SIGTERM and SIGHUP end the program through Python (``SystemExit`` with
    128 + the signal number), so the temporary files are removed on the way out.

    Only in the main thread (Python handles signals there); elsewhere it does nothing.
    """
    if threading.current_thread() is not threading.main_thread():
        yield
        return

    def stop(signum, frame):
        raise SystemExit(128 + signum)

    names = [n for n in ("SIGTERM", "SIGHUP") if hasattr(signal, n)]
    old = {n: signal.signal(getattr(signal, n), stop) for n in names}
    try:
        yield
    finally:
        for n, handler in old.items():
            signal.signal(getattr(signal, n), handler)


def write_atomic(path, writer: Callable[[pathlib.Path], None],
                 overwrite: bool = False) -> pathlib.Path:
    """Call ``writer(temporary_path)`` and publish the result as ``path`` (a set of one file).

    Returns
    -------
    pathlib.Path
        The path written.
    """
    with signals_cleanup(), OutputSet(overwrite) as out:
        target = out.add(path, writer)
    return target


def write_text_atomic(path, text: str, overwrite: bool = False,
                      encoding: str = "utf-8") -> pathlib.Path:
    """Write a text file atomically (a set of one file)."""
    return write_atomic(path, lambda p: p.write_text(text, encoding=encoding), overwrite)


@contextlib.contextmanager
def atomic_path(path, overwrite: bool = False) -> Iterator[pathlib.Path]:
    """Context manager yielding a temporary path beside ``path``; published onto it when the
    block ends without an exception, removed otherwise."""
    with signals_cleanup(), OutputSet(overwrite) as out:
        holder: list[pathlib.Path] = []
        out.add(path, holder.append)
        yield holder[0]
