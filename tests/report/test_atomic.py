"""Output files (similitude.report.atomic): written as a set, atomically, never over an existing
file or symbolic link without --force, not even by two processes at once; temporary files
removed on errors and signals, and by the next run after a SIGKILL; modes from the umask.

Outside references: POSIX link(2) fails with EEXIST when the new name exists (a symbolic link
included; IEEE Std 1003.1-2017), rename(2) replaces its target atomically; open(2) applies the
umask to the mode of a new file (mode & ~umask).
"""

from __future__ import annotations

import errno
import multiprocessing
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from similitude.errors import InputError
from similitude.report import atomic
from similitude.report.atomic import OutputExistsError, OutputSet, write_text_atomic

ROOT = Path(__file__).parents[2]


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if atomic.TEMP_SUFFIX in p.name)


def test_a_dangling_symbolic_link_counts_as_an_existing_file(tmp_path):
    link = tmp_path / "out.csv"
    link.symlink_to(tmp_path / "nowhere")
    with pytest.raises(OutputExistsError, match="symbolic link"):
        write_text_atomic(link, "x")
    assert link.is_symlink() and not link.exists()  # untouched, still dangling
    assert _leftovers(tmp_path) == []


def test_a_symbolic_link_to_a_file_is_kept_without_force(tmp_path):
    real = tmp_path / "real.csv"
    real.write_text("old")
    link = tmp_path / "out.csv"
    link.symlink_to(real)
    with pytest.raises(OutputExistsError):
        write_text_atomic(link, "new")
    assert real.read_text() == "old"


def test_force_replaces_the_link_itself_not_the_file_it_points_to(tmp_path):
    real = tmp_path / "real.csv"
    real.write_text("old")
    link = tmp_path / "out.csv"
    link.symlink_to(real)
    write_text_atomic(link, "new", overwrite=True)
    assert not link.is_symlink() and link.read_text() == "new"
    assert real.read_text() == "old"


def test_a_file_made_by_someone_else_during_the_write_is_not_replaced(tmp_path):
    target = tmp_path / "out.csv"

    def writer(tmp):
        tmp.write_text("ours")
        target.write_text("theirs")  # another process wins the race meanwhile

    with pytest.raises(OutputExistsError):
        atomic.write_atomic(target, writer)
    assert target.read_text() == "theirs"
    assert _leftovers(tmp_path) == []


def _race(path: str, text: str, start, results) -> None:
    start.wait()
    try:
        write_text_atomic(path, text)
        results.put(("ok", text))
    except OutputExistsError:
        results.put(("exists", text))


def test_two_processes_writing_one_path_at_once_leave_exactly_one_winner(tmp_path):
    ctx = multiprocessing.get_context("fork")
    for round_ in range(15):
        target = tmp_path / f"race{round_}.csv"
        start, results = ctx.Event(), ctx.Queue()
        procs = [ctx.Process(target=_race, args=(str(target), name, start, results))
                 for name in ("first", "second")]
        for p in procs:
            p.start()
        start.set()
        for p in procs:
            p.join(30)
        outcome = sorted(results.get(timeout=5) for _ in procs)
        winners = [text for kind, text in outcome if kind == "ok"]
        assert len(winners) == 1, outcome
        assert target.read_text() == winners[0]
    assert _leftovers(tmp_path) == []


def test_a_set_publishes_nothing_when_a_later_file_fails(tmp_path):
    first = tmp_path / "plan.xlsx"

    def broken(tmp):
        raise OSError(errno.ENOSPC, "no space left on device")

    with pytest.raises(OSError, match="no space"), OutputSet() as out:
        out.add(first, lambda tmp: tmp.write_text("workbook"))
        out.add(tmp_path / "matrix.csv", broken)
    assert list(tmp_path.iterdir()) == []


def test_a_set_takes_back_published_files_when_a_later_publication_fails(tmp_path):
    old = tmp_path / "a.csv"
    old.write_text("old a")
    taken = tmp_path / "b.csv"
    with pytest.raises(OutputExistsError), OutputSet(overwrite=False) as out:
        out.add(tmp_path / "new.csv", lambda tmp: tmp.write_text("new"))
        out.add(taken, lambda tmp: tmp.write_text("ours"))
        taken.write_text("someone else's")  # appears after the check, before publishing
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a.csv", "b.csv"]
    assert taken.read_text() == "someone else's"


def test_an_overwriting_set_restores_the_old_files_when_it_fails(tmp_path):
    a, b = tmp_path / "a.csv", tmp_path / "b.csv"
    a.write_text("old a")
    os.mkdir(tmp_path / "sub")
    with pytest.raises(OSError), OutputSet(overwrite=True) as out:
        out.add(a, lambda tmp: tmp.write_text("new a"))
        out.add(b, lambda tmp: tmp.write_text("new b"))
        out._staged[1].target = tmp_path / "sub"  # publishing b fails: a folder is there
    assert a.read_text() == "old a" and not b.exists()
    assert _leftovers(tmp_path) == []


