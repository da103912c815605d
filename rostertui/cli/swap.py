"""`rostertui swap WS PERSON DATE PERSON2 [DATE2]`: exchange cells, report what it breaks."""

from __future__ import annotations

import argparse
from datetime import date
from pathlib import Path

from rostertui.cli.args import cell_line, iso_date, violation_line
from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, save_and_warn, warn
from rostertui.core.check import Violation
from rostertui.core.edit.plans import plan_swap
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.diff import CellDiff
from rostertui.core.repair.impact import Impact


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "swap",
        help="exchange two cells; reports the violations this creates",
        description="Exchange cells of WS/roster.toml: two people on DATE; one person on "
        "DATE and DATE2 (give PERSON twice); or two people on DATE and DATE2, each taking "
        "the other's cell on both dates. Prints the cells changed and the violations "
        "created and resolved. Exit 0 when the result keeps every hard rule, 1 when not.",
    )
    p.add_argument("workspace", help="workspace folder")
    p.add_argument("person", help="a person id")
    p.add_argument("date", type=iso_date, help="YYYY-MM-DD")
    p.add_argument("person2", help="the other person id (the same id for two dates)")
    p.add_argument("date2", type=iso_date, nargs="?", help="a second date (optional)")
    p.add_argument("--dry-run", action="store_true", help="report only; write nothing")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_swap(a.workspace, a.person, a.date, a.person2, a.date2,
                                         dry_run=a.dry_run, as_json=a.json))


def do_swap(workspace: str | Path, person: str, day: date, person2: str,
            day2: date | None = None, *, dry_run: bool = False, as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    warn(ws.warnings)
    assert ws.path is not None
    try:
        plan = plan_swap(ws, ws.roster, person, day, person2, day2)
    except EditError as exc:
        return fail(str(exc))
    changed, effect = plan.cells, plan.impact
    if changed and not dry_run:
        save_and_warn(plan.roster, ws.path)
    after = effect.after
    if as_json:
        print_json({"changed": [c.to_json() for c in changed],
                    "created": [v.to_json() for v in effect.created],
                    "resolved": [v.to_json() for v in effect.resolved],
                    "written": bool(changed) and not dry_run,
                    "compliant": after.compliant, "hard_violations": after.hard_violations,
                    "penalty": after.penalty})
    else:
        print(report(ws, changed, effect, dry_run))
    return EXIT_OK if after.compliant else EXIT_HARD


def report(ws: Workspace, changed: list[CellDiff], effect: Impact, dry_run: bool) -> str:
    if not changed:
        return "Nothing to swap: the cells hold the same shift. Nothing written."
    lines = ["Swap" + (" (dry run, nothing written)" if dry_run else "") + ":"]
    lines += ["  " + cell_line(ws, c) for c in changed]
    lines += _section("Creates", effect.created) + _section("Resolves", effect.resolved)
    after = effect.after
    verdict = ("every hard rule kept" if after.compliant
               else f"{after.hard_violations} hard violation(s) now")
    lines.append(f"Penalty {effect.before.penalty} -> {after.penalty}; {verdict}.")
    if not dry_run:
        lines.append(f"Wrote {(ws.path or Path('.')) / 'roster.toml'}.")
    return "\n".join(lines)


def _section(title: str, found: list[Violation]) -> list[str]:
    if not found:
        return [f"{title}: nothing."]
    return [f"{title}:"] + ["  " + violation_line(v) for v in found]
