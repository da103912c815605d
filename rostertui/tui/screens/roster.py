"""The roster screen: the grid, the status lines that explain the cursor, the footer.

Besides hand edits it starts the changes made to a published roster: a swap (mark a
cell, move to the other, ctrl+x again: a preview, then confirm), an absence, and the
diff mode that highlights the cells changed since a published version.
"""

from __future__ import annotations

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.content import Content
from textual.reactive import reactive
from textual.screen import Screen
from textual.widgets import Footer

from rostertui.core.edit.plans import AbsencePlan
from rostertui.core.edit.session import Session
from rostertui.core.errors import EditError, InputError
from rostertui.core.io.published import Published, load_published
from rostertui.core.repair.diff import roster_diff
from rostertui.tui.host import host
from rostertui.tui.look import MUTED, VALUE
from rostertui.tui.messages import CompareWith, SessionChanged
from rostertui.tui.screens.changes import AbsenceDialog, SwapDialog, code_text
from rostertui.tui.widgets.grid import RosterGrid
from rostertui.tui.widgets.status import StatusLine, SummaryBar

Cell = tuple[str, int]


class RosterScreen(Screen):
    CSS_PATH = "roster.tcss"

    BINDINGS = [
        Binding("ctrl+x", "swap", "Swap", tooltip="mark a cell for a swap; on another cell "
                "(another person that day, another day of theirs, or both): preview the swap, "
                "then confirm it"),
        Binding("ctrl+a", "absence", "Absence", tooltip="record a sick call or other absence of "
                "the person under the cursor: leave, and their shifts cleared"),
        Binding("ctrl+d", "diff", "Diff", tooltip="diff mode on/off: highlight the cells "
                "changed since the published version compared with (F9 chooses; default the "
                "last)"),
        Binding("escape", "drop_mark", "Drop the swap mark", show=False),
    ]

    diff = reactive(False)  # highlight the cells changed since `compared`
    mark: reactive[Cell | None] = reactive(None, init=False)  # the cell marked for a swap

    def __init__(self) -> None:
        super().__init__()
        self.typed = ""
        self.note = ""
        self.compare_to: int | None = None  # the version diff mode compares with (None: last)
        self.compared: Published | None = None
        self.changed: dict[Cell, str] = {}

    @property
    def session(self) -> Session:
        return host(self.app).session

    def compose(self) -> ComposeResult:
        yield SummaryBar(id="summary")
        yield RosterGrid(self.session, id="grid")
        yield StatusLine(id="status")
        yield Footer(compact=True, show_command_palette=False)

    @property
    def grid(self) -> RosterGrid:
        return self.query_one(RosterGrid)

    def on_mount(self) -> None:
        self.watch(self.app, "revision", self._revised, init=False)
        self.grid.focus()
        self.query_one(SummaryBar).show(self.session, "roster")

    def on_resize(self) -> None:
        self.set_class(self.size.height >= 40, "-tall")  # more lines to explain the cursor
        self.call_after_refresh(self.update_status)

    def _revised(self) -> None:
        if self.diff:
            self._load_compared()
        self._repaint()

    def _repaint(self) -> None:
        self.grid.show(self.session)
        self._highlight()
        mode = "roster"
        if self.diff and self.compared is not None:
            mode = f"diff with version {self.compared.version}"
        self.query_one(SummaryBar).show(self.session, mode)
        self.update_status()

    def update_status(self) -> None:
        grid = self.grid
        self.query_one(StatusLine).show(self.session, grid.view, grid.person, grid.cover_row,
                                        grid.day, self.typed, self.note, self._diff_line())

    def _highlight(self) -> None:
        self.grid.highlight(self.changed if self.diff else None, self.mark)

    # -- from the grid ---------------------------------------------------------------------
    @on(RosterGrid.CursorMoved)
    def _moved(self) -> None:
        self.note = self._mark_note() if self.mark is not None else ""
        self.update_status()

    @on(RosterGrid.Typing)
    def _typing(self, event: RosterGrid.Typing) -> None:
        self.typed = event.text
        self.update_status()

    @on(RosterGrid.EditRequested)
    def _edit(self, event: RosterGrid.EditRequested) -> None:
        try:
            change = self.session.set_cell(event.person, event.day, event.text)
        except EditError as exc:
            self.refused(f"not changed: {exc}")
            return
        self.note = "" if change is not None else "unchanged: the cell already holds that"
        self.app.post_message(SessionChanged())
        if change is None:
            self.update_status()

    @on(RosterGrid.LockRequested)
    def _lock(self, event: RosterGrid.LockRequested) -> None:
        locked = self.session.toggle_lock(event.person, event.day)
        self.note = ("locked: a solve keeps this cell as it is" if locked
                     else "unlocked: a solve may change this cell")
        self.app.post_message(SessionChanged())

    def refused(self, note: str) -> None:
        self.note = note
        self.update_status()
        self.app.bell()

    def goto(self, person: str | None, day: int | None,
             cover: tuple[str, str | None] | None = None) -> None:
        """Move the cursor to a person's cell (or a cover row's) and show it."""
        grid = self.grid
        day = grid.day if day is None else day
        if person is not None:
            grid.goto(person, day)
        elif cover is not None:
            grid.goto_cover(*cover, day)
        elif day != grid.day:
            grid.move_to(grid.row_index, day)  # a date alone: that day on the cursor's row
        grid.focus()

    # -- swap -------------------------------------------------------------------------------
    def action_swap(self) -> None:
        """First press marks the cell; on another cell, the swap is previewed."""
        grid = self.grid
        here = (grid.person, grid.day)
        if grid.person is None:
            self.refused("a swap exchanges people's cells: move to a person's row")
            return
        if self.mark is None or self.mark == here:
            self.mark = None if self.mark == here else (grid.person, grid.day)
            self.note = self._mark_note() if self.mark else "swap mark dropped"
            self.update_status()
            return
        (p1, d1), (p2, d2) = self.mark, (grid.person, grid.day)
        try:
            plan = self.session.preview_swap(p1, d1, p2, d2 if d2 != d1 else None)
        except EditError as exc:
            self.refused(f"no swap: {exc}")
            return
        if not plan.cells:
            self.refused("nothing to swap: the cells hold the same shifts")
            return

        def answered(yes: bool | None) -> None:
            if not yes:
                self.note = "swap cancelled: nothing changed (the mark stays; Esc drops it)"
                self.update_status()
                return
            change = self.session.swap(p1, d1, p2, d2 if d2 != d1 else None)
            self.mark = None
            self.note = f"{change.label}: done (ctrl+z undoes)" if change else ""
            self.app.post_message(SessionChanged())

        self.app.push_screen(SwapDialog(self.session, plan), answered)

    def action_drop_mark(self) -> None:
        if self.mark is not None:
            self.mark = None
            self.note = "swap mark dropped"
            self.update_status()

    def watch_mark(self) -> None:
        self._highlight()

    def _mark_note(self) -> str:
        assert self.mark is not None
        pid, day = self.mark
        when = self.grid.view.days[day].long
        return (f"marked {pid} {when} for a swap: move to the other cell (another person that "
                "day, another day of theirs, or both: they swap both days), ctrl+x; Esc drops")

    # -- absence ----------------------------------------------------------------------------
    def action_absence(self) -> None:
        grid = self.grid
        if grid.person is None:
            self.refused("an absence is a person's: move to their row")
            return
        day = self.session.ws.unit.dates[grid.day]
        self.app.push_screen(AbsenceDialog(self.session, grid.person, day), self._absent)

    def _absent(self, plan: AbsencePlan | None) -> None:
        if plan is None:
            return
        n = len(plan.cleared)
        short = plan.short
        text = f"{plan.label}: {n} shift{'s' if n != 1 else ''} cleared"
        if short:
            text += f"; cover now short: {len(short)} ({short[0].message}"
            text += ", …)" if len(short) > 1 else ")"
        text += ". F8 repairs; ctrl+z undoes."
        self.note = text
        self.notify(text, title="absence recorded", timeout=8,
                    severity="warning" if short else "information")
        self.update_status()

    # -- diff -------------------------------------------------------------------------------
    def action_diff(self) -> None:
        self.show_diff(not self.diff)

    def show_diff(self, on: bool, version: int | None = None) -> None:
        """Diff mode on (against `version`, or the one chosen before, or the last) or off."""
        if version is not None:
            self.app.post_message(CompareWith(version))
            self.compare_to = version
        if on and not self._load_compared():
            return
        self.diff = on
        self._repaint()
        if on and self.compared is not None:
            n = len(self.changed)
            self.notify(f"diff mode: {n} cell{'s' if n != 1 else ''} changed since "
                        f"{self.compared.label()}; ctrl+d ends it", timeout=5)

    def _load_compared(self) -> bool:
        """Read the version compared against and the changed cells; False (and diff mode
        off) when nothing is published or the file cannot be read."""
        session = self.session
        try:
            found = load_published(session.ws.path or ".",
                                   self.compare_to)
        except InputError as exc:
            found = None
            self.notify(str(exc), title="diff mode", severity="error", timeout=8)
        else:
            if found is None:
                self.notify("Nothing published yet: F9 lists versions and publishes the "
                            "roster (p).", title="diff mode", severity="warning", timeout=6)
        if found is None:
            self.compared, self.changed, self.diff = None, {}, False
            return False
        start = session.ws.unit.start
        self.compared = found
        self.changed = {(c.person, (c.date - start).days): c.before
                        for c in roster_diff(session.ws, found.roster, session.roster)
                        if c.person in session.roster.rows}
        return True

    def _diff_line(self) -> Content | None:
        grid = self.grid
        if not self.diff or self.compared is None or grid.person is None:
            return None
        key = (grid.person, grid.day)
        version = f"version {self.compared.version}"
        now = code_text(self.session.code(*key))
        if key in self.changed:
            return Content.styled(f"changed since {version}: published "
                                  f"{code_text(self.changed[key])} → now {now}", f"bold {VALUE}")
        return Content.styled(f"as in {version} ({now}) · {len(self.changed)} cells changed in "
                              "all", MUTED)
