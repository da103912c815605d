"""`rostertui stats`: human table, --json shape, no roster, --roster CSV, options, errors."""

from __future__ import annotations

import argparse
import json
from pathlib import Path

import pytest

from rostertui.cli.stats import do_stats, register
from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace
from rostertui.core.stats import roster_stats


def parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(prog="rostertui")
    register(p.add_subparsers(dest="verb"))
    return p


def test_human_table(good_ws: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert do_stats(good_ws) == 0
    out, err = capsys.readouterr()
    assert err == ""
    lines = out.splitlines()
    assert lines[0] == "Thornbury Walk-in Centre: 2027-03-22 to 2027-03-28 (1 weekend, 1 holiday)"
    assert "No roster yet" not in out
    # t01: 2 E (7.5 h) + L = 23 h against the full-time target 36; 1 of 1 request granted;
    # t02: 45.5 h with 15 h leave credit; t04 has no hours rule: hours alone.
    header = ("  Id   Name                 Hours  Shifts  Nights  Wkend days  Wkends  Hols  "
              "Requests  Longest  By shift")
    assert header in lines
    at = lines.index(header)
    assert lines[at + 1:at + 5] == [
        "  t01  Ansel Brightwater    23/36       3       0           0       0     0       1/1"
        "        3  E 2, L 1",
        "  t02  Bea Cornmill       45.5/36       4       0           3       1     1       0/0"
        "        3  E 3, L 1",
        "  t03  Cas Dunmore             40       4       4           2       1     1       0/1"
        "        4  N 4",
        "  t04  Dilys Everard         45.5       6       0           2       1     0       0/0"
        "        4  E 5, L 1",
    ]
    groups = lines.index("  Group      People  Nights  Weekends  Hours vs target")
    assert lines[groups + 1:groups + 4] == [
        "  full-time       2   0 / 0   0.5 / 1     -1.75 / 22.5",
        "  part-time       2   2 / 4     1 / 0              n/a",
        "  everyone        4   1 / 4  0.75 / 1     -1.75 / 22.5",
    ]


def test_json_is_one_object_matching_the_core(
    good_ws: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    assert do_stats(good_ws, as_json=True) == 0
    out = capsys.readouterr().out
    data = json.loads(out)  # the whole of stdout is one JSON object
    assert set(data) == {"people", "groups"}
    assert data == roster_stats(load_workspace(good_ws)).to_json()
    t02 = data["people"][1]
    assert (t02["person"], t02["hours"], t02["leave_hours"], t02["hours_target"]) == (
        "t02", 45.5, 15.0, 36.0)
    assert [g["group"] for g in data["groups"]] == ["full-time", "part-time", "everyone"]


def test_no_roster_says_so_and_shows_zeros(
    good_ws: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    (good_ws / "roster.toml").unlink()
    assert do_stats(good_ws) == 0
    out = capsys.readouterr().out
    assert "No roster yet: every person counts as off every day." in out
    assert "  t01  Ansel Brightwater   0/36       0       0" in out
    assert do_stats(good_ws, as_json=True) == 0
    data = json.loads(capsys.readouterr().out)
    assert {p["shifts"] for p in data["people"]} == {0}
    assert {p["hours"] for p in data["people"]} == {0.0}
    assert data["groups"][-1]["nights"]["spread"] == 0


def test_roster_file_csv(good_ws: Path, capsys: pytest.CaptureFixture[str]) -> None:
    csv = good_ws / "other.csv"
    csv.write_text("person,date,shift\nt04,2027-03-27,N\nt04,2027-03-28,N\nt01,2027-03-22,E\n")
    assert do_stats(good_ws, roster=csv, as_json=True) == 0
    people = {p["person"]: p for p in json.loads(capsys.readouterr().out)["people"]}
    assert (people["t04"]["nights"], people["t04"]["weekends"]) == (2, 1)
    assert (people["t01"]["shifts"], people["t02"]["shifts"]) == (1, 0)


def test_warnings_go_to_stderr_and_json_stays_clean(
    good_ws: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    with (good_ws / "requests.toml").open("a") as f:
        f.write('\n[[request]]\nperson = "t04"\ndate = 2027-05-01\nwant = "off"\n')
    assert do_stats(good_ws, as_json=True) == 0
    out, err = capsys.readouterr()
    assert "warning:" in err and "2027-05-01" in err
    people = json.loads(out)["people"]
    assert people[3]["requests_asked"] == 0  # outside the period: ignored


def test_bad_input_raises_input_error(good_ws: Path) -> None:
    (good_ws / "staff.toml").write_text('[[person]]\nid = "t01"\n')  # no name
    with pytest.raises(InputError):
        do_stats(good_ws)


def test_options_through_the_parser(good_ws: Path, capsys: pytest.CaptureFixture[str]) -> None:
    defaults = parser().parse_args(["stats"])
    assert (defaults.workspace, defaults.roster, defaults.json) == (".", None, False)
    csv = good_ws / "r.csv"
    csv.write_text("person,date,shift\nt03,2027-03-22,N\n")
    args = parser().parse_args(["stats", str(good_ws), "--roster", str(csv), "--json"])
    assert (args.workspace, args.roster, args.json) == (str(good_ws), str(csv), True)
    assert args.run(args) == 0
    data = json.loads(capsys.readouterr().out)
    assert [p["nights"] for p in data["people"]] == [0, 0, 1, 0]
    args = parser().parse_args(["stats", str(good_ws)])
    assert args.run(args) == 0
    assert "Group" in capsys.readouterr().out


def test_a_wrong_option_is_a_usage_error(capsys: pytest.CaptureFixture[str]) -> None:
    with pytest.raises(SystemExit) as exc:
        parser().parse_args(["stats", "--frobnicate"])
    assert exc.value.code == 2
    assert "unrecognized arguments" in capsys.readouterr().err
