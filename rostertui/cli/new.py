"""`rostertui new DIR`: a new, valid, empty workspace to fill in."""

from __future__ import annotations

import argparse
from datetime import date, timedelta
from pathlib import Path

from rostertui.cli.output import EXIT_OK, fail
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
    p = verbs.add_parser("new", help="write a new, valid, empty workspace to fill in")
    p.add_argument("dir", help="folder for the new workspace (created; must hold no workspace)")
    p.set_defaults(run=lambda a: do_new(a.dir))


def next_monday(today: date | None = None) -> date:
    today = today or date.today()
    return today + timedelta(days=(7 - today.weekday()) % 7 or 7)


def do_new(folder: str | Path, *, start: date | None = None) -> int:
    folder = Path(folder)
    if folder.exists() and not folder.is_dir():
        return fail(f"{folder} exists and is not a folder; nothing written")
    clash = [name for name in FILES if (folder / name).exists()]
    if clash:
        return fail(f"{folder} already holds {', '.join(clash)}; nothing written")
    folder.mkdir(parents=True, exist_ok=True)
    texts = {
        "unit.toml": UNIT_TEMPLATE.format(start=(start or next_monday()).isoformat()),
        "staff.toml": STAFF_TEMPLATE,
        "shifts.toml": SHIFTS_TEMPLATE,
        "requests.toml": REQUESTS_TEMPLATE,
    }
    for name, text in texts.items():
        write_atomic(folder / name, text)
    load_workspace(folder)  # the promise: what we write is valid
    print(f"new workspace in {folder}: edit unit.toml, staff.toml, shifts.toml, requests.toml")
    return EXIT_OK
