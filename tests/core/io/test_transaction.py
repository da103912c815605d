"""Changes of several files: a kill before the journal keeps every old file, a kill after
it is finished by the next load (rostertui/core/io/transaction.py)."""

from __future__ import annotations

import os
import shutil
import signal
import subprocess
import sys
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.io.load import load_workspace
from rostertui.core.io.transaction import JOURNAL, recover, transaction
from tests.conftest import DEMO, FIXTURES, REPO, copy_ws, two_working_days

pytestmark = pytest.mark.skipif(os.name != "posix", reason="kills with SIGKILL")


def clinic_copy(tmp_path: Path, name: str) -> Path:
    dest = copy_ws(DEMO / "clinic", tmp_path, name)
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", dest / "roster.toml")
    return dest


def absent_args(folder: Path) -> list[str]:
    """`absent` for a person on two days they work, so both files change."""
    pid, first, last = two_working_days(folder, first_day=5)
    return ["absent", str(folder), pid, first.isoformat(), last.isoformat(), "--reason", "sick"]


def killed_absent(folder: Path, hook: str) -> subprocess.CompletedProcess[str]:
    """`rostertui absent` in a child process that the test hook `hook` kills (SIGKILL)."""
    code = f"from rostertui.cli.main import main; main({absent_args(folder)!r})"
    env = {**os.environ, hook: "1", "PYTHONPATH": str(REPO)}
    done = subprocess.run([sys.executable, "-c", code], env=env, cwd=REPO, text=True,
                          capture_output=True, timeout=120)
    assert done.returncode == -signal.SIGKILL, done.stderr
    return done


def texts(folder: Path) -> dict[str, bytes]:
    return {n: (folder / n).read_bytes() for n in ("requests.toml", "roster.toml")}


def temps(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.endswith(".tmp"))


@pytest.fixture
def reference(tmp_path: Path) -> dict[str, bytes]:
    """Both files as an uninterrupted `absent` writes them."""
    ref = clinic_copy(tmp_path, "reference")
    assert main(absent_args(ref)) == 1  # the cover they held is short now
    return texts(ref)


def test_a_kill_after_the_commit_is_finished_by_the_next_load(
        tmp_path: Path, reference: dict[str, bytes], capsys: pytest.CaptureFixture[str]) -> None:
    ws = clinic_copy(tmp_path, "clinic")
    old = texts(ws)
    assert old["requests.toml"] != reference["requests.toml"]
    assert old["roster.toml"] != reference["roster.toml"]
    killed_absent(ws, "ROSTERTUI_TEST_DIE_AFTER_COMMIT")
    # killed between the two renames: the leave is on disk, the cleared shifts are not
    assert (ws / JOURNAL).is_file()
    assert texts(ws) == {"requests.toml": reference["requests.toml"],
                         "roster.toml": old["roster.toml"]}
    loaded = load_workspace(ws)
    assert texts(ws) == reference
    assert not (ws / JOURNAL).exists() and temps(ws) == []
    assert [str(w) for w in loaded.warnings] == [
        f"{JOURNAL}: finished an interrupted change of requests.toml and roster.toml (absent) "
        "left by a previous run"]
    assert load_workspace(ws).warnings == []  # finished once, said once
    capsys.readouterr()
    assert main(["check", str(ws)]) in (0, 1)
    assert "finished an interrupted change" not in capsys.readouterr().err


def test_a_kill_before_the_commit_keeps_the_old_files_and_the_next_write_cleans_up(
        tmp_path: Path, reference: dict[str, bytes], capsys: pytest.CaptureFixture[str]) -> None:
    ws = clinic_copy(tmp_path, "clinic")
    old = texts(ws)
    killed_absent(ws, "ROSTERTUI_TEST_DIE_BEFORE_COMMIT")
    assert texts(ws) == old and not (ws / JOURNAL).exists()
    staged = temps(ws)
    assert [n.split(".")[1] for n in staged] == ["requests", "roster"]  # both were staged
    assert load_workspace(ws).warnings == []  # nothing committed: nothing to finish
    assert temps(ws) == staged  # loading writes nothing
    assert main(absent_args(ws)) == 1
    assert texts(ws) == reference
    assert temps(ws) == []  # the dead run's staged copies went with the next write


def test_a_failure_inside_the_block_changes_no_file(tmp_path: Path) -> None:
    ws = clinic_copy(tmp_path, "clinic")
    old = texts(ws)
    with pytest.raises(RuntimeError), transaction(ws, "test") as tx:
        tx.write(ws / "requests.toml", "x = 1\n")
        tx.write(ws / "roster.toml", "x = 2\n")
        raise RuntimeError("stop")
    assert texts(ws) == old and temps(ws) == [] and not (ws / JOURNAL).exists()


def test_recovery_renames_what_is_left_and_leaves_a_workspace_without_journal_alone(
        tmp_path: Path) -> None:
    ws = clinic_copy(tmp_path, "clinic")
    assert recover(ws) is None
    staged = ws / ".roster.toml.1-abc.tmp"
    staged.write_text("new roster\n")
    (ws / JOURNAL).write_text(
        'verb = "save"\n'
        '[[file]]\nstaged = ".requests.toml.1-abc.tmp"\ntarget = "requests.toml"\n'
        '[[file]]\nstaged = ".roster.toml.1-abc.tmp"\ntarget = "roster.toml"\n')
    before = (ws / "requests.toml").read_bytes()  # renamed already: its copy is gone
    assert recover(ws) == ("finished an interrupted change of requests.toml and roster.toml "
                           "(save) left by a previous run")
    assert (ws / "roster.toml").read_text() == "new roster\n"
    assert (ws / "requests.toml").read_bytes() == before
    assert not (ws / JOURNAL).exists() and not staged.exists()


def test_a_journal_naming_files_outside_the_workspace_is_not_followed(tmp_path: Path) -> None:
    ws = clinic_copy(tmp_path, "clinic")
    victim = tmp_path / "victim.txt"
    victim.write_text("keep me\n")
    (ws / ".x.tmp").write_text("evil\n")
    (ws / JOURNAL).write_text('verb = "x"\n[[file]]\nstaged = ".x.tmp"\n'
                              'target = "../victim.txt"\n')
    message = recover(ws)
    assert message is not None and message.startswith(f"cannot read {JOURNAL}")
    assert victim.read_text() == "keep me\n" and (ws / JOURNAL).exists()
