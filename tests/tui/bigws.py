"""A large workspace for UI speed checks: the clinic's rules and shifts, N people x D days,
and a roster with a plausible (and imperfect) pattern, so there are many violations."""

from __future__ import annotations

import random
import shutil
from datetime import date, timedelta
from pathlib import Path

from tests.conftest import DEMO

CODES = ("E", "L", "N", "-")


def make_big_workspace(dest: Path, people: int = 100, days: int = 31, seed: int = 7) -> Path:
    rng = random.Random(seed)
    dest.mkdir(parents=True, exist_ok=True)
    shutil.copy(DEMO / "clinic" / "shifts.toml", dest / "shifts.toml")
    unit = (DEMO / "clinic" / "unit.toml").read_text(encoding="utf-8")
    unit = unit.replace("start = 2027-03-15", "start = 2027-05-03").replace(
        "days = 28", f"days = {days}").replace("holidays = [2027-03-26]", "holidays = [2027-05-13]")
    (dest / "unit.toml").write_text(unit, encoding="utf-8")
    staff, rows, requests = [], [], []
    start = date(2027, 5, 3)
    for i in range(1, people + 1):
        pid = f"p{i:03d}"
        skills = ["rn", "triage"] if i % 4 == 0 else ["rn"] if i % 2 == 0 else ["hca"]
        groups = ["part-time"] if i % 5 == 0 else ["full-time", "night-team"] if i % 7 == 0 \
            else ["full-time"]
        staff.append(f'[[person]]\nid = "{pid}"\nname = "Person {i:03d} Example"\n'
                     f"skills = {skills!r}\ngroups = {groups!r}\n".replace("'", '"'))
        row = [rng.choice(CODES) for _ in range(days)]
        rows.append(f"{pid} = [{', '.join(repr(c) for c in row)}]".replace("'", '"'))
        if i % 3 == 0:
            day = start + timedelta(days=rng.randrange(days))
            requests.append(f'[[request]]\nperson = "{pid}"\ndate = {day}\nwant = "off"\n'
                            "weight = 3\n")
    (dest / "staff.toml").write_text("\n".join(staff), encoding="utf-8")
    (dest / "requests.toml").write_text("\n".join(requests), encoding="utf-8")
    (dest / "roster.toml").write_text(
        f"start = {start}\ndays = {days}\n\n[rows]\n" + "\n".join(rows) + "\n", encoding="utf-8")
    return dest
