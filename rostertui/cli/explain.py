"""`rostertui explain WS [--time-limit S] [--json]`: why no roster keeps every hard rule."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from rostertui.cli.output import EXIT_HARD, EXIT_OK, print_json, warn
from rostertui.core.explain.run import Explanation, explain
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "explain",
        help="why no roster keeps every hard rule, in plain words (or that one exists)",
        description="Check whether a roster can keep every hard rule. If not, say why: "
        "counting checks (cover against the people free, hours against the period, locks "
        "alone), a small set of rules, cover, locks and leave that cannot all hold, and "
        "where the cover would fall short. If one can, price each request the current "
        "roster denies. Exit 0 when a roster can keep every hard rule, 1 when not.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument("--time-limit", type=float, default=60.0, metavar="S",
                   help="seconds for the whole explanation (default 60)")
    p.add_argument("--workers", type=int, default=0, metavar="N",
                   help="search threads (default: every core)")
    p.add_argument("--no-requests", action="store_true",
                   help="do not price the requests the roster denies")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_explain(a.workspace, time_limit=a.time_limit,
                                            workers=a.workers, requests=not a.no_requests,
                                            as_json=a.json))


def do_explain(workspace: str | Path, *, time_limit: float = 60.0, workers: int = 0,
               requests: bool = True, as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    warn(ws.warnings)
    result = explain(ws, time_limit, workers, on_progress=_progress,
                     price_requests=requests)
    if as_json:
        print_json(result.to_json(ws))
    else:
        print(report(ws, result))
    return EXIT_OK if result.feasible else EXIT_HARD


def _progress(message: str) -> None:
    print(f"  ... {message}", file=sys.stderr, flush=True)


def report(ws: Workspace, result: Explanation) -> str:
    lines: list[str] = []
    if result.feasible:
        lines.append(f"{ws.unit.name}: a roster exists that keeps every hard rule.")
    elif result.decided:
        lines.append(f"{ws.unit.name}: no roster can keep every hard rule.")
    else:
        lines.append(f"{ws.unit.name}: not settled within the time limit.")
    for i, reason in enumerate(result.reasons, start=1):
        lines.append(f"\n{i}. {reason.message}")
    if result.requests:
        lines.append("\nRequests the current roster does not grant:")
        lines += [f"  - {c.message(ws)}" for c in result.requests]
    return "\n".join(lines)
