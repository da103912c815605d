"""Write every workspace file kind back as TOML, atomically.

A file that exists is changed in place (`toml_merge`): its comments and layout stay, and
only what the model changed is rewritten. roster.toml is the tool's own file and is always
written fresh in the spec layout. Whenever a fresh rendering replaces text that held more
(the merge failed, the file was not TOML, roster.toml had comments), the previous text is
first kept in `.rostertui/backup/` and the save says so. `render` gives the text without
writing it, for a change of several files at once (`transaction.py`).
"""

from __future__ import annotations

import itertools
import tomllib
from dataclasses import dataclass
from datetime import datetime
from pathlib import Path
from typing import Any

import tomli_w
from pydantic import BaseModel

from rostertui.core.errors import Problem
from rostertui.core.io.atomic import create_new, write_atomic
from rostertui.core.io.toml_merge import merge_text, pairs, same_data
from rostertui.core.models.history import History
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import PresetFile
from rostertui.core.models.shifts import ShiftsFile
from rostertui.core.models.staff import Staff
from rostertui.core.models.unit import Unit


def as_toml_data(model: BaseModel, *, defaults: bool = False) -> dict[str, Any]:
    """The model as a TOML-ready dict: spec key names, no empty or (unless asked) default keys."""
    return model.model_dump(
        mode="python", by_alias=True, exclude_none=True, exclude_defaults=not defaults
    )


def _rules_data(rules: list[Any], defaults: bool = False) -> list[dict[str, Any]]:
    out = []
    for rule in rules:
        data = as_toml_data(rule, defaults=defaults)
        # kind first, after id, so a reader sees what the rule is at once
        ordered = {"id": data.pop("id"), "kind": rule.kind, **data}
        out.append(ordered)
    return out


def unit_data(unit: Unit, *, defaults: bool = False) -> dict[str, Any]:
    data = as_toml_data(unit, defaults=defaults)
    data.pop("rule", None)
    for key in ("name", "timezone", "start", "days"):  # always written, in spec order
        data[key] = getattr(unit, key)
    head = {k: data[k] for k in ("name", "timezone", "start", "days")}
    head.update({k: v for k, v in data.items() if k not in head})
    if unit.rule:
        head["rule"] = _rules_data(list(unit.rule), defaults)
    return head


def dumps_unit(unit: Unit) -> str:
    return tomli_w.dumps(unit_data(unit))


def dumps_preset(preset: PresetFile) -> str:
    return tomli_w.dumps({"rule": _rules_data(list(preset.rule))})


def dumps_plain(model: BaseModel) -> str:
    return tomli_w.dumps(as_toml_data(model))


def toml_data(model: BaseModel, *, defaults: bool = False) -> dict[str, Any]:
    """What `dumps` writes for a model (roster.toml aside), as data."""
    if isinstance(model, Unit):
        return unit_data(model, defaults=defaults)
    if isinstance(model, PresetFile):
        return {"rule": _rules_data(list(model.rule), defaults)}
    if isinstance(model, Staff | ShiftsFile | RequestsFile | History):
        return as_toml_data(model, defaults=defaults)
    raise TypeError(f"no TOML writer for {type(model).__name__}")


def toml_inline(values: list[str]) -> str:
    """A list of strings as one inline TOML array."""
    return "[" + ", ".join(tomli_w.dumps({"v": v}).split(" = ", 1)[1].strip() for v in values) + "]"


def toml_key(name: str) -> str:
    """A key as TOML writes it (bare, or quoted when it must be)."""
    return tomli_w.dumps({name: 0}).split(" = ", 1)[0]


def dumps_roster(roster: Roster) -> str:
    """roster.toml exactly as the spec shows: one inline row of codes per person."""
    lines = [f"start = {roster.start.isoformat()}", f"days = {roster.days}", "", "[rows]"]
    lines += [f"{toml_key(pid)} = {toml_inline(row)}" for pid, row in roster.rows.items()]
    for lock in roster.lock:
        dates = ", ".join(d.isoformat() for d in lock.dates)
        person = toml_inline([lock.person])[1:-1]
        lines += ["", "[[lock]]", f"person = {person}", f"dates = [{dates}]"]
    if roster.solve is not None:
        lines += ["", "[solve]"]
        lines += tomli_w.dumps(roster.solve.model_dump(exclude_none=True)).splitlines()
    return "\n".join(lines) + "\n"


def dumps(model: BaseModel) -> str:
    if isinstance(model, Roster):
        return dumps_roster(model)
    return tomli_w.dumps(toml_data(model))


FILE_NAMES: dict[type[BaseModel], str] = {
    Unit: "unit.toml",
    Staff: "staff.toml",
    ShiftsFile: "shifts.toml",
    RequestsFile: "requests.toml",
    History: "history.toml",
    Roster: "roster.toml",
}


def as_written(raw: Any, old: Any, new: Any) -> Any:
    """`new`, except where it says what the file already said: there, the file's own words.

    `raw` is the file's data and `old` the same data as the model writes it (defaults
    dropped, `credit_hours = 8` read as 8.0). Where `new` equals `old`, `raw` is kept, and
    a key the file spells out at its default (`weekend = ["sat", "sun"]`, `weight = 1`,
    `skills = []`) stays while the model still has that default.
    """
    if same_data(old, new):
        return raw
    if isinstance(new, dict) and isinstance(old, dict) and isinstance(raw, dict):
        out = {k: as_written(raw.get(k), old.get(k), v) for k, v in new.items()}
        out.update({k: v for k, v in raw.items() if k not in old and k not in new})
        return out
    if isinstance(new, list) and isinstance(old, list) and isinstance(raw, list):
        items = list(new)
        if len(raw) == len(old):
            for i, j in pairs(old, new):
                items[j] = as_written(raw[i], old[i], new[j])
        return items
    return new


