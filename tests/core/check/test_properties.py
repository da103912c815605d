"""Properties of the checker on random small workspaces and rosters (hypothesis).

Each example is a whole workspace written as TOML text into a temporary folder and
read back through `load_workspace`: 2-6 people with random skills and groups, 1-4
shift types at random clock times (nights across midnight, 24-hour shifts, DST
zones), 3-14 days, random cover, rules of every kind of rules.md (hard or soft,
random weights and scopes), leave and requests, random history; then a random roster.

(a) the checker never raises; (b) the penalty is the sum of units x weight of the
soft entries (weights read from the generated files, not from the checker), hard
entries cost 0, cover and request penalties equal a direct count, by_kind adds up;
(c) renaming people (a bijection applied to every file) or reordering `[[person]]`
changes no violation but its person id; (d) an all-off roster breaks only what an
all-off roster can break (rules.md, "Kinds" and "Terms": minimum rules, cover
`min` and `ideal`, `want` requests), and every cover minimum shows up.
"""

from __future__ import annotations

import copy
import math
import tempfile
from collections import Counter
from datetime import date, datetime, timedelta
from pathlib import Path
from typing import Any
from zoneinfo import ZoneInfo

import tomli_w
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.io.load import load_workspace
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
        r["days"] = draw(st.integers(1, 6))
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
def workspaces(draw, rich_history: bool = False) -> Spec:
    """A random workspace; `rich_history`: everyone has history, mostly ending on a shift,
    and rules that history can break come up more often."""
    start = draw(STARTS)
    n = draw(st.integers(3, 14))
    dates = [start + timedelta(days=i) for i in range(n)]
    people = PEOPLE[: draw(st.integers(2, 6))]
    staff = [{"id": pid, "name": f"Person {pid}", "skills": _subset(draw, SKILLS),
              "groups": _subset(draw, GROUPS)} for pid in people]
    held = sorted({s for p in staff for s in p["skills"]})
    codes = draw(st.lists(st.sampled_from(CODES), min_size=1, max_size=4, unique=True))
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
        last = st.sampled_from([*codes, *codes, *codes, OFF]) if rich_history else st.nothing()
        history = {
            "rows": {pid: draw(st.lists(st.sampled_from([*codes, OFF]), max_size=8))
                     + draw(st.lists(last, max_size=1))
                     for pid in with_rows},
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


def check_spec(spec: Spec, name: str = "ws") -> CheckResult:
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write(spec, Path(tmp) / name))
        result = check_roster(ws)
        result.to_json()  # the report serialises too
        return result


# --- (a) and (b) ---------------------------------------------------------------------------


def covered_days(c: dict[str, Any], dates: list[date]) -> list[date]:
    if "dates" in c:
        return [d for d in dates if d in set(c["dates"])]
    if "days" in c:
        return [d for d in dates if WEEKDAYS[d.weekday()] in c["days"]]
    return dates


def cover_totals(spec: Spec) -> tuple[int, int]:
    """(soft penalty, hard units) of the cover entries, counted directly."""
    unit, rows = spec["unit"], spec["roster"]["rows"]
    dates = [unit["start"] + timedelta(days=i) for i in range(unit["days"])]
    skills = {p["id"]: set(p["skills"]) for p in spec["staff"]["person"]}
    soft = hard = 0
    for c in spec["shifts"]["cover"]:
        for d in covered_days(c, dates):
            i = (d - unit["start"]).days
            n = sum(1 for pid, row in rows.items()
                    if row[i] == c["shift"] and ("skill" not in c or c["skill"] in skills[pid]))
            hard += max(0, c.get("min", n) - n) + max(0, n - c.get("max", n))
            if "ideal" in c:
                soft += c["under_weight"] * max(0, c["ideal"] - n)
                soft += c.get("over_weight", 0) * max(0, n - c["ideal"])
    return soft, hard


def cell_counts(spec: Spec) -> dict[str, list[tuple[str, date]]]:
    """(person, date) of every `leave` and `requires` breach, counted directly."""
    unit, rows = spec["unit"], spec["roster"]["rows"]
    skills = {p["id"]: set(p["skills"]) for p in spec["staff"]["person"]}
    needs = {s["code"]: set(s.get("requires", [])) for s in spec["shifts"]["shift"]}
    on_leave: set[tuple[str, date]] = set()
    for lv in spec["requests"]["leave"]:
        d = lv["from"]
        while d <= lv.get("to", lv["from"]):
            on_leave.add((lv["person"], d))
            d += timedelta(days=1)
    found: dict[str, list[tuple[str, date]]] = {"leave": [], "requires": []}
    for pid, row in rows.items():
        for i, code in enumerate(row):
            d = unit["start"] + timedelta(days=i)
            if code != OFF and (pid, d) in on_leave:
                found["leave"].append((pid, d))
            if code != OFF and not needs[code] <= skills[pid]:
                found["requires"].append((pid, d))
    return {k: sorted(v) for k, v in found.items()}


