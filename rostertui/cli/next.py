"""`rostertui next WS [NEW_DIR] [--days N] [--from-version N] [--holidays D,...] [--force]
[--json]`: start the next period in a new workspace folder."""

from __future__ import annotations

import argparse
from datetime import date
from pathlib import Path

from rostertui.cli.args import iso_date, version_number
from rostertui.cli.output import EXIT_HARD, EXIT_OK, print_json, warn
from rostertui.core.cycle import plan_next, preview_lines, write_plan
from rostertui.core.io.load import load_workspace
from rostertui.core.io.published import load_published


def date_list(text: str) -> list[date]:
    """argparse type: dates as YYYY-MM-DD separated by commas (may be empty)."""
    return [iso_date(part) for part in (p.strip() for p in text.split(",")) if part]


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "next",
        help="start the next period: a new workspace whose history is what was worked",
        description="Make the next period's workspace from WS: a new folder (never one that "
        "exists) starting the day after WS's period ends, with unit.toml (new start, days "
        "and holidays; comments kept), staff.toml and shifts.toml copied, the leave and "
        "requests that reach into the new period, and history.toml written from WS's "
        "roster: the days the rules look back over, and hours_before for the averaging "
        "rules. Refuses (exit 2, nothing written) when WS has no roster, when WS cannot be "
        "read, when the target exists, or when the roster breaks a hard rule (unless "
        "--force). Exit 0 when written; 1 when written with --force from a roster that "
        "breaks a hard rule.",
    )
    p.add_argument("workspace", help="the current period's workspace folder")
    p.add_argument("new_dir", metavar="NEW_DIR", nargs="?",
                   help="folder for the next period (default: a sibling named after the new "
                   "start, e.g. ward-b-2027-04-12; a trailing date in WS's name is replaced)")
    p.add_argument("--days", type=int, metavar="N",
                   help="length of the new period (default: the same as WS's)")
    p.add_argument("--from-version", type=version_number, metavar="N",
                   help="take the history from published version N instead of roster.toml")
    p.add_argument("--holidays", type=date_list, metavar="DATES", default=None,
                   help="the new period's holidays, e.g. 2027-04-05,2027-05-01 (the old "
                   "ones are past and not kept)")
    p.add_argument("--force", action="store_true",
                   help="start from a roster that breaks a hard rule (history.toml says so)")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_next(
        a.workspace, a.new_dir, days=a.days, version=a.from_version, holidays=a.holidays,
        force=a.force, as_json=a.json))


def do_next(
    workspace: str | Path, new_dir: str | Path | None = None, *, days: int | None = None,
    version: int | None = None, holidays: list[date] | None = None, force: bool = False,
    as_json: bool = False,
) -> int:
    label = "roster.toml"
    roster_file = None
    if version is not None:
        published = load_published(workspace, version)
        assert published is not None
        roster_file, label = published.path, f"published version {version}"
    ws = load_workspace(workspace, roster_file=roster_file)
    warn(ws.warnings)
    plan = plan_next(ws, Path(new_dir) if new_dir is not None else None, days=days,
                     holidays=holidays, force=force, roster_label=label)
    new_ws = write_plan(plan)
    if as_json:
        print_json(plan.to_json())
    else:
        print("\n".join(preview_lines(plan)))
        for w in plan.warnings:
            print(f"warning: {w}")
        warn(new_ws.warnings)
    return EXIT_HARD if plan.hard_violations else EXIT_OK
