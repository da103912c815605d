"""Repair: solve again changing as few cells as possible, never a day before "from".

Progress as in a solve (penalty, bound, and the cells the best roster changes).
At the end each changed cell is listed with what it fixed; nothing changes in the
grid until "keep" (k), which is one undoable step. Esc while running stops the
search and keeps the best repair found so far for review.
"""

from __future__ import annotations

from collections.abc import Iterable
from datetime import date
from typing import TYPE_CHECKING

from textual import on
from textual.binding import Binding
from textual.content import Content
from textual.widget import Widget
from textual.widgets import Button, DataTable, Input, Label, Static

from rostertui.core.edit.forms import parse_day
from rostertui.core.edit.session import Session
from rostertui.core.errors import EditError
from rostertui.core.words import day as day_text
from rostertui.core.words import weekday_day
from rostertui.tui.messages import SessionChanged
from rostertui.tui.screens.solve import SearchScreen, SolveSettings, progress_text

if TYPE_CHECKING:
    from rostertui.core.repair.repair import RepairOutcome


def shown(code: str) -> str:
    return "off" if code == "-" else code


class RepairScreen(SearchScreen):
    CSS_PATH = ["solve.tcss", "repair.tcss"]

    BINDINGS = [
        *SearchScreen.BINDINGS,
        Binding("k", "keep", "Keep the repair"),
    ]

    WORK_NAME = "repair"
    HINTS = {
        "ready": "Enter starts · Esc closes · days before \"from\" keep their shifts; locks "
                 "are kept; each changed cell costs the unit's [repair] change_weight",
        "running": "Esc stops the search and keeps the best repair so far, to review",
        "done": "k keeps the repair (one step: ctrl+z undoes it) · Esc discards it",
        "failed": "Enter or Esc closes; the grid is unchanged",
    }

    def __init__(self, settings: SolveSettings, start_from: date) -> None:
        super().__init__(settings)
        self.start_from = start_from
        self.result: RepairOutcome | None = None  # once done
        self.kept = False

    def heading(self) -> str:
        return f"Repair {self.session.ws.unit.name} with as few changes as possible"

    def form(self) -> Iterable[Widget]:
        yield Label("from")
        yield Input(self.start_from.isoformat(), id="from")

    def results(self) -> Iterable[Widget]:
        yield DataTable(id="changed", cursor_type="row", zebra_stripes=True)

    def end_buttons(self) -> Iterable[Widget]:
        yield Button("Keep (k)", id="keep", variant="primary")
        yield Button("Discard", id="close")

    def read_form(self) -> bool:
        ws = self.session.ws
        try:
            start_from = parse_day(ws, self.query_one("#from", Input).value)
        except EditError as exc:
            self.say(str(exc))
            return False
        self.start_from = start_from
        return True

    def search(self, session: Session, settings: SolveSettings):
        from rostertui.core.repair.repair import repair
        from rostertui.core.solver import SolveOptions

        options = SolveOptions(time_limit=settings.time_limit, workers=settings.workers,
                               seed=settings.seed)
        return repair(session.workspace_for_solve(), self.start_from, options,
                      on_progress=self.relay, cancel=self.cancel)

    # -- the end ------------------------------------------------------------------------------
    def finished(self, result) -> None:
        outcome = result.outcome
        self.result = result
        self.last_penalty, self.last_bound = outcome.objective, outcome.bound
        self.query_one("#progress", Static).update(
            progress_text(outcome.seconds, outcome.objective, outcome.bound, outcome.changes))
        if outcome.roster is None or result.after is None:
            self.no_roster(outcome.status)
            return
        before, after = result.before, result.after
        stopped = " (stopped early)" if self.cancel.is_set() else ""
        n = len(result.changed)
        self.summary = (
            f"{outcome.status}{stopped}: {n} cell{'s' if n != 1 else ''} changed from "
            f"{day_text(result.start_from)}; penalty {before.penalty} -> {after.penalty}; "
            f"hard violations {before.hard_violations} -> {after.hard_violations}; "
            f"{outcome.seconds:.1f} s.")
        if result.past:
            self.summary += (f" {len(result.past)} hard breach(es) before "
                             f"{day_text(result.start_from)} are the past's, left as they were.")
        self.summary += " Not in the grid yet: k keeps it."
        self.say(Content.styled(self.summary, "bold"))
        self._fill(result)
        keep = self.query_one("#keep", Button)
        keep.display = True
        keep.focus()

    def _fill(self, result) -> None:
        table = self.query_one("#changed", DataTable)
        table.clear(columns=True)
        table.add_columns("person", "date", "change", "what it fixed")
        ws = self.session.ws
        for c in result.changed:
            cell = c.cell
            name = ws.person_by_id[cell.person].name if cell.person in ws.person_by_id \
                else cell.person
            fixed = "; ".join(v.message for v in c.fixes) or "made room for another change"
            table.add_row(name, weekday_day(cell.date),
                          f"{shown(cell.before)} → {shown(cell.after)}", fixed)
        table.display = bool(result.changed)

    def action_keep(self) -> None:
        result = self.result
        if self.phase != "done" or result is None or result.outcome.roster is None or self.kept:
            return
        self.kept = True
        n = len(result.changed)
        if n == 0:
            self.notify("the repair changes no cell: the grid stays as it is", timeout=4)
            self.dismiss()
            return
        label = f"repair from {day_text(result.start_from)} ({n} cells)"
        self.session.replace(result.outcome.roster, label)
        self.app.post_message(SessionChanged())
        self.notify(f"{label} kept; ctrl+s saves, ctrl+z undoes", timeout=5)
        self.dismiss()

    @on(Button.Pressed, "#keep")
    def _keep(self) -> None:
        self.action_keep()
