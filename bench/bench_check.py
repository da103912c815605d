"""Time the checker (and the loader) on a large unit: 200 people x 31 days by default.

Not a test: run it by hand and copy the table into BENCHMARKS.md (see bench/README.md).

The workspace is written to a temporary folder: four shift types (a night across
midnight among them), cover by skill, leave and requests, a week of history for
everyone, and a random roster. It is checked under every shipped preset; presets
that share rule ids cannot be combined, so there are two rule sets:

  eu-working-time + care-ward   and   uk-working-time + care-ward

each alone and with local rules of every other kind of rules.md (hours bands and
targets, forbidden sequences, min/max shifts, min stretches, weekends, not-available,
balance), so that every rule kind is evaluated. Times are the best of --repeat runs
after one warm-up run.
"""

from __future__ import annotations

import argparse
import platform
import random
import sys
import tempfile
import time
from collections.abc import Callable
from datetime import date, timedelta
from pathlib import Path
from typing import Any

import tomli_w

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace

START = date(2027, 3, 1)  # a Monday; the month holds the EU change to summer time
SHIFTS = [
    {"code": "E", "name": "Early", "start": "07:00", "end": "15:00", "paid_hours": 7.5},
    {"code": "D", "name": "Day", "start": "09:00", "end": "17:30", "paid_hours": 8},
    {"code": "L", "name": "Late", "start": "14:00", "end": "21:30", "paid_hours": 7},
    {"code": "N", "name": "Night", "start": "21:00", "end": "07:30", "paid_hours": 10,
     "requires": ["rn"]},
]
# Presets that share rule ids cannot be combined: every shipped preset is in one of these.
RULE_SETS = (["eu-working-time", "care-ward"], ["uk-working-time", "care-ward"])
LOCAL_RULES: list[dict[str, Any]] = [
    {"id": "ft-band", "kind": "hours", "groups": ["full-time"], "min": 120, "max": 170},
    {"id": "ft-target", "kind": "hours", "groups": ["full-time"], "target": 150, "weight": 2},
    {"id": "pt-band", "kind": "hours", "groups": ["part-time"], "min": 60, "max": 110,
     "target": 90, "weight": 2},
    {"id": "no-day-after-night", "kind": "forbidden-sequence", "first": "@night",
     "then": ["E", "D", "L"]},
    {"id": "night-team-nights", "kind": "min-shifts", "shift": "N", "count": 8,
     "groups": ["night-team"], "weight": 5},
    {"id": "max-nights", "kind": "max-shifts", "shift": "N", "count": 12, "weight": 10},
    {"id": "min-run", "kind": "min-consecutive-days", "days": 2, "weight": 3},
    {"id": "min-off", "kind": "min-consecutive-off", "days": 2, "weight": 3},
    {"id": "weekends-cap", "kind": "max-weekends", "count": 2, "weight": 10},
    {"id": "no-sunday-earlies", "kind": "not-available", "days": ["sun"], "shift": "E",
     "groups": ["part-time"], "weight": 4},
    {"id": "fair-hours", "kind": "balance", "metric": "hours", "weight": 1},
    {"id": "fair-lates", "kind": "balance", "metric": "shift:L", "weight": 2},
    {"id": "fair-shifts", "kind": "balance", "metric": "shifts", "weight": 1},
]


