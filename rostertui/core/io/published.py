"""Published versions of a roster: `WS/published/NNN.toml`, numbered, never overwritten.

A version file is a roster.toml (same layout, loads with `check --roster`) with a
`[published]` table: its number, when it was published (UTC) and the note given.
A new version is staged in a transaction (`transaction.py`, the workspace locked, so
two publishes at once get two numbers) and then hard-linked to its name, which fails
rather than replace a file that exists: no earlier version is ever lost. The UI saves
the roster and publishes it in one transaction.
"""

from __future__ import annotations

import re
import tomllib
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path

import tomli_w
from pydantic import Field, ValidationError

from rostertui.core.errors import InputError, Problem
from rostertui.core.io.save import dumps_roster
from rostertui.core.io.transaction import TargetTaken, Transaction, transaction
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
            now: datetime | None = None, notices: list[Problem] | None = None) -> Published:
    """Keep `roster` as the next published version; never replaces an existing file.

    Written through a transaction (the workspace locked, so two publishes get two
    numbers); what the user should know (a change finished for a previous run) is
    appended to `notices`."""
    while True:
        try:
            with transaction(ws_folder, "publish") as tx:
                done = stage_publish(tx, roster, note, now)
        except TargetTaken:  # the number was taken meanwhile, outside rostertui
            continue
        if notices is not None:
            notices.extend(tx.notices)
        return done


def stage_publish(tx: Transaction, roster: Roster, note: str = "",
                  now: datetime | None = None) -> Published:
    """Stage `roster` as the next published version of the workspace `tx` writes, so it
    is kept together with the transaction's other files, or not at all."""
    folder = folder_of(tx.folder)
    folder.mkdir(exist_ok=True)
    at = (now or datetime.now(UTC)).replace(microsecond=0)
    while True:
        numbers = versions(tx.folder)
        meta = PublishedMeta(version=(numbers[-1] + 1) if numbers else 1, at=at, note=note)
        target = path_of(tx.folder, meta.version)
        try:
            tx.create(target, dumps_published(meta, roster))
        except TargetTaken:  # written by something else since we listed the folder
            continue
        return Published(meta, roster, target)
