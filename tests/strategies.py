"""Random small workspaces for property tests (hypothesis), written as TOML.

2-6 people with random skills and groups, 1-4 shift types at random clock times
(nights across midnight, 24-hour shifts, DST zones), 3-14 days, random cover,
rules of every kind of rules.md (hard or soft, random weights and scopes), leave
and requests, random history, and a random roster. Used by the checker's and
the solver's property tests.
"""

from __future__ import annotations

from datetime import date, timedelta
from pathlib import Path
from typing import Any

import tomli_w
from hypothesis import HealthCheck
from hypothesis import strategies as st

from rostertui.core.models.rules import RULE_KINDS

Spec = dict[str, Any]  # one key per file: unit, staff, shifts, requests, history, roster

OFF = "-"
WEEKDAYS = ("mon", "tue", "wed", "thu", "fri", "sat", "sun")
SKILLS = ("rn", "hca", "tri")  # shorter than 4: never taken for a typo of one another
GROUPS = ("g1", "g2", "nt")
CODES = ("E", "D", "L", "N", "X", "tw")
PEOPLE = ("p1", "p2", "p3", "p4", "p5", "p6")
ZONES = ("UTC", "Europe/Lisbon", "America/New_York", "Australia/Sydney")
# Starts near the DST changes of 2027 (Europe 28 Mar / 31 Oct, US 14 Mar / 7 Nov,
# Sydney 4 Apr / 3 Oct) and anywhere else in the year.
STARTS = st.one_of(
    st.dates(date(2027, 3, 8), date(2027, 4, 6)),
    st.dates(date(2027, 9, 28), date(2027, 11, 8)),
    st.dates(date(2026, 12, 20), date(2027, 12, 31)),
)
BUILTIN = ("leave", "requires", "lock", "cover", "request")
SETTINGS = dict(deadline=None, suppress_health_check=[HealthCheck.too_slow])


# --- generating a workspace --------------------------------------------------------------


def _subset(draw, items, min_size=0) -> list:
    return draw(st.lists(st.sampled_from(list(items)), min_size=min_size, unique=True)
                ) if items else []


def _clock(draw) -> str:
    minute = draw(st.one_of(st.integers(0, 95).map(lambda q: q * 15), st.integers(0, 1439)))
    return f"{minute // 60:02d}:{minute % 60:02d}"


def _shift(draw, code: str, held: list[str]) -> dict[str, Any]:
    shift: dict[str, Any] = {"code": code, "name": f"Shift {code}",
                             "start": _clock(draw), "end": _clock(draw)}
    if code == "N" and draw(st.booleans()):  # a classic night across midnight
        shift["start"], shift["end"] = "22:00", draw(st.sampled_from(["06:00", "07:30"]))
    paid = draw(st.one_of(st.none(), st.sampled_from([0, 4, 7.5, 7.6, 8.25, 10, 12.5, 24])))
    if paid is not None:
        shift["paid_hours"] = paid
    night = draw(st.sampled_from([None, True, False]))
    if night is not None:
        shift["night"] = night
    if held and draw(st.integers(0, 3)) == 0:
        shift["requires"] = _subset(draw, held, 1)[:1]
    return shift


def _cover(draw, codes: list[str], dates: list[date], held: list[str]) -> dict[str, Any]:
    c: dict[str, Any] = {"shift": draw(st.sampled_from(codes))}
    which = draw(st.integers(0, 2))
    if which == 1:
        c["days"] = _subset(draw, WEEKDAYS, 1)
    elif which == 2:
        c["dates"] = sorted(_subset(draw, dates, 1))
    if held and draw(st.booleans()):
        c["skill"] = draw(st.sampled_from(held))
    low = draw(st.one_of(st.none(), st.integers(0, 3)))
    high = draw(st.one_of(st.none(), st.integers(low or 0, 4)))
    ideal = draw(st.one_of(st.none(), st.integers(0, 4)))
    for key, value in (("min", low), ("max", high), ("ideal", ideal)):
        if value is not None:
            c[key] = value
    if ideal is not None:
        c["under_weight"] = draw(st.integers(0, 100))
        if draw(st.booleans()):
            c["over_weight"] = draw(st.integers(0, 50))
    return c