def build(folder: Path, people: int, days: int, presets: list[str], local: bool,
          seed: int) -> Path:
    """Write the benchmark workspace with a random roster into `folder`."""
    rng = random.Random(seed)
    folder.mkdir(parents=True)
    dates = [START + timedelta(days=i) for i in range(days)]
    ids = [f"s{i:03d}" for i in range(people)]
    staff = []
    for i, pid in enumerate(ids):
        skills = ["rn"] if i % 3 else ["rn", "triage"]
        if i % 4 == 3:
            skills = ["hca"]
        groups = ["part-time"] if i % 5 == 4 else ["full-time"]
        if i % 7 == 0:
            groups.append("night-team")
        staff.append({"id": pid, "name": f"Person {i}", "skills": skills, "groups": groups})
    scale = max(1, people // 14)
    cover: list[dict[str, Any]] = [
        {"shift": "E", "days": ["mon", "tue", "wed", "thu", "fri"], "min": 3 * scale,
         "ideal": 4 * scale, "under_weight": 60, "over_weight": 10},
        {"shift": "E", "skill": "triage", "min": scale},
        {"shift": "D", "ideal": 2 * scale, "under_weight": 20, "over_weight": 5},
        {"shift": "L", "min": 2 * scale, "max": 5 * scale, "ideal": 3 * scale,
         "under_weight": 60, "over_weight": 20},
        {"shift": "L", "skill": "rn", "min": scale},
        {"shift": "N", "min": 2 * scale, "max": 3 * scale},
        {"shift": "N", "skill": "rn", "min": scale},
    ]
    leave, requests = [], []
    for pid in ids:
        if rng.random() < 0.3:
            first = START + timedelta(days=rng.randrange(days))
            leave.append({"person": pid, "from": first,
                          "to": first + timedelta(days=rng.randrange(5)), "credit_hours": 7.5})
        for _ in range(rng.randrange(4)):
            day = rng.choice(dates)
            if rng.random() < 0.5:
                requests.append({"person": pid, "date": day, "want": "off", "weight": 3})
            else:
                requests.append({"person": pid, "date": day, "avoid": rng.choice("EDLN"),
                                 "weight": 2})
    codes = ["E", "D", "L", "N", "-", "-", "-"]
    history = {
        "rows": {pid: [rng.choice(codes) for _ in range(7)] for pid in ids},
        "hours_before": {pid: float(rng.randrange(300, 700)) for pid in ids[::3]},
    }
    rows = {pid: [rng.choice(codes) for _ in range(days)] for pid in ids}
    unit: dict[str, Any] = {
        "name": f"Benchmark unit ({people} people)", "timezone": "Europe/Lisbon",
        "start": START, "days": days, "holidays": [START + timedelta(days=18)],
        "include": presets,
    }
    if local:
        unit["rule"] = LOCAL_RULES
    files = {
        "unit": unit,
        "staff": {"person": staff},
        "shifts": {"shift": SHIFTS, "cover": cover},
        "requests": {"leave": leave, "request": requests},
        "history": history,
        "roster": {"start": START, "days": days, "rows": rows},
    }
    for name, data in files.items():
        (folder / f"{name}.toml").write_text(tomli_w.dumps(data), encoding="utf-8")
    return folder


def best_of(repeat: int, fn: Callable[[], object]) -> float:
    """Best wall time in seconds of `repeat` runs, after one warm-up run."""
    fn()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return min(times)


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--people", type=int, default=200)
    parser.add_argument("--days", type=int, default=31)
    parser.add_argument("--repeat", type=int, default=5, help="timed runs after a warm-up")
    parser.add_argument("--seed", type=int, default=0)
    args = parser.parse_args(argv)

    print(f"rostertui check benchmark: {args.people} people x {args.days} days, seed "
          f"{args.seed}, best of {args.repeat} after a warm-up")
    print(f"Python {platform.python_version()} on {platform.platform()}, "
          f"{platform.processor() or platform.machine()}\n")
    head = (f"{'rule set':<44} {'rules':>5} {'violations':>10} {'penalty':>9} "
            f"{'load (s)':>9} {'check (s)':>9}")
    print(head)
    print("-" * len(head))
    worst = 0.0
    with tempfile.TemporaryDirectory() as tmp:
        runs = [(presets, local) for presets in RULE_SETS for local in (False, True)]
        for i, (presets, local) in enumerate(runs):
            name = " + ".join(presets) + (" + local rules" if local else "")
            folder = build(Path(tmp) / f"ws{i}", args.people, args.days, presets, local,
                           args.seed)
            ws = load_workspace(folder)
            load_s = best_of(args.repeat, lambda f=folder: load_workspace(f))
            check_s = best_of(args.repeat, lambda w=ws: check_roster(w))
            result = check_roster(ws)
            worst = max(worst, check_s)
            print(f"{name:<44} {len(ws.rules):>5} {len(result.violations):>10} "
                  f"{result.penalty:>9} {load_s:>9.3f} {check_s:>9.3f}")
    target = 0.5
    verdict = "within" if worst < target else "OVER"
    print(f"\nslowest check {worst:.3f} s: {verdict} the {target} s target")
    return 0 if worst < target else 1


if __name__ == "__main__":
    sys.exit(main())
