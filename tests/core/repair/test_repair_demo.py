"""A two-day sick call for each person of the clinic demo, repaired.

The roster is tests/fixtures/clinic_solved_roster.toml, a compliant solve of
demo/clinic. Each repair must restore compliance, prove it changed the fewest
cells, change nothing before `from`, and stay within three times the cells of
the absence (the published roster against the repaired one).
"""

from __future__ import annotations

import dataclasses
import shutil

import pytest

from rostertui.core.io.load import load_workspace
from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.absence import record_absence
from rostertui.core.repair.diff import roster_diff
from rostertui.core.repair.repair import repair
from rostertui.core.solver import SolveOptions
from tests.conftest import DEMO, FIXTURES, copy_ws


@pytest.fixture(scope="module")
def clinic(tmp_path_factory: pytest.TempPathFactory) -> Workspace:
    folder = copy_ws(DEMO / "clinic", tmp_path_factory.mktemp("demo"))
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", folder / "roster.toml")
    return load_workspace(folder)


PEOPLE = [f"c{i:02d}" for i in range(1, 15)]


@pytest.mark.parametrize("pid", PEOPLE)
def test_a_two_day_sick_call_is_repaired_with_few_changes(clinic: Workspace, pid: str) -> None:
    published = clinic.roster
    assert published is not None
    row = published.rows[pid]
    d = next(d for d in range(10, clinic.unit.days - 1) if OFF not in (row[d], row[d + 1]))
    first, last = clinic.unit.dates[d], clinic.unit.dates[d + 1]
    absence = record_absence(clinic, pid, first, last, "sick")
    assert len(absence.cleared) == 2
    ws = dataclasses.replace(clinic, requests=absence.requests, roster=absence.roster)
    result = repair(ws, first, SolveOptions(time_limit=20, workers=2))
    out = result.outcome
    assert out.status == "optimal" and out.roster is not None and out.check is not None
    assert out.check.compliant
    changed = roster_diff(ws, published, out.roster)
    assert len(changed) <= 3 * len(absence.cleared)
    assert all(c.date >= first for c in changed)
    assert out.changes == len(result.changed)  # every change the solver counted is listed
