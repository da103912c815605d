"""Statistics and checker agree on requests: stats reads the checker's verdicts
(`CheckResult.requests`) and the checker's grid, so granted / denied per person match
the request violations the check reports, whether or not the check is passed in."""

from __future__ import annotations

import tempfile
from collections import Counter
from pathlib import Path

from hypothesis import given, settings

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.stats import roster_stats
from tests.strategies import SETTINGS, Spec, workspaces, write


@settings(max_examples=120, **SETTINGS)
@given(workspaces())
def test_granted_and_denied_requests_match_the_check(spec: Spec) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write(spec, Path(tmp) / "ws"))
    check = check_roster(ws)
    assert check.grid is not None and check.grid.rows.keys() == set(ws.person_ids)
    stats = roster_stats(ws, check=check)
    assert stats == roster_stats(ws)  # the same numbers without the check at hand
    denied = Counter(v.person for v in check.violations if v.kind == "request")
    asked = Counter(o.request.person for o in check.requests)
    in_period = [r for r in ws.requests.request if ws.unit.in_period(r.date)]
    assert len(check.requests) == len(in_period)
    for p in stats.people:
        assert p.requests_denied == denied[p.person]
        assert p.requests_granted + p.requests_denied == asked[p.person]
    assert sum(o.request.weight for o in check.requests if not o.honoured) == sum(
        v.penalty for v in check.violations if v.kind == "request")
