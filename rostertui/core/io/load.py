"""The one entry point that reads a workspace folder into a validated Workspace."""

from __future__ import annotations

import os
import re
import tomllib
from pathlib import Path
from typing import Any, TypeVar

from pydantic import BaseModel, ValidationError

from rostertui.core.errors import InputError, Problem
from rostertui.core.io.crosscheck import CrossCheck, KnownNames
from rostertui.core.io.errors_map import problems_from
from rostertui.core.io.presets import preset_names, resolve_include
from rostertui.core.io.report import Report
from rostertui.core.io.roster_csv import read_roster_csv
from rostertui.core.io.ruleset import merge_rules
from rostertui.core.io.toml_lines import key_lines
from rostertui.core.io.transaction import JOURNAL, recover
from rostertui.core.models.history import History
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import PresetFile, Rule
from rostertui.core.models.shifts import ShiftsFile
from rostertui.core.models.staff import Staff
from rostertui.core.models.unit import Unit
from rostertui.core.models.workspace import Workspace

M = TypeVar("M", bound=BaseModel)

FILES: dict[str, type[BaseModel]] = {
    "unit.toml": Unit,
    "staff.toml": Staff,
    "shifts.toml": ShiftsFile,
    "requests.toml": RequestsFile,
    "history.toml": History,
    "roster.toml": Roster,
}
REQUIRED = ("unit.toml", "staff.toml", "shifts.toml")


def _known_keys() -> set[str]:
    """Every key name the format knows, for "did you mean" hints."""
    from rostertui.core.models import history, requests, roster, rules, shifts, staff, unit

    keys: set[str] = set()
    for module in (history, requests, roster, rules, shifts, staff, unit):
        for value in vars(module).values():
            if isinstance(value, type) and issubclass(value, BaseModel):
                keys.update(info.alias or name for name, info in value.model_fields.items())
    return keys


KNOWN_KEYS = _known_keys()


def read_toml(path: Path, label: str, report: Report) -> dict[str, Any] | None:
    """Parse one TOML file; on failure record a problem and return None."""
    if not path.is_file():  # a named pipe would block forever, a folder cannot be read
        report.error(label, (), "not a regular file (a folder, named pipe or device): "
                     "a workspace file must be a regular file or a link to one")
        return None
    try:
        text = path.read_text(encoding="utf-8")
    except UnicodeDecodeError as exc:
        report.error(label, (), f"not UTF-8 text ({exc.reason} at byte {exc.start})")
        return None
    except OSError as exc:
        report.error(label, (), f"cannot be read: {exc.strerror or exc}")
        return None
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        where = re.search(r"\(at line (\d+), column \d+\)", str(exc))
        line = int(where.group(1)) if where else None
        report.problems.append(Problem(label, "", f"not valid TOML: {exc}", line))
        return None
    report.lines[label] = key_lines(text)
    return data


def validate(model: type[M], data: dict[str, Any], label: str, report: Report) -> M | None:
    """Validate a file; on errors record them all and salvage what is valid.

    Salvage drops each list item (and each other top-level key) that has an error and
    validates again, so the cross-file checks can still run on the rest and one run
    reports every problem. None when nothing sensible is left (a required key broken).
    """
    try:
        return model.model_validate(data)
    except ValidationError as exc:
        errors = exc.errors(include_url=False)
        report.problems.extend(
            problems_from(exc, label, report.lines.get(label, {}), known_keys=KNOWN_KEYS)
        )
    pruned = _prune(data, [tuple(e["loc"]) for e in errors])
    try:
        return model.model_validate(pruned)
    except ValidationError:
        return None


def _prune(data: dict[str, Any], locs: list[tuple[Any, ...]]) -> dict[str, Any]:
    drop_items: dict[str, set[int]] = {}
    drop_keys: set[str] = set()
    for loc in locs:
        if not loc:
            continue
        key = str(loc[0])
        if len(loc) > 1 and isinstance(loc[1], int) and isinstance(data.get(key), list):
            drop_items.setdefault(key, set()).add(loc[1])
        else:
            drop_keys.add(key)
    out: dict[str, Any] = {}
    for key, value in data.items():
        if key in drop_keys:
            continue
        if key in drop_items:
            value = [item for i, item in enumerate(value) if i not in drop_items[key]]
        out[key] = value
    return out


def raw_names(data: dict[str, Any] | None, table: str, key: str) -> set[str]:
    """Names given in a file's raw data, valid or not (to avoid cascades of errors)."""
    names: set[str] = set()
    items = data.get(table) if isinstance(data, dict) else None
    for item in items if isinstance(items, list) else []:
        value = item.get(key) if isinstance(item, dict) else None
        if isinstance(value, str):
            names.add(value)
        elif isinstance(value, list):
            names.update(v for v in value if isinstance(v, str))
    return names


def load_file(
    folder: Path, name: str, report: Report, raw: dict[str, Any] | None = None
) -> BaseModel | None:
    path = folder / name
    if not path.exists():
        if os.path.lexists(path):  # a dangling link or a loop: never silently absent
            report.error(name, (), "is a link to a file that does not exist (or a link "
                         "loop); fix or remove the link")
            return None
        if name in REQUIRED:
            report.error(name, (), f"missing: a workspace needs {', '.join(REQUIRED)}")
        return None
    data = read_toml(path, name, report)
    if data is None:
        return None
    if raw is not None:
        raw[name] = data
    return validate(FILES[name], data, name, report)


