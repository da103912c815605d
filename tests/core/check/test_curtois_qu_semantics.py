"""The checker agrees with the published objective of the Curtois & Qu benchmark.

Source of the instances and of the objective: Curtois, T. and Qu, R. (2014)
"Computational results on new staff scheduling benchmark instances", technical
report, University of Nottingham (data set "Nurse Rostering Instances 1..24",
schedulingbenchmarks.org). The folder ../shared/benchmarks/curtois-qu holds the
instance texts, a README that states the text format and the objective, and the
instances converted to workspaces (`workspaces/InstanceN`).

For Instances 1-4 this module parses the instance text directly (no rostertui
code), computes the published objective of a roster -- unmet shift-on request
weights + violated shift-off request weights + weighted cover under/over per
(day, shift) -- and the units of each hard rule of the README, then writes the
same roster as roster.toml into a copy of the converted workspace and compares:
the checker's `penalty` must equal the objective (the instance's hard rules are
hard rules of the workspace, costing nothing), and its hard units per kind must
equal the README's hard rules counted directly.
"""

from __future__ import annotations

import json
import math
import random
from dataclasses import dataclass, field
from datetime import date, timedelta
from pathlib import Path

import pytest

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.io.load import load_workspace
from tests.conftest import BENCHMARKS, copy_ws, need_shared

INSTANCES = [1, 2, 3, 4]
SEEDS = range(6)
START = date(2024, 1, 1)  # the converted workspaces start on a Monday, as day 0 does
OFF = "-"


@dataclass
class Staff:
    id: str
    max_shifts: dict[str, int]
    max_minutes: int
    min_minutes: int
    max_run: int
    min_run: int
    min_off: int
    max_weekends: int


@dataclass
class Instance:
    horizon: int = 0
    length: dict[str, int] = field(default_factory=dict)  # shift -> minutes
    cannot_follow: dict[str, set[str]] = field(default_factory=dict)
    staff: list[Staff] = field(default_factory=list)
    days_off: dict[str, set[int]] = field(default_factory=dict)
    on: list[tuple[str, int, str, int]] = field(default_factory=list)
    off: list[tuple[str, int, str, int]] = field(default_factory=list)
    cover: dict[tuple[int, str], tuple[int, int, int]] = field(default_factory=dict)


def parse(text: str) -> Instance:
    """The instance text format of the benchmark's README (sections, comma separated)."""
    inst = Instance()
    section = ""
    for raw in text.splitlines():
        line = raw.strip()
        if not line or line.startswith("#"):
            continue
        if line.startswith("SECTION_"):
            section = line
            continue
        f = [x.strip() for x in line.split(",")]
        if section == "SECTION_HORIZON":
            inst.horizon = int(f[0])
        elif section == "SECTION_SHIFTS":
            inst.length[f[0]] = int(f[1])
            inst.cannot_follow[f[0]] = {s for s in f[2].split("|") if s} if len(f) > 2 else set()
        elif section == "SECTION_STAFF":
            caps = dict(item.split("=") for item in f[1].split("|") if item)
            inst.staff.append(Staff(f[0], {k: int(v) for k, v in caps.items()},
                                    *(int(x) for x in f[2:8])))
        elif section == "SECTION_DAYS_OFF":
            inst.days_off[f[0]] = {int(x) for x in f[1:] if x}
        elif section in ("SECTION_SHIFT_ON_REQUESTS", "SECTION_SHIFT_OFF_REQUESTS"):
            target = inst.on if section.endswith("ON_REQUESTS") else inst.off
            target.append((f[0], int(f[1]), f[2], int(f[3])))
        elif section == "SECTION_COVER":
            inst.cover[int(f[0]), f[1]] = (int(f[2]), int(f[3]), int(f[4]))
    return inst


Grid = dict[str, list[str]]  # person -> one code per day, "-" = off


def objective(inst: Instance, grid: Grid) -> int:
    """The published objective (README, "Rules and objective")."""
    total = sum(w for e, d, s, w in inst.on if grid[e][d] != s)
    total += sum(w for e, d, s, w in inst.off if grid[e][d] == s)
    for (d, s), (need, under, over) in inst.cover.items():
        n = sum(1 for row in grid.values() if row[d] == s)
        total += under * max(0, need - n) + over * max(0, n - need)
    return total


def runs(flags: list[bool]) -> list[tuple[int, int]]:
    out, first = [], None
    for i, flag in enumerate([*flags, False]):
        if flag and first is None:
            first = i
        elif not flag and first is not None:
            out.append((first, i - 1))
            first = None
    return out


