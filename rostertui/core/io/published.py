"""Published versions of a roster: `WS/published/NNN.toml`, numbered, never overwritten.

A version file is a roster.toml (same layout, loads with `check --roster`) with a
`[published]` table: its number, when it was published (UTC) and the note given.
A new version is written to a temporary file and then hard-linked to its name,
which fails rather than replace a file that exists: two publishes at once get two
numbers, and no earlier version is ever lost.
"""

from __future__ import annotations

import contextlib
import os
import re
import tempfile
import tomllib
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path

import tomli_w
from pydantic import Field, ValidationError

from rostertui.core.errors import InputError, Problem
from rostertui.core.io.atomic import fsync_dir
from rostertui.core.io.save import dumps_roster
from rostertui.core.models.common import Strict
from rostertui.core.models.roster import Roster

FOLDER = "published"
_NAME = re.compile(r"^(\d{3,})\.toml$")


class PublishedMeta(Strict):
    version: int = Field(ge=1)
    at: datetime
    note: str = ""


@dataclass(frozen=True)
class Published:
    meta: PublishedMeta
    roster: Roster
    path: Path

    @property
    def version(self) -> int:
        return self.meta.version

    def label(self) -> str:
        stamp = self.meta.at.astimezone(UTC).strftime("%Y-%m-%d %H:%M UTC")
        note = f" - {self.meta.note}" if self.meta.note else ""
        return f"version {self.version}, {stamp}{note}"


def folder_of(ws_folder: str | Path) -> Path:
    return Path(ws_folder) / FOLDER


def dumps_published(meta: PublishedMeta, roster: Roster) -> str:
    body = dumps_roster(roster)
    head, rest = body.split("\n\n", 1)
    table = tomli_w.dumps({"published": meta.model_dump(exclude_none=True)})
    comment = (f"# Published version {meta.version} of the roster, kept by rostertui publish.\n"
               "# Never edited by the tool; edit roster.toml, then publish again.\n")
    return f"{comment}{head}\n\n{table}\n{rest}"


def versions(ws_folder: str | Path) -> list[int]:
    """Numbers of the published versions, oldest first."""
    folder = folder_of(ws_folder)
    if not folder.is_dir():
        return []
    found = (_NAME.match(p.name) for p in folder.iterdir())
    return sorted(int(m.group(1)) for m in found if m)


def path_of(ws_folder: str | Path, version: int) -> Path:
    return folder_of(ws_folder) / f"{version:03d}.toml"


def load_published(ws_folder: str | Path, version: int | None = None) -> Published | None:
    """A published version (default: the last); None when nothing was published.

    Raises InputError naming the file when the version does not exist or is damaged.
    """
    numbers = versions(ws_folder)
    if version is None:
        if not numbers:
            return None
        version = numbers[-1]
    path = path_of(ws_folder, version)
    label = f"{FOLDER}/{path.name}"
    if version not in numbers:
        have = ", ".join(map(str, numbers)) or "none yet"
        message = f"no published version {version} (published: {have})"
        raise InputError([Problem(label, "", message)])
    try:
        data = tomllib.loads(path.read_text(encoding="utf-8"))
        meta = PublishedMeta.model_validate(data.pop("published", None))
        roster = Roster.model_validate(data)
    except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError, ValidationError) as exc:
        raise InputError([Problem(label, "", f"cannot be read as a published roster: {exc}")]) \
            from None
    return Published(meta, roster, path)


def list_published(ws_folder: str | Path) -> list[Published]:
    found = (load_published(ws_folder, v) for v in versions(ws_folder))
    return [p for p in found if p is not None]


def publish(ws_folder: str | Path, roster: Roster, note: str = "",
            now: datetime | None = None) -> Published:
    """Keep `roster` as the next published version; never replaces an existing file."""
    folder = folder_of(ws_folder)
    folder.mkdir(exist_ok=True)
    at = (now or datetime.now(UTC)).replace(microsecond=0)
    while True:
        numbers = versions(ws_folder)
        meta = PublishedMeta(version=(numbers[-1] + 1) if numbers else 1, at=at, note=note)
        target = path_of(ws_folder, meta.version)
        if _create(target, dumps_published(meta, roster)):
            return Published(meta, roster, target)


def _create(target: Path, text: str) -> bool:
    """Write `text` to a new file `target` in one step; False if it exists already."""
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=target.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(text.encode("utf-8"))
            fh.flush()
            os.fsync(fh.fileno())
        try:
            os.link(tmp, target)  # fails if target exists: nothing is ever replaced
        except FileExistsError:
            return False
        except OSError:  # no hard links here: exclusive create, then write
            return _create_exclusive(target, text)
    finally:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
    fsync_dir(target.parent)
    return True


def _create_exclusive(target: Path, text: str) -> bool:
    try:
        fd = os.open(target, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o666)
    except FileExistsError:
        return False
    with os.fdopen(fd, "wb") as fh:
        fh.write(text.encode("utf-8"))
        fh.flush()
        os.fsync(fh.fileno())
    return True