def workspace_files(folder: Path, include: list[str]) -> list[tuple[Path, str]]:
    """The TOML files a workspace reads, with their path relative to the workspace: its
    top-level files (not hidden ones, such as a journal's) and the local presets it
    includes. Used by every trial load of would-be files (UI editors, imports)."""
    found = [(p, p.name) for p in sorted(folder.glob("*.toml")) if not p.name.startswith(".")]
    found += [(folder / name, name) for name in include if name.endswith(".toml")]
    return [(p, rel) for p, rel in found if p.is_file()]


def load_workspace(folder: str | Path, *, roster_file: str | Path | None = None) -> Workspace:
    """Read, validate and cross-check every file of the workspace folder.

    Every problem of the run is collected; if there is any, InputError holds them all.
    `roster_file` (a roster TOML or a CSV `person,date,shift`) replaces WS/roster.toml.
    """
    folder = Path(folder)
    report = Report()
    if not folder.is_dir():
        why = ("is a file, not a workspace folder; give the folder that holds unit.toml"
               if folder.exists() else "no such workspace folder")
        report.error(str(folder), (), why)
        raise InputError(report.problems)
    finished = recover(folder)  # a change of several files a killed run left half done
    if finished:
        report.warn(JOURNAL, (), finished)
    raw: dict[str, Any] = {}
    models = {
        name: load_file(folder, name, report, raw) for name in FILES if name != "roster.toml"
    }
    roster_label = "roster.toml"
    roster: BaseModel | None = None
    if roster_file is None:
        roster = load_file(folder, "roster.toml", report)
    elif not Path(roster_file).is_file():
        report.error(str(roster_file), (), "no such roster file")
    elif Path(roster_file).suffix.lower() != ".csv":
        roster_label = Path(roster_file).name
        data = read_toml(Path(roster_file), roster_label, report)
        if data is not None:
            data.pop("published", None)  # a published version: its metadata is not roster data
        roster = validate(Roster, data, roster_label, report) if data is not None else None
    unit, staff, shifts = models["unit.toml"], models["staff.toml"], models["shifts.toml"]
    requests = models["requests.toml"] or RequestsFile()
    history = models["history.toml"]
    presets = _load_presets(folder, unit, report) if isinstance(unit, Unit) else []
    if not (isinstance(staff, Staff) and isinstance(shifts, ShiftsFile)):
        raise InputError(report.problems)
    names = KnownNames(
        people=raw_names(raw.get("staff.toml"), "person", "id"),
        codes=raw_names(raw.get("shifts.toml"), "shift", "code"),
        skills=raw_names(raw.get("staff.toml"), "person", "skills"),
    )
    if (roster_file is not None and Path(roster_file).suffix.lower() == ".csv"
            and isinstance(unit, Unit)):
        roster_label = Path(roster_file).name
        roster = read_roster_csv(
            Path(roster_file), unit, [p.id for p in staff.person],
            {s.code for s in shifts.shift}, report,
        )
    check = CrossCheck(unit if isinstance(unit, Unit) else None, staff, shifts, report, names)
    check.staff(staff)
    check.shifts(shifts, staff)
    if isinstance(unit, Unit):
        check.unit_dates()
    assert isinstance(requests, RequestsFile)
    check.requests(requests)
    if isinstance(history, History):
        check.history(history)
    if isinstance(roster, Roster):
        check.roster(roster, roster_label)
    for _origin, label, listed in presets:
        for i, rule in enumerate(listed):
            check.rule(label, i, rule)
    local_rules = list(unit.rule) if isinstance(unit, Unit) else []
    for i, rule in enumerate(local_rules):
        check.rule("unit.toml", i, rule)
    check.finish()
    rules = merge_rules(presets, local_rules, staff, report)
    if report.problems or not isinstance(unit, Unit):
        raise InputError(report.problems)
    return Workspace(
        unit=unit,
        staff=staff,
        shifts=shifts,
        requests=requests,
        history=history if isinstance(history, History) else None,
        roster=roster if isinstance(roster, Roster) else None,
        rules=rules,
        warnings=report.warnings,
        path=folder,
    )


def _load_presets(folder: Path, unit: Unit, report: Report) -> list[tuple[str, str, list[Rule]]]:
    loaded: list[tuple[str, str, list[Rule]]] = []
    for i, name in enumerate(unit.include):
        label = name if name.endswith(".toml") else f"rules/{name}.toml"
        try:
            path = resolve_include(name, folder)
            found = path.is_file()
        except OSError as exc:  # a name too long for the file system, say
            report.error("unit.toml", ("include", i),
                         f"preset {name[:60]!r} cannot be looked up: {exc.strerror}")
            continue
        if not found:
            if name.endswith(".toml"):
                why = f"preset file {name!r} not found in the workspace"
            else:
                why = f"unknown preset {name!r}; shipped presets: {', '.join(preset_names())}"
            report.error("unit.toml", ("include", i), why)
            continue
        data = read_toml(path, label, report)
        if data is None:
            continue
        preset = validate(PresetFile, data, label, report)
        if preset is not None:
            loaded.append((name, label, list(preset.rule)))
    return loaded