def _selector(draw, codes: list[str]) -> str:
    return draw(st.sampled_from([*codes, "@night"]))


def _rule(draw, i: int, kind: str, codes: list[str], dates: list[date],
          people: list[str]) -> dict[str, Any]:
    r: dict[str, Any] = {"id": f"r{i}-{kind}", "kind": kind}
    soft = kind == "balance" or draw(st.booleans())
    if kind in ("min-rest",):
        r["hours"] = draw(st.sampled_from([1, 8, 10.5, 11, 12, 16]))
    elif kind == "weekly-rest":
        r["window_days"] = draw(st.integers(1, 7))
        most = 24 * r["window_days"]  # a whole window: more than a window across DST holds
        r["hours"] = draw(st.one_of(st.integers(1, most), st.sampled_from([most - 1, most])))
        r["align"] = draw(st.sampled_from(["monday", "period-start", "rolling"]))
    elif kind in ("max-consecutive-days", "min-consecutive-days", "min-consecutive-off"):
        r["days"] = draw(st.integers(1, 10))
        if kind.startswith("min") and draw(st.booleans()):
            r["edges"] = draw(st.sampled_from(["open", "closed"]))
    elif kind == "max-consecutive-shift":
        r["shift"], r["count"] = _selector(draw, codes), draw(st.integers(1, 4))
    elif kind == "forbidden-sequence":
        r["first"] = _selector(draw, codes)
        r["then"] = draw(st.lists(st.sampled_from([*codes, "@night", OFF]), min_size=1,
                                  max_size=3, unique=True))
    elif kind in ("max-shifts", "min-shifts"):
        r["count"] = draw(st.integers(0, len(dates)))
        if draw(st.booleans()):
            r["shift"] = _selector(draw, codes)
    elif kind == "hours":
        low = draw(st.one_of(st.none(), st.sampled_from([0, 7.5, 20, 40.25, 60])))
        high = draw(st.one_of(st.none(), st.sampled_from([8, 30, 45.5, 70, 100])))
        if low is not None and high is not None and low > high:
            low, high = high, low
        target = draw(st.one_of(st.none(), st.sampled_from([0, 16, 37.5, 50]))) if soft else None
        if low is None and high is None and target is None:
            high = 40
        for key, value in (("min", low), ("max", high), ("target", target)):
            if value is not None:
                r[key] = value
    elif kind == "max-average-weekly-hours":
        r["hours"] = draw(st.sampled_from([8, 20, 35.5, 48]))
        r["weeks"] = draw(st.integers(1, 17))
    elif kind == "max-weekends":
        r["count"] = draw(st.integers(0, 2))
    elif kind == "not-available":
        if draw(st.booleans()):
            r["days"] = _subset(draw, WEEKDAYS)
        if draw(st.booleans()):
            r["dates"] = sorted(_subset(draw, dates))
        if draw(st.booleans()):
            r["shift"] = _selector(draw, codes)
    elif kind == "balance":
        r["metric"] = draw(st.sampled_from(
            ["shifts", "hours", "weekends", "nights", *(f"shift:{c}" for c in codes)]))
    scope = draw(st.integers(0, 4))
    if scope in (1, 3):
        r["people"] = _subset(draw, people)
    if scope in (2, 3):
        r["groups"] = _subset(draw, GROUPS)
    if draw(st.integers(0, 3)) == 0:
        r["except"] = _subset(draw, people, 1)
    if soft:
        r["weight"] = draw(st.integers(1, 40))
    return r


# What history or leave credit alone can break (rules.md): drawn more often for (d).
HISTORY_KINDS = ("forbidden-sequence", "weekly-rest", "min-consecutive-off",
                 "max-average-weekly-hours", "balance", "hours")


