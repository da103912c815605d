"""Write every workspace file kind back as TOML, atomically.

A file that exists is changed in place (`toml_merge`): its comments and layout stay, and
only what the model changed is rewritten. roster.toml is the tool's own file and is always
written fresh in the spec layout.
"""

from __future__ import annotations

import tomllib
from pathlib import Path
from typing import Any

import tomli_w
from pydantic import BaseModel

from rostertui.core.io.atomic import write_atomic
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


def _inline(values: list[str]) -> str:
    return "[" + ", ".join(tomli_w.dumps({"v": v}).split(" = ", 1)[1].strip() for v in values) + "]"


def _key(name: str) -> str:
    return tomli_w.dumps({name: 0}).split(" = ", 1)[0]


def dumps_roster(roster: Roster) -> str:
    """roster.toml exactly as the spec shows: one inline row of codes per person."""
    lines = [f"start = {roster.start.isoformat()}", f"days = {roster.days}", "", "[rows]"]
    lines += [f"{_key(pid)} = {_inline(row)}" for pid, row in roster.rows.items()]
    for lock in roster.lock:
        dates = ", ".join(d.isoformat() for d in lock.dates)
        lines += ["", "[[lock]]", f"person = {_inline([lock.person])[1:-1]}", f"dates = [{dates}]"]
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
        out = list(new)
        if len(raw) == len(old):
            for i, j in pairs(old, new):
                out[j] = as_written(raw[i], old[i], new[j])
        return out
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


def _merged(model: BaseModel, path: Path) -> str | None:
    """The file's text with the model's data merged in; None if it cannot be trusted."""
    try:
        text = path.read_text(encoding="utf-8")
        data = _merge_data(model, tomllib.loads(text))
    except (OSError, ValueError):  # unreadable or not TOML: written fresh, as before
        return None
    try:
        merged = merge_text(text, data)
        back = tomllib.loads(merged)
    except Exception:  # a tomlkit corner case must not stop a save: write it fresh
        return None
    # never write something that reads back differently from what was meant
    return merged if same_data(back, tomllib.loads(tomli_w.dumps(data))) else None


def save(model: BaseModel, folder: str | Path) -> Path:
    """Write one file model to its file in the workspace folder, atomically.

    An existing file that parses keeps its comments and layout: only what changed is
    rewritten. roster.toml (the tool's own file) and new files are written fresh.
    """
    path = Path(folder) / FILE_NAMES[type(model)]
    merged = None if isinstance(model, Roster) or not path.is_file() else _merged(model, path)
    write_atomic(path, merged if merged is not None else dumps(model))
    return path
