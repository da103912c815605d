"""A staff list read into people: multi-value cells, the contract group joining the
groups, every bad row by line; the text written loads back with the loader."""

from __future__ import annotations

import tomllib
from pathlib import Path

from rostertui.core.intake.staff_csv import read_staff_csv, staff_toml
from rostertui.core.models.staff import Person


def write(tmp_path: Path, data: bytes) -> Path:
    path = tmp_path / "staff.csv"
    path.write_bytes(data)
    return path


def test_people_from_a_semicolon_list_with_a_contract_group(tmp_path: Path) -> None:
    data = ("\ufeffid;name;skills;groups;contract group\r\n"
            "p01;Ana Lima;rn triage;ward;full-time\r\n"
            "p02;Bo Berg;\"rn, hca\";\"ward;nights\";part-time\r\n"
            "p03;Cy Dee;;;\r\n").encode()
    read = read_staff_csv(write(tmp_path, data))
    assert read.ok
    assert read.people == [
        Person(id="p01", name="Ana Lima", skills=["rn", "triage"], groups=["ward", "full-time"]),
        Person(id="p02", name="Bo Berg", skills=["rn", "hca"],
               groups=["ward", "nights", "part-time"]),
        Person(id="p03", name="Cy Dee"),
    ]
    assert read.lines == [2, 3, 4]


def test_only_id_and_name_are_required(tmp_path: Path) -> None:
    read = read_staff_csv(write(tmp_path, b"Name,ID\nAna,p01\n"))
    assert read.people == [Person(id="p01", name="Ana")]


def test_every_bad_row_by_line_and_column(tmp_path: Path) -> None:
    data = (b'id,name,skills,groups,contract\n'
            b',Ana,rn,,\n'                  # 2: empty id
            b'p02,"Bo\tBerg",rn,,\n'        # 3: a tab in the name
            b'p03,Cy,r@n,,\n'               # 4: a skill that is no identifier
            b'p02,Di,rn,,"full, part"\n'    # 5: a repeated id and two contract groups
            b'p06,,rn,,\n'                  # 6: empty name
            b'-,Ed,,,\n')                   # 7: the off code as an id
    read = read_staff_csv(write(tmp_path, data))
    got = [(p.line, p.key) for p in read.problems]
    assert got == [(2, "id"), (3, "name"), (4, "skills"), (5, "id"), (5, "contract group"),
                   (6, "name"), (7, "id")]
    text = "\n".join(str(p) for p in read.problems)
    assert "staff.csv: id (line 2): empty id" in text
    assert "a tab" in text and "'r@n' is not a valid identifier" in text
    assert "id 'p02' is already given on line 3" in text
    assert "'-' is reserved" in text
    assert read.people == []


def test_a_header_alone_is_a_problem(tmp_path: Path) -> None:
    read = read_staff_csv(write(tmp_path, b"id;name\r\n"))
    assert not read.ok and "no people" in read.problems[0].message


def test_staff_toml_keeps_the_header_and_reads_back(tmp_path: Path) -> None:
    read = read_staff_csv(write(tmp_path, 'id,name,skills\np01,"Zoë ""Z"" Ng",rn\n'.encode()))
    text = staff_toml(read.staff, "# comment one\n# comment two\n")
    assert text.startswith("# comment one\n# comment two\n\n[[person]]\n")
    assert 'skills = ["rn"]' in text and "groups = []" in text
    assert tomllib.loads(text)["person"] == [
        {"id": "p01", "name": 'Zoë "Z" Ng', "skills": ["rn"], "groups": []}]
