"""The editors (F6): each change checked by the loader on a scratch copy, then written."""

from __future__ import annotations

import tomllib
from datetime import date
from pathlib import Path

from textual.widgets import DataTable, Input, Static, TabbedContent, TextArea

from rostertui.core.io.load import load_workspace
from rostertui.tui.app import RosterApp
from rostertui.tui.screens.dialogs import Confirm
from rostertui.tui.screens.editors import EditorsScreen
from rostertui.tui.widgets.list_editor import ListEditor
from rostertui.tui.widgets.rules_editor import RulesEditor
from tests.tui.conftest import run
from tests.tui.pilot import grid_of, row_text


def toml(folder: Path, name: str) -> dict:
    return tomllib.loads((folder / name).read_text(encoding="utf-8"))


async def open_tab(pilot, app: RosterApp, tab: str) -> ListEditor | RulesEditor:
    await pilot.press("f6")
    screen = app.screen
    assert isinstance(screen, EditorsScreen)
    screen.query_one(TabbedContent).active = f"tab-{tab}"
    await pilot.pause()
    return screen.query_one(f"#edit-{tab}")


async def fill(pilot, editor: ListEditor, **values: str) -> None:
    for name, value in values.items():
        editor.query_one(f"#f-{name}", Input).value = value
    editor.query_one(f"#f-{next(iter(values))}", Input).focus()
    await pilot.press("enter")


def problems(editor) -> str:
    return str(editor.query_one(".problems", Static).content)


def test_add_rename_and_remove_a_person(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press("E")  # an unsaved hand edit first
            people = await open_tab(pilot, app, "person")
            assert people.query_one(DataTable).row_count == 14
            await pilot.press("n")
            await fill(pilot, people, id="c15", name="Ana Nova", skills="rn, triage",
                       groups="part-time")
            assert [p["id"] for p in toml(clinic, "staff.toml")["person"]][-1] == "c15"
            assert app.session.ws.person_by_id["c15"].skills == ["rn", "triage"]
            assert app.session.code("c01", 0) == "E" and app.session.dirty  # carried over
            await pilot.press("f2")
            assert "Ana Nova" in row_text(grid_of(app), "c15")

            await pilot.press("f6")
            table = people.query_one(DataTable)
            table.focus()
            table.move_cursor(row=0)
            await pilot.press("enter")  # Marta into the form
            assert people.query_one("#f-id", Input).disabled
            await fill(pilot, people, name="Marta Quintela Sousa")
            assert load_workspace(clinic).person_by_id["c01"].name == "Marta Quintela Sousa"

            table.focus()
            table.move_cursor(row=14)
            await pilot.press("delete")
            assert isinstance(app.screen, Confirm)
            await pilot.press("y")
            assert "c15" not in app.session.ws.person_ids
            assert len(toml(clinic, "staff.toml")["person"]) == 14

    run(go)


def test_a_bad_person_is_refused_in_the_loaders_words(clinic: Path) -> None:
    before = (clinic / "staff.toml").read_bytes()

    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            people = await open_tab(pilot, app, "person")
            await pilot.press("n")
            await fill(pilot, people, id="c 15", name="Bad Id")
            assert "Not saved" in problems(people)
            assert "staff.toml: person[14].id" in problems(people)
            assert "not a valid identifier" in problems(people)
            await fill(pilot, people, id="c01", name="Twin")  # an id already taken
            assert "c01" in problems(people) and "Not saved" in problems(people)
            assert len(app.session.ws.person_ids) == 14

    run(go)
    assert (clinic / "staff.toml").read_bytes() == before


def test_removing_someone_with_leave_is_refused_until_the_leave_goes(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            people = await open_tab(pilot, app, "person")
            table = people.query_one(DataTable)
            table.focus()
            table.move_cursor(row=12)  # Rita Moinhola, on leave 15-18 Mar
            await pilot.press("delete", "y")
            assert "requests.toml" in problems(people) and "c13" in problems(people)
            assert "c13" in app.session.ws.person_ids

    run(go)


def test_removing_a_person_drops_their_saved_roster_row(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press(*["down"] * 7, "N", "ctrl+l", "ctrl+s")  # c08
            people = await open_tab(pilot, app, "person")
            table = people.query_one(DataTable)
            table.focus()
            table.move_cursor(row=7)
            await pilot.press("delete", "y")
        roster = load_workspace(clinic).roster
        assert roster is not None and "c08" not in roster.rows and roster.lock == []

    run(go)


def test_new_leave_turns_a_worked_day_into_a_hard_violation(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(120, 40)) as pilot:
            await pilot.press(*["right"] * 5, "L")  # Marta works the late on 20 Mar
            assert not [v for v in app.session.check.violations if v.rule == "leave"]
            leave = await open_tab(pilot, app, "leave")
            await pilot.press("n")
            await fill(pilot, leave, person="c01", from_="2027-03-20", reason="sick",
                       credit_hours="7.5")
            assert toml(clinic, "requests.toml")["leave"][-1] == {
                "person": "c01", "from": date(2027, 3, 20), "reason": "sick",
                "credit_hours": 7.5}
            found = [v for v in app.session.check.violations if v.rule == "leave"]
            assert [(v.person, v.dates) for v in found] == [("c01", (date(2027, 3, 20),))]
            await fill(pilot, leave, from_="20 March")
            assert "Not saved" in problems(leave) and "leave[4].from" in problems(leave)

    run(go)


def test_a_preset_rule_is_overridden_by_a_local_rule(clinic: Path) -> None:
    async def go() -> None:
        app = RosterApp(load_workspace(clinic))
        async with app.run_test(size=(140, 40)) as pilot:
            rules = await open_tab(pilot, app, "rules")
            assert isinstance(rules, RulesEditor)
            table = rules.query_one(DataTable)
            table.focus()
            comments = [ln for ln in (clinic / "unit.toml").read_text().splitlines()
                        if ln.lstrip().startswith("#")]
            assert comments, "the demo's unit.toml is expected to hold comments"
            ids = [r.id for r in app.session.ws.rules]
            table.move_cursor(row=ids.index("max-days-in-row"))
            await pilot.press("enter")
            text = rules.query_one(TextArea)
            assert 'id = "max-days-in-row"' in text.text and "days = 6" in text.text
            text.load_text(text.text.replace("days = 6", "days = 5"))
            await pilot.press("ctrl+r")
            local = [r for r in toml(clinic, "unit.toml")["rule"] if r["id"] == "max-days-in-row"]
            assert local and local[0]["days"] == 5
            kept = (clinic / "unit.toml").read_text()
            assert all(c in kept for c in comments), "saving a rule lost the user's comments"
            eff = next(r for r in app.session.ws.rules if r.id == "max-days-in-row")
            assert eff.origin == "unit.toml" and eff.rule.days == 5

            text.load_text('id = "x"\nkind = "max-consecutive-dayz"\n')
            await pilot.press("ctrl+r")
            assert "Not saved" in problems(rules) and "unit.toml" in problems(rules)
            text.load_text('id = "x"\nkind = ')
            await pilot.press("ctrl+r")
            assert "not valid TOML" in problems(rules)

            table.focus()
            ids = [r.id for r in app.session.ws.rules]
            table.move_cursor(row=ids.index("max-days-in-row"))
            await pilot.press("delete")  # the local rule goes: the preset's is back
            eff = next(r for r in app.session.ws.rules if r.id == "max-days-in-row")
            assert eff.origin == "care-ward" and eff.rule.days == 6

    run(go)
