"""A screen that shows the session and redraws when it changes, even while hidden."""

from __future__ import annotations

from textual.screen import Screen


class PanelScreen(Screen):
    """Redraws now if shown when the roster changes (the app's `revision`), else on return.

    Subclasses implement `reload()` and call `self.follow_revisions()` once mounted.
    """

    _stale = False

    def follow_revisions(self) -> None:
        self.watch(self.app, "revision", self._revised, init=False)

    def reload(self) -> None:  # pragma: no cover - every panel defines it
        raise NotImplementedError

    def _revised(self) -> None:
        if self.is_current:
            self.reload()
        else:
            self._stale = True

    def on_screen_resume(self) -> None:
        if self._stale:
            self._stale = False
            self.reload()
