"""The CLI and the UI share one swap -> check -> impact wiring (core/edit/plans.py): the
`swap` and `absent` verbs report the very plan the editing session previews."""

from __future__ import annotations

import json
import shutil
from datetime import date
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.check import Violation
from rostertui.core.edit.session import Session
from rostertui.core.io.load import load_workspace
from tests.conftest import DEMO, FIXTURES, copy_ws


@pytest.fixture
def solved(tmp_path: Path) -> Path:
    """The clinic demo with a fixed solved roster."""
    dest = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", dest / "roster.toml")
    return dest


def cli_json(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, dict]:
    code = main(list(args))
    return code, json.loads(capsys.readouterr().out)


def as_json(found: list[Violation]) -> list[dict]:
    return [v.to_json() for v in found]


def differing_pair(s: Session, day: int) -> tuple[str, str]:
    """Two people whose cells on `day` hold different codes, neither locked."""
    people = [p for p in s.ws.person_ids if not s.locked(p, day)]
    for a in people:
        for b in people:
            if s.code(a, day) != s.code(b, day):
                return a, b
    raise AssertionError("everyone holds the same code")


@pytest.mark.parametrize("days", [(3, None), (3, 9)])
def test_the_cli_swap_and_the_session_make_the_same_plan(
        solved: Path, capsys: pytest.CaptureFixture[str],
        days: tuple[int, int | None]) -> None:
    session = Session(load_workspace(solved))
    day, day2 = days
    a, b = differing_pair(session, day)
    plan = session.preview_swap(a, day, b, day2)
    assert plan.cells  # a real change, so the comparison could fail
    dates = [session.ws.unit.dates[d].isoformat() for d in (day, day2) if d is not None]
    code, out = cli_json(capsys, "swap", str(solved), a, dates[0], b, *dates[1:], "--dry-run",
                         "--json")
    assert out["changed"] == [c.to_json() for c in plan.cells]
    assert out["created"] == as_json(plan.impact.created)
    assert out["resolved"] == as_json(plan.impact.resolved)
    after = plan.impact.after
    assert (out["compliant"], out["hard_violations"], out["penalty"]) == (
        after.compliant, after.hard_violations, after.penalty)
    assert code == (0 if after.compliant else 1)


def test_the_cli_absence_and_the_session_make_the_same_plan(
        solved: Path, capsys: pytest.CaptureFixture[str]) -> None:
    session = Session(load_workspace(solved))
    pid = next(p for p in session.ws.person_ids if session.code(p, 4) != "-")
    first, last = date(2027, 3, 19), date(2027, 3, 20)
    plan = session.absent(pid, first, last, reason="sick")
    assert plan.cleared
    code, out = cli_json(capsys, "absent", str(solved), pid, first.isoformat(), last.isoformat(),
                         "--reason", "sick", "--json")
    assert out["cleared"] == [c.to_json() for c in plan.cleared]
    assert out["created"] == as_json(plan.impact.created)
    assert out["penalty"] == plan.impact.after.penalty == session.check.penalty
    assert load_workspace(solved).roster == session.roster  # the file holds the session's roster
