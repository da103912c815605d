"""`rostertui absent WS PERSON FROM [TO] [--reason TEXT]`: record an absence as leave."""

from __future__ import annotations

import argparse
from datetime import date
from pathlib import Path

from rostertui.cli.args import cell_line, iso_date, violation_line
from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, warn
from rostertui.core.edit.plans import plan_absence
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.io.transaction import transaction


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "absent",
        help="record an absence as leave; reports the cover it breaks",
        description="Add a [[leave]] for PERSON from FROM to TO (default: FROM) to "
        "requests.toml and clear their shifts on those dates in roster.toml. Prints the "
        "shifts cleared and the cover now short; `rostertui repair` then fills the gaps. "
        "Exit 0 when the roster still keeps every hard rule, 1 when not.",
    )
    p.add_argument("workspace", help="workspace folder")
    p.add_argument("person", help="a person id")
    p.add_argument("first", metavar="FROM", type=iso_date, help="first day absent, YYYY-MM-DD")
    p.add_argument("last", metavar="TO", type=iso_date, nargs="?",
                   help="last day absent (default: FROM)")
    p.add_argument("--reason", metavar="TEXT", help="e.g. \"sick\"; kept with the leave")
    p.add_argument("--credit-hours", type=float, metavar="H",
                   help="paid hours credited per absent day (counted by hours rules)")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_absent(a.workspace, a.person, a.first, a.last,
                                           reason=a.reason, credit_hours=a.credit_hours,
                                           as_json=a.json))


def do_absent(workspace: str | Path, person: str, first: date, last: date | None = None, *,
              reason: str | None = None, credit_hours: float | None = None,
              as_json: bool = False) -> int:
    ws = load_workspace(workspace)
    warn(ws.warnings)
    assert ws.path is not None
    try:
        plan = plan_absence(ws, ws.roster, person, first, last, reason, credit_hours)
    except EditError as exc:
        return fail(str(exc))
    absence, effect = plan.absence, plan.impact
    with transaction(ws.path, "absent") as tx:  # both files, or neither
        tx.save(absence.requests)  # the leave first: it is what the user typed
        if absence.cleared and absence.roster is not None:
            tx.save(absence.roster)
    warn(tx.notices)
    after = effect.after
    if as_json:
        print_json({"leave": absence.leave.model_dump(mode="json", by_alias=True,
                                                      exclude_none=True),
                    "cleared": [c.to_json() for c in absence.cleared],
                    "created": [v.to_json() for v in effect.created],
                    "compliant": after.compliant, "hard_violations": after.hard_violations,
                    "penalty": after.penalty})
        return EXIT_OK if after.compliant else EXIT_HARD
    lv = absence.leave
    span = f"{lv.from_}" + (f" to {lv.to}" if lv.to else "")
    print(f"Recorded leave for {person} on {span} in {ws.path / 'requests.toml'}.")
    if ws.roster is None:
        print("No roster yet: nothing to clear.")
    elif not absence.cleared:
        print("They had no shift on those dates: the roster is unchanged.")
    else:
        print(f"Cleared {len(absence.cleared)} shift(s) in {ws.path / 'roster.toml'}:")
        for c in absence.cleared:
            print("  " + cell_line(ws, c))
    short = [v for v in effect.created if v.kind == "cover"]
    if short:
        print("Cover now short:")
        for v in short:
            print("  " + violation_line(v))
        print("Run rostertui repair to fill the gaps with as few changes as possible.")
    return EXIT_OK if after.compliant else EXIT_HARD

