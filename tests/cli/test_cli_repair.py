"""publish, diff, swap, absent and repair from the command line, on the clinic demo."""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.io.published import load_published
from rostertui.core.repair.diff import roster_diff
from rostertui.core.solver import SolveOptions, solve
from tests.conftest import DEMO, FIXTURES, copy_ws, two_working_days


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """The clinic demo with a fixed solved roster (tests/fixtures/clinic_solved_roster.toml)."""
    dest = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", dest / "roster.toml")
    return dest


def run(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, str, str]:
    code = main(list(args))
    captured = capsys.readouterr()
    return code, captured.out, captured.err


def test_sick_call_repair_changes_few_cells_and_nothing_before_from(
        clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert run(capsys, "publish", str(clinic), "--note", "March")[0] == 0
    pid, first, last = two_working_days(clinic)
    code, out, _ = run(capsys, "absent", str(clinic), pid, first.isoformat(), last.isoformat(),
                       "--reason", "sick")
    assert code == 1 and "Cover now short" in out  # the cover they held is short now
    before_repair = load_workspace(clinic).roster
    code, out, err = run(capsys, "repair", str(clinic), "--from", first.isoformat(),
                         "--time-limit", "20", "--workers", "2", "--json")
    data = json.loads(out)
    assert code == 0 and data["hard_violations"] == 0, err
    assert {"status", "objective", "bound", "seconds", "hard_violations",
            "changed_cells"} <= set(data)
    ws = load_workspace(clinic)
    assert check_roster(ws).compliant and check_roster(ws).penalty == data["objective"]
    published = load_published(clinic)
    assert published is not None
    since_published = roster_diff(ws, published.roster, ws.roster)
    assert len(since_published) <= 3 * 2  # the absence was two cells
    assert all(c.date >= first for c in since_published)
    by_repair = roster_diff(ws, before_repair, ws.roster)
    assert [(c.person, c.date.isoformat(), c.before, c.after) for c in by_repair] == [
        (c["person"], c["date"], c["before"], c["after"]) for c in data["changed_cells"]]
    # a fresh solve of the same workspace reshuffles far more
    fresh = solve(load_workspace(clinic), SolveOptions(time_limit=8, workers=2,
                                                       warm_start=False))
    assert fresh.roster is not None
    assert len(roster_diff(ws, published.roster, fresh.roster)) > 3 * len(since_published)


def test_diff_of_a_swap_lists_exactly_the_swapped_cells(
        clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    run(capsys, "publish", str(clinic))
    ws = load_workspace(clinic)
    rows, dates = ws.roster.rows, ws.unit.dates  # type: ignore[union-attr]
    a, b = ws.person_ids[0], next(p for p in ws.person_ids[1:]
                                  if rows[p][3] != rows[ws.person_ids[0]][3]
                                  and rows[p][5] != rows[ws.person_ids[0]][5])
    code, out, _ = run(capsys, "swap", str(clinic), a, dates[3].isoformat(), b)
    assert code in (0, 1) and "Creates" in out
    changed = json.loads(run(capsys, "diff", str(clinic), "--json")[1])["changed"]
    assert sorted((c["person"], c["date"]) for c in changed) == sorted(
        [(a, dates[3].isoformat()), (b, dates[3].isoformat())])
    assert {c["before"] for c in changed} == {rows[a][3], rows[b][3]}
    run(capsys, "swap", str(clinic), a, dates[3].isoformat(), b)  # swap back: no change
    run(capsys, "swap", str(clinic), a, dates[3].isoformat(), b, dates[5].isoformat())
    changed = json.loads(run(capsys, "diff", str(clinic), "--json")[1])["changed"]
    assert len(changed) == 4
    assert {(c["person"], c["date"]) for c in changed} == {
        (p, d.isoformat()) for p in (a, b) for d in (dates[3], dates[5])}


def test_publish_never_overwrites_and_diff_takes_a_version(
        clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert run(capsys, "publish", str(clinic), "--note", "first")[0] == 0
    first = (clinic / "published" / "001.toml").read_bytes()
    ws = load_workspace(clinic)
    a, b = ws.person_ids[:2]
    run(capsys, "swap", str(clinic), a, ws.unit.dates[0].isoformat(), a,
        ws.unit.dates[1].isoformat())
    data = json.loads(run(capsys, "publish", str(clinic), "--json")[1])
    assert data["version"] == 2 and data["path"].endswith("002.toml")
    assert (clinic / "published" / "001.toml").read_bytes() == first
    assert json.loads(run(capsys, "diff", str(clinic), "--json")[1]) == {"changed": []}
    against_1 = json.loads(run(capsys, "diff", str(clinic), "--against", "1", "--json")[1])
    assert len(against_1["changed"]) in (0, 2)


@pytest.mark.parametrize(("args", "words"), [
    (["swap", "{ws}", "zz9", "2027-03-20", "c01"], "no person 'zz9'"),
    (["swap", "{ws}", "c01", "2027-13-01", "c02"], "not a date"),
    (["swap", "{ws}", "c01", "2027-05-20", "c02"], "outside the period"),
    (["absent", "{ws}", "c01", "2027-03-20", "2027-03-18"], "before it starts"),
    (["absent", "{ws}", "c01", "2027-03-20", "--credit-hours", "30"], "credit_hours"),
    (["diff", "{ws}"], "nothing published yet"),
    (["diff", "{ws}", "--against", "x"], "not a version number"),
    (["repair", "{ws}", "--from", "2027-06-01"], "nothing left to repair"),
])
def test_bad_input_exits_2_names_the_problem_and_writes_nothing(
        clinic: Path, capsys: pytest.CaptureFixture[str], args: list[str], words: str) -> None:
    before = {p.name: p.read_bytes() for p in clinic.iterdir() if p.is_file()}
    code, out, err = run(capsys, *[a.format(ws=clinic) for a in args])
    assert code == 2 and words in err and out == ""
    assert {p.name: p.read_bytes() for p in clinic.iterdir() if p.is_file()} == before
    assert not (clinic / "published").exists()


def test_repair_without_a_roster_and_diff_against_a_missing_version(
        tmp_path: Path, clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    empty = copy_ws(DEMO / "clinic", tmp_path, "empty")
    code, _, err = run(capsys, "repair", str(empty))
    assert code == 2 and "no roster.toml to repair" in err
    run(capsys, "publish", str(clinic))
    code, _, err = run(capsys, "diff", str(clinic), "--against", "9")
    assert code == 2 and "published/009.toml" in err


def test_a_file_system_error_is_a_message_and_exit_2(
        clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    (clinic / "published").write_text("not a folder\n")
    code, out, err = run(capsys, "publish", str(clinic))
    assert code == 2 and out == "" and "published" in err and "Traceback" not in err
    assert (clinic / "published").read_text() == "not a folder\n"
