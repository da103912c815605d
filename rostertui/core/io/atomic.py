"""Atomic file writes: a temporary file in the same folder, fsync, then rename.

Temporaries are named `.{name}.{pid}-{random}.tmp`. A process killed between writing its
temporary and the rename leaves it behind, so each write of `name` first removes the
stale temporaries of `name` in that folder: those whose process is gone, and those of the
old naming (`.{name}.XXXXXXXX.tmp`, no pid) older than a minute. A temporary of a live
process is never touched, nor one listed in a pending journal (`transaction.py`).
"""

from __future__ import annotations

import contextlib
import os
import re
import secrets
import time
from pathlib import Path

JOURNAL = ".rostertui-journal.toml"  # the commit record of a change of several files
OLD_TEMP_AGE = 60.0  # seconds after which an old-style temporary (no pid) counts as stale
_MIDDLE = re.compile(r"^(?:(?P<pid>\d+)-[A-Za-z0-9_]+|(?P<old>[a-z0-9_]{8}))$")
_FLAGS = os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_NOFOLLOW", 0) \
    | getattr(os, "O_BINARY", 0)


def write_atomic(path: Path, data: str | bytes) -> None:
    """Replace `path` with `data` so that readers see the old file or the new one, never half.

    The temporary file lives beside the target (same filesystem, so the rename is
    atomic); it is flushed and fsynced before the rename, and the folder is fsynced
    after it so the rename itself survives a power cut.
    """
    path = Path(path)
    tmp = stage(path, data)
    try:
        os.replace(tmp, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        raise
    fsync_dir(path.parent)


def stage(path: Path, data: str | bytes) -> Path:
    """A new, fsynced temporary beside `path` holding `data`, with the mode `path` has (or
    would get); the caller renames it onto `path` or deletes it. Removes the stale
    temporaries of `path` first."""
    path = Path(path)
    raw = data.encode("utf-8") if isinstance(data, str) else data
    remove_stale_temps(path.parent, path.name)
    while True:
        tmp = path.parent / temp_name(path.name)
        try:
            fd = os.open(tmp, _FLAGS, 0o600)
        except FileExistsError:
            continue
        break
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(raw)
            fh.flush()
            os.fsync(fh.fileno())
        if path.exists():
            with contextlib.suppress(OSError):
                os.chmod(tmp, path.stat().st_mode & 0o777)
        else:
            with contextlib.suppress(OSError):
                os.chmod(tmp, 0o666 & ~_umask())
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        raise
    return tmp


def create_new(path: Path, data: str | bytes) -> bool:
    """Write a new file `path` in one step; False (nothing written) if it exists already.

    The fsynced temporary is hard-linked to its name, which fails rather than replace a
    file; where there are no hard links, an exclusive create and write instead.
    """
    path = Path(path)
    tmp = stage(path, data)
    try:
        return link_new(tmp, path)
    finally:
        with contextlib.suppress(OSError):
            os.unlink(tmp)


def link_new(tmp: Path, path: Path) -> bool:
    """Give the staged file `tmp` the new name `path` too (the caller unlinks `tmp`);
    False, nothing written, if `path` exists. A hard link fails rather than replace a
    file; where there are none, an exclusive create and copy instead."""
    try:
        os.link(tmp, path)
    except FileExistsError:
        return False
    except OSError:  # no hard links on this filesystem
        return _create_exclusive(path, Path(tmp).read_bytes())
    fsync_dir(path.parent)
    return True


def _create_exclusive(path: Path, raw: bytes) -> bool:
    try:
        fd = os.open(path, _FLAGS, 0o666)
    except FileExistsError:
        return False
    with os.fdopen(fd, "wb") as fh:
        fh.write(raw)
        fh.flush()
        os.fsync(fh.fileno())
    fsync_dir(path.parent)
    return True


def temp_name(name: str) -> str:
    return f".{name}.{os.getpid()}-{secrets.token_hex(4)}.tmp"


def pid_alive(pid: int) -> bool:
    """Whether process `pid` exists (a process we may not signal exists too). Off POSIX
    every pid counts as alive: nothing is deleted there on a guess."""
    if os.name != "posix":
        return True
    if pid <= 0:
        return False
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    except (OverflowError, ValueError):
        return False
    except OSError:
        return True
    return True


def remove_stale_temps(folder: Path, name: str) -> list[Path]:
    """Delete the temporaries of `name` in `folder` left by processes that are gone (see
    the module's docstring); returns those deleted."""
    prefix = f".{name}."
    try:
        entries = [e for e in os.scandir(folder)
                   if e.name.startswith(prefix) and e.name.endswith(".tmp")]
    except OSError:
        return []
    if not entries:
        return []
    pending = _journal_text(Path(folder))
    removed: list[Path] = []
    now = time.time()
    for entry in entries:
        found = _MIDDLE.match(entry.name[len(prefix):-len(".tmp")])
        if found is None or entry.name in pending:
            continue
        try:
            if not entry.is_file(follow_symlinks=False):
                continue
            if found.group("pid") is not None:
                stale = not pid_alive(int(found.group("pid")))
            else:
                stale = now - entry.stat(follow_symlinks=False).st_mtime > OLD_TEMP_AGE
            if stale:
                os.unlink(entry.path)
                removed.append(Path(entry.path))
        except OSError:
            continue
    return removed


def _journal_text(folder: Path) -> str:
    """The text of a pending journal in `folder` or its parent (published/ lies below the
    workspace): the temporaries it names are staged files of a committed change."""
    text = ""
    for where in (folder, folder.parent):
        with contextlib.suppress(OSError, UnicodeDecodeError):
            text += (where / JOURNAL).read_text(encoding="utf-8")
    return text


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def fsync_dir(folder: Path) -> None:
    if os.name != "posix":
        return
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)