@st.composite
def workspaces(draw, rich_history: bool = False, max_people: int = 6, max_days: int = 14,
               max_codes: int = 4, min_people: int = 2, min_days: int = 3) -> Spec:
    """A random workspace; `rich_history`: everyone has history, mostly ending on a shift,
    and rules that history can break come up more often."""
    start = draw(STARTS)
    n = draw(st.integers(min(min_days, max_days), max_days))
    dates = [start + timedelta(days=i) for i in range(n)]
    people = PEOPLE[: draw(st.integers(min_people, max_people))]
    staff = [{"id": pid, "name": f"Person {pid}", "skills": _subset(draw, SKILLS),
              "groups": _subset(draw, GROUPS)} for pid in people]
    held = sorted({s for p in staff for s in p["skills"]})
    codes = draw(st.lists(st.sampled_from(CODES), min_size=1, max_size=max_codes, unique=True))
    shifts = [_shift(draw, code, held) for code in codes]
    cover = [_cover(draw, codes, dates, held) for _ in range(draw(st.integers(0, 4)))]
    pool = [*RULE_KINDS, *HISTORY_KINDS, *HISTORY_KINDS] if rich_history else RULE_KINDS
    kinds = draw(st.lists(st.sampled_from(pool), max_size=8))
    unit: dict[str, Any] = {"name": "Property ward", "timezone": draw(st.sampled_from(ZONES)),
                            "start": start, "days": n}
    if draw(st.booleans()):
        unit["weekend"] = _subset(draw, WEEKDAYS)
    if draw(st.booleans()):
        unit["holidays"] = sorted(_subset(draw, dates))
    unit["rule"] = [_rule(draw, i, kind, codes, dates, list(people))
                    for i, kind in enumerate(kinds)]
    leave = []
    for _ in range(draw(st.integers(0, 3))):
        first = start + timedelta(days=draw(st.integers(-2, n - 1)))
        item: dict[str, Any] = {"person": draw(st.sampled_from(people)), "from": first}
        if draw(st.booleans()):
            item["to"] = first + timedelta(days=draw(st.integers(0, 3)))
        if draw(st.booleans()):
            item["credit_hours"] = draw(st.sampled_from([0, 4.5, 7.5, 8]))
        leave.append(item)
    requests = []
    for _ in range(draw(st.integers(0, 5))):
        item = {"person": draw(st.sampled_from(people)),
                "date": start + timedelta(days=draw(st.integers(0, n - 1)))}
        how = draw(st.sampled_from(["off", "want", "avoid"]))
        if how == "off":
            item["want"] = "off"
        else:
            item[how] = draw(st.sampled_from(codes))
        if draw(st.booleans()):
            item["weight"] = draw(st.integers(1, 9))
        requests.append(item)
    history = None
    if rich_history or draw(st.booleans()):
        with_rows = list(people) if rich_history else _subset(draw, people)
        shift_last = st.sampled_from([*codes, *codes, *codes, OFF])
        rows_before = {}
        for pid in with_rows:
            row = draw(st.lists(st.sampled_from([*codes, OFF]), max_size=8))
            rows_before[pid] = row + ([draw(shift_last)] if rich_history else [])
        history = {
            "rows": rows_before,
            "hours_before": {pid: draw(st.sampled_from([0, 120.5, 500, 790]))
                             for pid in _subset(draw, people)},
        }
    cells = st.sampled_from([OFF, OFF, *codes])
    rows = {pid: draw(st.lists(cells, min_size=n, max_size=n)) for pid in people}
    return {
        "unit": unit,
        "staff": {"person": staff},
        "shifts": {"shift": shifts, "cover": cover},
        "requests": {"leave": leave, "request": requests},
        "history": history,
        "roster": {"start": start, "days": n, "rows": rows},
    }


def write(spec: Spec, folder: Path) -> Path:
    folder.mkdir(parents=True, exist_ok=True)
    for name, data in spec.items():
        if data is not None:
            (folder / f"{name}.toml").write_text(tomli_w.dumps(data), encoding="utf-8")
    return folder


