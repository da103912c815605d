"""`rostertui new DIR`: a new, valid, empty workspace to fill in."""

from __future__ import annotations

import argparse
from datetime import date, timedelta
from pathlib import Path

from rostertui.cli.output import EXIT_OK, fail
from rostertui.core.errors import InputError, Problem
from rostertui.core.intake.staff_csv import read_staff_csv, staff_toml
from rostertui.core.intake.trial import relabel, trial_load
from rostertui.core.io.atomic import write_atomic
from rostertui.core.io.load import FILES, load_workspace

UNIT_TEMPLATE = """\
# The unit: its name, timezone, roster period and the rules that apply.
name = "New unit"
timezone = "UTC"           # your IANA zone, e.g. "Europe/Lisbon"; rest is measured in it
start = {start}       # first day of the period
days = 28
weekend = ["sat", "sun"]
holidays = []
include = ["eu-working-time"]   # rule presets shipped in rules/ (see the README)

# Local rules: same shape as in a preset; a local rule with a preset rule's id replaces it.
# [[rule]]
# id = "max-nights-in-row"
# kind = "max-consecutive-shift"
# shift = "@night"
# count = 3
# weight = 50

# What one changed cell costs when `rostertui repair` mends a published roster.
# [repair]
# change_weight = 1000
"""

STAFF_TEMPLATE = """\
# One [[person]] per member of staff, in display order.
# [[person]]
# id = "p01"
# name = "Given Family"
# skills = ["rn"]
# groups = ["full-time"]
person = []
"""

SHIFTS_TEMPLATE = """\
# Shift types and cover (how many people each shift needs).
# [[shift]]
# code = "E"
# name = "Early"
# start = "07:00"
# end = "15:00"
#
# [[cover]]
# shift = "E"
# min = 2
# ideal = 3
# under_weight = 100
shift = []
cover = []
"""

REQUESTS_TEMPLATE = """\
# Leave (hard: no shift on these dates) and requests (soft: granted when possible).
# [[leave]]
# person = "p01"
# from = 2027-03-08
# to = 2027-03-12
#
# [[request]]
# person = "p01"
# date = 2027-03-05
# want = "off"
# weight = 3
leave = []
request = []
"""


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "new", help="write a new, valid, empty workspace to fill in",
        description="Write a new workspace to fill in. With --staff, staff.toml holds one "
        "[[person]] per row of a CSV with the columns id, name and optionally skills, "
        "groups, contract group (comma- or semicolon-separated, UTF-8 with or without a "
        "BOM); every bad row is reported by line and nothing is written.",
    )
    p.add_argument("dir", help="folder for the new workspace (created; must hold no workspace)")
    p.add_argument("--staff", metavar="FILE.csv", help="fill staff.toml from a staff list")
    p.set_defaults(run=lambda a: do_new(a.dir, staff_csv=a.staff))


def next_monday(today: date | None = None) -> date:
    today = today or date.today()
    return today + timedelta(days=(7 - today.weekday()) % 7 or 7)


def do_new(folder: str | Path, *, start: date | None = None,
           staff_csv: str | Path | None = None) -> int:
    """Write the templates into `folder`; with `staff_csv`, staff.toml from that staff list
    (checked first, then with the loader: nothing is written, not even the folder, on any
    problem; InputError names the CSV's lines)."""
    folder = Path(folder)
    if folder.exists() and not folder.is_dir():
        return fail(f"{folder} exists and is not a folder; nothing written")
    clash = [name for name in FILES if (folder / name).exists()]
    if clash:
        return fail(f"{folder} already holds {', '.join(clash)}; nothing written")
    texts = {
        "unit.toml": UNIT_TEMPLATE.format(start=(start or next_monday()).isoformat()),
        "staff.toml": STAFF_TEMPLATE,
        "shifts.toml": SHIFTS_TEMPLATE,
        "requests.toml": REQUESTS_TEMPLATE,
    }
    people = ""
    if staff_csv is not None:
        texts["staff.toml"], n = _staff_text(Path(staff_csv), texts)
        people = f" with {n} {'person' if n == 1 else 'people'} from {Path(staff_csv).name}"
    folder.mkdir(parents=True, exist_ok=True)
    for name, text in texts.items():
        write_atomic(folder / name, text)
    load_workspace(folder)  # the promise: what we write is valid
    print(f"new workspace in {folder}{people}: edit unit.toml, staff.toml, shifts.toml, "
          "requests.toml")
    return EXIT_OK


def _staff_text(path: Path, texts: dict[str, str]) -> tuple[str, int]:
    """staff.toml from the staff list at `path`, judged by the loader beside the other
    templates; InputError with every problem, each on its CSV line."""
    if not path.is_file():
        raise InputError([Problem(str(path), "", "no such staff list (a CSV file)")])
    read = read_staff_csv(path)
    if not read.ok:
        raise InputError(read.problems)
    header = "".join(line + "\n" for line in STAFF_TEMPLATE.splitlines() if line.startswith("#"))
    text = staff_toml(read.staff, header)
    try:
        trial_load({**texts, "staff.toml": text})
    except InputError as exc:
        lines = dict(enumerate(read.lines))
        raise InputError(relabel(exc.problems, "staff.toml", "person", lines, read.label,
                                 {"groups": "groups or contract group"})) from None
    return text, len(read.people)
