"""Requests from a CSV checked against a workspace (the clinic demo: period 2027-03-15 to
2027-04-11, shifts E, L, N, people c01-c14): what is added, what is skipped, every bad row
on its line, and the loader's own problems put back on CSV lines."""

from __future__ import annotations

from datetime import date
from pathlib import Path

import pytest

from rostertui.core.errors import Problem
from rostertui.core.intake.requests_csv import plan_requests
from rostertui.core.intake.trial import relabel
from rostertui.core.io.load import load_workspace
from rostertui.core.models.requests import Request
from rostertui.core.models.workspace import Workspace
from tests.conftest import DEMO, copy_ws


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    return copy_ws(DEMO / "clinic", tmp_path, "clinic")


@pytest.fixture
def ws(clinic: Path) -> Workspace:
    return load_workspace(clinic)


def write(tmp_path: Path, text: str, *, bom: bool = False, crlf: bool = False) -> Path:
    path = tmp_path / "requests.csv"
    if crlf:
        text = text.replace("\n", "\r\n")
    path.write_bytes(("\ufeff" if bom else "").encode() + text.encode())
    return path


def test_want_and_avoid_columns(tmp_path: Path, ws: Workspace) -> None:
    csv = ("person,date,want,avoid,weight,note\n"
           "c01,2027-03-16,off,,3,\"dentist, early\"\n"
           "c02,2027-03-17,,N,,\n"
           "c02,2027-03-18,l,,,\n")  # the case of a shift code is forgiven
    plan = plan_requests(write(tmp_path, csv), ws)
    assert plan.ok, plan.problems
    assert plan.added == [
        (2, Request(person="c01", date=date(2027, 3, 16), want="off", weight=3,
                    note="dentist, early")),
        (3, Request(person="c02", date=date(2027, 3, 17), avoid="N")),
        (4, Request(person="c02", date=date(2027, 3, 18), want="L")),
    ]
    assert plan.per_person() == {"c01": 1, "c02": 2}
    assert plan.requests is not None
    assert plan.requests.request[-3:] == [r for _, r in plan.added]
    assert plan.requests.request[:-3] == ws.requests.request
    assert plan.requests.leave == ws.requests.leave


def test_one_request_column_semicolons_bom_crlf_and_spreadsheet_dates(
        tmp_path: Path, ws: Workspace) -> None:
    csv = ("Person;Date;Request;Weight;Note\n"
           "c03;20/03/2027;off;2;\"school play;\nbring cake\"\n"  # day first: 20 March
           "c04;3/21/2027;avoid n;;\n"                             # month first: 21 March
           "c05;22.3.2027;want E;;\n"                             # dotted: day first
           "c06;05/04/2027;-;;\n")                                # 5 April (4 May is outside)
    plan = plan_requests(write(tmp_path, csv, bom=True, crlf=True), ws)
    assert plan.ok, plan.problems
    got = [(line, r.person, r.date, r.want, r.avoid, r.note) for line, r in plan.added]
    assert got == [
        (2, "c03", date(2027, 3, 20), "off", None, "school play;\nbring cake"),
        (4, "c04", date(2027, 3, 21), None, "N", None),
        (5, "c05", date(2027, 3, 22), "E", None, None),
        (6, "c06", date(2027, 4, 5), "off", None, None),
    ]


def test_every_bad_row_by_line(tmp_path: Path, ws: Workspace) -> None:
    csv = ("person,date,want,avoid,weight\n"
           "c99,2027-03-16,off,,\n"      # 2 unknown person, with a hint
           "c01,2027-05-16,X,,0\n"       # 3 outside the period, unknown code, bad weight
           "c01,16-03-2027,off,,\n"      # 4 not a date
           "c02,2027-03-20,,off,\n"      # 5 avoid off
           "c03,2027-03-21,off,N,\n"     # 6 both want and avoid
           "c04,2027-03-20,,,\n"         # 7 neither
           "c05,2027-03-20,off,,\n"
           "c05,2027-03-20,off,,4\n"     # 9 the same request as line 8
           ",2027-03-20,off,,\n")        # 10 no person
    plan = plan_requests(write(tmp_path, csv), ws)
    assert plan.requests is None and [line for line, _ in plan.added] == [8]
    got = [(p.line, p.key) for p in plan.problems]
    assert got == [(2, "person"), (3, "date"), (3, "want"), (3, "weight"), (4, "date"),
                   (5, "avoid"), (6, ""), (7, ""), (9, ""), (10, "person")]
    text = "\n".join(str(p) for p in plan.problems)
    assert "requests.csv: person (line 2): unknown person 'c99' (did you mean 'c09'?)" in text
    assert "2027-05-16 is outside the period 2027-03-15 to 2027-04-11" in text
    assert "unknown shift code 'X'; shifts: E, L, N; or off" in text
    assert "'16-03-2027' is not a date; write it as YYYY-MM-DD" in text
    assert "the same request as line 8" in text


def test_an_ambiguous_date_is_refused(tmp_path: Path, clinic: Path) -> None:
    unit = clinic / "unit.toml"
    unit.write_text(unit.read_text(encoding="utf-8").replace(
        "start = 2027-03-15", "start = 2027-03-01").replace("days = 28", "days = 60"),
        encoding="utf-8")
    plan = plan_requests(write(tmp_path, "person,date,want\nc01,03/04/2027,off\n"),
                         load_workspace(clinic))
    [problem] = plan.problems
    assert problem.line == 2
    assert "could be 2027-04-03 or 2027-03-04; write it as YYYY-MM-DD" in problem.message


def test_rows_already_in_requests_toml(tmp_path: Path, ws: Workspace) -> None:
    first = ws.requests.request[0]  # c01 2027-03-20 want off, weight 5, a note
    same = f"{first.person},{first.date},{first.want},{first.weight},{first.note}"
    plan = plan_requests(write(tmp_path, f"person,date,want,weight,note\n{same}\n"), ws)
    assert plan.ok and plan.added == [] and plan.skipped == [(2, first)]
    assert "already in requests.toml; skipped" in plan.skipped_notices()[0].message
    other = f"{first.person},{first.date},{first.want},1,"
    plan = plan_requests(write(tmp_path, f"person,date,want,weight,note\n{other}\n"), ws)
    assert not plan.ok
    assert "requests.toml already holds this request (request[0], weight 5" in str(
        plan.problems[0])


def test_missing_columns_and_no_rows(tmp_path: Path, ws: Workspace) -> None:
    plan = plan_requests(write(tmp_path, "person,date,weight\nc01,2027-03-16,2\n"), ws)
    assert "needs a want, avoid or request column" in plan.problems[0].message
    plan = plan_requests(write(tmp_path, "person;date;want\r\n"), ws)
    assert "no requests" in plan.problems[0].message


def test_the_loaders_problems_come_back_on_csv_lines() -> None:
    loader = [Problem("requests.toml", "request[5].want", "unknown shift code 'Q'", 40),
              Problem("requests.toml", "request[1].date", "earlier entry", 12),
              Problem("staff.toml", "person[5]", "elsewhere", 3)]
    out = relabel(loader, "requests.toml", "request", {5: 7}, "mine.csv")
    assert out[0] == Problem("mine.csv", "want", "unknown shift code 'Q'", 7)
    assert out[1:] == loader[1:]
