"""What the grid shows (pure): cover rows, violations by cell, words; form texts."""

from __future__ import annotations

from datetime import date

import pytest

from rostertui.core.check.grid import Grid
from rostertui.core.edit.session import Session
from rostertui.core.edit.view import GridView, cell_text, cover_text
from rostertui.core.models.workspace import Workspace


def test_cover_rows_join_entries_of_the_same_shift_and_skill(clinic_ws: Workspace) -> None:
    view = GridView.build(Session(clinic_ws))
    assert [c.label for c in view.cover] == ["E", "E·rn", "E·triage", "L", "L·rn", "N", "N·rn"]
    early = view.cover[0]
    monday, saturday = early.needs[0], early.needs[5]  # 15 Mar is a Monday
    assert (monday.min, monday.ideal, saturday.min, saturday.ideal) == (3, 4, 2, 3)
    assert view.cover[2].needs[5] is None  # triage is asked on weekdays only


def test_violations_land_on_cells_people_and_cover(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c13", 0, "E")  # on leave
    view = GridView.build(s)
    assert view.severity("c13", 0) == "hard" and view.severity("c13", 1) is None
    assert [v.rule for v in view.cell_violations["c13", 0]] == ["leave"]
    # nobody works: every person is below the hard hours band, for the whole period
    assert view.person_severity("c01") == "hard"
    assert "ft-hours-band" in {v.rule for v in view.person_violations["c01"]}
    e_row = 0
    assert view.cover[e_row].assigned[0] == 1
    assert view.cover_severity(e_row, 0) == "hard"  # 1 on E, at least 3
    assert "1 assigned; min 3, ideal 4" in cover_text(view, e_row, 0)


def test_a_stretch_violation_covers_every_day_of_the_stretch(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    for day in range(7, 14):  # seven early shifts in a row, 22-28 Mar; at most 6
        s.set_cell("c01", day, "E")
    view = GridView.build(s)
    stretch = [v for v in s.check.violations if v.rule == "max-days-in-row"]
    assert stretch and stretch[0].dates == (date(2027, 3, 22), date(2027, 3, 28))
    assert all(stretch[0] in view.cell_violations["c01", d] for d in range(7, 14))
    assert "max-days-in-row" not in {v.rule for v in view.cell_violations.get(("c01", 6), [])}


def test_the_cell_in_words(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 5, "L")
    s.toggle_lock("c01", 5)
    text = cell_text(s, GridView.build(s), "c01", 5)
    assert text == ("Sat 20 Mar · Marta Quintela (rn, triage) · L Late 14:00-21:30 7 h · locked"
                    " · asks the day off (weight 5, daughter's birthday): NOT granted")


def test_form_text_becomes_typed_values_and_bad_text_is_left_for_the_loader() -> None:
    from rostertui.core.edit.forms import build_item, field_text
    from rostertui.core.models.requests import Leave
    from rostertui.core.models.shifts import Cover

    leave = build_item(Leave, {"person": "c01", "from_": "2027-03-20", "to": "",
                               "credit_hours": "7.5"})
    assert (leave.from_, leave.to, leave.credit_hours) == (date(2027, 3, 20), None, 7.5)
    assert field_text(leave, "from_") == "2027-03-20" and field_text(leave, "to") == ""
    cover = build_item(Cover, {"shift": "E", "days": "mon, tue sat", "min": "two"})
    assert cover.days == ["mon", "tue", "sat"] and cover.min == "two"


def test_a_keystroke_builds_one_grid_for_check_statistics_and_view(
        clinic_ws: Workspace, monkeypatch: pytest.MonkeyPatch) -> None:
    s = Session(clinic_ws)
    built: list[Grid] = []
    init = Grid.__init__

    def counted(self: Grid, *args: object) -> None:
        built.append(self)
        init(self, *args)  # type: ignore[arg-type]

    monkeypatch.setattr(Grid, "__init__", counted)
    s.set_cell("c01", 5, "L")
    view = GridView.build(s)
    assert built == [s.check.grid]  # the check's grid, read by the statistics and the view
    assert view.cover[3].assigned[5] == sum(1 for row in s.roster.rows.values() if row[5] == "L")
