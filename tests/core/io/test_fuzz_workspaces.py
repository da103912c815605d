"""A seeded fuzz test: mutants of the bundled workspaces through the loader and the checker.

Each case copies one workspace (the clinic demo with a solved roster, the depot demo,
the small test fixture), changes one thing in one file and loads it in-process:

- a key renamed to a near miss, or a value given a TOML type the format does not
  allow there (a date in quotes, a number as a string, true for a weight), must be an
  input error naming that file: never silently accepted (workspace-format.md: a typo
  is never ignored);
- anything else (keys dropped, entries duplicated, extreme numbers, odd text,
  truncated or binary files) may load or be refused, but never with a traceback;
  what loads is also checked, its statistics computed and, with a roster, every
  export format rendered in memory (none of which may raise either).

A failing case names its seed: `pytest -k "fuzz and 137"` replays it.
"""

from __future__ import annotations

import math
import random
import shutil
import tomllib
from datetime import date, datetime, timedelta
from pathlib import Path
from typing import Any

import pytest
import tomli_w

from rostertui.core.check.run import check_roster
from rostertui.core.errors import InputError
from rostertui.core.io.export.files import FORMATS, render
from rostertui.core.io.load import load_workspace
from rostertui.core.stats.compute import roster_stats
from tests.conftest import DEMO, FIXTURES

CASES = 500
NOW = datetime(2027, 3, 1, 12, 0)
FILES = ("unit.toml", "staff.toml", "shifts.toml", "requests.toml", "roster.toml",
         "history.toml")
# Tables whose keys are the user's own names (person ids), not keys of the format.
MAPS = ("rows", "hours_before")
Path_ = tuple[str | int, ...]


def _source(rng: random.Random, tmp_path: Path) -> Path:
    folder = tmp_path / "ws"
    which = rng.choice(("clinic", "depot", "good"))
    if which == "good":
        shutil.copytree(FIXTURES / "good", folder)
    else:
        shutil.copytree(DEMO / which, folder)
        if which == "clinic":
            shutil.copy(FIXTURES / "clinic_solved_roster.toml", folder / "roster.toml")
    return folder


def _walk(node: Any, path: Path_ = ()) -> list[tuple[Path_, Any]]:
    """Every value below `node` with its path (tables and lists included)."""
    found: list[tuple[Path_, Any]] = []
    items = node.items() if isinstance(node, dict) else enumerate(node)
    for key, value in items:
        here = (*path, key)
        found.append((here, value))
        if isinstance(value, dict | list):
            found += _walk(value, here)
    return found


def _parent(data: Any, path: Path_) -> Any:
    for part in path[:-1]:
        data = data[part]
    return data


def _typo(key: str, rng: random.Random) -> str:
    i = rng.randrange(len(key) + 1)
    return key[:i] + rng.choice("xqz_") + key[i:]


def _wrong_type(value: Any, rng: random.Random) -> Any | None:
    """A value of a TOML type no key of the format accepts in place of `value`."""
    if isinstance(value, bool):
        return rng.choice(["true", 1])
    if isinstance(value, int):
        return rng.choice([str(value), True])  # not a float: a float key takes an int
    if isinstance(value, float):
        return rng.choice([str(value), False])
    if isinstance(value, date) and not isinstance(value, datetime):
        return rng.choice([value.isoformat(), datetime(value.year, value.month, value.day),
                           value.toordinal()])
    if isinstance(value, str):
        return rng.choice([7, True, date(2027, 3, 15)])
    if isinstance(value, list) and value:
        return "x"
    return None


ODD_NUMBERS = [0, -1, 10**9, 2**63 - 1, 1e308, -0.0, math.inf, math.nan, 1e-300, 0.1 + 0.2]
ODD_TEXT = ["", " ", "Ω" * 300, "a\x00b", "\u202eevil", "-", "@night", "E E", "\ud7ff",
            "x" * 5000, "2027-02-30", "25:00", "E,L", "'"]


def _free_change(data: dict, rng: random.Random) -> str:
    """Any change at all, described; the result need not be valid."""
    spots = _walk(data)
    if not spots:
        data["x"] = 1
        return "added key x to an empty file"
    path, value = rng.choice(spots)
    parent = _parent(data, path)
    what = rng.randrange(5)
    if what == 0:
        del parent[path[-1]]
        return f"removed {path}"
    if what == 1 and isinstance(value, dict | list) and value:
        if isinstance(value, list):
            value.append(value[rng.randrange(len(value))])
            return f"duplicated an entry of {path}"
        key = rng.choice(list(value))
        del value[key]
        return f"removed {(*path, key)}"
    if what == 2:
        parent[path[-1]] = rng.choice(ODD_NUMBERS)
        return f"{path} = {parent[path[-1]]!r}"
    if what == 3:
        parent[path[-1]] = rng.choice(ODD_TEXT)
        return f"{path} = {parent[path[-1]]!r}"
    if isinstance(value, date) and not isinstance(value, datetime):
        parent[path[-1]] = value + timedelta(days=rng.choice([-400, -30, -1, 1, 30, 400]))
        return f"{path} moved to {parent[path[-1]]}"
    parent[path[-1]] = []
    return f"{path} = []"