def test_folders_made_for_a_failed_set_are_removed(tmp_path):
    with pytest.raises(RuntimeError), OutputSet() as out:
        folder = out.folder(tmp_path / "csv" / "deeper")
        out.add(folder / "a.csv", lambda tmp: tmp.write_text("a"))
        raise RuntimeError("later failure")
    assert list(tmp_path.iterdir()) == []


def test_new_files_get_the_mode_the_umask_gives(tmp_path):
    old = os.umask(0o027)
    try:
        path = write_text_atomic(tmp_path / "m.csv", "x")
    finally:
        os.umask(old)
    assert path.stat().st_mode & 0o777 == 0o640  # 0666 & ~0027 (open(2))


def test_a_missing_folder_is_a_named_error(tmp_path):
    with pytest.raises(InputError, match="does not exist"):
        write_text_atomic(tmp_path / "missing" / "m.csv", "x")


def test_a_folder_that_cannot_be_written_is_a_named_error(tmp_path, monkeypatch):
    # the tests may run as root, for whom a read-only mode changes nothing: the refusal of the
    # file system is simulated where the program meets it
    real_open = os.open

    def refusing_open(path, flags, mode=0o777, **kw):
        if str(path).endswith(atomic.TEMP_SUFFIX):
            raise PermissionError(errno.EACCES, "Permission denied", str(path))
        return real_open(path, flags, mode, **kw)

    monkeypatch.setattr(os, "open", refusing_open)
    with pytest.raises(InputError, match="cannot write in folder .*Permission denied"):
        write_text_atomic(tmp_path / "m.csv", "x")
    assert list(tmp_path.iterdir()) == []


def _dead_pid() -> int:
    proc = subprocess.Popen([sys.executable, "-c", "pass"])
    proc.wait()
    return proc.pid


def test_the_next_write_removes_temporary_files_of_dead_processes(tmp_path):
    target = tmp_path / "plan.xlsx"
    stale = tmp_path / f".plan.xlsx.{_dead_pid()}-abcd{atomic.TEMP_SUFFIX}"
    stale.write_bytes(b"half")
    alive = tmp_path / f".plan.xlsx.{os.getpid()}-beef{atomic.TEMP_SUFFIX}"
    alive.write_bytes(b"being written")
    write_text_atomic(target, "done")
    assert not stale.exists() and alive.exists()


_SLOW_WRITER = """
import sys, time
from similitude.report.atomic import write_atomic
def writer(tmp):
    with open(tmp, "wb") as fh:
        for _ in range(400):
            fh.write(b"x" * 100_000)
            fh.flush()
            print("writing", flush=True)
            time.sleep(0.05)
write_atomic(sys.argv[1], writer)
"""


def _start_slow_write(target: Path) -> subprocess.Popen:
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    proc = subprocess.Popen([sys.executable, "-c", _SLOW_WRITER, str(target)], env=env,
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    for _ in range(3):
        assert proc.stdout.readline().startswith(b"writing")
    return proc


def test_sigterm_during_a_write_leaves_neither_target_nor_temporary_file(tmp_path):
    target = tmp_path / "big.bin"
    proc = _start_slow_write(target)
    proc.send_signal(signal.SIGTERM)
    proc.communicate(timeout=30)
    assert proc.returncode == 128 + signal.SIGTERM
    assert list(tmp_path.iterdir()) == []


def test_sigkill_during_a_write_leaves_no_partial_target_and_the_next_run_cleans_up(tmp_path):
    target = tmp_path / "big.bin"
    proc = _start_slow_write(target)
    proc.kill()  # SIGKILL: no handler runs
    proc.communicate(timeout=30)
    assert not target.exists()  # absent, never partial
    assert _leftovers(tmp_path)  # what SIGKILL leaves behind ...
    write_text_atomic(target, "the next run")
    assert _leftovers(tmp_path) == []  # ... the next run of the same target removes
    assert target.read_text() == "the next run"


def test_sigkill_during_a_large_workbook_write_leaves_the_target_absent_or_complete(tmp_path):
    # a real plan workbook of many runs, killed after a random share of its write
    import openpyxl

    case = tmp_path / "case.toml"
    case.write_text((ROOT / "demo_cases" / "ferry_resistance.toml").read_text()
                    .replace("repeats = 2", "repeats = 100")
                    .replace('"facilities/towing_tank_demo.toml"',
                             repr(str(ROOT / "demo_cases/facilities/towing_tank_demo.toml"))
                             .replace("'", '"')))
    target = tmp_path / "plan.xlsx"
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    for delay in (0.5, 1.5, 3.0):
        proc = subprocess.Popen([sys.executable, "-m", "similitude", "plan", str(case), "-o",
                                 str(target), "--force"], env=env, stdout=subprocess.DEVNULL,
                                stderr=subprocess.DEVNULL)
        time.sleep(delay)
        proc.kill()
        proc.wait(30)
        if target.exists():
            openpyxl.load_workbook(target, read_only=True).close()  # complete: it opens
    rc = subprocess.run([sys.executable, "-m", "similitude", "plan", str(case), "-o",
                         str(target), "--force"], env=env, capture_output=True).returncode
    assert rc == 0
    assert _leftovers(tmp_path) == []
