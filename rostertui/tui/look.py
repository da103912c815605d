"""The words' colours, as theme variables: what a style means, never a colour.

Text that Python builds (a verdict, a progress line, a status line) is Textual
`Content` styled with these; Textual resolves `$error` and the rest against the
current theme when it paints, so a theme switch recolours it and a 16-colour
terminal maps it to its own palette. Colour only adds to the words and symbols
(✖ hard, ▲ soft, ✓ none): nothing is told by colour alone. Each screen's layout
and the grid's colours are in the .tcss files.
"""

from __future__ import annotations

from textual.app import App
from textual.color import Color

GOOD = "$text-success"  # kept, granted, written, no violation
BAD = "$text-error"  # hard violations, failures, refusals
UNSURE = "$text-warning"  # soft violations, running, not settled, unsaved
MUTED = "$foreground-muted"  # labels and asides
TITLE = "$text-primary"  # section titles
VALUE = "$text-accent"  # a figure or a name worth a glance (cells changed, found by)


def theme_colour(app: App, name: str) -> str:
    """A theme variable as an opaque `#rrggbb` for Rich renderables that Textual does not
    restyle (DataTable cells): blended over the theme's background if translucent."""
    variables = app.theme_variables
    colour = Color.parse(variables[name])
    if colour.a < 1:
        colour = Color.parse(variables["background"]).blend(colour.with_alpha(1), colour.a)
    return colour.hex
