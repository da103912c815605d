"""Temporaries a killed write left behind are removed by the next write of the same file,
never those of a live process (rostertui/core/io/atomic.py)."""

from __future__ import annotations

import os
import subprocess
import sys
import time
from pathlib import Path

import pytest

from rostertui.core.io import atomic
from rostertui.core.io.atomic import JOURNAL, write_atomic
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import save
from tests.conftest import FIXTURES, copy_ws

pytestmark = pytest.mark.skipif(os.name != "posix", reason="pids are checked on POSIX only")


def dead_pid() -> int:
    child = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                           capture_output=True, text=True, check=True)
    pid = int(child.stdout)
    assert not atomic.pid_alive(pid)
    return pid


def test_the_next_write_removes_its_own_stale_temporaries_only(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    pid = dead_pid()
    dead = ws / f".roster.toml.{pid}-abc.tmp"
    old_style = ws / ".roster.toml.k3j_9x2a.tmp"  # tempfile.mkstemp's naming, no pid
    young_old_style = ws / ".roster.toml.q1w2e3r4.tmp"
    live = ws / f".roster.toml.{os.getpid()}-abc.tmp"
    other_file = ws / f".staff.toml.{pid}-abc.tmp"
    for p in (dead, old_style, young_old_style, live, other_file):
        p.write_text("half a roster")
    an_hour_ago = time.time() - 3600
    os.utime(old_style, (an_hour_ago, an_hour_ago))
    roster = load_workspace(ws).roster
    assert roster is not None
    save(roster, ws)
    assert not dead.exists() and not old_style.exists()
    assert live.exists()  # a live process may still rename it
    assert young_old_style.exists()  # may belong to an old version still running
    assert other_file.exists()  # only the written file's own temporaries
    assert sorted(p.name for p in ws.iterdir() if p.name.endswith(".tmp")) == sorted(
        [live.name, young_old_style.name, other_file.name])


def test_temporaries_are_named_with_the_pid(tmp_path: Path,
                                            monkeypatch: pytest.MonkeyPatch) -> None:
    seen: list[str] = []
    real = atomic.os.replace
    monkeypatch.setattr(atomic.os, "replace", lambda a, b: (seen.append(Path(a).name),
                                                            real(a, b)))
    write_atomic(tmp_path / "unit.toml", "name = 'x'\n")
    [name] = seen
    assert name.startswith(f".unit.toml.{os.getpid()}-") and name.endswith(".tmp")


def test_a_staged_file_of_a_pending_journal_is_kept(tmp_path: Path) -> None:
    staged = tmp_path / f".roster.toml.{dead_pid()}-abc.tmp"
    staged.write_text("the committed roster\n")
    (tmp_path / JOURNAL).write_text(f'verb = "absent"\n[[file]]\nstaged = "{staged.name}"\n'
                                    'target = "roster.toml"\n')
    write_atomic(tmp_path / "roster.toml", "x = 1\n")
    assert staged.exists()  # the next load renames it; deleting it would lose the change
