"""The roster grid: people x days with cover rows below, drawn with the Line API.

Only the lines that change are repainted: a cursor move repaints the old and new
cursor lines and the two header lines. Typing a code edits the cell under the
cursor: a letter that can only start one code sets it at once; otherwise the
typed text waits (Enter sets it, Escape drops it). The grid never changes the
roster itself: it posts `EditRequested` / `LockRequested` upward.
"""

from __future__ import annotations

from textual import events
from textual.binding import Binding
from textual.geometry import Region, Size
from textual.message import Message
from textual.scroll_view import ScrollView
from textual.strip import Strip

from rostertui.core.edit.session import Session
from rostertui.core.edit.view import GridView
from rostertui.core.models.common import OFF
from rostertui.tui.widgets.grid_paint import HEADER, STYLE_NAMES, Layout, Painter, Row
from rostertui.tui.widgets.palette import TONES, shift_colours


class RosterGrid(ScrollView, can_focus=True):
    COMPONENT_CLASSES = {f"grid--{name}" for name in (*STYLE_NAMES, *TONES)}

    DEFAULT_CSS = """
    RosterGrid { scrollbar-size: 1 1; }
    """  # its colours, from the theme: grid.tcss (the app's stylesheet)

    BINDINGS = [
        Binding("up", "move(0, -1)", "Up", show=False),
        Binding("down", "move(0, 1)", "Down", show=False),
        Binding("left", "move(-1, 0)", "Left", show=False),
        Binding("right", "move(1, 0)", "Right", show=False),
        Binding("home", "jump_day(0)", "First day", show=False),
        Binding("end", "jump_day(-1)", "Last day", show=False),
        Binding("pageup", "page(-1)", "Page up", show=False),
        Binding("pagedown", "page(1)", "Page down", show=False),
        Binding("ctrl+home", "jump_row(0)", "First person", show=False),
        Binding("ctrl+end", "jump_row(-1)", "Last row", show=False),
        Binding("space,minus,delete,backspace", "set_off", "Off", show=False),
        Binding("ctrl+l", "toggle_lock", "Lock"),
    ]

    class CursorMoved(Message):
        def __init__(self, person: str | None, cover_row: int | None, day: int):
            super().__init__()
            self.person, self.cover_row, self.day = person, cover_row, day

    class EditRequested(Message):
        def __init__(self, person: str, day: int, text: str):
            super().__init__()
            self.person, self.day, self.text = person, day, text

    class LockRequested(Message):
        def __init__(self, person: str, day: int):
            super().__init__()
            self.person, self.day = person, day

    class Typing(Message):
        """The text typed so far into the cursor cell ("" when dropped or set)."""

        def __init__(self, text: str):
            super().__init__()
            self.text = text

    def __init__(self, session: Session, **kwargs) -> None:
        super().__init__(**kwargs)
        self.session = session
        self.view = GridView.build(session)
        self.rows = self._rows()
        self.colours = shift_colours(session.ws.shifts.shift)
        self.grid_layout = Layout.of(session, self.view, 80)
        self.row_index = 0  # index into self.rows (never the separator)
        self.day = 0
        self.typed = ""
        self.changed: dict[tuple[str, int], str] | None = None  # diff mode: published codes
        self.mark: tuple[str, int] | None = None  # the cell marked for a swap
        self._painter: Painter | None = None

    # -- data ---------------------------------------------------------------------------------
    def _rows(self) -> list[Row]:
        rows = [Row("person", p.id) for p in self.view.people]
        if self.view.cover:
            rows.append(Row("sep"))
            rows += [Row("cover", i) for i in range(len(self.view.cover))]
        return rows

    def show(self, session: Session) -> None:
        """Take the session's current state (after any change) and repaint."""
        self.session = session
        self.view = GridView.build(session)
        self.colours = shift_colours(session.ws.shifts.shift)
        rows = self._rows()
        if rows != self.rows:  # an editor changed the people or the cover
            self.rows = rows
            self.row_index = min(self.row_index, max(0, len(rows) - 1))
            if rows and rows[self.row_index].kind == "sep":
                self.row_index -= 1
        self._relayout(self.size.width or 80)
        self.refresh()

    def _relayout(self, width: int) -> None:
        """Column widths for this width (and these names and codes); the virtual size."""
        self.grid_layout = Layout.of(self.session, self.view, width)
        self._painter = None
        self.virtual_size = Size(self.grid_layout.fixed_w + self.grid_layout.canvas_w,
                                 HEADER + len(self.rows))

    @property
    def person(self) -> str | None:
        row = self.rows[self.row_index] if self.rows else None
        return row.key if row is not None and row.kind == "person" else None  # type: ignore

    @property
    def cover_row(self) -> int | None:
        row = self.rows[self.row_index] if self.rows else None
        return row.key if row is not None and row.kind == "cover" else None  # type: ignore

    def painter(self) -> Painter:
        if self._painter is None:
            styles = {name: self.get_component_rich_style(f"grid--{name}", partial=True)
                      for name in STYLE_NAMES}
            colours = {code: self.get_component_rich_style(f"grid--{tone}", partial=True)
                       for code, tone in self.colours.items()}
            self._painter = Painter(self.session, self.view, self.grid_layout, styles, colours,
                                    self.changed, self.mark)
        return self._painter

    def highlight(self, changed: dict[tuple[str, int], str] | None,
                  mark: tuple[str, int] | None) -> None:
        """Diff mode's changed cells (None: diff mode off) and the swap mark; repaint."""
        if (changed, mark) != (self.changed, self.mark):
            self.changed, self.mark = changed, mark
            self._painter = None
            self.refresh()

    def notify_style_update(self) -> None:
        super().notify_style_update()
        self._painter = None

    def on_resize(self, event: events.Resize) -> None:
        self._relayout(event.size.width)
        self._scroll_to_cursor()

    # -- painting ---------------------------------------------------------------------------
    def render_line(self, y: int) -> Strip:
        painter, lay = self.painter(), self.grid_layout
        width = self.scrollable_content_region.width
        if y < HEADER:
            fixed, canvas = painter.header(y, self.day)
        else:
            i = y - HEADER + int(self.scroll_y)
            if i >= len(self.rows):
                return Strip.blank(width, self.rich_style)
            fixed, canvas = painter.row(self.rows[i], self.day if i == self.row_index else None)
        x = int(self.scroll_x)
        visible = max(0, width - lay.fixed_w)
        canvas = canvas.crop_extend(x, x + visible, painter.s["base"])
        return Strip.join([fixed, canvas]).crop(0, width).apply_style(self.rich_style)

    def _line_of(self, row_index: int) -> int:
        return HEADER + row_index - int(self.scroll_y)

    def _refresh_rows(self, *row_indices: int) -> None:
        width = self.size.width
        self.refresh(Region(0, 0, width, HEADER))
        for i in row_indices:
            self.refresh(Region(0, self._line_of(i), width, 1))

    # -- cursor -------------------------------------------------------------------------------
    def move_to(self, row_index: int, day: int) -> None:
        if not self.rows:
            return
        n_days = len(self.view.days)
        row_index = max(0, min(row_index, len(self.rows) - 1))
        if self.rows[row_index].kind == "sep":
            row_index += 1 if row_index > self.row_index else -1
        old = self.row_index
        self.row_index, self.day = row_index, max(0, min(day, n_days - 1))
        self._drop_typing()
        if not self._scroll_to_cursor():
            self._refresh_rows(old, self.row_index)
        self.post_message(self.CursorMoved(self.person, self.cover_row, self.day))

    def goto(self, person: str, day: int) -> None:
        for i, row in enumerate(self.rows):
            if row.kind == "person" and row.key == person:
                self.move_to(i, day)
                return

    def goto_cover(self, shift: str, skill: str | None, day: int) -> None:
        for i, row in enumerate(self.rows):
            if row.kind == "cover":
                c = self.view.cover[row.key]  # type: ignore[index]
                if (c.shift, c.skill) == (shift, skill):
                    self.move_to(i, day)
                    return

    def _scroll_to_cursor(self) -> bool:
        """Scroll so the cursor cell shows; True when the view scrolled (full repaint)."""
        region = self.scrollable_content_region
        lay = self.grid_layout
        body_h = max(1, region.height - HEADER)
        y = int(self.scroll_y)
        if self.row_index < y:
            y = self.row_index
        elif self.row_index >= y + body_h:
            y = self.row_index - body_h + 1
        x = int(self.scroll_x)
        visible = max(1, region.width - lay.fixed_w)
        left = lay.day_x[self.day] if lay.day_x else 0
        right = left + lay.cell_w
        if left < x:
            x = max(0, left - 1)
        elif right > x + visible:
            x = right - visible
        if (x, y) == (int(self.scroll_x), int(self.scroll_y)):
            return False
        self.scroll_to(x, y, animate=False, force=True)
        return True

    def action_move(self, dx: int, dy: int) -> None:
        self.move_to(self.row_index + dy, self.day + dx)

    def action_jump_day(self, day: int) -> None:
        self.move_to(self.row_index, day if day >= 0 else len(self.view.days) - 1)

    def action_jump_row(self, row: int) -> None:
        self.move_to(row if row >= 0 else len(self.rows) - 1, self.day)

    def action_page(self, direction: int) -> None:
        step = max(1, self.scrollable_content_region.height - HEADER - 1)
        self.move_to(self.row_index + direction * step, self.day)

    def on_click(self, event: events.Click) -> None:
        lay = self.grid_layout
        if event.y < HEADER:
            return
        row = event.y - HEADER + int(self.scroll_y)
        x = event.x - lay.fixed_w + int(self.scroll_x)
        day = next((i for i, left in enumerate(lay.day_x) if left <= x < left + lay.cell_w),
                   self.day)
        if 0 <= row < len(self.rows) and self.rows[row].kind != "sep":
            self.move_to(row, day)

    # -- editing ------------------------------------------------------------------------------
    def action_set_off(self) -> None:
        if self.typed:
            return
        if self.person is not None:
            self.post_message(self.EditRequested(self.person, self.day, OFF))

    def action_toggle_lock(self) -> None:
        if self.person is not None:
            self.post_message(self.LockRequested(self.person, self.day))

    def _drop_typing(self) -> None:
        if self.typed:
            self.typed = ""
            self.post_message(self.Typing(""))

    def _commit(self, text: str) -> None:
        self.typed = ""
        self.post_message(self.Typing(""))
        if self.person is not None:
            self.post_message(self.EditRequested(self.person, self.day, text))

    def on_key(self, event: events.Key) -> None:
        """Typed shift codes; Backspace, Enter and Escape while a code is being typed."""
        char = event.character or ""
        if self.typed and event.key in ("enter", "escape", "backspace"):
            event.stop()
            event.prevent_default()
            if event.key == "enter":
                self._commit(self.typed)
            elif event.key == "escape":
                self._drop_typing()
            else:
                self.typed = self.typed[:-1]
                self.post_message(self.Typing(self.typed))
            return
        if len(char) != 1 or not (char.isalnum() or (self.typed and char in "_.-")):
            return
        event.stop()
        event.prevent_default()
        if self.person is None:
            self.notify("cover rows count the people assigned; edit a person's cell",
                        severity="warning")
            return
        self.typed += char
        codes = self.session.codes
        starts = [c for c in codes if c.lower().startswith(self.typed.lower())]
        exact = [c for c in codes if c.lower() == self.typed.lower()]
        if exact and len(starts) == 1:
            self._commit(exact[0])
        elif not starts:
            self._commit(self.typed)  # the session refuses it, in words
        else:
            self.post_message(self.Typing(self.typed))
