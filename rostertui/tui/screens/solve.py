"""Live solve: options, then progress as solutions come, then what changed.

The solver runs in a thread worker; its progress callback is a `ProgressRelay`,
which posts at most one `SolveProgressed` at a time (and a newer one replaces a
queued older one), so the UI never floods. A timer ticks the elapsed time between
solutions. Escape stops the search and keeps the best roster found so far.
The solved roster becomes the grid's roster, unsaved (ctrl+s saves, ctrl+z undoes).

`SearchScreen` is that machinery; `SolveScreen` here and `RepairScreen`
(repair.py) say what to ask, what to run and what to show at the end.
"""

from __future__ import annotations

import threading
import time
from collections.abc import Iterable
from dataclasses import dataclass
from typing import Any, ClassVar

from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.content import Content
from textual.reactive import reactive
from textual.screen import ModalScreen
from textual.types import CSSPathType
from textual.widget import Widget
from textual.widgets import Button, Input, Label, Sparkline, Static
from textual.worker import Worker, WorkerState

from rostertui.core.edit.session import Session, changed_cells
from rostertui.core.solver.summary import bound_sources, improvement_story
from rostertui.tui.host import host
from rostertui.tui.look import BAD, GOOD, MUTED, UNSURE, VALUE
from rostertui.tui.messages import (
    ExplainRequested,
    ProgressRelay,
    RosterSolved,
    SolveProgressed,
    SolveSettingsChosen,
)


@dataclass(frozen=True)
class SolveSettings:
    time_limit: float = 60.0
    workers: int = 0
    seed: int = 0


def progress_text(elapsed: float, penalty: int | None, bound: int | None,
                  changes: int | None = None, stage: str = "search",
                  found_by: str | None = None) -> Content:
    text = Content.assemble(("elapsed ", MUTED), (f"{elapsed:6.1f} s", "bold"))
    if penalty is None and stage == "bound":
        text += Content.styled("   proving a bound (column generation)…", style=UNSURE)
    elif penalty is None:
        text += Content.styled("   searching for a first roster…", style=UNSURE)
    else:
        text += Content.styled("   penalty ", style=MUTED)
        text += Content.styled(f"{penalty}", style=f"bold {GOOD}")
    if bound is not None:
        text += Content.styled("   bound ", style=MUTED)
        text += Content.styled(f"{bound}", style="bold")
    if penalty is not None and bound is not None:
        gap = 0.0 if penalty == 0 else max(0.0, (penalty - bound) / abs(penalty))
        text += Content.styled("   gap ", style=MUTED)
        text += Content.styled(f"{gap:.1%}", style="bold")
    if changes is not None and penalty is not None:
        text += Content.styled("   cells changed ", style=MUTED)
        text += Content.styled(f"{changes}", style=f"bold {VALUE}")
    if found_by is not None and penalty is not None:
        text += Content.styled("   by ", style=MUTED)
        text += Content.styled(found_by, style=f"bold {VALUE}")
    return text


