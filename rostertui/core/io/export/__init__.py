"""Files for the world outside: CSV (long and grid), iCalendar, printable and audit HTML.

Pure core: no textual, no CLI. Each renderer takes a loaded `Workspace` with a
roster and returns text (or, for calendars per person, file name -> text);
`files.export` renders one format and writes it atomically.
"""

from rostertui.core.io.export.common import NoRoster, neutralise
from rostertui.core.io.export.csv_out import grid_csv, long_csv
from rostertui.core.io.export.files import DEFAULT_NAMES, FORMATS, default_path, export, render
from rostertui.core.io.export.html_audit import audit_html
from rostertui.core.io.export.html_roster import roster_html
from rostertui.core.io.export.ics import ics_all, ics_per_person

__all__ = [
    "DEFAULT_NAMES",
    "FORMATS",
    "NoRoster",
    "audit_html",
    "default_path",
    "export",
    "grid_csv",
    "ics_all",
    "ics_per_person",
    "long_csv",
    "neutralise",
    "render",
    "roster_html",
]
