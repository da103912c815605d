"""Reading a CSV as spreadsheets save it: BOM, `;` or `,`, CRLF, RFC 4180 quoting, header
names, the line each row starts on, and every problem at once."""

from __future__ import annotations

import csv
from pathlib import Path

import pytest

from rostertui.core.intake.sheet import column_name, guess_separator, read_sheet, split_values

COLUMNS = {"required": ("id", "name"), "optional": ("skills", "contract group"),
           "aliases": {"contract": "contract group"}}


def write(tmp_path: Path, data: bytes, name: str = "list.csv") -> Path:
    path = tmp_path / name
    path.write_bytes(data)
    return path


def test_a_european_spreadsheet_csv_utf8_bom_semicolons_crlf(tmp_path: Path) -> None:
    data = ("\ufeffID ; Name;Skills;Contract_Group\r\n"
            "p01;Ana Lima;rn;full-time\r\n"
            "p02;\"Berg; Bo\";\"rn;triage\";\r\n").encode()
    sheet = read_sheet(write(tmp_path, data), **COLUMNS)
    assert sheet.problems == []
    assert sheet.separator == ";"
    assert sheet.columns == ["id", "name", "skills", "contract group"]
    assert [(r.line, r.get("id"), r.get("name"), r.get("skills")) for r in sheet.rows] == [
        (2, "p01", "Ana Lima", "rn"), (3, "p02", "Berg; Bo", "rn;triage")]


def test_commas_with_quotes_doubled_quotes_and_a_line_break_in_a_cell(tmp_path: Path) -> None:
    data = (b'id,name,skills\n'
            b'p01,"Lima, Ana ""Nita""","rn, triage"\n'
            b'p02,"two\nlines",hca\n'
            b'p03,Cy,\n')
    sheet = read_sheet(write(tmp_path, data), **COLUMNS)
    assert sheet.separator == ","
    assert sheet.problems == []
    assert [r.line for r in sheet.rows] == [2, 3, 5]  # the row with a line break takes 3-4
    assert sheet.rows[0].get("name") == 'Lima, Ana "Nita"'
    assert sheet.rows[1].cells["name"] == "two\nlines"


def test_blank_rows_and_empty_padding_columns_are_ignored(tmp_path: Path) -> None:
    data = b"id;name;;\r\np01;Ana;;\r\n;;;\r\n\r\np02;Bo\r\n"
    sheet = read_sheet(write(tmp_path, data), **COLUMNS)
    assert sheet.problems == []
    assert [(r.line, r.get("id"), r.get("skills")) for r in sheet.rows] == [
        (2, "p01", ""), (5, "p02", "")]


def test_header_problems_all_at_once_with_a_hint(tmp_path: Path) -> None:
    data = b"id,nmae,skils,id\np01,Ana,rn,p01\n"
    sheet = read_sheet(write(tmp_path, data), **COLUMNS)
    messages = [p.message for p in sheet.problems]
    assert all(p.line == 1 and p.file == "list.csv" for p in sheet.problems)
    assert any("unknown column 'nmae'; did you mean 'name'?" in m for m in messages)
    assert any("unknown column 'skils'; did you mean 'skills'?" in m for m in messages)
    assert any("column 'id' is given twice (columns 1 and 4)" in m for m in messages)
    assert any("the header lacks name" in m for m in messages)
    assert sheet.rows == []


def test_a_cell_without_a_column_names_the_line(tmp_path: Path) -> None:
    data = b"id,name\np01,Ana\np02,Berg, Bo\n"
    sheet = read_sheet(write(tmp_path, data), **COLUMNS)
    [problem] = sheet.problems
    assert problem.line == 3 and "'Bo' has no column" in problem.message
    assert "in quotes" in problem.message


def test_not_utf8_and_utf16_are_refused_with_the_fix(tmp_path: Path) -> None:
    latin = read_sheet(write(tmp_path, "id,name\np01,Jos\u00e9\n".encode("latin-1")),
                       **COLUMNS)
    assert latin.problems[0].line == 2 and "CSV UTF-8" in latin.problems[0].message
    utf16 = read_sheet(write(tmp_path, "id\tname\n".encode("utf-16"), "u.csv"), **COLUMNS)
    assert "UTF-16" in utf16.problems[0].message


def test_an_empty_file_and_a_huge_field(tmp_path: Path) -> None:
    empty = read_sheet(write(tmp_path, b""), **COLUMNS)
    assert "no header" in empty.problems[0].message
    huge = b"id,name\np01,\"" + b"x" * (csv.field_size_limit() + 10) + b"\"\n"
    sheet = read_sheet(write(tmp_path, huge, "huge.csv"), **COLUMNS)
    assert "not a readable CSV row" in sheet.problems[0].message
    assert sheet.problems[0].line == 2


@pytest.mark.parametrize(("header", "sep"), [
    ("a;b;c", ";"), ("a,b,c", ","), ('"x,y";b;c', ";"), ('"x;y;z",b', ","), ("a", ","),
])
def test_the_separator_is_the_more_frequent_outside_quotes(header: str, sep: str) -> None:
    assert guess_separator(header + "\r\n1,2;3,4,5") == sep


def test_names_and_values() -> None:
    assert column_name("  Contract_Group ") == "contract group"
    assert column_name("contract-group") == "contract group"
    assert split_values(" rn;ward, triage  hca rn ") == ["rn", "ward", "triage", "hca"]
    assert split_values("") == []