class SearchScreen(ModalScreen[None]):
    """Settings, a search in a thread worker with live progress, then the result."""

    CSS_PATH: ClassVar[CSSPathType | None] = "solve.tcss"

    BINDINGS = [
        Binding("escape", "stop_or_close", "Stop / close"),
        Binding("enter", "start_or_close", "Start / close", show=False),
        Binding("f1", "app.help", "Help", show=False),
    ]

    WORK_NAME = "search"
    HINTS = {"ready": "", "running": "", "done": "", "failed": "Enter or Esc closes"}

    phase = reactive("ready")  # ready | running | done | failed

    def __init__(self, settings: SolveSettings) -> None:
        super().__init__()
        self.settings = settings
        self.cancel = threading.Event()
        self.relay = ProgressRelay(self.post_message)
        self.started = 0.0
        self.last_penalty: int | None = None
        self.last_bound: int | None = None
        self.last_stage = "search"
        self.last_found_by: str | None = None
        self.last_changes: int | None = None
        self.penalties: list[float] = []
        self.summary = ""

    @property
    def session(self) -> Session:
        return host(self.app).session

    # -- what a subclass says -----------------------------------------------------------------
    def heading(self) -> str:
        raise NotImplementedError

    def form(self) -> Iterable[Widget]:
        """Fields before the solver's own (time limit, workers, seed)."""
        return ()

    def results(self) -> Iterable[Widget]:
        """Widgets under the summary (shown when done)."""
        return ()

    def end_buttons(self) -> Iterable[Widget]:
        yield Button("Close", id="close")

    def read_form(self) -> bool:
        """Read the subclass's fields; False (and a message in #summary) when wrong."""
        return True

    def search(self, session: Session, settings: SolveSettings) -> Any:
        """Runs in the worker thread: the search, with `self.relay` and `self.cancel`."""
        raise NotImplementedError

    def finished(self, result: Any) -> None:
        raise NotImplementedError

    # -- layout -------------------------------------------------------------------------------
    def compose(self) -> ComposeResult:
        s = self.settings
        with Vertical(id="panel"):
            yield Label(self.heading(), id="title")
            with Horizontal(id="form"):
                yield from self.form()
                yield Label("time limit (s)")
                yield Input(f"{s.time_limit:g}", type="number", id="time-limit")
                yield Label("workers (0 = all)")
                yield Input(str(s.workers), type="integer", id="workers")
                yield Label("seed")
                yield Input(str(s.seed), type="integer", id="seed")
            yield Static("", id="progress")
            yield Sparkline([], id="spark")
            yield Static("", id="summary")
            yield from self.results()
            with Horizontal(id="buttons"):
                yield Button("Start", id="start", variant="primary")
                yield Button("Stop, keep the best", id="stop", variant="warning")
                yield from self.end_buttons()
            yield Static("", id="hint")

    def on_mount(self) -> None:
        self.watch_phase("ready")
        self.query_one("#start", Button).focus()

    def watch_phase(self, phase: str) -> None:
        self.set_class(phase == "ready", "-ready")
        self.set_class(phase == "running", "-running")
        self.set_class(phase in ("done", "failed"), "-done")
        self.hint(self.HINTS[phase])

    def hint(self, text: str) -> None:
        self.query_one("#hint", Static).update(Content.styled(text))

    def say(self, text: str | Content) -> None:
        self.query_one("#summary", Static).update(text)

    # -- starting -----------------------------------------------------------------------------
    def _read_settings(self) -> SolveSettings | None:
        try:
            limit = float(self.query_one("#time-limit", Input).value)
            workers = int(self.query_one("#workers", Input).value or 0)
            seed = int(self.query_one("#seed", Input).value or 0)
        except ValueError:
            self.say("time limit, workers and seed are numbers")
            return None
        if limit <= 0 or workers < 0:
            self.say("the time limit must be above 0 and workers 0 or more")
            return None
        return SolveSettings(limit, workers, seed)

    def action_start_or_close(self) -> None:
        if self.phase == "ready":
            self.start()
        elif self.phase in ("done", "failed"):
            self.dismiss()

    @on(Input.Submitted)
    @on(Button.Pressed, "#start")
    def start(self) -> None:
        if self.phase != "ready":
            return
        self.say("")
        settings = self._read_settings()
        if settings is None or not self.read_form():
            return
        self.settings = settings
        self.app.post_message(SolveSettingsChosen(settings))
        self.phase = "running"
        self.started = time.monotonic()
        self.set_interval(0.25, self._tick, name="solve-clock")
        self.query_one("#stop", Button).focus()
        session = self.session
        self.run_worker(lambda: self.search(session, settings), name=self.WORK_NAME,
                        group="solve", thread=True, exclusive=True, exit_on_error=False)

    # -- progress -----------------------------------------------------------------------------
    def _tick(self) -> None:
        if self.phase == "running":
            elapsed = time.monotonic() - self.started
            self.query_one("#progress", Static).update(
                progress_text(elapsed, self.last_penalty, self.last_bound, self.last_changes,
                              self.last_stage, self.last_found_by))

    @on(SolveProgressed)
    def _progressed(self, event: SolveProgressed) -> None:
        event.stop()
        p = self.relay.take() or event.progress
        self.last_penalty, self.last_bound, self.last_changes = p.penalty, p.bound, p.changes
        self.last_stage = p.stage
        if p.penalty is not None and (not self.penalties or self.penalties[-1] != p.penalty):
            self.penalties.append(float(p.penalty))
            self.query_one(Sparkline).data = list(self.penalties[-200:])
            if p.found_by is not None and p.found_by != self.last_found_by:
                self.say(f"{p.elapsed:.1f} s: penalty {p.penalty}, found by {p.found_by}")
        self.last_found_by = p.found_by
        self._tick()

    def action_stop_or_close(self) -> None:
        if self.phase == "running":
            self.cancel.set()
            self.hint("stopping: keeping the best roster so far…")
        else:
            self.dismiss()

    @on(Button.Pressed, "#stop")
    def _stop(self) -> None:
        self.action_stop_or_close()

    @on(Button.Pressed, "#close")
    def _close(self) -> None:
        if self.phase != "running":
            self.dismiss()

    # -- the end ------------------------------------------------------------------------------
    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        if event.worker.group != "solve":
            return
        if event.state == WorkerState.SUCCESS:
            self.phase = "done"
            self.finished(event.worker.result)
        elif event.state in (WorkerState.ERROR, WorkerState.CANCELLED):
            self.phase = "failed"  # the app's one worker-failure handler shows the error
            self.say(Content.styled(f"The {self.WORK_NAME} failed; the grid is unchanged.",
                                    style=f"bold {BAD}"))

    def no_roster(self, status: str) -> None:
        why = ("No roster keeps every hard rule: the rules, cover, leave and locks "
               "contradict each other." if status == "infeasible" else
               "No roster found in the time given (not proven impossible either); "
               "try a longer time limit.")
        self.summary = f"{why} The grid is unchanged."
        self.say(Content.styled(self.summary, style=f"bold {BAD}"))
        self.query_one("#progress", Static).update(Content.assemble(  # not "searching…"
            ("elapsed ", MUTED), (f"{time.monotonic() - self.started:6.1f} s", "bold"),
            ("   no roster", f"bold {BAD}")))

    def on_unmount(self) -> None:
        self.cancel.set()  # a search still running stops with the screen