def _merge_data(model: BaseModel, raw: dict[str, Any]) -> dict[str, Any]:
    """What to merge into the file: the model's data in the file's own words."""
    new = toml_data(model)
    try:
        data = as_written(raw, toml_data(type(model).model_validate(raw)), new)
        same = type(model).model_validate(data) == model
    except ValueError:  # pydantic's ValidationError: the file on disk is not valid
        return new
    return data if same else new


def _merged(model: BaseModel, text: str) -> tuple[str | None, str]:
    """The file's text with the model's data merged in, or None and why it cannot be."""
    try:
        data = _merge_data(model, tomllib.loads(text))
    except ValueError:  # not TOML: written fresh
        return None, "not valid TOML, so it was written fresh"
    return merged_text(text, data)


def merged_text(text: str, data: dict[str, Any]) -> tuple[str | None, str]:
    """`text` holding `data`, its comments and layout kept, or None and why it cannot."""
    try:
        merged = merge_text(text, data)
        back = tomllib.loads(merged)
    except Exception:  # a tomlkit corner case must not stop a save: write it fresh
        return None, "could not keep its comments and layout"
    # never write something that reads back differently from what was meant
    if same_data(back, tomllib.loads(tomli_w.dumps(data))):
        return merged, ""
    return None, "could not keep its comments and layout"


@dataclass(frozen=True)
class Rendered:
    """What `save` writes: the file, its new text, and, when that text is a fresh rendering
    that drops what the file held (comments, layout, text that was not TOML), the previous
    bytes to keep as a backup and why they are lost from the file."""

    path: Path
    text: str
    previous: bytes | None = None
    why: str = ""


def render(model: BaseModel, folder: str | Path) -> Rendered:
    """The file `save` would write for `model` in the workspace `folder`, and its text.

    An existing file that parses keeps its comments and layout: only what changed is
    rewritten. roster.toml (the tool's own file) and new files are written fresh.
    """
    path = Path(folder) / FILE_NAMES[type(model)]
    if not path.is_file():
        return Rendered(path, dumps(model))
    old = path.read_bytes()  # unreadable: the OSError stops the save, nothing is replaced
    try:
        text = old.decode("utf-8")
    except UnicodeDecodeError:
        return _fresh(path, model, old, "not UTF-8 text, so it was written fresh")
    if isinstance(model, Roster):
        try:
            tomllib.loads(text)
        except ValueError:
            return _fresh(path, model, old, "not valid TOML, so it was written fresh")
        if has_comment(text):
            return _fresh(path, model, old, "always written fresh, so its comments are not kept")
        return Rendered(path, dumps(model))
    merged, why = _merged(model, text)
    if merged is not None:
        return Rendered(path, merged)
    return _fresh(path, model, old, why)


def _fresh(path: Path, model: BaseModel, old: bytes, why: str) -> Rendered:
    text = dumps(model)
    if text.encode("utf-8") == old:  # nothing of the old text is lost
        return Rendered(path, text)
    return Rendered(path, text, old, why)


def has_comment(text: str) -> bool:
    """Whether TOML text holds a comment: a `#` outside every string."""
    i, n = 0, len(text)
    while i < n:
        c = text[i]
        if c == "#":
            return True
        if c not in "\"'":
            i += 1
            continue
        quote = c * 3 if text.startswith(c * 3, i) else c
        j = i + len(quote)
        while j < n and not text.startswith(quote, j):
            if c == '"' and text[j] == "\\":
                j += 1
            elif len(quote) == 1 and text[j] == "\n":
                break  # not TOML; stop the string at the line's end
            j += 1
        j += len(quote)
        for _ in range(2 if len(quote) == 3 else 0):  # the closing quotes may be 4 or 5
            if j < n and text[j] == c:
                j += 1
        i = j
    return False


BACKUP_FOLDER = Path(".rostertui") / "backup"


def keep_backup(folder: str | Path, name: str, data: bytes, now: datetime | None = None) -> Path:
    """Copy `data` (a file's previous text) to `.rostertui/backup/<name>.<YYYYmmddTHHMMSS>`
    in the workspace, atomically; an earlier backup is never overwritten (a counter is
    added). Returns the backup's path."""
    where = Path(folder) / BACKUP_FOLDER
    where.mkdir(parents=True, exist_ok=True)
    stamp = (now or datetime.now()).strftime("%Y%m%dT%H%M%S")
    for n in itertools.count():
        path = where / (f"{name}.{stamp}" + (f".{n}" if n else ""))
        if not path.exists() and create_new(path, data):
            return path
    raise AssertionError("unreachable")


def keep_previous(rendered: Rendered, folder: str | Path) -> Problem | None:
    """When `rendered` drops what its file held: back the previous text up and return the
    notice saying so (None when nothing is lost)."""
    if rendered.previous is None:
        return None
    name = rendered.path.name
    backup = keep_backup(folder, name, rendered.previous)
    shown = backup.relative_to(Path(folder)).as_posix()
    return Problem(name, "", f"{rendered.why}; the previous text is kept in {shown}")


def save(model: BaseModel, folder: str | Path, notices: list[Problem] | None = None) -> Path:
    """Write one file model to its file in the workspace folder, atomically.

    An existing file that parses keeps its comments and layout: only what changed is
    rewritten. When it cannot (the merge fails, the file is not TOML, roster.toml held
    comments), its previous text is first copied to `.rostertui/backup/` and a notice
    naming the copy is appended to `notices`.
    """
    rendered = render(model, folder)
    notice = keep_previous(rendered, folder)
    if notice is not None and notices is not None:
        notices.append(notice)
    write_atomic(rendered.path, rendered.text)
    return rendered.path
