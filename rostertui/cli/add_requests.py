"""`rostertui add-requests WS FILE.csv [--dry-run] [--json]`: soft requests from a CSV."""

from __future__ import annotations

import argparse
from pathlib import Path

from rostertui.cli.output import EXIT_OK, print_json, warn
from rostertui.core.errors import InputError, Problem
from rostertui.core.intake.requests_csv import RequestsImport, plan_requests
from rostertui.core.io.load import load_workspace
from rostertui.core.io.transaction import transaction


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "add-requests",
        help="add soft requests from a CSV (a spreadsheet or a form export) to requests.toml",
        description="Append one [[request]] per row of FILE.csv to WS/requests.toml, keeping "
        "its comments. Columns: person, date, then want / avoid (or one request column: off, "
        "N, avoid N), and optionally weight and note; comma- or semicolon-separated, UTF-8 "
        "with or without a BOM. Rows already in requests.toml are skipped. Every bad row is "
        "reported by line and nothing is written (exit 2).",
    )
    p.add_argument("workspace", help="workspace folder")
    p.add_argument("file", metavar="FILE.csv", help="the requests, one per row")
    p.add_argument("--dry-run", action="store_true", help="check and say what would be "
                   "added; write nothing")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_add_requests(a.workspace, a.file, dry_run=a.dry_run,
                                                 as_json=a.json))


def do_add_requests(workspace: str | Path, file: str | Path, *, dry_run: bool = False,
                    as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    assert ws.path is not None
    if not Path(file).is_file():
        raise InputError([Problem(str(file), "", "no such file (a CSV of requests)")])
    plan = plan_requests(Path(file), ws)
    if not plan.ok:
        raise InputError(plan.problems)
    warn(plan.skipped_notices())
    target = ws.path / "requests.toml"
    written = False
    if plan.added and not dry_run:
        assert plan.requests is not None
        with transaction(ws.path, "add-requests") as tx:
            tx.save(plan.requests)
        warn(tx.notices)
        written = True
    if as_json:
        print_json({"added": len(plan.added), "skipped": len(plan.skipped),
                    "per_person": plan.per_person(), "dry_run": dry_run,
                    "written": str(target) if written else None})
    else:
        print(summary(plan, target, dry_run))
    return EXIT_OK


def summary(plan: RequestsImport, target: Path, dry_run: bool) -> str:
    n = len(plan.added)
    if not n:
        return (f"nothing to add: every request in {plan.label} is already in {target}"
                if plan.skipped else f"nothing to add from {plan.label}")
    verb = "would add" if dry_run else "added"
    head = f"{verb} {n} request{'s' if n != 1 else ''} from {plan.label} to {target}"
    if plan.skipped:
        head += f" ({len(plan.skipped)} already there, skipped)"
    people = ", ".join(f"{pid} {k}" for pid, k in plan.per_person().items())
    return f"{head}\n  per person: {people}" + ("\nnothing written (--dry-run)." if dry_run
                                                else "")
