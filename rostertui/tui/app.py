"""The rostertui app: bindings, modes, and the few actions every screen shares.

The screens do the work. State is one `Session` (state.py); after each change the
app bumps the reactive `revision`, and every screen watching it repaints.
"""

from __future__ import annotations

from collections.abc import Iterable

from textual import on
from textual.app import App, SystemCommand
from textual.binding import Binding
from textual.reactive import reactive
from textual.screen import Screen
from textual.worker import Worker, WorkerState

from rostertui.core.models.workspace import Workspace
from rostertui.tui.messages import GotoCell, RosterSolved
from rostertui.tui.screens.dialogs import ConfirmQuit, ErrorDialog
from rostertui.tui.screens.editors import EditorsScreen
from rostertui.tui.screens.fairness import FairnessScreen
from rostertui.tui.screens.help import HelpScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.solve import SolveScreen, SolveSettings
from rostertui.tui.screens.violations import ViolationsScreen
from rostertui.tui.state import Session, changed_cells


class RosterApp(App[int]):
    CSS_PATH = "app.tcss"
    TITLE = "rostertui"
    MODES = {"roster": RosterScreen, "violations": ViolationsScreen, "fairness": FairnessScreen,
             "edit": EditorsScreen}
    DEFAULT_MODE = "roster"

    BINDINGS = [
        Binding("f1,question_mark", "help", "Help", key_display="F1"),
        Binding("f2", "switch_mode('roster')", "Grid", key_display="F2"),
        Binding("f3", "switch_mode('violations')", "Violations", key_display="F3"),
        Binding("f4", "switch_mode('fairness')", "Fairness", key_display="F4"),
        Binding("f5", "solve", "Solve", key_display="F5"),
        Binding("f6", "switch_mode('edit')", "Edit", key_display="F6"),
        Binding("ctrl+s", "save", "Save"),
        Binding("ctrl+z", "undo", "Undo"),
        Binding("ctrl+y", "redo", "Redo", show=False),
        Binding("ctrl+q", "quit", "Quit", priority=True),
    ]

    revision = reactive(0)

    def __init__(self, ws: Workspace, solve_settings: SolveSettings | None = None) -> None:
        super().__init__()
        self.session = Session(ws)
        self.solve_settings = solve_settings or SolveSettings()
        self.title = f"rostertui · {ws.unit.name}"

    def on_mount(self) -> None:
        for problem in self.session.ws.warnings:
            self.notify(str(problem), title="warning", severity="warning", timeout=8)
        if not self.session.had_file:
            self.notify("No roster.toml yet: everyone is off. F5 builds a roster; or type "
                        "shift codes into the grid. F1 lists every key.", timeout=8)

    def check_action(self, action: str, parameters: tuple[object, ...]) -> bool | None:
        """The footer leaves out the key of the screen already shown."""
        return not (action == "switch_mode" and parameters[:1] == (self.current_mode,))

    def revised(self) -> None:
        """The session changed: every screen watching `revision` repaints."""
        self.revision += 1

    def replace_session(self, session: Session) -> None:
        """An editor rewrote a workspace file: carry on with the reloaded workspace."""
        self.session = session
        self.revised()

    def get_system_commands(self, screen: Screen) -> Iterable[SystemCommand]:
        yield from super().get_system_commands(screen)
        yield SystemCommand("Solve", "Build a roster with the solver (F5)", self.action_solve)
        yield SystemCommand("Save", "Write roster.toml (ctrl+s)", self.action_save)
        yield SystemCommand("Undo", "Undo the last change (ctrl+z)", self.action_undo)
        yield SystemCommand("Keys", "Every key binding (F1)", self.action_help)

    # -- actions ------------------------------------------------------------------------------
    def action_help(self) -> None:
        if not isinstance(self.screen, HelpScreen):
            self.push_screen(HelpScreen())

    def action_solve(self) -> None:
        if not isinstance(self.screen, SolveScreen):
            self.push_screen(SolveScreen(self.solve_settings))

    def action_save(self) -> None:
        try:
            path = self.session.save()
        except OSError as exc:
            self.push_screen(ErrorDialog("Not saved", f"roster.toml could not be written: {exc}"))
            return
        self.notify(f"saved {path}", timeout=4)
        self.revised()

    def action_undo(self) -> None:
        change = self.session.undo()
        self.notify(f"undone: {change.label}" if change else "nothing to undo", timeout=3)
        self.revised()

    def action_redo(self) -> None:
        change = self.session.redo()
        self.notify(f"redone: {change.label}" if change else "nothing to redo", timeout=3)
        self.revised()

    async def action_quit(self) -> None:
        session = self.session
        if not session.dirty:
            self.exit(0)
            return
        changes = len(changed_cells(session.saved, session.roster))
        changes += int(session.saved.lock != session.roster.lock)

        def chosen(choice: str | None) -> None:
            if choice == "save":
                self.action_save()
                if not self.session.dirty:
                    self.exit(0)
            elif choice == "discard":
                self.exit(0)

        if not isinstance(self.screen, ConfirmQuit):
            self.push_screen(ConfirmQuit(changes), chosen)

    # -- messages from the screens ----------------------------------------------------------
    @on(GotoCell)
    async def _goto(self, event: GotoCell) -> None:
        await self.switch_mode("roster")
        screen = self.screen
        if isinstance(screen, RosterScreen):
            screen.goto(event.person, event.day, event.cover)

    @on(RosterSolved)
    def _solved(self, event: RosterSolved) -> None:
        outcome = event.outcome
        self.session.replace(outcome.roster, f"solve ({outcome.status})")
        self.revised()

    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        """The one place a failed worker becomes an error dialog."""
        if event.state == WorkerState.ERROR:
            error = event.worker.error
            self.push_screen(ErrorDialog(f"{event.worker.name or 'work'} failed",
                                         f"{type(error).__name__}: {error}"))
