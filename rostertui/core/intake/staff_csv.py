"""staff.toml from a staff list: columns id, name, skills, groups, contract group.

`id` and `name` are required; the others are optional columns and may be empty cells.
Skills and groups hold several codes separated by spaces, commas or semicolons
(`sheet.split_values`). The format has no contract key: a rule targets people through
their groups, so the contract group (`full-time`, `part-time-60`) joins the person's
`groups`, after the others. One `[[person]]` per row, in the file's order.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from pydantic import TypeAdapter, ValidationError

from rostertui.core.errors import Problem
from rostertui.core.intake.sheet import Row, Sheet, read_sheet, split_values
from rostertui.core.io.save import as_toml_data, toml_inline
from rostertui.core.models.common import DisplayName, Identifier
from rostertui.core.models.staff import Person, Staff

REQUIRED = ("id", "name")
OPTIONAL = ("skills", "groups", "contract group")
ALIASES = {"contract": "contract group", "skill": "skills", "group": "groups",
           "person": "id", "person id": "id"}

_IDENTIFIER = TypeAdapter(Identifier)
_NAME = TypeAdapter(DisplayName)


@dataclass
class StaffImport:
    """The people read (each with its CSV line) and every problem; `ok` when none."""

    label: str
    people: list[Person] = field(default_factory=list)
    lines: list[int] = field(default_factory=list)
    problems: list[Problem] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        return not self.problems

    @property
    def staff(self) -> Staff:
        return Staff(person=self.people)


def read_staff_csv(path: Path) -> StaffImport:
    sheet = read_sheet(Path(path), required=REQUIRED, optional=OPTIONAL, aliases=ALIASES)
    out = StaffImport(sheet.label)
    seen: dict[str, int] = {}
    for row in sheet.rows:
        person = _person(sheet, row, seen)
        if person is not None:
            out.people.append(person)
            out.lines.append(row.line)
    if not sheet.problems and not sheet.rows:
        sheet.bad(None, "", "holds a header but no people; one row per person")
    out.problems = sorted(sheet.problems, key=lambda p: p.line or 0)
    return out


def _person(sheet: Sheet, row: Row, seen: dict[str, int]) -> Person | None:
    before = len(sheet.problems)
    pid = row.get("id")
    if not pid:
        sheet.bad(row.line, "id", "empty id; every person needs one (e.g. p01)")
    elif _check(sheet, row, "id", _IDENTIFIER, pid):
        if pid in seen:
            sheet.bad(row.line, "id", f"id {pid!r} is already given on line {seen[pid]}")
        seen.setdefault(pid, row.line)
    name = row.cells.get("name", "").strip(" ")
    if not name.strip():
        sheet.bad(row.line, "name", "empty name")
    else:
        _check(sheet, row, "name", _NAME, name)
    codes: dict[str, list[str]] = {}
    for column in OPTIONAL:
        codes[column] = split_values(row.get(column))
        for code in codes[column]:
            _check(sheet, row, column, _IDENTIFIER, code)
    if len(codes["contract group"]) > 1:
        sheet.bad(row.line, "contract group", "one contract group per person; put the "
                  "others in the groups column")
    if len(sheet.problems) > before:
        return None
    groups = list(dict.fromkeys(codes["groups"] + codes["contract group"]))
    return Person(id=pid, name=name, skills=codes["skills"], groups=groups)


def _check(sheet: Sheet, row: Row, column: str, adapter: TypeAdapter[str], value: str) -> bool:
    try:
        adapter.validate_python(value)
    except ValidationError as exc:
        message = exc.errors(include_url=False)[0]["msg"].removeprefix("Value error, ")
        sheet.bad(row.line, column, message)
        return False
    return True


def staff_toml(staff: Staff, header: str = "") -> str:
    """staff.toml's text: `header` (comment lines) then one `[[person]]` per person, in
    the spec's layout (lists on one line)."""
    blocks = ["\n".join(["[[person]]", *(f"{key} = {_value(value)}" for key, value in
                                          as_toml_data(p, defaults=True).items())])
              for p in staff.person]
    body = "\n\n".join(blocks) + "\n" if blocks else "person = []\n"
    return (header.rstrip("\n") + "\n\n" if header.strip() else "") + body


def _value(value: str | list[str]) -> str:
    return toml_inline(value) if isinstance(value, list) else toml_inline([value])[1:-1]
