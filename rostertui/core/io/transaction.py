"""A change of several workspace files that a kill cannot leave half done.

    with transaction(folder, "absent") as tx:
        tx.save(requests)          # staged: nothing is replaced yet
        tx.save(roster)
    # here both files hold their new text; tx.notices says what the user should know

Each file's new text is first staged as a fully fsynced temporary beside its target
(`.{name}.{pid}-{random}.tmp`, the naming of `atomic.py`). Then a journal,
`.rostertui-journal.toml` in the workspace, is written atomically: it lists the staged
temporary -> target pairs and the verb, and it is the commit point. Then each staged file
is renamed onto its target, the folders are fsynced and the journal deleted.

Killed before the journal exists: every target keeps its old text, and the staged
temporaries are stale ones that the next write of each file removes. Killed after: the
next `load_workspace` (or transaction) finishes the journal (`recover`), renaming the
staged files still there, and says so in a warning.

While a transaction runs it holds an exclusive lock (`flock`) on the workspace folder,
so two processes never interleave their changes, and a journal whose folder is not
locked belongs to a process that is gone. A "create" entry (a published version) is a
new file that never replaces one: it is hard-linked to its name.

Test hook: with ROSTERTUI_TEST_DIE_BEFORE_COMMIT=1 the process kills itself (SIGKILL)
after staging, before the journal; with ROSTERTUI_TEST_DIE_AFTER_COMMIT=1, after the
journal is written and the first file renamed. Only tests set them.
"""

from __future__ import annotations

import contextlib
import errno
import os
import signal
import time
import tomllib
from collections.abc import Iterator
from dataclasses import dataclass, field
from datetime import UTC, datetime
from pathlib import Path, PurePosixPath
from typing import Any

import tomli_w
from pydantic import BaseModel

from rostertui.core.errors import Problem
from rostertui.core.io.atomic import JOURNAL, fsync_dir, link_new, stage, write_atomic
from rostertui.core.io.save import keep_previous, render

__all__ = ["JOURNAL", "TargetTaken", "Transaction", "recover", "transaction"]

LOCK_WAIT = 10.0  # seconds a transaction waits for another one on the same workspace
RECOVER_WAIT = 3.0  # seconds a load waits for a running transaction before reading anyway

try:
    import fcntl
except ImportError:  # not POSIX: no lock, the journal alone
    fcntl = None  # type: ignore[assignment]


class TargetTaken(FileExistsError):
    """A file to create (a published version) exists already: nothing was written."""


@dataclass(frozen=True)
class _Staged:
    tmp: Path
    target: Path
    create: bool  # a new file: never replaces one


@dataclass
class Transaction:
    """The files staged so far; committed when the `transaction` block ends."""

    folder: Path
    verb: str
    staged: list[_Staged] = field(default_factory=list)
    notices: list[Problem] = field(default_factory=list)

    def save(self, model: BaseModel) -> Path:
        """Stage what `save.save` would write for `model` (a backup of text it drops is
        kept now, and noted); returns the target."""
        rendered = render(model, self.folder)
        notice = keep_previous(rendered, self.folder)
        if notice is not None:
            self.notices.append(notice)
        return self.write(rendered.path, rendered.text)

    def write(self, path: Path, text: str | bytes) -> Path:
        """Stage `text` to replace (or create) `path`, which must lie in the workspace."""
        return self._stage(Path(path), text, create=False)

    def create(self, path: Path, text: str | bytes) -> Path:
        """Stage a new file `path`; TargetTaken (now or at the commit) if it exists."""
        path = Path(path)
        if path.exists() or any(s.target == path for s in self.staged):
            raise TargetTaken(errno.EEXIST, "exists already", str(path))
        return self._stage(path, text, create=True)

    def _stage(self, path: Path, text: str | bytes, create: bool) -> Path:
        _relative(self.folder, path)  # refuses a path outside the workspace
        for earlier in [s for s in self.staged if s.target == path]:  # staged twice: the last
            _unlink(earlier.tmp)
            self.staged.remove(earlier)
        self.staged.append(_Staged(stage(path, text), path, create))
        return path

    def discard(self) -> None:
        for s in self.staged:
            _unlink(s.tmp)
        self.staged = []

    def commit(self) -> None:
        if not self.staged:
            return
        taken = [s.target for s in self.staged if s.create and s.target.exists()]
        if taken:
            self.discard()
            raise TargetTaken(errno.EEXIST, "exists already", str(taken[0]))
        if len(self.staged) == 1:  # one rename is atomic by itself: no journal needed
            try:
                _put(self.staged[0])
            except BaseException:
                self.discard()
                raise
            fsync_dir(self.staged[0].target.parent)
            self.staged = []
            return
        _test_hook("ROSTERTUI_TEST_DIE_BEFORE_COMMIT")
        journal = self.folder / JOURNAL
        try:
            write_atomic(journal, _journal_text(self))  # the commit point
        except BaseException:
            self.discard()
            raise
        # from here on a failure leaves the journal: the next load finishes the change
        for i, s in enumerate(self.staged):
            _put(s)
            if i == 0:
                _test_hook("ROSTERTUI_TEST_DIE_AFTER_COMMIT")
        for parent in dict.fromkeys(s.target.parent for s in self.staged):
            fsync_dir(parent)
        os.unlink(journal)
        fsync_dir(self.folder)
        self.staged = []


