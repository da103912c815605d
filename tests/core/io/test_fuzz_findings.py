"""Cases a fuzzing run over malformed workspaces found (each failed before its fix)."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace
from tests.conftest import REPO, copy_ws


def _problems(folder: Path, **kw) -> list:
    with pytest.raises(InputError) as exc:
        load_workspace(folder, **kw)
    return exc.value.problems


def test_clock_times_with_non_ascii_digits_are_refused(good_ws: Path) -> None:
    path = good_ws / "shifts.toml"
    text = path.read_text(encoding="utf-8")
    first = text.index('start = "') + len('start = "')
    path.write_text(text[:first] + "\u0661\u0665:\u0660\u0660" + text[first + 5:],
                    encoding="utf-8")
    found = _problems(good_ws)
    assert any(p.file == "shifts.toml" and "clock time" in p.message for p in found)


def test_a_csv_field_past_the_csv_module_limit_is_a_message(good_ws: Path) -> None:
    csv_file = good_ws / "big.csv"
    csv_file.write_text("person,date,shift\n" + "x" * 200_000 + ",2027-03-01,E\n",
                        encoding="utf-8")
    found = _problems(good_ws, roster_file=csv_file)
    assert any(p.file == "big.csv" and p.line == 2 for p in found)


def test_a_dangling_link_in_place_of_requests_is_an_error(good_ws: Path) -> None:
    target = good_ws / "requests.toml"
    if target.exists():
        target.unlink()
    os.symlink(good_ws / "nowhere.toml", target)
    found = _problems(good_ws)
    assert any(p.file == "requests.toml" for p in found)


def test_a_named_pipe_in_place_of_a_file_is_refused_not_read(good_ws: Path) -> None:
    target = good_ws / "history.toml"
    if target.exists():
        target.unlink()
    os.mkfifo(target)
    found = _problems(good_ws)  # would block forever reading the pipe
    assert any(p.file == "history.toml" and "regular file" in p.message for p in found)


def test_a_file_given_as_the_workspace_says_it_is_a_file(good_ws: Path) -> None:
    found = _problems(good_ws / "unit.toml")
    assert "is a file" in found[0].message


# -- 1. hour values at 1/100 h ----------------------------------------------------------

def _clinic(tmp_path: Path) -> Path:
    return copy_ws(REPO / "demo" / "clinic", tmp_path, "clinic")


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not in {path.name}"
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def test_hour_values_are_rounded_to_a_hundredth_at_load(tmp_path: Path) -> None:
    ws_dir = _clinic(tmp_path)
    _edit(ws_dir / "history.toml", "c03 = 664.5", "c03 = 1e-300")
    _edit(ws_dir / "history.toml", "c04 = 512.5", "c04 = 512.50000000000003")
    _edit(ws_dir / "unit.toml", "target = 150\n", "target = 150.70000000000003\n")
    ws = load_workspace(ws_dir)
    assert ws.history is not None
    assert ws.history.hours_before["c03"] == 0.0
    assert ws.history.hours_before["c04"] == 512.5
    targets = [e.rule.target for e in ws.rules if getattr(e.rule, "target", None)]
    assert 150.7 in targets


def test_the_solver_takes_hour_values_that_needed_a_huge_scale(good_ws: Path) -> None:
    """Failed before: ValueError 'hour values need a finer scale' from solver/scaled_hours.py."""
    from rostertui.core.check.run import check_roster
    from rostertui.core.solver.outcome import SolveOptions
    from rostertui.core.solver.run import solve

    _edit(good_ws / "history.toml", "t01 = 151.5", "t01 = 1e-300")
    _edit(good_ws / "unit.toml", "min = 16\n", "min = 16.700000000000003\n")
    ws = load_workspace(good_ws)
    result = solve(ws, SolveOptions(time_limit=5, workers=1, seed=1))
    assert result.roster is not None and result.objective is not None
    assert check_roster(ws, result.roster).penalty == result.objective


# -- 3. control characters in names -------------------------------------------------------

@pytest.mark.parametrize(
    ("file", "old", "new"),
    [
        ("staff.toml", 'name = "Ansel Brightwater"', 'name = "Ansel\\nBrightwater"'),
        ("staff.toml", 'name = "Ansel Brightwater"', 'name = "Ansel\\u0007"'),
        ("staff.toml", 'name = "Ansel Brightwater"', 'name = "Ansel\\u2028Brightwater"'),
        ("staff.toml", 'name = "Ansel Brightwater"', 'name = "   "'),
        ("shifts.toml", 'name = "Early"', 'name = "Ear\\rly"'),
        ("unit.toml", 'name = "Thornbury Walk-in Centre"', 'name = "Thornbury\\tCentre"'),
    ],
)
def test_names_with_control_characters_are_refused(good_ws: Path, file: str, old: str,
                                                   new: str) -> None:
    """Failed before: a newline in a name crashed `export --to ics --per-person`."""
    _edit(good_ws / file, old, new)
    found = _problems(good_ws)
    assert [(p.file, p.key.rsplit(".", 1)[-1]) for p in found] == [(file, "name")]


def test_notes_may_still_span_lines(good_ws: Path) -> None:
    _edit(good_ws / "requests.toml", 'note = "family wedding"', 'note = "family\\nwedding"')
    ws = load_workspace(good_ws)
    assert ws.requests.request[0].note == "family\nwedding"


# -- 4. strict TOML types ---------------------------------------------------------------------

STRICT_CASES = [
    ("unit.toml", "start = 2027-03-22", 'start = "2027-03-22"', "start",
     "found the string '2027-03-22': write 2027-03-22"),
    ("unit.toml", "start = 2027-03-22", "start = 2027-03-22T00:00:00Z", "start",
     "write the date alone, 2027-03-22"),
    ("unit.toml", "start = 2027-03-22", "start = 2027-03-22T08:00:00", "start",
     "found the date-time 2027-03-22T08:00:00"),
    ("unit.toml", "holidays = [2027-03-26]", 'holidays = ["2027-03-26"]', "holidays[0]",
     "write 2027-03-26"),
    ("unit.toml", "days = 7", "days = 7.0", "days", "expected a whole number; found the "
     "number 7.0: write 7"),
    ("unit.toml", "days = 7", "days = true", "days", "expected a whole number; found true"),
    ("unit.toml", "days = 7", 'days = "7"', "days", "write 7 without quotes"),
    ("unit.toml", "weight = 2\n", "weight = true\n", "weight", "found true"),
    ("requests.toml", "from = 2027-03-24", 'from = "2027-03-24"', "from", "write 2027-03-24"),
    ("requests.toml", "weight = 3", "weight = true", "weight", "found true"),
    ("requests.toml", "credit_hours = 7.5", 'credit_hours = "7.5"', "credit_hours",
     "expected a number; found the string '7.5': write 7.5 without quotes"),
    ("roster.toml", "dates = [2027-03-22, 2027-03-23]", 'dates = ["2027-03-22", 2027-03-23]',
     "dates[0]", "write 2027-03-22"),
    ("history.toml", "t01 = 151.5", 't01 = "151.5"', "t01", "write 151.5 without quotes"),
    ("shifts.toml", "paid_hours = 7.5", "paid_hours = false", "paid_hours", "found false"),
]


@pytest.mark.parametrize(("file", "old", "new", "key", "words"), STRICT_CASES,
                         ids=[f"{c[0]}:{c[2]}" for c in STRICT_CASES])
def test_wrong_toml_types_are_errors_not_coerced(good_ws: Path, file: str, old: str,
                                                 new: str, key: str, words: str) -> None:
    """Failed before: each of these loaded without a word (pydantic's lax mode)."""
    _edit(good_ws / file, old, new)
    found = _problems(good_ws)
    assert len(found) == 1, found
    assert found[0].file == file
    assert found[0].key.endswith(key)
    assert words in found[0].message
    assert found[0].line is not None


# -- messages -----------------------------------------------------------------------------------

def test_include_inside_a_rule_does_not_suggest_itself(good_ws: Path) -> None:
    _edit(good_ws / "unit.toml", 'id = "hours-band"', 'id = "hours-band"\ninclude = "x"')
    found = _problems(good_ws)
    assert len(found) == 1
    assert "did you mean" not in found[0].message
    assert "top level" in found[0].message


def test_an_empty_shifts_file_is_said_once(good_ws: Path) -> None:
    (good_ws / "shifts.toml").write_text("", encoding="utf-8")
    found = _problems(good_ws)
    assert [p.file for p in found] == ["shifts.toml"]
    assert "no shift is defined, yet" in found[0].message


# -- found by tests/core/io/test_fuzz_workspaces.py -----------------------------------------

def test_a_table_list_given_as_a_number_is_a_message(good_ws: Path) -> None:
    """Failed before: TypeError in raw_names() when `shift = 7` replaced [[shift]]."""
    (good_ws / "shifts.toml").write_text("shift = 7\n", encoding="utf-8")
    found = _problems(good_ws)
    assert any(p.file == "shifts.toml" and p.key == "shift" for p in found)


def test_a_preset_name_too_long_for_the_file_system_is_a_message(good_ws: Path) -> None:
    """Failed before: OSError 'File name too long' from Path.is_file()."""
    _edit(good_ws / "unit.toml", '"eu-working-time"', '"' + "x" * 300 + '"')
    found = _problems(good_ws)
    assert any(p.file == "unit.toml" and p.key == "include[0]" for p in found)


@pytest.mark.parametrize("zone", ["\u03a9" * 300, "Europe", "../.."])
def test_a_timezone_no_file_system_can_look_up_is_a_message(good_ws: Path, zone: str) -> None:
    """Failed before: OSError 'File name too long' from ZoneInfo()."""
    _edit(good_ws / "unit.toml", '"Europe/Lisbon"', f'"{zone}"')
    found = _problems(good_ws)
    assert [(p.file, p.key) for p in found] == [("unit.toml", "timezone")]
