"""Generate a realistic fictional unit of N people for the solver's scale series.

Three shift types (early, late, a night across midnight needing the `rn` skill),
cover scaled to the headcount, 80 % full-time and 20 % part-time with hard hours
bands and soft targets, a forbidden night -> early/late sequence, leave and
requests for some people, and every shipped preset that can be combined
(eu-working-time + care-ward). Written to a folder as a workspace.
"""

from __future__ import annotations

import math
import random
from datetime import date, timedelta
from pathlib import Path
from typing import Any

import tomli_w

START = date(2027, 3, 1)  # a Monday; Europe/Lisbon changes to summer time on 28 Mar


def write_unit(folder: Path, people: int, days: int = 28, seed: int = 0,
               include: tuple[str, ...] = ("eu-working-time", "care-ward")) -> Path:
    rng = random.Random(seed)
    folder.mkdir(parents=True, exist_ok=True)
    ids = [f"s{i:03d}" for i in range(people)]
    staff = []
    for i, pid in enumerate(ids):
        skills = ["rn"] if i % 2 == 0 else ["hca"]
        if i % 5 == 0:
            skills.append("triage")
        staff.append({"id": pid, "name": f"Staff {i + 1:03d}", "skills": skills,
                      "groups": ["part-time" if i % 5 == 4 else "full-time"]})
    unit = {
        "name": f"Generated unit of {people}", "timezone": "Europe/Lisbon",
        "start": START, "days": days, "holidays": [START + timedelta(days=18)],
        "include": list(include),
        "rule": [
            {"id": "ft-band", "kind": "hours", "groups": ["full-time"], "min": 100, "max": 165},
            {"id": "ft-target", "kind": "hours", "groups": ["full-time"], "target": 140,
             "weight": 2},
            {"id": "pt-band", "kind": "hours", "groups": ["part-time"], "min": 40, "max": 105},
            {"id": "no-night-to-day", "kind": "forbidden-sequence", "first": "@night",
             "then": ["E", "L"]},
            {"id": "max-weekends", "kind": "max-weekends", "count": 3, "weight": 10},
        ],
    }
    e, late, n = (max(1, math.ceil(people * f)) for f in (0.2, 0.16, 0.1))
    shifts = {
        "shift": [
            {"code": "E", "name": "Early", "start": "07:00", "end": "15:00", "paid_hours": 7.5},
            {"code": "L", "name": "Late", "start": "14:00", "end": "21:30", "paid_hours": 7},
            {"code": "N", "name": "Night", "start": "21:00", "end": "07:30", "paid_hours": 10,
             "requires": ["rn"]},
        ],
        "cover": [
            {"shift": "E", "min": e, "ideal": e + 1, "under_weight": 100, "over_weight": 5},
            {"shift": "E", "skill": "triage", "min": 1},
            {"shift": "L", "min": late, "ideal": late + 1, "under_weight": 100,
             "over_weight": 5},
            {"shift": "N", "min": n, "max": n + 1},
        ],
    }
    leave, requests = [], []
    for pid in rng.sample(ids, max(1, people // 6)):
        first = START + timedelta(days=rng.randrange(days - 5))
        leave.append({"person": pid, "from": first, "to": first + timedelta(days=4),
                      "credit_hours": 7.5})
    for pid in rng.sample(ids, max(1, people // 2)):
        day = START + timedelta(days=rng.randrange(days))
        kind = rng.choice(["off", "E", "L"])
        requests.append({"person": pid, "date": day, "want": kind,
                         "weight": rng.randint(1, 5)})
    files: dict[str, dict[str, Any]] = {
        "unit.toml": unit, "staff.toml": {"person": staff}, "shifts.toml": shifts,
        "requests.toml": {"leave": leave, "request": requests},
    }
    for name, data in files.items():
        (folder / name).write_text(tomli_w.dumps(data))
    return folder
