"""The rostertui app: bindings, modes, and the few actions every screen shares.

The screens do the work. State is one `Session` (core/edit/session.py); after each change the
app bumps the reactive `revision`, and every screen watching it repaints.
"""

from __future__ import annotations

from collections.abc import Iterable
from pathlib import Path

from textual import on
from textual.app import App, SystemCommand
from textual.binding import Binding
from textual.reactive import reactive
from textual.screen import ModalScreen, Screen
from textual.worker import Worker, WorkerState

from rostertui.core.edit.session import Session
from rostertui.core.intake.requests_csv import RequestsImport
from rostertui.core.models.workspace import Workspace
from rostertui.tui.messages import (
    CompareWith,
    ExplainRequested,
    ExplanationKept,
    GotoCell,
    RosterSolved,
    SessionChanged,
    SolveSettingsChosen,
    WorkspaceEdited,
)
from rostertui.tui.screens.dialogs import ConfirmQuit, ErrorDialog, notify_written
from rostertui.tui.screens.editors import EditorsScreen
from rostertui.tui.screens.explain import Explained, ExplainScreen
from rostertui.tui.screens.export import ExportScreen
from rostertui.tui.screens.fairness import FairnessScreen
from rostertui.tui.screens.help import HelpScreen
from rostertui.tui.screens.intake import AddRequestsScreen
from rostertui.tui.screens.nextperiod import NextPeriodScreen
from rostertui.tui.screens.repair import RepairScreen
from rostertui.tui.screens.roster import RosterScreen
from rostertui.tui.screens.solve import SearchScreen, SolveScreen, SolveSettings
from rostertui.tui.screens.versions import VersionsScreen
from rostertui.tui.screens.violations import ViolationsScreen


