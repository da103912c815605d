"""`rostertui check WS [--roster FILE] [--json]`: audit a roster against the rules."""

from __future__ import annotations

import argparse
from collections import defaultdict
from pathlib import Path
from typing import TYPE_CHECKING

from rostertui.cli.output import EXIT_HARD, EXIT_OK, print_json, warn
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace

if TYPE_CHECKING:
    from rostertui.core.check import CheckResult, Violation


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "check",
        help="audit a roster against the rules (or validate a workspace with no roster yet)",
        description="Audit a roster against every rule; with no roster yet, validate the "
        "workspace. Exit 0 compliant, 1 hard violations, 2 unreadable input.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument(
        "--roster", metavar="FILE", help="a roster TOML or a CSV person,date,shift to audit"
    )
    p.add_argument("--json", action="store_true", help="print one JSON object (rules.md shape)")
    p.set_defaults(run=lambda a: do_check(a.workspace, roster=a.roster, as_json=a.json))


def do_check(
    workspace: str | Path, *, roster: str | Path | None = None, as_json: bool = False
) -> int:
    ws = load_workspace(workspace, roster_file=roster)
    warn(ws.warnings)
    if ws.roster is None:
        if as_json:
            print_json(
                {"compliant": True, "hard_violations": 0, "penalty": 0, "by_kind": {},
                 "violations": [], "roster": None}
            )
        else:
            print(
                f"{ws.unit.name}: the workspace is valid ({len(ws.staff.person)} people, "
                f"{len(ws.shifts.shift)} shift types, {len(ws.rules)} rules); "
                "no roster yet to check."
            )
        return EXIT_OK
    from rostertui.core.check import check_roster

    result = check_roster(ws)
    if as_json:
        print_json(result.to_json())
    else:
        print(human_report(ws, result))
    return EXIT_OK if result.compliant else EXIT_HARD


def _line(v: Violation) -> str:
    tag = "HARD" if v.hard else f"soft {v.penalty:>5}"
    src = f"  [{v.source}]" if v.source else ""
    return f"    {tag:<10} {v.rule}: {v.message}{src}"


def human_report(ws: Workspace, result: CheckResult) -> str:
    """Violations grouped by person then date, the penalty by kind, a verdict."""
    names = {p.id: p.name for p in ws.staff.person}
    order = {pid: i for i, pid in enumerate(ws.person_ids)}
    by_person: dict[str | None, list[Violation]] = defaultdict(list)
    for v in result.violations:
        by_person[v.person].append(v)
    out = [f"{ws.unit.name}: {ws.unit.start} to {ws.unit.end}"]
    people = sorted((p for p in by_person if p is not None), key=lambda p: order.get(p, 1 << 30))
    for pid in people:
        out.append(f"\n  {names.get(pid, pid)} ({pid})")
        for v in sorted(by_person[pid], key=lambda v: (v.dates[:1] or (ws.unit.end,), v.rule)):
            out.append(_line(v))
    if by_person.get(None):
        out.append("\n  Cover and unit-wide")
        for v in sorted(by_person[None], key=lambda v: (v.dates[:1], v.rule)):
            out.append(_line(v))
    if result.by_kind:
        out.append("\n  Penalty by kind")
        for kind, agg in sorted(result.by_kind.items(), key=lambda kv: -kv[1]["penalty"]):
            out.append(f"    {kind:<26} {agg['units']:>6} units {agg['penalty']:>8}")
    if result.compliant:
        verdict = f"\nCompliant: no hard rule broken; penalty {result.penalty}."
    else:
        verdict = (
            f"\nNOT compliant: {result.hard_violations} hard violation"
            f"{'s' if result.hard_violations != 1 else ''}; penalty {result.penalty}."
        )
    out.append(verdict)
    return "\n".join(out)
