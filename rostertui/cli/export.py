"""`rostertui export WS --to csv|ics|html|audit-html [--grid] [--per-person] [--out PATH]`.

Writes files for spreadsheets, calendars and print (rostertui.core.io.export):

  --to csv               long form person,date,shift,start,end,paid_hours
                         (`check --roster` reads it back); default WS/export/roster.csv
  --to csv --grid        one row per person, one column per date; WS/export/roster-grid.csv
  --to ics               every shift in one calendar; WS/export/roster.ics
  --to ics --per-person  one calendar per person, <person-id>.ics in WS/export/calendars/
  --to html              the printable roster; WS/export/roster.html
  --to audit-html        the audit report; WS/export/audit.html

`--out` names the file (or, with --per-person, the folder); a single-file format
given an existing folder writes its default name inside it. Stdout: the paths
written, one a line; with --json exactly one object {"written", "format",
"compliant"}. Exit 0 when the roster is compliant, 1 when it has hard violations
(the files are written either way), 2 when there is no roster or the input or the
command is wrong (nothing written).
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, warn
from rostertui.core.io.load import load_workspace

TARGETS = ("csv", "ics", "html", "audit-html")


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "export",
        help="files for spreadsheets, calendars and print (CSV, iCalendar, HTML)",
        description="Export the roster: CSV (long form, or --grid), iCalendar (one file, "
        "or --per-person), a printable HTML roster, or an HTML audit report. Default "
        "files go to WS/export/. Exit 0 compliant, 1 hard violations (files written), "
        "2 no roster or unreadable input (nothing written).",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument("--to", required=True, choices=TARGETS, help="the format to write")
    p.add_argument("--out", metavar="PATH",
                   help="file to write (with --per-person: the folder); default in WS/export/")
    p.add_argument("--grid", action="store_true",
                   help="with --to csv: one row per person, one column per date")
    p.add_argument("--per-person", action="store_true",
                   help="with --to ics: one calendar file per person")
    p.add_argument("--json", action="store_true",
                   help='print one JSON object {"written", "format", "compliant"}')
    p.set_defaults(run=lambda a: do_export(
        a.workspace, to=a.to, out=a.out, grid=a.grid, per_person=a.per_person, as_json=a.json
    ))


def export_format(to: str, grid: bool = False, per_person: bool = False) -> str:
    """The core's format name for the command's options; ValueError when they clash."""
    if grid and to != "csv":
        raise ValueError("--grid goes with --to csv")
    if per_person and to != "ics":
        raise ValueError("--per-person goes with --to ics")
    if grid:
        return "csv-grid"
    if per_person:
        return "ics-per-person"
    return to


def do_export(
    workspace: str | Path,
    *,
    to: str,
    out: str | Path | None = None,
    grid: bool = False,
    per_person: bool = False,
    as_json: bool = False,
) -> int:
    try:
        fmt = export_format(to, grid, per_person)
    except ValueError as exc:
        return fail(str(exc))
    ws = load_workspace(workspace)
    warn(ws.warnings)
    if ws.roster is None:
        return fail(
            f"{Path(workspace) / 'roster.toml'} does not exist: no roster to export yet "
            "(build one with `rostertui solve`); nothing written."
        )
    from rostertui.core.check import check_roster
    from rostertui.core.io.export import export

    result = check_roster(ws)
    try:
        written = export(ws, fmt, out)
    except OSError as exc:
        return fail(f"cannot write the export: {exc}")
    if as_json:
        print_json({"written": [str(p) for p in written], "format": fmt,
                    "compliant": result.compliant})
    else:
        for path in written:
            print(path)
        if not result.compliant:
            n = result.hard_violations
            print(f"note: the roster has {n} hard violation{'s' if n != 1 else ''} "
                  "(`rostertui check` lists them)", file=sys.stderr)
    return EXIT_OK if result.compliant else EXIT_HARD