def request_total(spec: Spec) -> int:
    start, rows = spec["unit"]["start"], spec["roster"]["rows"]
    total = 0
    for r in spec["requests"]["request"]:
        has = rows[r["person"]][(r["date"] - start).days]
        want = r.get("want")
        if want == "off":
            broken = has != OFF
        elif want is not None:
            broken = has != want
        else:
            broken = has == r["avoid"]
        total += r.get("weight", 1) if broken else 0
    return total


@settings(max_examples=250, **SETTINGS)
@given(workspaces())
def test_never_raises_and_penalty_is_units_times_weight(spec: Spec) -> None:
    result = check_spec(spec)  # (a): never raises
    weights = {r["id"]: r.get("weight") for r in spec["unit"]["rule"]}
    for v in result.violations:
        assert v.units > 0
        if v.hard:
            assert v.penalty == 0
        if v.kind in BUILTIN:
            assert v.rule == v.kind and v.source is None
            if v.kind != "cover":
                assert v.hard == (v.kind != "request"), v
            continue
        assert v.kind in RULE_KINDS and v.rule in weights, v
        weight = weights[v.rule]
        assert v.hard == (weight is None), v
        assert v.penalty == (0 if weight is None else v.units * weight), v
    soft_cover, hard_cover = cover_totals(spec)
    cover = [v for v in result.violations if v.kind == "cover"]
    assert sum(v.penalty for v in cover if not v.hard) == soft_cover
    assert sum(v.units for v in cover if v.hard) == hard_cover
    for kind, cells in cell_counts(spec).items():
        got = sorted((v.person, *v.dates) for v in result.violations if v.kind == kind)
        assert got == cells, kind
    requests = [v for v in result.violations if v.kind == "request"]
    assert sum(v.penalty for v in requests) == request_total(spec)
    assert all(not v.hard and v.penalty > 0 for v in requests)
    assert result.penalty == sum(v.penalty for v in result.violations if not v.hard)
    assert result.penalty == sum(k["penalty"] for k in result.by_kind.values())
    assert result.hard_violations == sum(1 for v in result.violations if v.hard)


# --- (c) renaming and reordering people ----------------------------------------------------


def rename(spec: Spec, new: dict[str, str]) -> Spec:
    """The same workspace with every person id replaced through `new` in every file."""
    out = copy.deepcopy(spec)
    for p in out["staff"]["person"]:
        p["id"] = new[p["id"]]
    for r in out["unit"]["rule"]:
        for key in ("people", "except"):
            if key in r:
                r[key] = [new[pid] for pid in r[key]]
    for item in (*out["requests"]["leave"], *out["requests"]["request"]):
        item["person"] = new[item["person"]]
    if out["history"] is not None:
        for key in ("rows", "hours_before"):
            out["history"][key] = {new[pid]: v for pid, v in out["history"][key].items()}
    out["roster"]["rows"] = {new[pid]: row for pid, row in out["roster"]["rows"].items()}
    return out


def signature(result: CheckResult, back: dict[str, str] | None = None) -> Counter:
    """Every violation but its message (which may name people), person ids mapped back."""
    back = back or {}
    return Counter(
        (v.rule, v.kind, v.hard, back.get(v.person, v.person) if v.person else None, v.dates,
         v.units, v.penalty, v.shift, v.skill)
        for v in result.violations
    )


IDENTIFIERS = st.one_of(
    # names that are also shift codes, groups, skills or words the formats use
    st.sampled_from(["E", "N", "g1", "rn", "off", "x.y", "a-b", "1", "Ab_9", "night"]),
    st.from_regex(r"[A-Za-z0-9][A-Za-z0-9_.-]{0,31}", fullmatch=True),
)


@settings(max_examples=100, **SETTINGS)
@given(workspaces(), st.data())
def test_renaming_or_reordering_people_changes_nothing(spec: Spec, data: st.DataObject) -> None:
    ids = [p["id"] for p in spec["staff"]["person"]]
    names = data.draw(st.lists(IDENTIFIERS, min_size=len(ids), max_size=len(ids), unique=True),
                      label="new ids")
    new = dict(zip(ids, names, strict=True))
    order = data.draw(st.permutations(range(len(ids))), label="new order")
    reordered = copy.deepcopy(spec)
    reordered["staff"]["person"] = [reordered["staff"]["person"][i] for i in order]

    base = check_spec(spec)
    renamed = check_spec(rename(spec, new))
    moved = check_spec(reordered)
    for other in (renamed, moved):
        assert other.penalty == base.penalty
        assert other.by_kind == base.by_kind
        assert other.hard_violations == base.hard_violations
    assert signature(renamed, {v: k for k, v in new.items()}) == signature(base)
    assert signature(moved) == signature(base)


# --- (d) the all-off roster ----------------------------------------------------------------


