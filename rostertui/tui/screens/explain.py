"""Why no roster keeps every hard rule: the explanation panel (F10).

The core's `explain` runs in a thread worker on the workspace as the grid shows it
(unsaved edits and locks included); its progress lines replace each other as they
come. Then the verdict, and the reasons in plain words, each with the people,
dates and rules it names and what could be changed: Enter on a reason shows its
person and date in the grid. When a roster can keep every hard rule, the requests
the grid's roster denies are priced instead (Enter shows the request's cell).

The last decided result is kept on the app until the roster changes (the app's
`revision`): the worker posts it to the app (`ExplanationKept`), so F10 again shows
it at once; r runs it again. Esc while it runs stops the search (within a fraction
of a second) and shows what was settled, marked stopped; Esc then closes. F10
closes at any time: a run still going then finishes unseen in its thread (its
result is kept for the next F10, if still current). The screen is dismissed with
the `GotoCell` to post, or None.
"""

from __future__ import annotations

import contextlib
import threading
import time
from dataclasses import dataclass
from datetime import date
from typing import TYPE_CHECKING

from textual import on, work
from textual.app import App, ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.content import Content
from textual.reactive import reactive
from textual.screen import ModalScreen
from textual.widgets import Label, OptionList, Static
from textual.widgets.option_list import Option
from textual.worker import Worker, WorkerState

from rostertui.core.explain.reasons import Reason
from rostertui.core.explain.words import day as day_text
from rostertui.core.models.workspace import Workspace
from rostertui.tui.host import host
from rostertui.tui.look import BAD, GOOD, MUTED, UNSURE
from rostertui.tui.messages import ExplainProgressed, ExplanationKept, GotoCell

if TYPE_CHECKING:  # the solver (OR-Tools) is imported when the first explanation starts
    from rostertui.core.explain.requests import RequestCost
    from rostertui.core.explain.run import Explanation

UI_LIMIT = 30.0  # seconds at most, whatever the solve's time limit


@dataclass
class Explained:
    """One explanation and what it was run on (and the option last chosen in it)."""

    revision: int  # the app's revision when it started: kept while the roster is unchanged
    ws: Workspace
    result: Explanation
    limit: float
    seconds: float
    finished: float  # time.monotonic() at the end
    hard: int  # hard violations of the grid's roster
    denied: int  # requests the grid's roster does not grant
    priced: bool  # False: the roster breaks hard rules, so requests were not priced
    chosen: int = 0  # the reason (or request) last shown in the grid: highlighted again


def ui_time_limit(solve_limit: float) -> float:
    return min(solve_limit, UI_LIMIT)


def in_period(ws: Workspace, dates: tuple[date, ...]) -> list[int]:
    unit = ws.unit
    return sorted((d - unit.start).days for d in dates if unit.in_period(d))


def target(ws: Workspace, reason: Reason) -> GotoCell | None:
    """The cell a reason leads to: its first date in the period, and of the people it
    names the first on leave that day (the cell one would change), else the first."""
    days = in_period(ws, reason.dates)
    day = days[0] if days else None
    known = [p for p in reason.people if p in ws.person_by_id]
    person = known[0] if known else None
    if day is not None and known:
        when = ws.unit.dates[day]
        away = {lv.person for lv in ws.requests.leave if lv.from_ <= when <= lv.last}
        person = next((p for p in known if p in away), person)
    if person is None and day is None:
        return None
    if person is None and reason.cover is not None:
        return GotoCell(None, day, reason.cover)  # a cover row's cell that day
    return GotoCell(person, day)


def people_text(ws: Workspace, people: tuple[str, ...], most: int = 5) -> str:
    names = [ws.person_by_id[p].name if p in ws.person_by_id else p for p in people]
    if len(names) <= most:
        return ", ".join(names)
    return ", ".join(names[:most]) + f" and {len(names) - most} more"


def remedies(reason: Reason) -> list[str]:
    """What could change, from the rules a reason names."""
    out = []
    for rule in reason.rules:
        if rule == "cover":
            out.append("lower a cover minimum, or add people with the skill (F6: Cover, "
                       "People)")
        elif rule == "leave":
            out.append("move or shorten a leave (F6: Leave)")
        elif rule == "lock":
            out.append("unlock a cell (ctrl+l in the grid)")
        else:
            out.append(f"rule {rule} takes part (F6: Rules shows it)")
    return out


