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
changes no violation but its person id; (d) an all-off roster breaks only cover
`min` and `ideal`, `want` requests and minimum rules (min-shifts, hours min and
target, min-consecutive-off with `edges = "closed"`), every cover minimum and
every `want` shows up -- and, as rules.md allows, what history and leave credit
bring in alone: `first` -> "-" after the last history day, a weekly-rest window
holding history's shifts (or an hour short across DST), hours_before or leave
credit over an hours bound, a balance of hours.
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

from hypothesis import given, settings
from hypothesis import strategies as st

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.rules import RULE_KINDS
from rostertui.core.models.shifts import Shift
from tests.strategies import BUILTIN, OFF, SETTINGS, WEEKDAYS, Spec, workspaces, write


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
