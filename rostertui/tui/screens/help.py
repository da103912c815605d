"""Help: every key binding (read from the classes, so the list never drifts) and a legend."""

from __future__ import annotations

from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding, BindingType
from textual.containers import Horizontal, VerticalScroll
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Static

from rostertui.tui.host import host
from rostertui.tui.look import UNSURE, theme_colour
from rostertui.tui.widgets.legend import GridLegend

KEY_NAMES = {"minus": "-", "question_mark": "?", "space": "space", "pageup": "PgUp",
             "pagedown": "PgDn", "escape": "Esc", "enter": "Enter", "delete": "Del",
             "left_square_bracket": "[", "right_square_bracket": "]"}


def key_name(key: str) -> str:
    if key in KEY_NAMES:
        return KEY_NAMES[key]
    return key.upper() if key[:1] == "f" and key[1:].isdigit() else key


def keys_text(binding: Binding) -> str:
    return " / ".join(key_name(k.strip()) for k in binding.key.split(","))


def bindings_table(sections: list[tuple[str, list[BindingType], list[tuple[str, str]]]],
                   key_colour: str = "yellow", title_colour: str = "blue") -> Table:
    """A Rich table (Textual does not restyle it): the colours are given, from the theme."""
    table = Table(show_header=False, box=None, padding=(0, 2, 0, 0), expand=False)
    table.add_column(style=f"bold {key_colour}", no_wrap=True)
    table.add_column()
    for title, bindings, extra in sections:
        table.add_row(Text(title, style=f"bold underline {title_colour}"), "")
        for key, what in extra:
            table.add_row(key, what)
        for b in bindings:
            if isinstance(b, Binding) and b.description:  # the tooltip says more, if any
                table.add_row(keys_text(b), b.tooltip or b.description)
        table.add_row("", "")
    return table


class HelpScreen(ModalScreen[None]):
    CSS_PATH = "help.tcss"

    BINDINGS = [Binding("escape,f1,q,question_mark", "dismiss", "Close help")]

    def compose(self) -> ComposeResult:
        from rostertui.tui.app import RosterApp
        from rostertui.tui.screens.changes import AbsenceDialog, SwapDialog
        from rostertui.tui.screens.dialogs import ConfirmQuit
        from rostertui.tui.screens.editors import EditorsScreen
        from rostertui.tui.screens.explain import ExplainScreen
        from rostertui.tui.screens.export import ExportScreen
        from rostertui.tui.screens.fairness import FairnessScreen
        from rostertui.tui.screens.repair import RepairScreen
        from rostertui.tui.screens.roster import RosterScreen
        from rostertui.tui.screens.solve import SolveScreen
        from rostertui.tui.screens.versions import VersionsScreen
        from rostertui.tui.screens.violations import ViolationsScreen
        from rostertui.tui.widgets.grid import RosterGrid
        from rostertui.tui.widgets.list_editor import ListEditor
        from rostertui.tui.widgets.rules_editor import RulesEditor

        session = host(self.app).session
        codes = ", ".join(session.codes)
        sections = [
            ("Everywhere", RosterApp.BINDINGS, [("ctrl+p", "command palette")]),
            ("Roster grid", RosterGrid.BINDINGS + RosterScreen.BINDINGS, [
                ("mouse", "a click moves the cursor to the cell"),
                ("a shift code", f"type it into the cell ({codes}); a code that is not "
                                 "the start of another is set at once, else press Enter"),
                ("Esc", "drop a half-typed code"),
            ]),
            ("Violations (F3)", ViolationsScreen.BINDINGS,
             [("Tab", "move between the filters and the list")]),
            ("Fairness (F4)", FairnessScreen.BINDINGS, []),
            ("Solve (F5)", SolveScreen.BINDINGS, []),
            ("Repair (F8): as Solve, from a date on", RepairScreen.BINDINGS, []),
            ("Published versions (F9)", VersionsScreen.BINDINGS, []),
            ("Export (F7)", ExportScreen.BINDINGS,
             [("↑↓ space", "choose the format"), ("Enter", "in the path, or on Export: write "
                                                  "the files")]),
            ("Why (F10): why no roster keeps every hard rule", ExplainScreen.BINDINGS, [
                ("↑↓", "choose a reason, or a denied request"),
                ("Enter", "show its person and date in the grid (F10 again shows the "
                          "explanation at once while the roster is unchanged)"),
            ]),
            ("Swap preview (ctrl+x twice in the grid)", SwapDialog.BINDINGS, []),
            ("Absence (ctrl+a in the grid)", AbsenceDialog.BINDINGS,
             [("Enter", "record it (Tab from field to field)")]),
            ("Editors (F6): people, leave, requests, shifts, cover", EditorsScreen.BINDINGS
             + ListEditor.BINDINGS, [("Enter", "on a row: into the form; in the form: save"),
                                     ("Tab", "from field to field")]),
            ("Rules (F6, last tab)", RulesEditor.BINDINGS,
             [("Enter", "on a rule: its TOML into the text box")]),
            ("Quit with unsaved changes", ConfirmQuit.BINDINGS, []),
        ]
        with VerticalScroll(id="help-body"):
            yield Static(Content.styled("rostertui keys (Esc closes)", f"bold {UNSURE}"))
            with Horizontal(id="help-columns"):
                yield Static(bindings_table(sections, theme_colour(self.app, "text-warning"),
                                            theme_colour(self.app, "text-primary")),
                             id="help-keys")
                yield GridLegend(session, id="help-legend")

    def on_resize(self) -> None:
        self.set_class(self.size.width >= 150, "-wide")  # keys and legend side by side