def _credit(spec: Spec) -> dict[str, bool]:
    """Who has leave with a positive credit on a day of the period."""
    unit = spec["unit"]
    end = unit["start"] + timedelta(days=unit["days"] - 1)
    found = dict.fromkeys((p["id"] for p in spec["staff"]["person"]), False)
    for lv in spec["requests"]["leave"]:
        last = lv.get("to", lv["from"])
        if lv.get("credit_hours", 0) > 0 and lv["from"] <= end and last >= unit["start"]:
            found[lv["person"]] = True
    return found


def _in_scope(rule: dict[str, Any], person: dict[str, Any]) -> bool:
    if "people" not in rule and "groups" not in rule:
        chosen = True
    else:
        chosen = (person["id"] in rule.get("people", [])
                  or bool(set(rule.get("groups", [])) & set(person["groups"])))
    return chosen and person["id"] not in rule.get("except", [])


def _selected(spec: Spec, selector: str) -> set[str]:
    if selector != "@night":
        return {selector}
    from rostertui.core.models.shifts import Shift

    return {s["code"] for s in spec["shifts"]["shift"] if Shift(**s).is_night}


def _allowed_when_all_off(spec: Spec, v: Violation) -> bool:
    """Whether an all-off roster may break this rule (rules.md), from the files alone."""
    unit = spec["unit"]
    start = unit["start"]
    rule = next((r for r in unit["rule"] if r["id"] == v.rule), None)
    hist = (spec["history"] or {}).get("rows", {})
    row = hist.get(v.person, [])
    credit = _credit(spec)
    if v.kind == "hours":
        if credit[v.person]:
            return True  # leave credit alone can fall anywhere against min, max, target
        expected = [math.ceil(rule[k]) for k in ("min", "target") if rule.get(k, 0) > 0]
        return v.units in expected
    if v.kind == "min-consecutive-off":
        # the one stretch of days off reaches the period end: open there, so only
        # `edges = "closed"` judges it; length = the period + history's trailing days off
        trailing = len(row) - len("".join("x" if c != OFF else " " for c in row).rstrip())
        return rule.get("edges") == "closed" and v.units == rule["days"] - unit["days"] - trailing
    if v.kind == "forbidden-sequence":
        # (last history day, first period day): `first` then a day off
        return (OFF in rule["then"] and bool(row) and row[-1] in _selected(spec, rule["first"])
                and v.dates == (start - timedelta(days=1), start))
    if v.kind == "weekly-rest":
        # a window that starts before or on the first day can hold history's shifts;
        # a window across a spring DST change is an hour short of its nominal length
        tz = ZoneInfo(unit["timezone"])
        lo, hi = v.dates[0], v.dates[1] + timedelta(days=1)
        real = (datetime(hi.year, hi.month, hi.day, tzinfo=tz).timestamp()
                - datetime(lo.year, lo.month, lo.day, tzinfo=tz).timestamp()) / 3600
        return (v.dates[0] <= start and any(c != OFF for c in row)) or real < rule["hours"]
    if v.kind == "max-average-weekly-hours":
        return v.person in (spec["history"] or {}).get("hours_before", {}) or credit[v.person]
    if v.kind == "balance":
        return rule["metric"] == "hours" and any(credit.values())
    return v.kind in ("min-shifts", "cover", "request")


@settings(max_examples=150, **SETTINGS)
@given(workspaces(rich_history=True))
def test_an_all_off_roster_breaks_only_minimums_cover_and_wants(spec: Spec) -> None:
    spec["roster"]["rows"] = {pid: [OFF] * len(row) for pid, row in spec["roster"]["rows"].items()}
    result = check_spec(spec)
    for v in result.violations:
        assert _allowed_when_all_off(spec, v), v
    unit = spec["unit"]
    dates = [unit["start"] + timedelta(days=i) for i in range(unit["days"])]
    # every cover min and every ideal short, with units = the whole min / ideal
    expected = Counter()
    for c in spec["shifts"]["cover"]:
        for d in covered_days(c, dates):
            if c.get("min", 0) > 0:
                expected[True, c["shift"], c.get("skill"), (d,), c["min"]] += 1
            if c.get("ideal", 0) > 0 and c["under_weight"] > 0:
                expected[False, c["shift"], c.get("skill"), (d,), c["ideal"]] += 1
    got = Counter((v.hard, v.shift, v.skill, v.dates, v.units)
                  for v in result.violations if v.kind == "cover")
    assert got == expected
    # every `want = CODE` request is refused, nothing else is
    wants = Counter((r["person"], (r["date"],), r.get("weight", 1))
                    for r in spec["requests"]["request"] if r.get("want", "off") != "off")
    assert Counter((v.person, v.dates, v.penalty)
                   for v in result.violations if v.kind == "request") == wants
    # every min-shifts rule with a positive count, for everyone in scope
    people = spec["staff"]["person"]
    short = Counter((r["id"], p["id"], r["count"]) for r in unit["rule"]
                    if r["kind"] == "min-shifts" and r["count"] > 0
                    for p in people if _in_scope(r, p))
    assert Counter((v.rule, v.person, v.units)
                   for v in result.violations if v.kind == "min-shifts") == short