class SolveScreen(SearchScreen):
    BINDINGS = [
        *SearchScreen.BINDINGS,
        Binding("f10", "why", "Why no roster (closes the solve)", show=False),
    ]

    WORK_NAME = "solve"
    HINTS = {
        "ready": "Enter starts · Esc closes · the current grid (with its locks) is the "
                 "warm start",
        "running": "Esc stops the search and keeps the best roster so far",
        "done": "Enter or Esc closes · ctrl+s saves · ctrl+z gives back the old roster",
        "failed": "Enter or Esc closes",
    }

    def heading(self) -> str:
        return f"Solve {self.session.ws.unit.name}"

    def end_buttons(self) -> Iterable[Widget]:
        yield Button("Close", id="close")
        yield Button("Why? (F10)", id="why", variant="primary")

    def on_mount(self) -> None:
        super().on_mount()
        self.query_one("#why", Button).display = False

    def no_roster(self, status: str) -> None:
        super().no_roster(status)
        if status == "infeasible":
            self.hint("F10 or Why? explains which rules, people and dates collide (the "
                      "solve closes) · Esc closes")
            why = self.query_one("#why", Button)
            why.display = True
            why.focus()

    @on(Button.Pressed, "#why")
    def action_why(self) -> None:
        """Close the solve and explain (not while it runs: Esc stops it first)."""
        if self.phase == "running":
            self.notify("the solve is running: Esc stops it first", timeout=3)
            return
        self.dismiss()
        self.app.post_message(ExplainRequested())

    def search(self, session: Session, settings: SolveSettings):
        from rostertui.core.solver import SolveOptions, solve

        options = SolveOptions(time_limit=settings.time_limit, workers=settings.workers,
                               seed=settings.seed)
        return solve(session.workspace_for_solve(), options, on_progress=self.relay,
                     cancel=self.cancel)

    def finished(self, outcome) -> None:
        before, before_check = self.session.roster, self.session.check
        self.last_penalty, self.last_bound = outcome.objective, outcome.bound
        self.query_one("#progress", Static).update(
            progress_text(outcome.seconds, outcome.objective, outcome.bound))
        if outcome.roster is None:
            self.no_roster(outcome.status)
            return
        check = outcome.check
        changed = changed_cells(before, outcome.roster)
        stopped = " (stopped early)" if self.cancel.is_set() else ""
        self.summary = (
            f"{outcome.status}{stopped}: {len(changed)} cells changed; penalty "
            f"{before_check.penalty} -> {check.penalty}; hard violations "
            f"{before_check.hard_violations} -> {check.hard_violations}; "
            f"{outcome.seconds:.1f} s. Bounds: {bound_sources(outcome)}. "
            f"Found by: {improvement_story(outcome)}. "
            "The new roster is in the grid, not saved yet.")
        self.say(Content.styled(self.summary, style="bold"))
        self.post_message(RosterSolved(outcome))
        self.query_one("#close", Button).focus()
