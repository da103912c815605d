"""The time limit is for the whole solve: a slow build leaves the later phases less time;
and the build's length is estimated before building.

The timed bounds are generous (a busy 2-core machine): with a build made 3 s slower
and a 4 s limit, the solve takes about 4.2 s when the limit counts from the call and
7 s and more when it counts from after the build, as it did.
"""

from __future__ import annotations

import dataclasses
import shutil
import time
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.solver import SolveOptions, run, solve
from rostertui.core.solver.model import BUILD_PER_CELL, build_model, estimate_build
from tests.conftest import DEMO, FIXTURES, copy_ws
from tests.tui.bigws import make_big_workspace

SLOW_BUILD = 3.0
LIMIT = 4.0
LEFT = LIMIT - SLOW_BUILD  # after the build


@pytest.fixture
def slow_build(monkeypatch: pytest.MonkeyPatch) -> dict[str, list[float]]:
    """build_model takes SLOW_BUILD s longer; the limits given to the hint and the LP
    are recorded."""
    seen: dict[str, list[float]] = {"hint": [], "lp": []}

    def slow(*args: object, **kwargs: object) -> run.BuiltModel:
        time.sleep(SLOW_BUILD)
        return build_model(*args, **kwargs)  # type: ignore[arg-type]

    real_hint, real_relaxation = run._hint, run.Relaxation

    def hint(built: run.BuiltModel, budget: float):  # noqa: ANN202
        seen["hint"].append(budget)
        return real_hint(built, budget)

    class Relaxation(real_relaxation):  # type: ignore[misc, valid-type]
        def solve(self, time_limit: float) -> int | None:
            seen["lp"].append(time_limit)
            return super().solve(time_limit)

    monkeypatch.setattr(run, "build_model", slow)
    monkeypatch.setattr(run, "_hint", hint)
    monkeypatch.setattr(run, "Relaxation", Relaxation)
    return seen


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """The clinic demo (not proven optimal in seconds) with a solved roster to warm
    start from."""
    dest = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", dest / "roster.toml")
    return dest


def test_a_slow_build_leaves_the_search_only_what_remains(
        slow_build: dict[str, list[float]], clinic: Path) -> None:
    ws = load_workspace(clinic)
    t0 = time.monotonic()
    out = solve(ws, SolveOptions(time_limit=LIMIT, workers=2))
    wall = time.monotonic() - t0
    assert out.build_seconds >= SLOW_BUILD
    assert out.wall_seconds <= wall < LIMIT + 2
    assert out.seconds < run.MIN_SEARCH + 1  # LP and search had what remained (MIN_SEARCH)
    # the hint and the LP had at most their shares of what the build left
    assert slow_build["hint"] and max(slow_build["hint"]) <= run.HINT_SHARE * LEFT + 0.05
    # (the LP is skipped when building it alone would take more than its share)
    assert all(limit <= 0.2 * LEFT + 0.05 for limit in slow_build["lp"])
    assert out.phases["lp"] <= 0.2 * LEFT + 0.1
    assert out.roster is not None and check_roster(ws, out.roster).compliant


def test_the_callers_deadline_counts_instead_of_the_limit(
        slow_build: dict[str, list[float]], clinic: Path) -> None:
    ws = load_workspace(clinic)
    t0 = time.monotonic()
    out = solve(ws, SolveOptions(time_limit=60, workers=2, deadline=t0 + LIMIT))
    assert time.monotonic() - t0 < LIMIT + 2
    assert out.roster is not None
    assert set(out.phases) >= {"build", "hint", "lp", "search", "polish", "referee"}


def test_the_estimate_counts_the_cells_the_model_has() -> None:
    ws = load_workspace(FIXTURES / "good")  # leave and a skill-bound night
    est = estimate_build(ws)
    # exact without the roster's locks (a locked cell keeps one shift: a little less)
    assert est.cells == len(build_model(dataclasses.replace(ws, roster=None)).cells.x)
    assert est.cells >= len(build_model(ws).cells.x)
    assert est.people == len(ws.staff.person) and est.days == ws.unit.days
    assert est.rule_people == sum(len(eff.people) for eff in ws.rules)
    assert est.seconds > BUILD_PER_CELL * est.cells  # the rules cost on top of the cells


def test_the_estimate_grows_with_people_and_days(tmp_path: Path) -> None:
    def seconds(people: int, days: int) -> float:
        folder = make_big_workspace(tmp_path / f"w{people}x{days}", people, days)
        return estimate_build(load_workspace(folder)).seconds

    small, more_people, more_days = seconds(20, 14), seconds(40, 14), seconds(20, 28)
    assert small < more_people and small < more_days
    assert more_people == pytest.approx(2 * small, rel=0.05)  # linear in the headcount
    big = seconds(2014, 28)
    assert big > 2.0  # more than a --time-limit 2: the CLI warns
    assert big == pytest.approx(2014 / 20 * 2 * small, rel=0.05)
