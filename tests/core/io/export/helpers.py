"""A small hostile workspace for the export tests: names and notes that would be
formulas in a spreadsheet or markup in a page, and a night across a DST change."""

from __future__ import annotations

from pathlib import Path

from tests.core.check.helpers import write_ws

FORMULA_NAME = '=HYPERLINK("x")'
QUOTED_NAME = 'Smith, "Jo"'
MARKUP_NAME = "Ana <b>Bold</b>"
SCRIPT_NOTE = "<script>alert(1)</script>"
DDE_REASON = "=cmd|' /C calc'!A0"
PLUS_NOTE = "+1 call me @ home"
MULTILINE_NOTE = 'line one\nline two, "quoted"'

SHIFTS = """
[[shift]]
code = "E"
name = "Early"
start = "07:00"
end = "15:00"
paid_hours = 7.5

[[shift]]
code = "N"
name = "Night"
start = "22:00"
end = "07:00"
"""

COVER = """
[[cover]]
shift = "E"
min = 1
ideal = 2
under_weight = 10
"""

# Mon 22 Mar - Sun 28 Mar 2027; Lisbon springs forward at 01:00 on Sun 28 Mar.
ROWS = {
    "p1": "E E - - - N -",  # the night of Sat 27 Mar crosses the DST change
    "p2": "- - E - E E -",  # on leave Thu 25 Mar
    "p3": "N - - E - - E",
}

REQUESTS = f"""
[[leave]]
person = "p2"
from = 2027-03-25
reason = "{DDE_REASON}"

[[request]]
person = "p1"
date = 2027-03-23
avoid = "E"
weight = 3
note = "{SCRIPT_NOTE}"

[[request]]
person = "p2"
date = 2027-03-24
want = "E"
note = "{PLUS_NOTE}"

[[request]]
person = "p3"
date = 2027-03-25
want = "E"
note = '''{MULTILINE_NOTE}'''
"""

RULES = """
[[rule]]
id = "daily-rest"
kind = "min-rest"
hours = 11
source = "Directive 2003/88/EC, Art. 3 <i>"
note = "note <img src=x onerror=alert(2)>"

[[rule]]
id = "max-two"
kind = "max-shifts"
count = 2
weight = 4
"""


TAME = {  # the same workspace with harmless text, to compare the markup with
    FORMULA_NAME: "Pat One", QUOTED_NAME: "Jo Smith", MARKUP_NAME: "Ana Bold",
    SCRIPT_NOTE: "school play", DDE_REASON: "annual leave", PLUS_NOTE: "call me",
    "Ward & <i>B</i>": "Ward B", "Art. 3 <i>": "Art. 3", "<img src=x onerror=alert(2)>": "two",
}


def hostile_ws(folder: Path, timezone: str = "Europe/Lisbon", tame: bool = False) -> Path:
    """Three people (one named like a formula, one with a comma and quotes, one with
    markup), a note that is a script, and p1's night across the spring DST change.
    `tame`: the same workspace with every hostile text replaced by a harmless one."""
    write_ws(
        folder, rows=dict(ROWS), start="2027-03-22", timezone=timezone, shifts=SHIFTS,
        cover=COVER, requests=REQUESTS, rules=RULES, unit_extra="holidays = [2027-03-26]",
    )
    names = {"p1": FORMULA_NAME, "p2": QUOTED_NAME, "p3": MARKUP_NAME}
    staff = "".join(
        f"[[person]]\nid = \"{pid}\"\nname = '''{name}'''\nskills = []\ngroups = []\n\n"
        for pid, name in names.items()
    )
    (folder / "staff.toml").write_text(staff)
    text = (folder / "unit.toml").read_text().replace(
        'name = "Test ward"', "name = '''Ward & <i>B</i>'''"
    )
    (folder / "unit.toml").write_text(text)
    if tame:
        for path in folder.glob("*.toml"):
            text = path.read_text()
            for hostile, harmless in TAME.items():
                text = text.replace(hostile, harmless)
            path.write_text(text)
    return folder


def worked(rows: dict[str, str] = ROWS) -> int:
    return sum(1 for row in rows.values() for code in row.split() if code != "-")
