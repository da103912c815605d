"""`rostertui check` end to end on a copy of demo/clinic (rules.md, "What the checker reports").

The roster `tests/fixtures/clinic_breaches_roster.toml` is a compliant roster of
demo/clinic with five breaches planted by hand (its header says how). Each breach
is a swap of cells between two people, so the roster it came from is known
exactly (`ORIGINAL` below): the tests rebuild it, check that it has no hard
violation, and that the planted roster differs from it by exactly the planted
violations and one accepted side effect.
"""

from __future__ import annotations

import csv
import json
import shutil
import subprocess
import sys
import tomllib
from datetime import date, timedelta
from pathlib import Path
from typing import Any

import pytest

from rostertui.cli.main import main
from rostertui.core.models.rules import RULE_KINDS
from tests.conftest import DEMO, FIXTURES, REPO, copy_ws

BREACHES = FIXTURES / "clinic_breaches_roster.toml"
START = date(2027, 3, 15)

# The cells the five planted swaps changed, with their value in the compliant roster.
ORIGINAL: dict[tuple[str, str], str] = {
    # 1. min-rest: c11/c12 swapped E and L on 22 Mar
    ("c11", "2027-03-22"): "L", ("c12", "2027-03-22"): "E",
    # 2. forbidden-sequence: c04/c08 swapped nights (19 Mar <-> 1 Apr)
    ("c04", "2027-03-19"): "N", ("c08", "2027-03-19"): "-",
    ("c04", "2027-04-01"): "-", ("c08", "2027-04-01"): "N",
    # 3. leave: c05/c07 swapped earlies (17 Mar <-> 24 Mar, c05 on leave 22-26 Mar)
    ("c05", "2027-03-17"): "E", ("c07", "2027-03-17"): "-",
    ("c05", "2027-03-24"): "-", ("c07", "2027-03-24"): "E",
    # 4. cover min: c04 (rn) / c09 (hca) swapped L and E on 7 Apr
    ("c04", "2027-04-07"): "L", ("c09", "2027-04-07"): "E",
    # 5. max-consecutive-days: c09/c10 swapped nights of 25 and 26 Mar
    ("c09", "2027-03-25"): "N", ("c10", "2027-03-25"): "-",
    ("c09", "2027-03-26"): "-", ("c10", "2027-03-26"): "N",
}

Entry = tuple[str, str, bool, str | None, tuple[str, ...], int, int]

# (rule, kind, hard, person, dates, units, penalty) of every planted violation.
PLANTED: set[Entry] = {
    ("daily-rest", "min-rest", True, "c12", ("2027-03-22", "2027-03-23"), 1, 0),
    ("no-day-shift-after-night", "forbidden-sequence", True, "c04",
     ("2027-04-01", "2027-04-02"), 1, 0),
    # N ends 07:30 on 2 Apr, after the E starts at 07:00: a negative rest
    ("daily-rest", "min-rest", True, "c04", ("2027-04-01", "2027-04-02"), 1, 0),
    ("leave", "leave", True, "c05", ("2027-03-24",), 1, 0),
    ("cover", "cover", True, None, ("2027-04-07",), 1, 0),
    ("max-days-in-row", "max-consecutive-days", False, "c10", ("2027-03-19", "2027-03-25"), 1, 30),
}
# The one side effect accepted: c10 now works only 27-28 of the 26-28 Mar weekend.
ACCEPTED_SIDE_EFFECTS: set[Entry] = {
    ("complete-weekends", "complete-weekends", False, "c10", ("2027-03-26", "2027-03-28"), 1, 20),
}
PLANTED_KINDS = {"min-rest", "forbidden-sequence", "leave", "cover", "max-consecutive-days"}

TOP_KEYS = {"compliant", "hard_violations", "penalty", "by_kind", "violations"}
VIOLATION_KEYS = {"rule", "kind", "hard", "person", "dates", "units", "penalty", "message",
                  "source"}
BUILTIN_KINDS = {"leave", "requires", "lock", "cover", "request"}


def entry(v: dict[str, Any]) -> Entry:
    return (v["rule"], v["kind"], v["hard"], v["person"], tuple(v["dates"]), v["units"],
            v["penalty"])


