"""Every validation error of the loader: file, key path, line and a plain sentence."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace


def edit(ws: Path, name: str, old: str, new: str, count: int = 1) -> None:
    path = ws / name
    text = path.read_text()
    assert old in text, f"fixture changed: {old!r} not in {name}"
    path.write_text(text.replace(old, new, count))


def append(ws: Path, name: str, text: str) -> None:
    path = ws / name
    path.write_text(path.read_text() + "\n" + text)


def problems(ws: Path) -> list:
    with pytest.raises(InputError) as info:
        load_workspace(ws)
    return info.value.problems


def line_of_text(ws: Path, name: str, needle: str) -> int:
    """Line of `needle` in the file; "text#n" means its n-th occurrence (from 1)."""
    text, _, nth = needle.partition("#")
    hits = [i for i, line in enumerate((ws / name).read_text().splitlines(), start=1)
            if text in line]
    assert hits, f"{text!r} not in {name}"
    return hits[int(nth or 1) - 1]


# (file, old text, new text, key path, words in the message, text on the reported line)
CASES = [
    ("staff.toml", 'skills = ["rn", "triage"]', 'skils = ["rn", "triage"]',
     "person[0].skils", "unknown key 'skils' (did you mean 'skills'?)", "skils"),
    ("staff.toml", 'skills = ["hca"]', 'skills = ["hcaa", "triag"]',
     "person[3].skills[1]", "unknown skill 'triag'", '"triag"'),
    ("staff.toml", 'id = "t02"', 'id = "t01"', "person[1].id", "already used by person[0]",
     'id = "t01"#2'),
    ("staff.toml", 'id = "t04"', 'id = "t 04"', "person[3].id", "not a valid identifier",
     '"t 04"'),
    ("shifts.toml", 'start = "14:00"', 'start = "25:00"', "shift[1].start",
     "'25:00' is not a clock time", '"25:00"'),
    ("shifts.toml", 'code = "L"', 'code = "-"', "shift[1].code", "reserved", 'code = "-"'),
    ("shifts.toml", 'code = "L"', 'code = "E"', "shift[1].code", "already used by shift[0]",
     'code = "E"#2'),
    ("shifts.toml", "paid_hours = 7.5", "paid_hours = -2", "shift[0].paid_hours",
     "greater than or equal to 0", "paid_hours"),
    ("shifts.toml", "paid_hours = 7.5", "paid_hours = 90", "shift[0].paid_hours",
     "less than or equal to 24", "paid_hours"),
    ("shifts.toml", 'requires = ["rn"]', 'requires = ["icu"]', "shift[2].requires[0]",
     "unknown skill 'icu'", "requires"),
    ("shifts.toml", 'shift = "N"\nskill = "rn"', 'shift = "Q"\nskill = "rn"', "cover[1].shift",
     "unknown shift code 'Q'", 'shift = "Q"'),
    ("shifts.toml", 'skill = "rn"', 'skill = "midwife"', "cover[1].skill",
     "unknown skill 'midwife'", "midwife"),
    ("shifts.toml", "min = 1\nideal = 2", "min = -1\nideal = 2", "cover[0].min",
     "greater than or equal to 0", "min = -1"),
    ("shifts.toml", "max = 2\nideal = 1", "max = 2\nmin = 3\nideal = 1", "cover[2]",
     "min = 3 is above max = 2", "[[cover]]#3"),
    ("shifts.toml", 'days = ["sat", "sun"]', 'days = ["sat", "sun"]\ndates = [2027-03-27]',
     "cover[2]", "either days or dates", "[[cover]]#3"),
    ("shifts.toml", "ideal = 2\nunder_weight = 50", "ideal = 2", "cover[0]",
     "ideal needs under_weight", "[[cover]]"),
    ("shifts.toml", 'days = ["sat", "sun"]', 'days = ["sat", "sunday"]', "cover[2].days[1]",
     "'sunday'", "sunday"),
    ("requests.toml", 'person = "t01"', 'person = "t99"', "request[0].person",
     "unknown person 't99'", '"t99"'),
    ("requests.toml", 'person = "t02"', 'person = "nobody"', "leave[0].person",
     "unknown person 'nobody'", '"nobody"'),
    ("requests.toml", "to = 2027-03-25", "to = 2027-03-20", "leave[0]",
     "to = 2027-03-20 is before from = 2027-03-24", "[[leave]]"),
    ("requests.toml", 'want = "off"', 'want = "off"\navoid = "N"', "request[0]",
     "exactly one of want", "[[request]]"),
    ("requests.toml", 'avoid = "N"', 'note = "no choice"', "request[1]",
     "exactly one of want", "[[request]]#2"),
    ("requests.toml", 'want = "off"', 'want = "X"', "request[0].want",
     "unknown shift code 'X'", 'want = "X"'),
    ("requests.toml", 'avoid = "N"', 'avoid = "off"', "request[1].avoid",
     "unknown shift code 'off'", 'avoid = "off"'),
    ("requests.toml", "weight = 3", "weight = 0", "request[0].weight",
     "greater than 0", "weight = 0"),
    ("requests.toml", "credit_hours = 7.5", "credit_hours = 30", "leave[0].credit_hours",
     "less than or equal to 24", "credit_hours"),
    ("history.toml", 't03 = ["-", "L", "L"]', 't03 = ["-", "L", "Z"]', "rows.t03[2]",
     "unknown shift code 'Z'", "t03 = "),
    ("history.toml", "t01 = 151.5", "t77 = 151.5", "hours_before.t77",
     "unknown person 't77'", "t77 = 151.5"),
    ("history.toml", "t01 = 151.5", "t01 = -4", "hours_before.t01",
     "greater than or equal to 0", "t01 = -4"),
    ("roster.toml", 't04 = ["E", "E", "E", "E", "-", "L", "E"]', 't04 = ["E", "E", "E"]',
     "rows.t04", "row has 3 codes; expected 7", "t04 = "),
    ("roster.toml", 't01 = ["-", "E"', 't01 = ["-", "Y"', "rows.t01[1]",
     "unknown shift code 'Y'", "t01 = "),
    ("roster.toml", 't02 = ["E"', 'x02 = ["E"', "rows.x02", "unknown person 'x02'", "x02 = "),
    ("roster.toml", "dates = [2027-03-22, 2027-03-23]", "dates = [2027-03-22, 2027-04-23]",
     "lock[0].dates[1]", "locked date 2027-04-23 is outside the period", "dates = "),
    ("roster.toml", "days = 7", "days = 8", "start",
     "the roster covers 8 days from 2027-03-22", "start = "),
    ("roster.toml", 'status = "feasible"', 'status = "good"', "solve.status", "'good'",
     "status = "),
    ("unit.toml", 'timezone = "Europe/Lisbon"', 'timezone = "Europe/Lisabon"', "timezone",
     "not a known IANA timezone", "timezone = "),
    ("unit.toml", "days = 7", "days = 0", "days", "greater than or equal to 1", "days = 0"),
    ("unit.toml", "days = 7", "days = 400", "days", "less than or equal to 366", "days = 400"),
    ("unit.toml", '"presets/local.toml"]', '"presets/local.toml", "no-such-preset"]',
     "include[2]", "unknown preset 'no-such-preset'", "include = "),
    ("unit.toml", '"presets/local.toml"]', '"presets/missing.toml"]', "include[1]",
     "preset file 'presets/missing.toml' not found", "include = "),
    ("unit.toml", 'kind = "forbidden-sequence"', 'kind = "forbidden-sequnce"', "rule[0]",
     "unknown rule kind 'forbidden-sequnce'", "[[rule]]"),
    ("unit.toml", 'then = ["E", "L"]', 'then = ["E", "Q"]', "rule[0].then[1]",
     "unknown shift code 'Q'", "then = "),
    ("unit.toml", 'first = "@night"', 'first = "@nights"', "rule[0].first",
     "unknown shift code '@nights'", "first = "),
    ("unit.toml", "weight = 2", "weight = 0", "rule[1].weight", "greater than 0", "weight = 0"),
    ("unit.toml", "target = 36\nweight = 2", "target = 36", "rule[1]",
     "target needs a weight", "[[rule]]#2"),
    ("unit.toml", "min = 16\nmax = 60", "min = 70\nmax = 60", "rule[1]",
     "min = 70 is above max = 60", "[[rule]]#2"),
    ("unit.toml", 'groups = ["full-time"]', 'people = ["t01", "zz"]', "rule[1].people[1]",
     "unknown person 'zz'", "people = "),
    ("presets/local.toml", "weight = 3", "", "rule[1]",
     "a balance rule is soft only", "[[rule]]#2"),
    ("presets/local.toml", 'except = ["t04"]', 'except = ["t40"]', "rule[1].except[0]",
     "unknown person 't40'", "except = "),
]
CASES = [c for c in CASES if c[3] is not None]


@pytest.mark.parametrize(("name", "old", "new", "key", "words", "line_text"), CASES,
                         ids=[f"{c[0]}:{c[3]}:{c[4][:30]}" for c in CASES])
def test_each_problem_names_file_key_line_and_reason(
    good_ws: Path, name: str, old: str, new: str, key: str, words: str, line_text: str
) -> None:
    edit(good_ws, name, old, new)
    found = problems(good_ws)
    label = name if not name.startswith("presets/") else name
    matching = [p for p in found if p.file == label and p.key == key]
    assert matching, f"no problem at {label}: {key}; got {[str(p) for p in found]}"
    problem = matching[0]
    assert words in problem.message
    assert problem.line == line_of_text(good_ws, name, line_text)


def test_every_problem_of_a_run_is_reported_together(good_ws: Path) -> None:
    edit(good_ws, "staff.toml", 'skills = ["rn", "triage"]', 'skills = ["rn", "triagee"]')
    edit(good_ws, "shifts.toml", 'skill = "rn"', 'skill = "triage"')  # so triage is used
    edit(good_ws, "requests.toml", 'person = "t01"', 'person = "t99"')
    edit(good_ws, "shifts.toml", 'start = "14:00"', 'start = "25:00"')
    found = problems(good_ws)
    keys = {(p.file, p.key) for p in found}
    assert ("staff.toml", "person[0].skills[1]") in keys
    assert ("requests.toml", "request[0].person") in keys
    assert ("shifts.toml", "shift[1].start") in keys
    assert all(p.line is not None for p in found)


def test_a_broken_shift_does_not_cascade_into_unknown_code_errors(good_ws: Path) -> None:
    edit(good_ws, "shifts.toml", 'start = "14:00"', 'start = "2pm"')
    found = problems(good_ws)
    assert [p.key for p in found] == ["shift[1].start"]


def test_toml_syntax_error_gives_its_line(good_ws: Path) -> None:
    edit(good_ws, "staff.toml", 'name = "Bea Cornmill"', 'name = "Bea Cornmill')
    (problem,) = problems(good_ws)
    assert problem.file == "staff.toml"
    assert "not valid TOML" in problem.message
    assert problem.line == line_of_text(good_ws, "staff.toml", "Bea Cornmill")


def test_missing_required_file(good_ws: Path) -> None:
    (good_ws / "shifts.toml").unlink()
    found = problems(good_ws)
    assert [(p.file, "missing" in p.message) for p in found] == [("shifts.toml", True)]


def test_not_a_folder(tmp_path: Path) -> None:
    (problem,) = problems(tmp_path / "nowhere")
    assert "no such workspace folder" in problem.message


def test_same_rule_id_in_two_presets_is_an_error(good_ws: Path) -> None:
    append(good_ws, "presets/local.toml", '[[rule]]\nid = "daily-rest"\nkind = "min-rest"\n'
           "hours = 12\n")
    found = problems(good_ws)
    (p,) = [p for p in found if p.file == "presets/local.toml"]
    assert p.key == "rule[2].id"
    assert "also defined in rules/eu-working-time.toml" in p.message


def test_duplicate_local_rule_id_is_an_error(good_ws: Path) -> None:
    append(good_ws, "unit.toml", '[[rule]]\nid = "hours-band"\nkind = "max-weekends"\ncount = 2\n')
    (p,) = problems(good_ws)
    assert (p.file, p.key) == ("unit.toml", "rule[2].id")
    assert "already used by rule[1]" in p.message


def test_dates_outside_the_period_are_warnings_not_errors(good_ws: Path) -> None:
    edit(good_ws, "requests.toml", "date = 2027-03-27", "date = 2027-05-01")
    edit(good_ws, "requests.toml", "to = 2027-03-25", "to = 2027-04-02")
    ws = load_workspace(good_ws)
    texts = [str(w) for w in ws.warnings]
    assert any("request[0].date" in t and "outside the period" in t for t in texts)
    assert any("leave[0]" in t and "clipped" in t for t in texts)


def test_problem_text_reads_file_key_line_message(good_ws: Path) -> None:
    edit(good_ws, "shifts.toml", 'start = "14:00"', 'start = "25:00"')
    (p,) = problems(good_ws)
    assert re.fullmatch(r"shifts\.toml: shift\[1\]\.start \(line \d+\): '25:00' is not a .*",
                        str(p))
