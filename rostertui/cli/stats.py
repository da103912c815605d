"""`rostertui stats WS [--roster FILE] [--json]`: per-person and per-group statistics.

Human output: one aligned line per person, then one per group (staff groups in
order of first appearance, then "everyone"). With no roster yet it says so and
shows the zero statistics; the exit status is 0 either way (2 on unreadable
input, raised as `InputError` and reported by `main`).

`--json` prints exactly one object, `{"people": [...], "groups": [...]}`. Hours
and means are numbers with decimals (exact values as floats); counts are ints.

Each entry of `people` (staff order):
  `person`, `name`, `groups`   id, display name, group codes
  `hours`                      paid hours of shifts + leave credit (rules.md "Hours")
  `paid_hours`, `leave_hours`  the two parts of `hours`
  `hours_rule`                 id of the first `hours` rule that applies, or null
  `hours_min`, `hours_max`, `hours_target`   that rule's bounds (null when absent)
  `hours_deviation`            hours - target, else hours - (min + max) / 2, else null
  `shifts`, `by_shift`         shifts worked; per shift code (every code, 0 included)
  `nights`                     shifts whose night flag is true
  `weekend_days`, `weekends`   working days on weekend days or holidays; weekends worked
  `holidays`                   working days on holidays
  `requests_asked`, `requests_granted`, `requests_denied`   requests inside the period
  `longest_stretch`            longest working stretch with a day in the period,
                               history days before the period included

Each entry of `groups`:
  `group`, `everyone`          the group code ("everyone" with `everyone` true for all)
  `people`, `members`          how many, and their ids in staff order
  `nights`, `weekends`, `hours_deviation`   each `{"count", "mean", "spread", "min",
                               "max"}`; `count` = people measured (for hours_deviation,
                               only those with a target or both bounds); null when 0
"""

from __future__ import annotations

import argparse
from collections.abc import Sequence
from fractions import Fraction
from pathlib import Path

from rostertui.cli.output import EXIT_OK, print_json, warn
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.stats import PersonStats, RosterStats, Summary, roster_stats
from rostertui.core.words import number

PEOPLE_HEADER = (
    "Id", "Name", "Hours", "Shifts", "Nights", "Wkend days", "Wkends", "Hols",
    "Requests", "Longest", "By shift",
)
PEOPLE_ALIGN = "llrrrrrrrrl"
GROUP_HEADER = ("Group", "People", "Nights", "Weekends", "Hours vs target")
GROUP_ALIGN = "lrrrr"


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "stats",
        help="per-person and per-group statistics of a roster",
        description="Hours against each person's hours rule, shifts, nights, weekends, "
        "holidays, requests granted and the longest working stretch, then the mean and "
        "spread per group. Exit 0, or 2 on unreadable input.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument(
        "--roster", metavar="FILE", help="a roster TOML or a CSV person,date,shift to measure"
    )
    p.add_argument("--json", action="store_true", help='print one JSON object {"people", "groups"}')
    p.set_defaults(run=lambda a: do_stats(a.workspace, roster=a.roster, as_json=a.json))


def do_stats(
    workspace: str | Path, *, roster: str | Path | None = None, as_json: bool = False
) -> int:
    ws = load_workspace(workspace, roster_file=roster)
    warn(ws.warnings)
    stats = roster_stats(ws)
    if as_json:
        print_json(stats.to_json())
    else:
        print(human_report(ws, stats))
    return EXIT_OK


def table(header: Sequence[str], rows: Sequence[Sequence[str]], align: str) -> list[str]:
    """Lines of a table: columns padded to their widest cell, "l"eft or "r"ight aligned."""
    widths = [max(len(r[i]) for r in [header, *rows]) for i in range(len(header))]
    out: list[str] = []
    for row in [header, *rows]:
        cells = [
            cell.ljust(w) if a == "l" else cell.rjust(w)
            for cell, w, a in zip(row, widths, align, strict=True)
        ]
        out.append("  " + "  ".join(cells).rstrip())
    return out


def contract(p: PersonStats) -> str:
    """Hours against the person's hours rule: "148.5/150" (target), "36/16-60" (bounds)."""
    hours = number(p.hours)
    if p.hours_target is not None:
        return f"{hours}/{number(p.hours_target)}"
    if p.hours_min is not None and p.hours_max is not None:
        return f"{hours}/{number(p.hours_min)}-{number(p.hours_max)}"
    if p.hours_min is not None:
        return f"{hours}/>={number(p.hours_min)}"
    if p.hours_max is not None:
        return f"{hours}/<={number(p.hours_max)}"
    return hours


def signed(value: Fraction | int) -> str:
    return ("+" if value > 0 else "") + number(value)


def summary(s: Summary, sign: bool = False) -> str:
    """ "mean / spread", e.g. "1.5 / 2"; "n/a" when nobody is measured."""
    if s.mean is None or s.spread is None:
        return "n/a"
    mean = signed(s.mean) if sign else number(s.mean)
    return f"{mean} / {number(s.spread)}"


def _person_row(p: PersonStats) -> list[str]:
    by_shift = ", ".join(f"{code} {k}" for code, k in p.by_shift.items() if k)
    return [
        p.person, p.name, contract(p), str(p.shifts), str(p.nights), str(p.weekend_days),
        str(p.weekends), str(p.holidays), f"{p.requests_granted}/{p.requests_asked}",
        str(p.longest_stretch), by_shift,
    ]


def human_report(ws: Workspace, stats: RosterStats) -> str:
    """The people table, then the groups table (mean / spread per metric)."""
    def plural(n: int, word: str) -> str:
        return f"{n} {word}{'' if n == 1 else 's'}"

    head = (
        f"{ws.unit.name}: {ws.unit.start} to {ws.unit.end} "
        f"({plural(stats.weekends_in_period, 'weekend')}, "
        f"{plural(stats.holidays_in_period, 'holiday')})"
    )
    out = [head]
    if not stats.has_roster:
        out.append("No roster yet: every person counts as off every day.")
    out.append("")
    out += table(PEOPLE_HEADER, [_person_row(p) for p in stats.people], PEOPLE_ALIGN)
    out.append("")
    group_rows = [
        [g.group, str(g.people), summary(g.nights), summary(g.weekends),
         summary(g.hours_deviation, sign=True)]
        for g in stats.groups
    ]
    out += table(GROUP_HEADER, group_rows, GROUP_ALIGN)
    out.append(
        "\n  Hours: worked/target (or min-max); requests: granted/asked; groups: mean / spread"
        "\n  (max - min); hours vs target counts only people with a target or both bounds."
    )
    return "\n".join(out)