def verdict_text(done: Explained) -> Content:
    result = done.result
    if result.stopped and not result.decided:
        return Content.assemble(("■ Stopped (Esc) before it was settled.", f"bold {UNSURE}"),
                             (" r runs it again · Esc closes.", "bold"))
    if result.feasible:
        text = Content.styled("✔ A roster exists that keeps every hard rule.", style=f"bold {GOOD}")
        if done.hard:
            text += Content.styled(f" The roster in the grid breaks {done.hard} hard rule"
                                   f"{'s' if done.hard != 1 else ''}: F5 builds one that keeps "
                                   "them all, F8 repairs it with few changes.", style="bold")
        return text
    if result.decided:
        n = len(result.reasons)
        return Content.assemble(
            ("✖ No roster can keep every hard rule.", f"bold {BAD}"),
            (f" {n} reason{'s' if n != 1 else ''} below, in plain words; Enter on one shows "
             "its person and date in the grid.", "bold"))
    return Content.assemble(
        (f"? Not settled in {done.limit:g} s: the solver neither found a roster nor proved "
         "that none exists.", f"bold {UNSURE}"),
        (f" The time limit here is the solve's (F5), at most {UI_LIMIT:g} s.", "bold"))


def reason_prompt(i: int, reason: Reason) -> Content:
    return Content.assemble((f"{i}. ", f"bold {UNSURE}"), reason.message)


def request_prompt(ws: Workspace, cost: RequestCost) -> Content:
    if cost.status == "granted" and cost.cost is not None:
        badge = (f"{cost.cost:+d}", f"bold {GOOD if cost.cost <= 0 else UNSURE}")
    elif cost.status == "impossible":
        badge = ("hard", f"bold {BAD}")
    else:
        badge = ("?", f"bold {MUTED}")
    return Content.assemble((f"{badge[0]:>5} ", badge[1]), cost.message(ws))


def request_order(cost: RequestCost) -> tuple[int, int]:
    """The cheapest to grant first, then the unpriced, then those no roster grants."""
    rank = {"granted": 0, "unknown": 1}.get(cost.status, 2)
    return rank, cost.cost if cost.cost is not None else 0