def breach_rows() -> dict[str, list[str]]:
    return tomllib.loads(BREACHES.read_text(encoding="utf-8"))["rows"]


def compliant_rows() -> dict[str, list[str]]:
    rows = breach_rows()
    for (pid, day), code in ORIGINAL.items():
        rows[pid][(date.fromisoformat(day) - START).days] = code
    return rows


def roster_toml(rows: dict[str, list[str]]) -> str:
    body = "".join(f"{pid} = {json.dumps(row)}\n" for pid, row in rows.items())
    return f"start = {START}\ndays = 28\n[rows]\n{body}"


def run_check(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, dict[str, Any]]:
    code = main(["check", *args, "--json"])
    out = capsys.readouterr().out
    return code, json.loads(out)


def snapshot(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes() for p in folder.rglob("*") if p.is_file()}


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    return copy_ws(DEMO / "clinic", tmp_path, "clinic")


# --- the planted breaches -------------------------------------------------------------


def test_the_roster_before_planting_is_compliant(clinic: Path, capsys) -> None:
    (clinic / "roster.toml").write_text(roster_toml(compliant_rows()))
    code, report = run_check(capsys, str(clinic))
    assert (code, report["compliant"], report["hard_violations"]) == (0, True, 0)
    assert not {v["kind"] for v in report["violations"]} & (PLANTED_KINDS - {"cover"})
    assert all(not v["hard"] for v in report["violations"])


def test_planted_breaches_are_reported_exactly(clinic: Path, capsys) -> None:
    (clinic / "roster.toml").write_text(roster_toml(compliant_rows()))
    _, before = run_check(capsys, str(clinic))
    code, after = run_check(capsys, str(clinic), "--roster", str(BREACHES))
    assert code == 1
    got = {entry(v) for v in after["violations"]}
    was = {entry(v) for v in before["violations"]}
    assert len(got) == len(after["violations"])  # no two entries alike
    assert got - was == PLANTED | ACCEPTED_SIDE_EFFECTS
    assert was - got == set()
    # exact for the hard ones and for every planted kind
    assert {e for e in got if e[2]} == {e for e in PLANTED if e[2]}
    for kind in PLANTED_KINDS - {"cover"}:
        assert {e for e in got if e[1] == kind} == {e for e in PLANTED if e[1] == kind}, kind
    assert {e for e in got if e[1] == "cover"} == (
        {e for e in was if e[1] == "cover"} | {e for e in PLANTED if e[1] == "cover"})
    cover = next(v for v in after["violations"] if v["kind"] == "cover" and v["hard"])
    assert (cover["shift"], cover["skill"], cover["message"]) == (
        "L", "rn", "0 on L (rn) on 7 Apr; at least 1")
    rest = next(v for v in after["violations"]
                if v["rule"] == "daily-rest" and v["person"] == "c12")
    assert rest["message"] == ("9 h 30 min rest between L (ends 21:30 on 22 Mar) and E "
                               "(starts 07:00 on 23 Mar); needs 11 h")
    assert rest["source"] == "Directive 2003/88/EC, Art. 3"
    assert after["hard_violations"] == 5 and after["compliant"] is False
    assert after["penalty"] == before["penalty"] + 30 + 20
    for kind, agg in after["by_kind"].items():
        extra = [e for e in PLANTED | ACCEPTED_SIDE_EFFECTS if e[1] == kind]
        old = before["by_kind"].get(kind, {"units": 0, "penalty": 0})
        assert agg == {"units": old["units"] + sum(e[5] for e in extra),
                       "penalty": old["penalty"] + sum(e[6] for e in extra)}, kind


def test_breaches_as_roster_toml_in_the_workspace_and_via_roster_agree(clinic: Path,
                                                                        capsys) -> None:
    shutil.copyfile(BREACHES, clinic / "roster.toml")
    code_ws, in_ws = run_check(capsys, str(clinic))
    code_flag, via_flag = run_check(capsys, str(clinic), "--roster", str(BREACHES))
    assert code_ws == code_flag == 1
    assert in_ws == via_flag


# --- the JSON shape (rules.md, "What the checker reports") ----------------------------


