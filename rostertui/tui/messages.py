"""Messages that travel upward between screens and the app, carrying plain data.

Screens never set the app's attributes: they post one of these (to the app, when
the screen may close before it would pass the message on) and the app changes
its own state.
"""

from __future__ import annotations

import threading
from collections.abc import Callable
from typing import TYPE_CHECKING

from textual.message import Message

if TYPE_CHECKING:  # the solver (OR-Tools) is imported when the first solve starts
    from rostertui.core.edit.session import Session
    from rostertui.core.solver import SolveOutcome, SolveProgress
    from rostertui.tui.screens.explain import Explained
    from rostertui.tui.screens.solve import SolveSettings


class GotoCell(Message):
    """Show this person's cell on this day in the roster grid (from the violations list or
    the explanation); a day alone moves along the cursor's row."""

    def __init__(self, person: str | None, day: int | None, cover: tuple[str, str | None]
                 | None = None):
        super().__init__()
        self.person, self.day, self.cover = person, day, cover


class WorkspaceEdited(Message):
    """An editor wrote a workspace file; `session` is the reloaded workspace's session."""

    def __init__(self, session: Session, note: str):
        super().__init__()
        self.session, self.note = session, note


class SessionChanged(Message):
    """The session changed (an edit, a lock, a swap, an absence, a publish): the app bumps
    its `revision`, and every screen watching it repaints."""


class CompareWith(Message):
    """Diff mode compares with this published version from now on."""

    def __init__(self, version: int):
        super().__init__()
        self.version = version


class SolveSettingsChosen(Message):
    """The settings a solve started with: the next solve (and repair, and Why) starts
    from them."""

    def __init__(self, settings: SolveSettings):
        super().__init__()
        self.settings = settings


class ExplainRequested(Message):
    """Open the explanation panel (Why, F10)."""


class ExplanationKept(Message):
    """A decided explanation, posted by its worker thread: the app keeps it for the next
    F10 while the roster is unchanged (even when the panel was closed meanwhile)."""

    def __init__(self, explained: Explained):
        super().__init__()
        self.explained = explained


class SolveProgressed(Message):
    """The solver found a better roster or a better bound. A newer one replaces an
    older one still waiting in the queue, so a flood of solutions never floods the UI."""

    def __init__(self, progress: SolveProgress):
        super().__init__()
        self.progress = progress

    def can_replace(self, message: Message) -> bool:
        return isinstance(message, SolveProgressed)


class ExplainProgressed(Message):
    """What the explanation is doing now ("looking for hard items that cannot all hold").
    A newer one replaces an older one still waiting in the queue."""

    def __init__(self, text: str):
        super().__init__()
        self.text = text

    def can_replace(self, message: Message) -> bool:
        return isinstance(message, ExplainProgressed)


class RosterSolved(Message):
    """A solve ended with a roster: the app makes it the current (unsaved) roster."""

    def __init__(self, outcome: SolveOutcome):
        super().__init__()
        self.outcome = outcome


class ProgressRelay:
    """The solver's progress callback (called from solver threads).

    Keeps only the latest progress and posts a message only when none is waiting,
    so at most one progress message is ever in flight: the handler calls `take()`
    for the latest progress, which lets the next one be posted.
    """

    def __init__(self, post: Callable[[Message], object]):
        self._post = post
        self._lock = threading.Lock()
        self._latest: SolveProgress | None = None
        self._waiting = False
        self.received = 0
        self.posted = 0

    def __call__(self, progress: SolveProgress) -> None:
        with self._lock:
            self.received += 1
            self._latest = progress
            if self._waiting:
                return
            self._waiting = True
            self.posted += 1
        self._post(SolveProgressed(progress))

    def take(self) -> SolveProgress | None:
        with self._lock:
            self._waiting = False
            return self._latest