class ExplainScreen(ModalScreen[GotoCell | None]):
    CSS_PATH = "explain.tcss"

    BINDINGS = [
        Binding("escape", "close", "Stop / close", tooltip="stops a running explanation "
                "(what was settled stays shown); closes the panel otherwise"),
        Binding("f10", "hide", "Close", show=False),
        Binding("r", "again", "Run again", tooltip="explain again (a result is kept, and "
                "shown at once, until the roster changes)"),
        Binding("f1", "app.help", "Help", show=False),
    ]

    phase = reactive("running")  # running | done | failed

    def __init__(self, time_limit: float = UI_LIMIT, workers: int = 0) -> None:
        super().__init__()
        self.limit = ui_time_limit(time_limit)
        self.search_workers = workers
        self.started = 0.0
        self.step = "starting"
        self.done: Explained | None = None
        self.reasons: list[Reason] = []
        self.costs: list[RequestCost] = []
        self.cancel = threading.Event()  # Esc sets it: the running explanation stops

    @property
    def session(self):
        return host(self.app).session

    def compose(self) -> ComposeResult:
        with Vertical(id="explain-panel"):
            yield Label(f"Why · {self.session.ws.unit.name}: can a roster keep every hard "
                        "rule?", id="explain-title")
            yield Static("", id="explain-progress")
            yield Static("", id="verdict")
            yield OptionList(id="reasons")
            yield Static("", id="reason-detail")
            yield Static("", id="requests-title")
            yield OptionList(id="requests")
            yield Static("", id="explain-hint")

    def on_mount(self) -> None:
        self.set_interval(0.25, self._tick, name="explain-clock")
        kept = host(self.app).explained
        if kept is not None and kept.revision == host(self.app).revision:
            self.phase = "done"
            self.show(kept, kept=True)
        else:
            self.start()

    def watch_phase(self, phase: str) -> None:
        self.set_class(phase == "running", "-running")
        hint = {"running": "Esc stops it · F10 closes (it then finishes unseen; F10 shows "
                           "it if the roster has not changed)",
                "done": "r runs again · Esc closes",
                "failed": "r runs again · Esc closes"}[phase]
        self.query_one("#explain-hint", Static).update(Content.styled(hint))

    # -- running ------------------------------------------------------------------------------
    def start(self) -> None:
        from rostertui.core.explain.requests import denied

        session = self.session
        app = self.app
        self.cancel = threading.Event()
        ws = session.workspace_for_solve()
        hard = session.check.hard_violations
        asks = len(denied(ws, session.check)) if hard == 0 else 0
        self.phase = "running"
        self.started = time.monotonic()
        self.step = "starting"
        self.query_one("#verdict", Static).update("")
        for name in ("#reason-detail", "#requests-title"):
            self.query_one(name, Static).display = False
        for lists in self.query(OptionList):
            lists.clear_options()
            lists.display = False
        self._tick()
        self.run_explain(app, ws, host(app).revision, hard, asks, self.cancel)

    @work(thread=True, exclusive=True, group="explain", name="explanation",
          exit_on_error=False)
    def run_explain(self, app: App, ws: Workspace, revision: int, hard: int,
                    asks: int, cancel: threading.Event) -> Explained:
        from rostertui.core.explain.run import explain

        began = time.monotonic()
        result = explain(ws, self.limit, self.search_workers, on_progress=self._progress,
                         price_requests=hard == 0 and asks > 0, cancel=cancel)
        end = time.monotonic()
        out = Explained(revision, ws, result, self.limit, end - began, end, hard, asks,
                        hard == 0)
        if result.decided and not result.stopped:  # kept even if closed by now
            with contextlib.suppress(RuntimeError):  # the app's event loop has closed
                app.post_message(ExplanationKept(out))
        return out

    def _progress(self, text: str) -> None:
        """From the worker thread; nothing happens once the screen (or the app) is gone."""
        with contextlib.suppress(RuntimeError):  # the app's event loop has closed
            self.post_message(ExplainProgressed(text))

    @on(ExplainProgressed)
    def _progressed(self, event: ExplainProgressed) -> None:
        event.stop()
        self.step = event.text
        self._tick()

    def _tick(self) -> None:
        if self.phase != "running":
            return
        elapsed = time.monotonic() - self.started
        self.query_one("#explain-progress", Static).update(Content.assemble(
            ("… ", f"bold {UNSURE}"), (self.step, "bold"),
            (f"   {elapsed:.1f} s of at most {self.limit:g} s", MUTED)))

    def on_worker_state_changed(self, event: Worker.StateChanged) -> None:
        if event.worker.group != "explain":
            return
        if event.state == WorkerState.SUCCESS and isinstance(event.worker.result, Explained):
            self.phase = "done"
            self.show(event.worker.result)
        elif event.state in (WorkerState.ERROR, WorkerState.CANCELLED):
            self.phase = "failed"  # the app's one worker-failure handler shows the error
            self.query_one("#explain-progress", Static).update("")
            self.query_one("#verdict", Static).update(
                Content.styled("The explanation failed; nothing was changed.", style=f"bold {BAD}"))

    # -- the result ---------------------------------------------------------------------------
    def show(self, done: Explained, kept: bool = False) -> None:
        self.done = done
        ws, result = done.ws, done.result
        if kept:
            ago = time.monotonic() - done.finished
            when = f"{ago:.0f} s" if ago < 120 else f"{ago / 60:.0f} min"
            line = Content.styled(f"Explained {when} ago; the roster has not changed since (r "
                                  "runs it again).", style=MUTED)
        else:
            stopped = " Stopped (Esc): what was settled by then." if done.result.stopped else ""
            line = Content.styled(f"Done in {done.seconds:.1f} s.{stopped}", style=MUTED)
        self.query_one("#explain-progress", Static).update(line)
        self.query_one("#verdict", Static).update(verdict_text(done))

        self.reasons = list(result.reasons)
        reasons = self.query_one("#reasons", OptionList)
        reasons.clear_options()
        for i, reason in enumerate(self.reasons):
            if i:
                reasons.add_option(None)
            reasons.add_option(Option(reason_prompt(i + 1, reason), id=f"reason-{i}"))
        reasons.display = bool(self.reasons)
        self.query_one("#reason-detail", Static).display = bool(self.reasons)

        self.costs = sorted(result.requests, key=request_order)
        requests = self.query_one("#requests", OptionList)
        requests.clear_options()
        for i, cost in enumerate(self.costs):
            if i:
                requests.add_option(None)
            requests.add_option(Option(request_prompt(ws, cost), id=f"request-{i}"))
        requests.display = bool(self.costs)
        title = self.query_one("#requests-title", Static)
        title.update(self._requests_title(done))
        title.display = result.feasible

        first = done.chosen if kept else 0
        if self.reasons:
            reasons.highlighted = min(first, len(self.reasons) - 1)
            reasons.focus()
            self._detail(reasons.highlighted)
        elif self.costs:
            requests.highlighted = min(first, len(self.costs) - 1)
            requests.focus()
        if self.reasons or self.costs:
            self.query_one("#explain-hint", Static).update(Content.styled(
                "↑↓ choose · Enter shows it in the grid · r runs again · Esc closes"))

    def _requests_title(self, done: Explained) -> Content:
        if not done.priced:
            return Content.styled("Denied requests are priced against a roster that keeps every "
                                  "hard rule: build one first (F5), then explain again.",
                                  style=MUTED)
        if not done.denied:
            return Content.styled("The roster in the grid grants every request.", style=MUTED)
        n = len(self.costs)
        some = f"{n} of {done.denied}" if n < done.denied else f"{n}"
        return Content.assemble(
            (f"Requests the grid's roster does not grant ({some} priced in time): ", "bold"),
            ("the change in penalty to grant each with as few changes as possible, and who "
             "would pay it.", MUTED))

    def _detail(self, index: int | None) -> None:
        detail = self.query_one("#reason-detail", Static)
        if self.done is None or index is None or not 0 <= index < len(self.reasons):
            detail.update("")
            return
        ws, reason = self.done.ws, self.reasons[index]
        text = Content()
        names = []
        if reason.people:
            names.append(people_text(ws, reason.people))
        if reason.dates:
            days = sorted(reason.dates)
            names.append(day_text(days[0]) if len(days) == 1
                         else f"{day_text(days[0])} to {day_text(days[-1])}")
        if reason.rules:
            names.append("rules: " + ", ".join(reason.rules))
        text += Content.styled("about ", style=MUTED)
        text += Content.styled(" · ".join(names) or "nothing in particular")
        changes = remedies(reason)
        if changes:
            text += Content.styled("\nto change ", style=MUTED)
            text += Content.styled("; ".join(changes))
        goto = target(ws, reason)
        if goto is not None:
            who = ws.person_by_id[goto.person].name if goto.person else "the cursor's row"
            when = f" on {day_text(ws.unit.dates[goto.day])}" if goto.day is not None else ""
            text += Content.styled("\nEnter ", style=MUTED)
            text += Content.styled(f"shows {who}{when} in the grid")
        detail.update(text)

    # -- events and actions -------------------------------------------------------------------
    @on(OptionList.OptionHighlighted, "#reasons")
    def _highlighted(self, event: OptionList.OptionHighlighted) -> None:
        self._detail(self._index(event.option.id))

    @on(OptionList.OptionSelected, "#reasons")
    def _reason_chosen(self, event: OptionList.OptionSelected) -> None:
        index = self._index(event.option.id)
        if self.done is None or index is None:
            return
        goto = target(self.done.ws, self.reasons[index])
        if goto is None:
            self.notify("this reason names no person or date in the period", timeout=3)
            return
        self.done.chosen = index
        self.dismiss(goto)

    @on(OptionList.OptionSelected, "#requests")
    def _request_chosen(self, event: OptionList.OptionSelected) -> None:
        index = self._index(event.option.id)
        if self.done is None or index is None:
            return
        r = self.costs[index].request
        days = in_period(self.done.ws, (r.date,))
        self.done.chosen = index
        self.dismiss(GotoCell(r.person, days[0] if days else None))

    @staticmethod
    def _index(option_id: str | None) -> int | None:
        try:
            return int(str(option_id).rsplit("-", 1)[1])
        except (IndexError, ValueError):
            return None

    def action_again(self) -> None:
        if self.phase != "running":
            self.start()

    def action_close(self) -> None:
        """Esc: stop a running explanation (its end is shown), else close."""
        if self.phase == "running":
            self.cancel.set()
            self.step = "stopping"
            self._tick()
        else:
            self.dismiss(None)

    def action_hide(self) -> None:
        """F10: close; a running explanation finishes unseen (kept for the next F10)."""
        self.dismiss(None)
