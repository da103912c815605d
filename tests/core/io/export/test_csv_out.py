"""CSV export: the long form (read back by the roster reader with the same penalty),
the grid form, RFC 4180 quoting and spreadsheet formula neutralising."""

from __future__ import annotations

import csv
import io
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.io.export import grid_csv, long_csv, neutralise
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.core.io.export.helpers import (
    FORMULA_NAME,
    MARKUP_NAME,
    PLUS_NOTE,
    QUOTED_NAME,
    ROWS,
    SCRIPT_NOTE,
    worked,
)


def parse(text: str) -> list[list[str]]:
    return list(csv.reader(io.StringIO(text.removeprefix("\ufeff"), newline="")))


@pytest.mark.parametrize(("raw", "safe"), [
    ("=1+1", "'=1+1"), ("+1", "'+1"), ("-2", "'-2"), ("@SUM(A1)", "'@SUM(A1)"),
    ("\tx", "'\tx"), ("\rx", "'\rx"), ("-", "-"), ("plain", "plain"), ("", ""),
    ("a=b", "a=b"), ("--", "'--"),
])
def test_neutralise(raw: str, safe: str) -> None:
    assert neutralise(raw) == safe


def test_long_form_columns_rows_and_times(hostile_loaded: Workspace) -> None:
    rows = parse(long_csv(hostile_loaded))
    assert rows[0] == ["person", "date", "shift", "start", "end", "paid_hours"]
    assert len(rows) - 1 == worked()
    by_key = {(r[0], r[1]): r for r in rows[1:]}
    night = by_key["p1", "2027-03-27"]  # across the spring change: 22:00 WET to 07:00 WEST
    assert night[2:6] == ["N", "2027-03-27T22:00+00:00", "2027-03-28T07:00+01:00", "9"]
    assert by_key["p3", "2027-03-22"][4] == "2027-03-23T07:00+00:00"  # a night ends next day
    assert by_key["p2", "2027-03-24"][5] == "7.5"
    assert ("p1", "2027-03-24") not in by_key  # days off are not rows


def test_rfc4180_quoting_and_crlf(hostile_loaded: Workspace) -> None:
    text = long_csv(hostile_loaded)
    records = text.split("\r\n")
    assert records[0] == "person,date,shift,start,end,paid_hours"  # no byte order mark
    assert text.endswith("\r\n")
    grid = grid_csv(hostile_loaded)
    assert grid.startswith("\ufeff") and '"Smith, ""Jo"""' in grid
    names = {r[0]: r[1] for r in parse(grid)[1:]}
    assert names["p2"] == QUOTED_NAME and names["p3"] == MARKUP_NAME


def test_formulas_are_neutralised_and_text_survives(hostile_loaded: Workspace) -> None:
    for text in (long_csv(hostile_loaded), grid_csv(hostile_loaded)):
        fields = [f for r in parse(text) for f in r]
        assert FORMULA_NAME not in fields
        assert all(not f.startswith(("=", "+", "@", "\t", "\r")) for f in fields)
        assert all(f == "-" or not f.startswith("-") for f in fields)
    grid = parse(grid_csv(hostile_loaded))
    assert "'" + FORMULA_NAME in [r[1] for r in grid]
    notes = {r[0]: r[-1] for r in grid[1:]}
    assert notes["p1"] == f"2027-03-23: {SCRIPT_NOTE}"
    assert notes["p2"].startswith("2027-03-24: " + PLUS_NOTE + "; ")


def test_grid_form_one_row_per_person_one_column_per_date(hostile_loaded: Workspace) -> None:
    rows = parse(grid_csv(hostile_loaded))
    dates = [d.isoformat() for d in hostile_loaded.dates]
    assert rows[0] == ["person", "name", *dates, "shifts", "hours", "notes"]
    assert [r[0] for r in rows[1:]] == ["p1", "p2", "p3"]
    for r in rows[1:]:
        assert len(r) == len(rows[0])
        assert r[2:2 + len(dates)] == ROWS[r[0]].split()  # off stays "-"
    p1 = rows[1]
    assert p1[1] == "'" + FORMULA_NAME
    assert p1[-3:-1] == ["3", "24"]  # 7.5 + 7.5 + 9 h
    assert p1[-1] == f"2027-03-23: {SCRIPT_NOTE}"


def test_long_form_reads_back_with_the_same_roster_and_penalty(
    hostile: Path, hostile_loaded: Workspace, tmp_path: Path
) -> None:
    path = tmp_path / "roster.csv"
    path.write_text(long_csv(hostile_loaded), encoding="utf-8")
    again = load_workspace(hostile, roster_file=path)
    assert again.roster is not None and hostile_loaded.roster is not None
    assert again.roster.rows == hostile_loaded.roster.rows
    before, after = check_roster(hostile_loaded), check_roster(again)
    assert before.penalty > 0
    assert after.penalty == before.penalty
    assert after.to_json() == before.to_json()