class RosterApp(App[int]):
    CSS_PATH = ["app.tcss", "widgets/grid.tcss"]
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
        Binding("f7", "export", "Export", key_display="F7", tooltip="export the roster "
                "as shown (unsaved edits included): CSV, calendars, a printable page, the "
                "audit report"),
        Binding("f8", "repair", "Repair", key_display="F8"),
        Binding("f9", "versions", "Versions", key_display="F9"),
        Binding("f10", "explain", "Why", key_display="F10", tooltip="why no roster keeps "
                "every hard rule: which rules, people and dates collide, in plain words; "
                "when one can, what each denied request would cost"),
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
        self.compare_to: int | None = None  # the version diff mode compares with (None: last)
        self.explained: Explained | None = None  # the last explanation (F10), with its revision
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
        yield SystemCommand("Repair", "Solve again changing as few cells as possible (F8)",
                            self.action_repair)
        yield SystemCommand("Why", "Explain why no roster keeps every hard rule, or price "
                            "the denied requests (F10)", self.action_explain)
        yield SystemCommand("Export", "Write the roster as CSV, calendars, a printable page "
                            "or the audit report (F7)", self.action_export)
        yield SystemCommand("Versions", "Published versions; publish the roster (F9)",
                            self.action_versions)
        yield SystemCommand("Diff", "Highlight the cells changed since the last published "
                            "version (ctrl+d in the grid)", self.action_diff)
        yield SystemCommand("Save", "Write roster.toml, and requests.toml after an absence "
                            "(ctrl+s)", self.action_save)
        yield SystemCommand("Start the next period…", "A new workspace for the period after "
                            "this one, its history what this roster worked: preview, then "
                            "create", self.action_next_period)
        yield SystemCommand("Add requests from a CSV file…", "Requests from a spreadsheet or "
                            "a form export: preview, then add (undoable; ctrl+s saves)",
                            self.action_add_requests)
        yield SystemCommand("Undo", "Undo the last change (ctrl+z)", self.action_undo)
        yield SystemCommand("Keys", "Every key binding (F1)", self.action_help)

    # -- actions ------------------------------------------------------------------------------
    def action_help(self) -> None:
        if not isinstance(self.screen, HelpScreen):
            self.push_screen(HelpScreen())

    def searching(self) -> bool:
        """A solve or a repair is open (one at a time: each replaces the grid's roster)."""
        if any(isinstance(s, SearchScreen) for s in self.screen_stack):
            self.notify("a solve or repair is open: Esc closes it first", timeout=3)
            return True
        return False

    def action_solve(self) -> None:
        if not self.searching():
            self.push_screen(SolveScreen(self.solve_settings))

    def action_repair(self) -> None:
        if not self.searching():
            from rostertui.core.repair.repair import default_from

            start = default_from(self.session.ws)  # today where the unit is, as the CLI
            self.push_screen(RepairScreen(self.solve_settings, start))

    def dialog_open(self, what: str) -> bool:
        """A dialog is on top: it closes first (Esc)."""
        if isinstance(self.screen, ModalScreen):
            self.notify(f"{what}: close the open dialog first (Esc)", timeout=3)
            return True
        return False

    def action_explain(self) -> None:
        if not self.dialog_open("Why"):
            self.open_explanation()

    def open_explanation(self) -> None:
        settings = self.solve_settings
        self.push_screen(ExplainScreen(settings.time_limit, settings.workers), self._explained)

    def _explained(self, goto: GotoCell | None) -> None:
        if goto is not None:
            self.post_message(goto)

    def action_export(self) -> None:
        if not self.dialog_open("Export"):
            self.push_screen(ExportScreen(self.session.workspace_for_solve()), self._exported)

    def _exported(self, written: list[Path] | None) -> None:
        if not written:
            return
        shown = (str(written[0]) if len(written) == 1
                 else f"{len(written)} files in {written[0].parent}")
        self.notify(f"exported {shown}", title="export", timeout=6)

    def action_add_requests(self) -> None:
        if not self.dialog_open("Add requests"):
            self.push_screen(AddRequestsScreen(self.session.ws), self._requests_added)

    def _requests_added(self, plan: RequestsImport | None) -> None:
        if plan is None or plan.requests is None:
            return
        n = len(plan.added)
        label = f"add {n} request{'s' if n != 1 else ''} from {plan.label}"
        if self.session.add_requests(plan.requests, label) is not None:
            self.notify(f"{label}; ctrl+s writes requests.toml, ctrl+z undoes",
                        title="requests", timeout=6)
            self.revised()

    def action_versions(self) -> None:
        if isinstance(self.screen, VersionsScreen):
            return

        async def compare(version: int | None) -> None:
            if version is not None:
                await self.switch_mode("roster")
                screen = self.screen
                if isinstance(screen, RosterScreen):
                    screen.show_diff(True, version)

        self.push_screen(VersionsScreen(self.compare_to), compare)

    async def action_diff(self) -> None:
        await self.switch_mode("roster")
        screen = self.screen
        if isinstance(screen, RosterScreen):
            screen.action_diff()

    def action_next_period(self) -> None:
        folder = self.session.ws.path
        if folder is None or self.dialog_open("Next period"):
            return
        self.push_screen(NextPeriodScreen(folder, unsaved=self.session.dirty),
                         self._next_made)

    def _next_made(self, folder: Path | None) -> None:
        if folder is not None:
            self.notify(f"the next period is in {folder}; open it with: rostertui {folder}",
                        title="next period", timeout=10)

    def action_save(self) -> None:
        try:
            self.session.save()
        except OSError as exc:
            self.push_screen(ErrorDialog("Not saved", f"the files could not be written: {exc}"))
            return
        notify_written(self, "saved " + " and ".join(str(p) for p in self.session.wrote),
                       self.session.notices, timeout=4)
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
        changes = session.unsaved_changes()
        files = "roster.toml and requests.toml" if session.requests_dirty else "roster.toml"

        def chosen(choice: str | None) -> None:
            if choice == "save":
                self.action_save()
                if not self.session.dirty:
                    self.exit(0)
            elif choice == "discard":
                self.exit(0)

        if not isinstance(self.screen, ConfirmQuit):
            self.push_screen(ConfirmQuit(changes, files), chosen)

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
        assert outcome.roster is not None  # posted only when the search found a roster
        self.session.replace(outcome.roster, f"solve ({outcome.status})")
        self.revised()

    @on(SessionChanged)
    def _session_changed(self) -> None:
        self.revised()

    @on(WorkspaceEdited)
    def _workspace_edited(self, event: WorkspaceEdited) -> None:
        self.replace_session(event.session)

    @on(CompareWith)
    def _compare_with(self, event: CompareWith) -> None:
        self.compare_to = event.version

    @on(SolveSettingsChosen)
    def _solve_settings(self, event: SolveSettingsChosen) -> None:
        self.solve_settings = event.settings

    @on(ExplainRequested)
    def _explain_requested(self) -> None:
        self.open_explanation()

    @on(ExplanationKept)
    def _explanation_kept(self, event: ExplanationKept) -> None:
        """The newest roster's explanation wins (an older run may end later)."""
        kept = self.explained
        if kept is None or kept.revision <= event.explained.revision:
            self.explained = event.explained

    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        """The one place a failed worker becomes an error dialog."""
        if event.state == WorkerState.ERROR:
            error = event.worker.error
            self.push_screen(ErrorDialog(f"{event.worker.name or 'work'} failed",
                                         f"{type(error).__name__}: {error}"))