def assert_report_shape(report: dict[str, Any], rule_ids: set[str]) -> None:
    assert set(report) == TOP_KEYS
    assert isinstance(report["compliant"], bool)
    assert type(report["hard_violations"]) is int and type(report["penalty"]) is int
    violations = report["violations"]
    assert isinstance(violations, list)
    for v in violations:
        keys = VIOLATION_KEYS | ({"shift", "skill"} if v["kind"] == "cover" else set())
        assert set(v) == keys, v
        assert isinstance(v["rule"], str) and isinstance(v["kind"], str)
        assert isinstance(v["hard"], bool)
        assert v["person"] is None or isinstance(v["person"], str)
        assert isinstance(v["dates"], list)
        for d in v["dates"]:
            assert isinstance(d, str) and date.fromisoformat(d).isoformat() == d
        assert type(v["units"]) is int and v["units"] > 0
        assert type(v["penalty"]) is int and v["penalty"] >= 0
        assert isinstance(v["message"], str) and v["message"]
        assert v["source"] is None or isinstance(v["source"], str)
        if v["hard"]:
            assert v["penalty"] == 0
        if v["kind"] in BUILTIN_KINDS:
            assert v["rule"] == v["kind"] and v["source"] is None
        else:
            assert v["kind"] in RULE_KINDS and v["rule"] in rule_ids
        if v["kind"] == "cover":
            assert v["person"] is None and isinstance(v["shift"], str)
            assert v["skill"] is None or isinstance(v["skill"], str)
    assert report["hard_violations"] == sum(1 for v in violations if v["hard"])
    assert report["compliant"] == (report["hard_violations"] == 0)
    assert report["penalty"] == sum(v["penalty"] for v in violations)
    expected: dict[str, dict[str, int]] = {}
    for v in violations:
        agg = expected.setdefault(v["kind"], {"units": 0, "penalty": 0})
        agg["units"] += v["units"]
        agg["penalty"] += v["penalty"]
    assert report["by_kind"] == expected
    for agg in report["by_kind"].values():
        assert set(agg) == {"units", "penalty"}
        assert all(type(x) is int for x in agg.values())


def test_json_output_has_the_rules_md_shape(clinic: Path, capsys) -> None:
    from rostertui.core.io.load import load_workspace

    rule_ids = {eff.id for eff in load_workspace(clinic).rules}
    code, report = run_check(capsys, str(clinic), "--roster", str(BREACHES))
    assert code == 1
    assert_report_shape(report, rule_ids)
    kinds = {v["kind"] for v in report["violations"]}
    assert {"cover", "request", "leave", "balance", "hours", "min-rest"} <= kinds
    (clinic / "roster.toml").write_text(roster_toml(compliant_rows()))
    code, report = run_check(capsys, str(clinic))
    assert code == 0
    assert_report_shape(report, rule_ids)


def test_exit_codes_0_1_2_from_a_real_process(clinic: Path) -> None:
    def run(*args: str) -> subprocess.CompletedProcess[str]:
        return subprocess.run([sys.executable, "-m", "rostertui", "check", *args],
                              capture_output=True, text=True, check=False, cwd=REPO)

    (clinic / "roster.toml").write_text(roster_toml(compliant_rows()))
    assert run(str(clinic)).returncode == 0
    hard = run(str(clinic), "--roster", str(BREACHES))
    assert hard.returncode == 1 and "NOT compliant: 5 hard violations" in hard.stdout
    missing = run(str(clinic), "--roster", str(clinic / "nope.csv"))
    assert missing.returncode == 2 and missing.stdout == ""
    assert "no such roster file" in missing.stderr


# --- CSV rosters ----------------------------------------------------------------------


def write_csv(path: Path, rows: dict[str, list[str]], *, extra: list[list[str]] = ()) -> None:
    """One line per worked cell, in reverse order, with an extra column; off cells are
    written three ways (omitted, "-", "off") to use every spelling the README allows."""
    lines = [["shift", "note", "date", "person"]]
    for k, (pid, row) in enumerate(rows.items()):
        for i, code in enumerate(row):
            day = (START + timedelta(days=i)).isoformat()
            if code != "-":
                lines.append([code, "x", day, pid])
            elif (i + k) % 3 == 1:
                lines.append(["-", "", day, pid])
            elif (i + k) % 3 == 2:
                lines.append(["off", "", day, pid])
    body = lines[:1] + lines[:0:-1] + [list(r) for r in extra]
    with path.open("w", newline="", encoding="utf-8") as f:
        csv.writer(f).writerows(body)


