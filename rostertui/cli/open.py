"""`rostertui open [WS]`: the terminal UI on a workspace."""

from __future__ import annotations

import argparse
from pathlib import Path

from rostertui.cli.output import EXIT_OK, warn
from rostertui.core.io.load import load_workspace


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "open",
        help="the terminal UI on a workspace",
        description="Open the roster grid, violations, fairness and live solve on a workspace. "
        "F1 in the UI lists every key.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.set_defaults(run=lambda a: do_open(a.workspace))


def do_open(workspace: str | Path = ".") -> int:
    """Load the workspace (InputError propagates: exit 2, nothing written) and run the UI."""
    ws = load_workspace(workspace)
    warn(ws.warnings)
    from rostertui.tui.app import RosterApp  # textual only when the UI is wanted

    app = RosterApp(ws)
    app.run()
    return EXIT_OK if app.return_code in (None, 0) else int(app.return_code)
