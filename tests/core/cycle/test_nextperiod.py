"""The next period's workspace: what is carried, what is refused, and that nothing is
written on a refusal (cycle/nextperiod.py, cycle/write.py)."""

from __future__ import annotations

import tomllib
from datetime import date
from pathlib import Path

import pytest

from rostertui.core.cycle import default_target, plan_next, write_plan
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from tests.core.check.helpers import write_ws

from .helpers import roll

REQUESTS = """\
# Leave is hard.
[[leave]]
person = "a"
from = 2027-03-01
to = 2027-03-02
reason = "past"

# reaches into the next period
[[leave]]
person = "a"
from = 2027-03-06
to = 2027-03-09
credit_hours = 7.5

[[leave]]
person = "b"
from = 2027-03-08

[[request]]
person = "a"
date = 2027-03-03
want = "off"

# the dentist, next week
[[request]]
person = "b"
date = 2027-03-10
avoid = "E"
"""
LOCKS = '\n[[lock]]\nperson = "a"\ndates = [2027-03-01, 2027-03-02]\n'


def old_ws(tmp_path: Path, **kw: object) -> Path:
    options: dict[str, object] = {"rows": {"a": "- - E E - - -", "b": "- L L - - - N"},
                                  "requests": REQUESTS, "locks": LOCKS}
    options.update(kw)
    folder = write_ws(tmp_path / "ward", **options)  # type: ignore[arg-type]
    unit = folder / "unit.toml"
    unit.write_text("# the ward\n" + unit.read_text().replace(
        "days = 7", "days = 7   # one week\nholidays = [2027-03-05]  # a feast\n"))
    return folder


def snapshot(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes() for p in folder.rglob("*")
            if p.is_file()}


def test_the_new_workspace_carries_what_reaches_into_the_new_period(tmp_path: Path) -> None:
    old = old_ws(tmp_path)
    plan = roll(old, tmp_path / "next", holidays=[date(2027, 3, 12)])
    new = tmp_path / "next"
    ws = load_workspace(new)
    assert (ws.unit.start, ws.unit.days, ws.unit.holidays) == (date(2027, 3, 8), 7,
                                                              [date(2027, 3, 12)])
    assert ws.roster is None and not (new / "roster.toml").exists()  # no roster, no locks
    assert plan.locks_dropped == 2
    for name in ("staff.toml", "shifts.toml"):
        assert (new / name).read_bytes() == (old / name).read_bytes()
    # leave: the past one dropped, the one across the boundary clipped, the next kept
    leave = [(lv.person, lv.from_, lv.to, lv.credit_hours) for lv in ws.requests.leave]
    assert leave == [("a", date(2027, 3, 8), date(2027, 3, 9), 7.5),
                     ("b", date(2027, 3, 8), None, None)]
    assert [(r.person, r.date) for r in ws.requests.request] == [("b", date(2027, 3, 10))]
    assert (plan.leave_clipped, plan.leave_dropped, plan.requests_dropped) == (1, 1, 1)
    text = (new / "requests.toml").read_text()
    assert "# Leave is hard." in text and "# the dentist, next week" in text
    unit = (new / "unit.toml").read_text()
    assert unit.startswith("# the ward\n")
    assert "start = 2027-03-08\n" in unit and "# a feast" not in unit  # stale comment gone
    assert "# one week" not in unit


def test_history_rows_and_head_comment(tmp_path: Path) -> None:
    rules = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n'
    plan = roll(old_ws(tmp_path, rules=rules), tmp_path / "next")
    assert plan.history_days == 2
    text = (tmp_path / "next" / "history.toml").read_text()
    assert text.startswith("# What each person worked before 8 Mar 2027")
    assert tomllib.loads(text)["rows"] == {"a": ["-", "-"], "b": ["-", "N"]}
    assert any("no holidays" in w for w in plan.warnings)


def test_refuses_without_a_roster_and_writes_nothing(tmp_path: Path) -> None:
    old = old_ws(tmp_path)
    (old / "roster.toml").unlink()
    with pytest.raises(EditError, match="no roster yet"):
        plan_next(load_workspace(old), tmp_path / "next")
    assert not (tmp_path / "next").exists()


def test_refuses_a_roster_with_a_hard_breach_unless_forced(tmp_path: Path) -> None:
    rules = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n'
    old = old_ws(tmp_path, rules=rules, rows={"a": "- - L E - - -", "b": "- - - - - - -"})
    before = snapshot(tmp_path)
    with pytest.raises(EditError, match=r"breaks 1 hard rule .*--force"):
        plan_next(load_workspace(old), tmp_path / "next")
    assert snapshot(tmp_path) == before
    plan = roll(old, tmp_path / "next", force=True)
    assert plan.hard_violations == 1
    assert "# Written with --force: that roster breaks 1 hard rule" in (
        tmp_path / "next" / "history.toml").read_text()


def test_refuses_a_target_that_exists_even_when_it_appears_after_planning(tmp_path) -> None:
    old = old_ws(tmp_path)
    (tmp_path / "taken").mkdir()
    with pytest.raises(EditError, match="exists already"):
        plan_next(load_workspace(old), tmp_path / "taken")
    plan = plan_next(load_workspace(old), tmp_path / "late")
    (tmp_path / "late").mkdir()
    (tmp_path / "late" / "mine.txt").write_text("keep me")
    with pytest.raises(EditError, match="exists already"):
        write_plan(plan)
    assert snapshot(tmp_path / "late") == {"mine.txt": b"keep me"}
    assert sorted(p.name for p in tmp_path.iterdir()) == ["late", "taken", "ward"]  # no temp


def test_a_plan_that_would_not_load_is_never_published(tmp_path: Path) -> None:
    plan = plan_next(load_workspace(old_ws(tmp_path)), tmp_path / "next")
    plan.files["shifts.toml"] = b"shift = 3\n"
    with pytest.raises(EditError, match="would not load"):
        write_plan(plan)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["ward"]


def test_bad_days_and_holidays_are_refused(tmp_path: Path) -> None:
    ws = load_workspace(old_ws(tmp_path))
    with pytest.raises(EditError, match="1 to 366"):
        plan_next(ws, tmp_path / "n", days=0)
    with pytest.raises(EditError, match="outside the new period"):
        plan_next(ws, tmp_path / "n", holidays=[date(2027, 3, 5)])
    assert plan_next(ws, tmp_path / "n", days=14).end == date(2027, 3, 21)


def test_default_target_is_a_sibling_named_after_the_new_start(tmp_path: Path) -> None:
    start = date(2027, 4, 12)
    assert default_target(tmp_path / "ward-b", start) == tmp_path / "ward-b-2027-04-12"
    assert default_target(tmp_path / "ward-b-2027-03-15", start) == \
        tmp_path / "ward-b-2027-04-12"


def test_a_preset_file_inside_the_workspace_is_copied(tmp_path: Path) -> None:
    old = old_ws(tmp_path, unit_extra='include = ["local.toml"]')
    (old / "local.toml").write_text(
        '# ours\n[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n')
    roll(old, tmp_path / "next")
    assert (tmp_path / "next" / "local.toml").read_text().startswith("# ours")
    assert [r.id for r in load_workspace(tmp_path / "next").rules] == ["rest"]
