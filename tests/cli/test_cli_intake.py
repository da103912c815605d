"""`new DIR --staff FILE.csv` and `add-requests WS FILE.csv`: files as spreadsheets save
them, what is written (and loads back), every bad row by line, nothing written on error."""

from __future__ import annotations

import json
import tomllib
from datetime import date
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.cli.new import STAFF_TEMPLATE
from rostertui.core.io.load import load_workspace
from tests.conftest import DEMO, copy_ws

# "CSV UTF-8" from a spreadsheet in a European locale: BOM, semicolons, CRLF
STAFF_EU = ("\ufeffID;Name;Skills;Groups;Contract group\r\n"
            "p01;Ana Lima;rn;ward;full-time\r\n"
            "p02;\"Berg; Bo\";\"rn;triage\";ward nights;part-time\r\n"
            "p03;Zoë Ng;hca;;\r\n").encode()
# the same people, comma-separated, quoted fields as another spreadsheet writes them
STAFF_COMMAS = ('"id","name","skills","groups","contract group"\n'
                '"p01","Ana Lima","rn","ward","full-time"\n'
                '"p02","Berg; Bo","rn, triage","ward,nights","part-time"\n'
                '"p03","Zoë Ng","hca","",""\n').encode()


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    return copy_ws(DEMO / "clinic", tmp_path, "clinic")


@pytest.mark.parametrize("data", [STAFF_EU, STAFF_COMMAS], ids=["bom-semicolon-crlf", "commas"])
def test_new_with_a_staff_list(tmp_path: Path, data: bytes,
                               capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "staff.csv").write_bytes(data)
    assert main(["new", str(tmp_path / "ward"), "--staff", str(tmp_path / "staff.csv")]) == 0
    assert "with 3 people from staff.csv" in capsys.readouterr().out
    ws = load_workspace(tmp_path / "ward")
    assert [(p.id, p.name, p.skills, p.groups) for p in ws.staff.person] == [
        ("p01", "Ana Lima", ["rn"], ["ward", "full-time"]),
        ("p02", "Berg; Bo", ["rn", "triage"], ["ward", "nights", "part-time"]),
        ("p03", "Zoë Ng", ["hca"], []),
    ]
    text = (tmp_path / "ward" / "staff.toml").read_text(encoding="utf-8")
    assert text.startswith(STAFF_TEMPLATE.split("\n", 1)[0])  # the template's comments stay


def test_new_with_a_bad_staff_list_writes_nothing(tmp_path: Path,
                                                  capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "staff.csv").write_bytes(b"id;name;skils\r\np01;Ana;rn\r\n")
    target = tmp_path / "deep" / "ward"
    assert main(["new", str(target), "--staff", str(tmp_path / "staff.csv")]) == 2
    err = capsys.readouterr().err
    assert "staff.csv (line 1): unknown column 'skils'; did you mean 'skills'?" in err
    assert "nothing was written" in err
    assert not (tmp_path / "deep").exists()

    (tmp_path / "staff.csv").write_bytes(b"id,name\np01,Ana\n,Bo\np01,Cy\n")
    assert main(["new", str(target), "--staff", str(tmp_path / "staff.csv")]) == 2
    err = capsys.readouterr().err
    assert "2 problems" in err
    assert "staff.csv: id (line 3): empty id" in err
    assert "staff.csv: id (line 4): id 'p01' is already given on line 2" in err
    assert not (tmp_path / "deep").exists()

    assert main(["new", str(target), "--staff", str(tmp_path / "missing.csv")]) == 2
    assert "no such staff list" in capsys.readouterr().err
    assert not (tmp_path / "deep").exists()


REQUESTS_EU = ("\ufeffperson;date;request;weight;note\r\n"
               "c01;16/03/2027;off;3;\"dentist; 9:00\"\r\n"
               "c02;17/03/2027;avoid N;;\r\n"
               "c02;2027-03-18;E;;\r\n").encode()