@contextlib.contextmanager
def transaction(folder: str | Path, verb: str) -> Iterator[Transaction]:
    """Stage files inside the block; all of them replace their targets when it ends, or
    (an exception) none. The workspace is locked throughout, and a change a previous run
    left half done is finished first (noted on `notices`)."""
    tx = Transaction(Path(folder), verb)
    with _locked(tx.folder, LOCK_WAIT) as got:
        if not got:
            raise OSError(errno.EBUSY, "another rostertui is writing this workspace; "
                          "try again in a moment", str(tx.folder))
        finished = _finish(tx.folder)
        if finished:
            tx.notices.append(Problem(JOURNAL, "", finished))
        try:
            yield tx
        except BaseException:
            tx.discard()
            raise
        tx.commit()


def recover(folder: str | Path) -> str | None:
    """Finish a change of several files that a previous run committed but did not
    complete, and say so in a sentence; None when there was nothing to finish."""
    folder = Path(folder)
    if not (folder / JOURNAL).exists():
        return None
    with _locked(folder, RECOVER_WAIT) as got:
        # not got: a live transaction holds the folder; it finishes its own journal
        return _finish(folder) if got else None


# -- internals ------------------------------------------------------------------------------
def _finish(folder: Path) -> str | None:
    """With the folder locked: complete the journal there, if any."""
    journal = folder / JOURNAL
    try:
        data = tomllib.loads(journal.read_text(encoding="utf-8"))
        verb = str(data.get("verb", "?"))
        entries = [_entry(folder, item) for item in data.get("file", [])]
    except FileNotFoundError:
        return None
    except (OSError, ValueError, TypeError, KeyError) as exc:
        return (f"cannot read {JOURNAL}, left by an interrupted change of several files "
                f"({exc}); check the files, then delete it")
    names = [_relative(folder, s.target).as_posix() for s in entries]
    try:
        for s in entries:
            if s.tmp.exists():  # not yet renamed
                _put(s)
        for parent in dict.fromkeys(s.target.parent for s in entries):
            fsync_dir(parent)
        journal.unlink()
        fsync_dir(folder)
    except OSError as exc:
        return (f"could not finish an interrupted change of {_and(names)} ({verb}) left by a "
                f"previous run: {exc.strerror or exc}; {JOURNAL} is kept to try again")
    return f"finished an interrupted change of {_and(names)} ({verb}) left by a previous run"


def _put(s: _Staged) -> None:
    """Move a staged file onto its target."""
    if not s.create:
        os.replace(s.tmp, s.target)
        return
    if not link_new(s.tmp, s.target) and not os.path.samefile(s.tmp, s.target):
        raise FileExistsError(errno.EEXIST, "exists already", str(s.target))
    os.unlink(s.tmp)


def _journal_text(tx: Transaction) -> str:
    files = [{"staged": _relative(tx.folder, s.tmp).as_posix(),
              "target": _relative(tx.folder, s.target).as_posix(), "create": s.create}
             for s in tx.staged]
    head = ("# rostertui: a change of several files in progress. If it is still here, the\n"
            "# next run of rostertui finishes it (renames each staged file onto its target).\n")
    data = {"verb": tx.verb, "pid": os.getpid(),
            "at": datetime.now(UTC).replace(microsecond=0), "file": files}
    return head + tomli_w.dumps(data)


def _entry(folder: Path, item: Any) -> _Staged:
    """One journal entry, refusing anything but a staged temporary beside its target,
    both inside the workspace."""
    tmp, target = (_inside(folder, str(item[key])) for key in ("staged", "target"))
    if tmp.parent != target.parent or not (
            tmp.name.startswith(f".{target.name}.") and tmp.name.endswith(".tmp")):
        raise ValueError(f"{item['staged']!r} is not a staged copy of {item['target']!r}")
    return _Staged(tmp, target, bool(item.get("create", False)))


def _inside(folder: Path, rel: str) -> Path:
    path = PurePosixPath(rel)
    if path.is_absolute() or not path.parts or ".." in path.parts:
        raise ValueError(f"{rel!r} is not a path inside the workspace")
    return folder.joinpath(*path.parts)


def _relative(folder: Path, path: Path) -> PurePosixPath:
    try:
        return PurePosixPath(Path(os.path.abspath(path)).relative_to(os.path.abspath(folder)))
    except ValueError:
        raise ValueError(f"{path} is not inside the workspace {folder}") from None


def _and(names: list[str]) -> str:
    if not names:
        return "no file"
    return names[0] if len(names) == 1 else ", ".join(names[:-1]) + " and " + names[-1]


def _unlink(path: Path) -> None:
    with contextlib.suppress(OSError):
        os.unlink(path)


@contextlib.contextmanager
def _locked(folder: Path, wait: float) -> Iterator[bool]:
    """An exclusive lock on the folder (True), or False when another process keeps it for
    `wait` seconds. Where locks are unsupported, True without one."""
    if fcntl is None:
        yield True
        return
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        yield True
        return
    try:
        deadline = time.monotonic() + wait
        while True:
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                got = True
                break
            except BlockingIOError:
                if time.monotonic() >= deadline:
                    got = False
                    break
                time.sleep(0.02)
            except OSError:  # locks unsupported here (some network filesystems)
                got = True
                break
        yield got
    finally:
        os.close(fd)  # releases the lock


def _test_hook(name: str) -> None:
    """Test hook (see the module's docstring): die here as a kill -9 would."""
    if os.environ.get(name) != "1":
        return
    if hasattr(signal, "SIGKILL"):
        os.kill(os.getpid(), signal.SIGKILL)
    os._exit(137)
