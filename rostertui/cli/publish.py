"""`rostertui publish WS [--note TEXT] [--json]`: keep the roster as a published version."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, warn
from rostertui.core.check import check_roster
from rostertui.core.errors import Problem
from rostertui.core.io.load import load_workspace
from rostertui.core.io.published import publish


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "publish",
        help="keep the current roster as a published version",
        description="Keep WS/roster.toml as the next published version in WS/published/ "
        "(numbered, with the time and a note); earlier versions are never overwritten.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument("--note", default="", metavar="TEXT", help="a note kept with the version")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_publish(a.workspace, note=a.note, as_json=a.json))


def do_publish(workspace: str | Path, *, note: str = "", as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    warn(ws.warnings)
    if ws.roster is None:
        return fail(f"{Path(workspace) / 'roster.toml'}: no roster to publish yet; "
                    "run rostertui solve first")
    assert ws.path is not None
    check = check_roster(ws)
    notices: list[Problem] = []
    done = publish(ws.path, ws.roster, note, notices=notices)
    warn(notices)
    if as_json:
        print_json({"version": done.version, "at": done.meta.at.isoformat(),
                    "note": done.meta.note, "path": str(done.path),
                    "compliant": check.compliant, "hard_violations": check.hard_violations,
                    "penalty": check.penalty})
    else:
        print(f"Published {done.label()}: {done.path}")
    if not check.compliant:
        print(f"warning: the published roster breaks {check.hard_violations} hard rule(s); "
              "see rostertui check", file=sys.stderr)
        return EXIT_HARD
    return EXIT_OK
