"""`rostertui diff WS [--against VERSION] [--json]`: cells changed since publication."""

from __future__ import annotations

import argparse
from itertools import groupby
from pathlib import Path

from rostertui.cli.args import cell_line, version_number
from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, warn
from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.io.published import load_published
from rostertui.core.repair.diff import roster_diff


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "diff",
        help="cells changed since the last (or a given) published version",
        description="List every cell of WS/roster.toml that differs from a published "
        "version: person, date, before and after. Exit 0 when the current roster keeps "
        "every hard rule, 1 when it does not.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument("--against", type=version_number, metavar="VERSION",
                   help="a published version number (default: the last)")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_diff(a.workspace, against=a.against, as_json=a.json))


def do_diff(workspace: str | Path, *, against: int | None = None, as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    warn(ws.warnings)
    assert ws.path is not None
    published = load_published(ws.path, against)
    if published is None:
        return fail(f"{ws.path / 'published'}: nothing published yet; "
                    "run rostertui publish first")
    if ws.roster is None:
        return fail(f"{ws.path / 'roster.toml'}: no current roster to compare")
    changed = roster_diff(ws, published.roster, ws.roster)
    if as_json:
        print_json({"changed": [c.to_json() for c in changed]})
    else:
        print(f"Against published {published.label()}:")
        for _pid, cells in groupby(changed, key=lambda c: c.person):
            for c in cells:
                print("  " + cell_line(ws, c))
        people = len({c.person for c in changed})
        print(f"{len(changed)} cell{'s' if len(changed) != 1 else ''} changed"
              + (f" for {people} {'people' if people != 1 else 'person'}." if changed else "."))
    return EXIT_OK if check_roster(ws).compliant else EXIT_HARD