def test_csv_roster_gives_the_same_report_as_the_toml(clinic: Path, tmp_path: Path,
                                                      capsys) -> None:
    path = tmp_path / "march.csv"
    write_csv(path, breach_rows())
    code_toml, from_toml = run_check(capsys, str(clinic), "--roster", str(BREACHES))
    code_csv, from_csv = run_check(capsys, str(clinic), "--roster", str(path))
    assert code_csv == code_toml == 1
    assert from_csv["penalty"] == from_toml["penalty"] == 1208
    assert from_csv == from_toml


BAD_ROWS = {
    "unknown person": (["E", "", "2027-03-20", "c99"], "unknown person 'c99'"),
    "bad date": (["E", "", "2027-02-30", "c01"], "date '2027-02-30' is not a date"),
    "duplicate cell": (["L", "", "2027-03-15", "c01"], "c01 on 2027-03-15 is already given"),
}


@pytest.mark.parametrize("bad", sorted(BAD_ROWS))
def test_csv_with_a_bad_row_exits_2_naming_the_line_and_writes_nothing(
    bad: str, clinic: Path, tmp_path: Path, capsys
) -> None:
    path = tmp_path / "march.csv"
    row, message = BAD_ROWS[bad]
    write_csv(path, breach_rows(), extra=[row])
    line = len(path.read_text(encoding="utf-8").splitlines())
    before_ws, before_tmp = snapshot(clinic), snapshot(tmp_path)
    assert main(["check", str(clinic), "--roster", str(path), "--json"]) == 2
    out, err = capsys.readouterr()
    assert out == ""
    assert f"march.csv (line {line}): {message}" in err
    assert "nothing was written" in err
    assert snapshot(clinic) == before_ws and snapshot(tmp_path) == before_tmp


def test_csv_with_three_bad_rows_reports_all_three(clinic: Path, tmp_path: Path,
                                                   capsys) -> None:
    path = tmp_path / "march.csv"
    write_csv(path, breach_rows(), extra=[BAD_ROWS[k][0] for k in sorted(BAD_ROWS)])
    last = len(path.read_text(encoding="utf-8").splitlines())
    assert main(["check", str(clinic), "--roster", str(path)]) == 2
    out, err = capsys.readouterr()
    assert out == ""
    for offset, key in enumerate(sorted(BAD_ROWS)):
        assert f"march.csv (line {last - 2 + offset}): {BAD_ROWS[key][1]}" in err
    assert "3 problems in the input" in err


# --- a shift coded "off" ----------------------------------------------------------------


@pytest.mark.parametrize("code", ["off", "OFF", "Off"])
def test_a_shift_coded_off_is_an_input_error(code: str, tmp_path: Path, capsys) -> None:
    """workspace-format.md reserves "-" for off; README: in a CSV "-", "off" or an empty
    cell mean off; requests use want = "off" for a day off. A shift coded "off" can then
    never be written in a CSV nor wanted, so the loader must refuse it (exit 2, naming
    the key) instead of letting the two roster formats disagree."""
    ws = tmp_path / "ws"
    ws.mkdir()
    (ws / "unit.toml").write_text('name = "x"\ntimezone = "UTC"\nstart = 2027-03-01\ndays = 2\n')
    (ws / "staff.toml").write_text('[[person]]\nid = "a"\nname = "A"\n')
    (ws / "shifts.toml").write_text(
        f'[[shift]]\ncode = "{code}"\nname = "Office"\nstart = "09:00"\nend = "17:00"\n\n'
        f'[[cover]]\nshift = "{code}"\nmin = 1\n')
    (ws / "roster.toml").write_text(f'start = 2027-03-01\ndays = 2\n[rows]\na = ["{code}", '
                                    f'"{code}"]\n')
    path = tmp_path / "r.csv"
    path.write_text(f"person,date,shift\na,2027-03-01,{code}\na,2027-03-02,{code}\n")
    results = []
    for extra in ([], ["--roster", str(path)]):
        results.append(main(["check", str(ws), *extra]))
        err = capsys.readouterr().err
        assert "shifts.toml: shift[0].code" in err
    assert results == [2, 2]
