"""Text bar charts for the fairness panel: a value against a scale, a band and a target.

`bar(7, 10, 20)` fills 14 of 20 cells with eighth-block precision. `hours_bar`
also shades the contract band [min, max] behind the bar and draws the target
as `│`; the fill is green inside the band and red outside it. `range_bar` draws a
group's spread: `├──●──┤` from min to max with the mean as `●`.

The bars are Rich text for DataTable cells, which Textual does not restyle: the
colours come in a `BarColours`, which the fairness panel takes from the theme
(look.theme_colour) and builds again when the theme changes; the default is the
terminal's own named colours.
"""

from __future__ import annotations

from dataclasses import dataclass
from fractions import Fraction

from rich.text import Text

EIGHTHS = " ▏▎▍▌▋▊▉█"
Number = int | float | Fraction



@dataclass(frozen=True)
class BarColours:
    ok: str = "green"  # hours inside the contract band
    high: str = "red"  # hours outside it
    plain: str = "magenta"  # a bar with no band
    band: str = "grey19"  # the band's background
    track: str = "grey11"  # the rest of the bar's background
    mark: str = "white"  # the target `│`, the mean `●`


PLAIN_COLOURS = BarColours()


def _fill(value: Number, scale: Number, width: int) -> list[str]:
    """Characters of a bar `value / scale` of `width` cells."""
    if scale <= 0 or width <= 0:
        return [" "] * max(width, 0)
    eighths = round(max(Fraction(0), min(Fraction(value), Fraction(scale))) / Fraction(scale)
                    * width * 8)
    full, part = divmod(int(eighths), 8)
    cells = ["█"] * full
    if full < width:
        cells.append(EIGHTHS[part])
    return (cells + [" "] * width)[:width]


def bar(value: Number, scale: Number, width: int, colour: str | None = None,
        colours: BarColours = PLAIN_COLOURS) -> Text:
    text = Text()
    for ch in _fill(value, scale, width):
        text.append(ch, style=f"{colour or colours.plain} on {colours.track}")
    return text


def _cell_of(value: Number, scale: Number, width: int) -> int:
    return min(width - 1, int(Fraction(value) / Fraction(scale) * width)) if scale > 0 else 0


def hours_bar(hours: Number, low: Number | None, high: Number | None, target: Number | None,
              scale: Number, width: int, colours: BarColours = PLAIN_COLOURS) -> Text:
    """Hours against the contract: band [low, high] shaded, target `│`, fill coloured."""
    outside = (low is not None and hours < low) or (high is not None and hours > high)
    colour = colours.high if outside else colours.ok
    if low is None and high is None:
        band = range(0)
    else:
        band = range(_cell_of(low, scale, width) if low is not None else 0,
                     _cell_of(high, scale, width) + 1 if high is not None else width)
    mark = _cell_of(target, scale, width) if target is not None else None
    text = Text()
    for i, ch in enumerate(_fill(hours, scale, width)):
        bg = colours.band if i in band else colours.track
        if i == mark and ch == " ":
            text.append("│", style=f"bold {colours.mark} on {bg}")
        else:
            text.append(ch, style=f"{colour} on {bg}")
    return text


def range_bar(low: Number | None, mean: Number | None, high: Number | None, scale: Number,
              width: int, colours: BarColours = PLAIN_COLOURS) -> Text:
    """A group's spread from min to max, with the mean marked."""
    text = Text()
    if low is None or high is None or mean is None or width < 3:
        return Text(" " * width)
    a, b = _cell_of(low, scale, width), _cell_of(high, scale, width)
    m = _cell_of(mean, scale, width)
    for i in range(width):
        if i == m:
            ch = "●"
        elif a == b == i:
            ch = "│"
        elif i == a:
            ch = "├"
        elif i == b:
            ch = "┤"
        elif a < i < b:
            ch = "─"
        else:
            ch = " "
        fg = colours.mark if ch == "●" else colours.plain
        text.append(ch, style=f"{fg} on {colours.track}")
    return text
