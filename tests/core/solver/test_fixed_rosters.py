"""The model judges any roster as the checker does, not only the rosters it chose.

A roster is fixed into the built model (solver/fixing.py: every cell's variable
fixed to the roster's value) and the copy minimised: the model must be feasible
exactly when the checker finds no hard violation, and its optimum must be the
checker's penalty. The rosters are planted compliant ones (a random roster, the
workspace made to fit it: shifts on leave or without the skill taken off, every
hard rule it breaks made soft, cover bounds it breaks dropped) and random
perturbations of them, on generated workspaces of two to four weeks (several
weekends, weekly and averaging windows). When model and checker disagree, the
failure names the rule.

ROSTERTUI_EXAMPLES=200 for a longer run.
"""

from __future__ import annotations

import copy
import dataclasses
import os
import tempfile
from pathlib import Path
from typing import Any

from hypothesis import assume, given, settings
from hypothesis import strategies as st
from ortools.sat.python import cp_model

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.fixing import fixed_copy, values_of
from rostertui.core.solver.model import BuiltModel, build_model
from tests.strategies import SETTINGS, Spec, workspaces, write

EXAMPLES = int(os.environ.get("ROSTERTUI_EXAMPLES", 80))
PERTURBATIONS = 3
Rows = dict[str, list[str]]


@dataclasses.dataclass
class Verdict:
    """The model's judgement of one fixed roster."""

    feasible: bool
    objective: int | None = None
    per_rule: dict[str, int] = dataclasses.field(default_factory=dict)  # penalty by rule id
    outside: list[tuple[str, int, str]] = dataclasses.field(default_factory=list)


def judge(built: BuiltModel, rows: Rows) -> Verdict:
    """Fix `rows` into a copy of the model and minimise it."""
    cells = built.cells
    outside = [(pid, d, code) for p, pid in enumerate(cells.people)
               for d, code in enumerate(rows[pid])
               if code != OFF and (p, d, code) not in cells.x]
    if outside:  # a shift in a cell the model has no variable for: no such roster
        return Verdict(False, outside=outside)
    values = values_of(built, {p: rows[pid] for p, pid in enumerate(cells.people)})
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1
    solver.parameters.max_time_in_seconds = 60
    status = solver.solve(fixed_copy(built, values))
    assert status in (cp_model.OPTIMAL, cp_model.INFEASIBLE), solver.status_name(status)
    if status == cp_model.INFEASIBLE:
        return Verdict(False)
    per_rule: dict[str, int] = {}
    for term in built.builder.terms:
        value = term.units if isinstance(term.units, int) else solver.value(term.units)
        per_rule[term.rule] = per_rule.get(term.rule, 0) + term.weight * value
    return Verdict(True, round(solver.objective_value), per_rule)


def checker_per_rule(result: CheckResult) -> dict[str, int]:
    out: dict[str, int] = {}
    for v in result.violations:
        out[v.rule] = out.get(v.rule, 0) + v.penalty
    return out


def breaking_rules(ws: Workspace, rows: Rows) -> list[str]:
    """The hard rules without which the fixed roster becomes feasible (the model's
    culprits when the checker finds none)."""
    found = []
    for eff in ws.rules:
        if eff.hard:
            rest = [e for e in ws.rules if e is not eff]
            if judge(build_model(dataclasses.replace(ws, rules=rest)), rows).feasible:
                found.append(eff.rule.id)
    return found or ["none alone: cover, leave, requires or several rules together"]


def compare(ws: Workspace, built: BuiltModel, rows: Rows, what: str) -> None:
    roster = Roster(start=ws.unit.start, days=ws.unit.days, rows=rows)
    result = check_roster(ws, roster)
    verdict = judge(built, rows)
    hard = sorted({f"{v.rule} ({v.kind})" for v in result.violations if v.hard})
    if verdict.feasible and hard:
        raise AssertionError(f"{what}: the model accepts a roster the checker finds "
                             f"breaking {', '.join(hard)}\n{rows}")
    if not verdict.feasible and not hard:
        culprits = (f"cells without a variable {verdict.outside}" if verdict.outside
                    else ", ".join(breaking_rules(ws, rows)))
        raise AssertionError(f"{what}: the model refuses a roster the checker finds "
                             f"compliant; refused by {culprits}\n{rows}")
    if verdict.feasible and verdict.objective != result.penalty:
        mine, theirs = verdict.per_rule, checker_per_rule(result)
        differ = {rule: (mine.get(rule, 0), theirs.get(rule, 0))
                  for rule in sorted({*mine, *theirs}) if mine.get(rule, 0) != theirs.get(rule, 0)}
        raise AssertionError(f"{what}: objective {verdict.objective} but the checker's penalty "
                             f"is {result.penalty}; (model, checker) by rule: {differ}\n{rows}")