def hard_units(inst: Instance, grid: Grid) -> dict[str, int]:
    """Units of each hard rule of the README, counted the rules.md way (per kind)."""
    h = inst.horizon
    units = dict.fromkeys(("max-shifts", "hours", "max-consecutive-days",
                           "min-consecutive-days", "min-consecutive-off", "max-weekends",
                           "leave", "forbidden-sequence"), 0)
    for st in inst.staff:
        row = grid[st.id]
        for s, cap in st.max_shifts.items():
            units["max-shifts"] += max(0, row.count(s) - cap)
        minutes = sum(inst.length[c] for c in row if c != OFF)
        if minutes > st.max_minutes:
            units["hours"] += math.ceil((minutes - st.max_minutes) / 60)
        if minutes < st.min_minutes:
            units["hours"] += math.ceil((st.min_minutes - minutes) / 60)
        for a, b in runs([c != OFF for c in row]):
            units["max-consecutive-days"] += max(0, b - a + 1 - st.max_run)
            if a > 0 and b < h - 1:  # runs touching the horizon's edges are exempt
                units["min-consecutive-days"] += max(0, st.min_run - (b - a + 1))
        for a, b in runs([c == OFF for c in row]):
            if a > 0 and b < h - 1:
                units["min-consecutive-off"] += max(0, st.min_off - (b - a + 1))
        worked = sum(1 for w in range(h // 7) if row[7 * w + 5] != OFF or row[7 * w + 6] != OFF)
        units["max-weekends"] += max(0, worked - st.max_weekends)
        units["leave"] += sum(1 for d in inst.days_off.get(st.id, ()) if row[d] != OFF)
        units["forbidden-sequence"] += sum(
            1 for d in range(h - 1) if row[d] != OFF and row[d + 1] in inst.cannot_follow[row[d]]
        )
    return {k: v for k, v in units.items() if v}


# --- rosters --------------------------------------------------------------------------


def random_grid(inst: Instance, rng: random.Random, p_off: float) -> Grid:
    codes = list(inst.length)
    return {st.id: [OFF if rng.random() < p_off else rng.choice(codes)
                    for _ in range(inst.horizon)] for st in inst.staff}


def greedy_grid(inst: Instance) -> Grid:
    """Follow the cover day by day: fill each requirement with free staff allowed that
    shift (day off kept, type cap left, no forbidden succession), fewest shifts first."""
    grid = {st.id: [OFF] * inst.horizon for st in inst.staff}
    for d in range(inst.horizon):
        for s in inst.length:
            need = inst.cover.get((d, s), (0, 0, 0))[0]
            for st in sorted(inst.staff, key=lambda x: (sum(c != OFF for c in grid[x.id]), x.id)):
                if need == 0:
                    break
                row = grid[st.id]
                if (row[d] != OFF or d in inst.days_off.get(st.id, ())
                        or row.count(s) >= st.max_shifts.get(s, inst.horizon)
                        or (d > 0 and row[d - 1] != OFF and s in inst.cannot_follow[row[d - 1]])):
                    continue
                row[d] = s
                need -= 1
    return grid


# --- through the workspace ------------------------------------------------------------


def load_instance(n: int) -> Instance:
    path = BENCHMARKS / f"Instance{n}.txt"
    need_shared(path)
    need_shared(BENCHMARKS / "workspaces" / f"Instance{n}")
    return parse(path.read_text(encoding="utf-8"))


def check_grid(n: int, grid: Grid, tmp_path: Path, name: str) -> CheckResult:
    ws = copy_ws(BENCHMARKS / "workspaces" / f"Instance{n}", tmp_path, name)
    rows = "".join(f"{json.dumps(pid)} = {json.dumps(row)}\n" for pid, row in grid.items())
    (ws / "roster.toml").write_text(
        f"start = {START}\ndays = {len(next(iter(grid.values())))}\n[rows]\n{rows}",
        encoding="utf-8",
    )
    return check_roster(load_workspace(ws))


def assert_agrees(inst: Instance, grid: Grid, result: CheckResult) -> None:
    assert result.penalty == objective(inst, grid)
    hard = {k: v["units"] for k, v in result.by_kind.items() if k not in ("cover", "request")}
    assert hard == hard_units(inst, grid)
    assert all(v.hard for v in result.violations if v.kind not in ("cover", "request"))
    assert result.compliant == (not hard_units(inst, grid))


@pytest.mark.parametrize("n", INSTANCES)
def test_parsed_text_matches_the_converted_workspace(n: int) -> None:
    inst = load_instance(n)
    ws = load_workspace(BENCHMARKS / "workspaces" / f"Instance{n}")
    assert ws.unit.days == inst.horizon and ws.unit.start == START
    assert [p.id for p in ws.staff.person] == [st.id for st in inst.staff]
    assert [s.code for s in ws.shifts.shift] == list(inst.length)
    assert (len(ws.requests.request), sum(len(v) for v in inst.days_off.values())) == (
        len(inst.on) + len(inst.off), sum(len(lv.dates()) for lv in ws.requests.leave))


@pytest.mark.parametrize("seed", SEEDS)
@pytest.mark.parametrize("n", INSTANCES)
def test_penalty_equals_the_published_objective_on_random_rosters(
    n: int, seed: int, tmp_path: Path
) -> None:
    inst = load_instance(n)
    rng = random.Random(1000 * n + seed)
    grid = random_grid(inst, rng, p_off=rng.choice([0.2, 0.4, 0.6]))
    assert_agrees(inst, grid, check_grid(n, grid, tmp_path, f"r{seed}"))


@pytest.mark.parametrize("n", INSTANCES)
def test_penalty_equals_the_published_objective_on_a_cover_following_roster(
    n: int, tmp_path: Path
) -> None:
    inst = load_instance(n)
    grid = greedy_grid(inst)
    result = check_grid(n, grid, tmp_path, "greedy")
    assert_agrees(inst, grid, result)
    # the greedy roster meets most of the cover, so its objective is far below all-off's
    off = {st.id: [OFF] * inst.horizon for st in inst.staff}
    assert result.penalty < objective(inst, off) / 2


@pytest.mark.parametrize("n", INSTANCES)
def test_all_off_and_all_on_rosters(n: int, tmp_path: Path) -> None:
    inst = load_instance(n)
    first = next(iter(inst.length))
    for name, code in (("off", OFF), ("on", first)):
        grid = {st.id: [code] * inst.horizon for st in inst.staff}
        assert_agrees(inst, grid, check_grid(n, grid, tmp_path, name))


def _blank(inst: Instance) -> Grid:
    return {st.id: [OFF] * inst.horizon for st in inst.staff}


@pytest.mark.parametrize("n", [2, 3, 4])  # Instance 1's only cap, D=14, is its horizon
def test_a_banned_shift_type_is_a_hard_max_shifts_violation(n: int, tmp_path: Path) -> None:
    """MaxShifts `T=0` exceeded: a hard `max-shifts` entry for that person, units = over."""
    inst = load_instance(n)
    st, s = min(((st, s) for st in inst.staff for s in st.max_shifts),
                key=lambda pair: (pair[0].max_shifts[pair[1]], pair[0].id))
    over = 2
    days = [d for d in range(inst.horizon) if d not in inst.days_off.get(st.id, ())]
    assert st.max_shifts[s] == 0 and len(days) >= over
    grid = _blank(inst)
    for d in days[: st.max_shifts[s] + over]:
        grid[st.id][d] = s
    result = check_grid(n, grid, tmp_path, "cap")
    found = [(v.kind, v.hard, v.person, v.units) for v in result.violations
             if v.kind == "max-shifts"]
    assert found == [("max-shifts", True, st.id, over)]
    assert_agrees(inst, grid, result)


@pytest.mark.parametrize("n", INSTANCES)
def test_lone_working_day_and_lone_day_off_are_hard_min_run_violations(
    n: int, tmp_path: Path
) -> None:
    """MinConsecutiveShifts / MinConsecutiveDaysOff of at least 2: a single working day
    (and, separately, a single day off) in the middle of the horizon breaks them."""
    inst = load_instance(n)
    st = next(st for st in inst.staff if st.min_run >= 2 and st.min_off >= 2)
    s = next(s for s in inst.length if st.max_shifts.get(s, 1) > 0)
    mid = inst.horizon // 2
    lone_day = _blank(inst)
    lone_day[st.id][mid] = s
    result = check_grid(n, lone_day, tmp_path, "lone-day")
    day = START + timedelta(days=mid)
    assert [(v.hard, v.person, v.dates, v.units) for v in result.violations
            if v.kind == "min-consecutive-days"] == [(True, st.id, (day, day), st.min_run - 1)]
    assert_agrees(inst, lone_day, result)

    lone_off = {pid: [s] * inst.horizon for pid in lone_day}
    lone_off[st.id][mid] = OFF
    result = check_grid(n, lone_off, tmp_path, "lone-off")
    assert [(v.hard, v.person, v.dates, v.units) for v in result.violations
            if v.kind == "min-consecutive-off"] == [(True, st.id, (day, day), st.min_off - 1)]
    assert_agrees(inst, lone_off, result)
