"""Write every workspace file kind back as TOML, atomically."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import tomli_w
from pydantic import BaseModel

from rostertui.core.io.atomic import write_atomic
from rostertui.core.models.history import History
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import PresetFile
from rostertui.core.models.shifts import ShiftsFile
from rostertui.core.models.staff import Staff
from rostertui.core.models.unit import Unit


def as_toml_data(model: BaseModel) -> dict[str, Any]:
    """The model as a TOML-ready dict: spec key names, no empty or default keys."""
    return model.model_dump(mode="python", by_alias=True, exclude_none=True, exclude_defaults=True)


def _rules_data(rules: list[Any]) -> list[dict[str, Any]]:
    out = []
    for rule in rules:
        data = as_toml_data(rule)
        # kind first, after id, so a reader sees what the rule is at once
        ordered = {"id": data.pop("id"), "kind": rule.kind, **data}
        out.append(ordered)
    return out


def dumps_unit(unit: Unit) -> str:
    data = as_toml_data(unit)
    data.pop("rule", None)
    for key in ("name", "timezone", "start", "days"):  # always written, in spec order
        data[key] = getattr(unit, key)
    head = {k: data[k] for k in ("name", "timezone", "start", "days")}
    head.update({k: v for k, v in data.items() if k not in head})
    if unit.rule:
        head["rule"] = _rules_data(list(unit.rule))
    return tomli_w.dumps(head)


def dumps_preset(preset: PresetFile) -> str:
    return tomli_w.dumps({"rule": _rules_data(list(preset.rule))})


def dumps_plain(model: BaseModel) -> str:
    return tomli_w.dumps(as_toml_data(model))


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
    if isinstance(model, Unit):
        return dumps_unit(model)
    if isinstance(model, PresetFile):
        return dumps_preset(model)
    if isinstance(model, Staff | ShiftsFile | RequestsFile | History):
        return dumps_plain(model)
    raise TypeError(f"no TOML writer for {type(model).__name__}")


FILE_NAMES: dict[type[BaseModel], str] = {
    Unit: "unit.toml",
    Staff: "staff.toml",
    ShiftsFile: "shifts.toml",
    RequestsFile: "requests.toml",
    History: "history.toml",
    Roster: "roster.toml",
}


def save(model: BaseModel, folder: str | Path) -> Path:
    """Write one file model to its file in the workspace folder, atomically."""
    path = Path(folder) / FILE_NAMES[type(model)]
    write_atomic(path, dumps(model))
    return path