def _mutate(folder: Path, rng: random.Random) -> tuple[str, str, bool]:
    """Change one file; (file, description, must this be refused?)."""
    present = [f for f in FILES if (folder / f).is_file()]
    name = rng.choice(present)
    target = folder / name
    text = target.read_text(encoding="utf-8")
    mode = rng.choices(["typo", "type", "free", "bytes"], weights=[3, 4, 4, 1])[0]
    if mode == "bytes":
        raw = text.encode("utf-8")
        cut = rng.randrange(len(raw) + 1)
        tail = bytes(rng.randrange(256) for _ in range(rng.randrange(0, 12)))
        target.write_bytes(raw[:cut] + tail)
        return name, f"cut at byte {cut}, then {tail!r}", False
    data = tomllib.loads(text)
    spots = _walk(data)
    if mode == "typo":
        keys = [(p, v) for p, v in spots if isinstance(p[-1], str)
                and not any(m in p[:-1] for m in MAPS)]
        if keys:
            path, value = rng.choice(keys)
            parent = _parent(data, path)
            new_key = _typo(str(path[-1]), rng)
            parent[new_key] = parent.pop(path[-1])
            target.write_text(tomli_w.dumps(data), encoding="utf-8")
            return name, f"renamed {path} to {new_key!r}", True
        mode = "free"
    if mode == "type":
        typed = [(p, v) for p, v in spots if _wrong_type(v, random.Random(0)) is not None]
        if typed:
            path, value = rng.choice(typed)
            bad = _wrong_type(value, rng)
            _parent(data, path)[path[-1]] = bad
            target.write_text(tomli_w.dumps(data), encoding="utf-8")
            return name, f"{path}: {value!r} -> {bad!r}", True
    description = _free_change(data, rng)
    target.write_text(tomli_w.dumps(data), encoding="utf-8")
    return name, description, False


CSV_ODD = ["", ",", '"', '""', "\r", "\n", "\x00", "\ufeff", ";", "2027-03-32", "t01", "E",
           "-", "Ω", "x" * 200_000, "\n\n", ",,,,", "person,date,shift\n"]


def _mutant_csv(folder: Path, rng: random.Random) -> Path:
    """A roster CSV as spreadsheets write them, with a few bytes changed."""
    ws = load_workspace(folder)
    text = next(iter(render(ws, "csv", now=NOW).values()))
    for _ in range(rng.randrange(1, 4)):
        at = rng.randrange(len(text) + 1)
        text = text[:at] + rng.choice(CSV_ODD) + text[at + rng.randrange(0, 8):]
    path = folder / "elsewhere.csv"
    path.write_bytes(text.encode("utf-8", "surrogatepass"))
    return path


@pytest.mark.parametrize("seed", range(CASES // 5))
def test_fuzz_a_mutant_roster_csv(seed: int, tmp_path: Path) -> None:
    rng = random.Random(seed)
    folder = tmp_path / "ws"
    shutil.copytree(DEMO / "clinic", folder)
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", folder / "roster.toml")
    csv_file = _mutant_csv(folder, rng)
    try:
        ws = load_workspace(folder, roster_file=csv_file)
    except InputError as exc:
        assert {p.file for p in exc.problems} == {"elsewhere.csv"}
        return
    assert check_roster(ws).penalty >= 0
    assert roster_stats(ws).has_roster


@pytest.mark.parametrize("seed", range(CASES))
def test_fuzz_a_mutant_workspace(seed: int, tmp_path: Path) -> None:
    rng = random.Random(seed)
    folder = _source(rng, tmp_path)
    name, description, must_refuse = _mutate(folder, rng)
    try:
        ws = load_workspace(folder)
    except InputError as exc:
        files = {p.file for p in exc.problems}
        if must_refuse:
            assert name in files, f"{name}: {description}: refused, but for {files}"
        return
    assert not must_refuse, f"{name}: {description}: loaded without a word"
    result = check_roster(ws)
    assert result.penalty >= 0
    assert len(roster_stats(ws).people) == len(ws.staff.person)
    if ws.roster is not None:
        for fmt in FORMATS:
            assert render(ws, fmt, now=NOW), fmt
