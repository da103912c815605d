"""Small modal dialogs: quit with unsaved changes, a yes/no question, an error message;
and the note after a write."""

from __future__ import annotations

from textual import on
from textual.app import App, ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widget import Widget
from textual.widgets import Button, Label, Static


class ConfirmQuit(ModalScreen[str | None]):
    """Dismissed with "save", "discard" or None (stay)."""

    CSS_PATH = "dialogs.tcss"

    BINDINGS = [
        Binding("s", "choose('save')", "Save and quit"),
        Binding("d", "choose('discard')", "Quit without saving"),
        Binding("escape,c", "choose(None)", "Cancel"),
    ]

    def __init__(self, changes: int, files: str = "roster.toml") -> None:
        super().__init__()
        self.changes, self.files = changes, files

    def compose(self) -> ComposeResult:
        steps = f"{self.changes} change{'s' if self.changes != 1 else ''}"
        with Vertical(classes="dialog"):
            yield Label("Unsaved changes", classes="title")
            yield Static(f"The roster has {steps} not yet saved to {self.files}.")
            with Horizontal(classes="buttons"):
                yield Button("Save and quit (s)", id="save", variant="primary")
                yield Button("Quit without saving (d)", id="discard", variant="error")
                yield Button("Cancel (Esc)", id="cancel")

    def on_mount(self) -> None:
        self.query_one("#save", Button).focus()

    @on(Button.Pressed)
    def _pressed(self, event: Button.Pressed) -> None:
        self.dismiss(None if event.button.id == "cancel" else event.button.id)

    def action_choose(self, choice: str | None) -> None:
        self.dismiss(choice)


class Confirm(ModalScreen[bool]):
    """A yes/no question; dismissed with True (y or the button) or False (n, Esc)."""

    CSS_PATH = "dialogs.tcss"

    BINDINGS = [
        Binding("y", "answer(True)", "Yes"),
        Binding("n,escape", "answer(False)", "No"),
    ]

    def __init__(self, question: str, yes: str = "Yes") -> None:
        super().__init__()
        self.question, self.yes = question, yes

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            yield Static(self.question)
            with Horizontal(classes="buttons"):
                yield Button(f"{self.yes} (y)", id="yes", variant="error")
                yield Button("Cancel (n)", id="no")

    def on_mount(self) -> None:
        self.query_one("#no", Button).focus()

    @on(Button.Pressed)
    def _pressed(self, event: Button.Pressed) -> None:
        self.dismiss(event.button.id == "yes")

    def action_answer(self, yes: bool) -> None:
        self.dismiss(yes)


class ErrorDialog(ModalScreen[None]):
    CSS_PATH = "dialogs.tcss"

    BINDINGS = [Binding("escape,enter", "dismiss", "Close")]

    def __init__(self, title: str, message: str) -> None:
        super().__init__()
        self.title_text, self.message = title, message

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog error"):
            yield Label(self.title_text, classes="title")
            yield Static(self.message)
            with Horizontal(classes="buttons"):
                yield Button("Close (Esc)", id="close")

    def on_mount(self) -> None:
        self.query_one("#close", Button).focus()

    @on(Button.Pressed)
    def _pressed(self) -> None:
        self.dismiss()


def notify_written(node: App | Widget, done: str, notices: list[str], timeout: float = 5) -> None:
    """Say what was written; with the save's notices (a file written fresh: where its
    previous text is kept), as a warning that stays longer."""
    if notices:
        node.notify("\n".join([done, *notices]), severity="warning", timeout=12)
    else:
        node.notify(done, timeout=timeout)