def test_add_requests_keeps_the_comments_and_loads_back(
        clinic: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    before = (clinic / "requests.toml").read_text(encoding="utf-8")
    n = len(load_workspace(clinic).requests.request)
    (tmp_path / "req.csv").write_bytes(REQUESTS_EU)
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv")]) == 0
    out = capsys.readouterr().out
    assert "added 3 requests from req.csv" in out and "per person: c01 1, c02 2" in out
    after = (clinic / "requests.toml").read_text(encoding="utf-8")
    assert after.startswith(before)  # appended: every comment and entry as it was
    assert "# --- Requests ---" in after
    ws = load_workspace(clinic)
    assert ws.warnings == []
    added = ws.requests.request[n:]
    assert [(r.person, r.date, r.want, r.avoid, r.weight, r.note) for r in added] == [
        ("c01", date(2027, 3, 16), "off", None, 3, "dentist; 9:00"),
        ("c02", date(2027, 3, 17), None, "N", 1, None),
        ("c02", date(2027, 3, 18), "E", None, 1, None),
    ]
    assert tomllib.loads(after)["request"][n:][1] == {
        "person": "c02", "date": date(2027, 3, 17), "avoid": "N"}

    # the same file again adds nothing, says so, and leaves the file as it is
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv"), "--json"]) == 0
    captured = capsys.readouterr()
    assert json.loads(captured.out) == {"added": 0, "skipped": 3, "per_person": {},
                                        "dry_run": False, "written": None}
    assert "req.csv (line 2): c01 on 2027-03-16: already in requests.toml" in captured.err
    assert (clinic / "requests.toml").read_text(encoding="utf-8") == after


def test_dry_run_and_json(clinic: Path, tmp_path: Path,
                          capsys: pytest.CaptureFixture[str]) -> None:
    before = (clinic / "requests.toml").read_bytes()
    (tmp_path / "req.csv").write_bytes(REQUESTS_EU)
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv"), "--dry-run"]) == 0
    assert "would add 3 requests" in capsys.readouterr().out
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv"), "--dry-run",
                 "--json"]) == 0
    assert json.loads(capsys.readouterr().out) == {
        "added": 3, "skipped": 0, "per_person": {"c01": 1, "c02": 2}, "dry_run": True,
        "written": None}
    assert (clinic / "requests.toml").read_bytes() == before


def test_bad_rows_are_all_reported_and_nothing_is_written(
        clinic: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    before = (clinic / "requests.toml").read_bytes()
    (tmp_path / "req.csv").write_text(
        'person,date,want,avoid,weight,note\n'
        'c01,2027-03-16,off,,,"fine"\n'
        'c1,2027-03-17,off,,,\n'
        'c02,2027-04-30,off,,,\n'
        'c03,2027-03-18,Z,,,\n', encoding="utf-8")
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv"), "--json"]) == 2
    captured = capsys.readouterr()
    assert captured.out == ""
    assert "3 problems" in captured.err
    assert "req.csv: person (line 3): unknown person 'c1'" in captured.err
    assert "req.csv: date (line 4): 2027-04-30 is outside the period" in captured.err
    assert "req.csv: want (line 5): unknown shift code 'Z'" in captured.err
    assert (clinic / "requests.toml").read_bytes() == before
    assert main(["add-requests", str(clinic), str(tmp_path / "none.csv")]) == 2
    assert "no such file" in capsys.readouterr().err


def test_into_a_workspace_without_requests_toml(clinic: Path, tmp_path: Path) -> None:
    (clinic / "requests.toml").unlink()
    (tmp_path / "req.csv").write_text("person,date,want\nc01,2027-03-16,off\n",
                                      encoding="utf-8")
    assert main(["add-requests", str(clinic), str(tmp_path / "req.csv")]) == 0
    [request] = load_workspace(clinic).requests.request
    assert (request.person, request.want) == ("c01", "off")
