"""A CSV file as a spreadsheet saves it: the header and the rows, each with its line.

RFC 4180 (quoted fields may hold the separator, doubled quotes and line breaks), UTF-8
with or without a byte-order mark, CRLF or LF line ends. The separator is `;` or `,`:
whichever appears more often outside quotes in the header line (a one-column header:
`,`). Header names are compared trimmed, case-insensitive, with `_`, `-` and runs of
spaces read as one space (`Contract_Group` is `contract group`). A column with an empty
header is ignored when every cell under it is empty too (spreadsheets pad rows).

Every problem is collected (never only the first) as a `Problem` whose file is the CSV's
name, key the column and line the physical line where the row starts.
"""

from __future__ import annotations

import csv
import difflib
import io
import re
from collections.abc import Iterator
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from rostertui.core.errors import Problem

SEPARATORS = (";", ",")


@dataclass(frozen=True)
class Row:
    """One data row: its cells by (normalised) column name, and the line it starts on."""

    line: int
    cells: dict[str, str]

    def get(self, column: str) -> str:
        return self.cells.get(column, "").strip()


@dataclass
class Sheet:
    """What was read: rows, and every problem found while reading them."""

    label: str
    separator: str = ","
    columns: list[str] = field(default_factory=list)
    rows: list[Row] = field(default_factory=list)
    problems: list[Problem] = field(default_factory=list)

    def bad(self, line: int | None, column: str, message: str) -> None:
        self.problems.append(Problem(file=self.label, key=column, message=message, line=line))


def column_name(text: str) -> str:
    """A header cell as compared: trimmed, lower case, `_`/`-`/spaces as one space."""
    return re.sub(r"[\s_-]+", " ", text.strip().lower()).strip()


def split_values(text: str) -> list[str]:
    """A cell holding several codes (`rn;ward`, `rn, ward`, `rn ward`): spaces, commas and
    semicolons all separate, and never belong to a code (identifiers hold none of them).
    Repeats are dropped, the order kept."""
    return list(dict.fromkeys(v for v in re.split(r"[\s,;]+", text) if v))


def guess_separator(text: str) -> str:
    """`;` or `,`: the more frequent outside quotes on the header line."""
    counts = dict.fromkeys(SEPARATORS, 0)
    quoted = False
    for ch in text:
        if ch == '"':
            quoted = not quoted
        elif not quoted and ch in "\r\n":
            break
        elif not quoted and ch in counts:
            counts[ch] += 1
    return ";" if counts[";"] > counts[","] else ","


def read_text(path: Path, label: str, problems: list[Problem]) -> str | None:
    """The file's text (a UTF-8 byte-order mark dropped), or None and the problem."""
    try:
        raw = path.read_bytes()
    except OSError as exc:
        problems.append(Problem(label, "", f"cannot be read: {exc.strerror or exc}"))
        return None
    if raw.startswith((b"\xff\xfe", b"\xfe\xff")):
        problems.append(Problem(label, "", "is UTF-16 text; save it as \"CSV UTF-8\" "
                                "(comma or semicolon separated)"))
        return None
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = raw[:exc.start].count(b"\n") + 1
        problems.append(Problem(label, "", f"not UTF-8 text (byte {exc.start}); save it as "
                                "\"CSV UTF-8\"", line))
        return None


def read_sheet(path: Path, *, required: tuple[str, ...], optional: tuple[str, ...],
               aliases: dict[str, str] | None = None) -> Sheet:
    """Read `path`; `aliases` maps other header names to a column (`contract` ->
    `contract group`). Unknown, repeated and missing columns are problems (then no rows
    are read); so is a row with more cells than the header, unless the extra ones are
    empty. A row with fewer cells has the missing ones empty; blank rows are skipped."""
    sheet = Sheet(label=path.name)
    text = read_text(path, sheet.label, sheet.problems)
    if text is None:
        return sheet
    sheet.separator = guess_separator(text)
    reader = csv.reader(io.StringIO(text, newline=""), delimiter=sheet.separator)
    _read(sheet, reader, required, optional, aliases or {})
    return sheet


def _records(sheet: Sheet, reader: Any) -> Iterator[tuple[int, list[str]]]:
    """(the line a record starts on, its cells); a record the csv module cannot read (a
    field beyond its size limit) is a problem on its line and ends the reading."""
    line = 1
    while True:
        try:
            record = next(reader)
        except StopIteration:
            return
        except csv.Error as exc:
            sheet.bad(line, "", f"not a readable CSV row ({exc})")
            return
        yield line, record
        line = reader.line_num + 1


def _read(sheet: Sheet, reader: Any, required: tuple[str, ...],
          optional: tuple[str, ...], aliases: dict[str, str]) -> None:
    records = _records(sheet, reader)
    header = next(records, (1, None))[1]
    expected = ", ".join([*required, *(f"{c} (optional)" for c in optional)])
    if sheet.problems:
        return
    if header is None or not any(h.strip() for h in header):
        sheet.bad(1, "", f"no header; the first line names the columns: {expected}")
        return
    known = {c: c for c in (*required, *optional)} | aliases
    names: list[str] = []
    for i, cell in enumerate(header):
        name = column_name(cell)
        if not name:
            names.append("")
            continue
        if name not in known:
            hint = difflib.get_close_matches(name, list(known), n=1, cutoff=0.6)
            near = f"; did you mean {hint[0]!r}?" if hint else ""
            sheet.bad(1, "", f"unknown column {cell.strip()!r}{near} "
                      f"(columns: {expected})")
            names.append("")
            continue
        column = known[name]
        if column in names:
            sheet.bad(1, "", f"column {column!r} is given twice "
                      f"(columns {names.index(column) + 1} and {i + 1})")
        names.append(column)
    missing = [c for c in required if c not in names]
    if missing:
        sheet.bad(1, "", f"the header lacks {', '.join(missing)}; the columns are: {expected} "
                  f"(read as {sheet.separator!r}-separated)")
    if sheet.problems:
        return
    sheet.columns = [n for n in names if n]
    for start, record in records:
        if not any(cell.strip() for cell in record):
            continue
        extra = [c for i, c in enumerate(record) if c.strip() and (i >= len(names)
                                                                   or not names[i])]
        if extra:
            sheet.bad(start, "", f"{len(record)} cells but the header names "
                      f"{len(sheet.columns)} columns; the cell {extra[0].strip()[:40]!r} has "
                      "no column (a separator inside a cell needs the cell in quotes)")
            continue
        cells = {name: record[i] if i < len(record) else ""
                 for i, name in enumerate(names) if name}
        sheet.rows.append(Row(start, cells))