def load(spec: Spec, folder: Path) -> Workspace:
    return load_workspace(write(spec, folder))


# Breaches that taking shifts off can mend (a shift too many, too long a run, too
# little rest, a forbidden pair, a weekend in part, a shift on an unavailable day).
MENDED_BY_OFF = ("leave", "requires", "max-consecutive-days", "max-consecutive-shift",
                 "min-rest", "weekly-rest", "forbidden-sequence", "max-shifts", "hours",
                 "max-average-weekly-hours", "max-weekends", "complete-weekends",
                 "not-available")
ROUNDS = 8


def plant(spec: Spec, folder: Path, data: Any) -> Workspace:
    """Make roster and workspace (in `spec`) fit: a few rounds of taking shifts off
    where a hard rule breaks (leave, requires and breaches more shifts can only
    worsen), then every hard rule still broken made soft and every cover bound
    broken dropped."""
    rows = spec["roster"]["rows"]
    rules = {r["id"]: r for r in spec["unit"]["rule"]}
    for attempt in range(ROUNDS + 2):
        ws = load(spec, folder / f"plant{attempt}")
        hard = [v for v in check_roster(ws).violations if v.hard]
        if not hard:
            return ws
        for v in hard:
            days = [(d - ws.unit.start).days for d in v.dates]
            days = [d for d in days if 0 <= d < ws.unit.days]
            if attempt < ROUNDS and v.kind in MENDED_BY_OFF and v.person is not None:
                row = rows[v.person]
                worked = [d for d in range(min(days), max(days) + 1)] if days else \
                    [d for d, code in enumerate(row) if code != OFF]
                if worked:  # one day of the breach (or of the row) off
                    row[data.draw(st.sampled_from(worked), label="off")] = OFF
                    continue
            if v.kind == "cover":
                for c in spec["shifts"]["cover"]:
                    if c["shift"] == v.shift and c.get("skill") == v.skill:
                        c.pop("min", None)
                        c.pop("max", None)
            elif v.kind not in ("leave", "requires"):
                rules[v.rule]["weight"] = data.draw(st.integers(1, 40), label="weight")
    assume(False)  # pragma: no cover - planting did not settle (never seen)
    raise AssertionError


@st.composite
def perturbation(draw: Any, spec: Spec) -> list[tuple[str, int, str]]:
    """1-6 cells changed, mostly to a shift (which more often breaks a hard rule)."""
    people = list(spec["roster"]["rows"])
    codes = [s["code"] for s in spec["shifts"]["shift"]]
    n = spec["unit"]["days"]
    code = st.one_of(st.sampled_from(codes), st.sampled_from(codes), st.just(OFF))
    change = st.tuples(st.sampled_from(people), st.integers(0, n - 1), code)
    return draw(st.lists(change, min_size=1, max_size=6))


@settings(max_examples=EXAMPLES, **SETTINGS)
@given(workspaces(min_days=14, max_days=28, max_people=5), st.data())
def test_the_model_judges_fixed_rosters_as_the_checker_does(spec: Spec, data: Any) -> None:
    spec = copy.deepcopy(spec)
    with tempfile.TemporaryDirectory() as tmp:
        ws = plant(spec, Path(tmp), data)
    built = build_model(ws)
    planted = {pid: list(row) for pid, row in spec["roster"]["rows"].items()}
    compare(ws, built, planted, "planted roster")
    for k in range(PERTURBATIONS):
        rows = {pid: list(row) for pid, row in planted.items()}
        for pid, d, code in data.draw(perturbation(spec), label=f"perturbation {k}"):
            rows[pid][d] = code
        compare(ws, built, rows, f"perturbation {k}")
