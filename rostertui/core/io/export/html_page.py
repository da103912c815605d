"""The shell both HTML exports share: one self-contained page (inline CSS, no script,
no external link), printable in landscape on A4 or Letter, and an escaping helper.

Every piece of user data goes through `esc` (html.escape with quotes), so a name
or note can never become markup.
"""

from __future__ import annotations

from collections.abc import Iterable
from html import escape

CSS = """
@page { size: landscape; margin: 10mm; }  /* A4 or Letter: the printer's paper */
* { box-sizing: border-box; }
body { font: 10pt/1.35 "Helvetica Neue", Arial, sans-serif; color: #111; margin: 1.5em; }
h1 { font-size: 16pt; margin: 0 0 .2em; }
h2 { font-size: 12.5pt; margin: 1.4em 0 .4em; border-bottom: 1px solid #999; }
h3 { font-size: 11pt; margin: 1em 0 .3em; }
p.meta { color: #444; margin: 0 0 .8em; }
table { border-collapse: collapse; margin: .3em 0 .8em; }
th, td { border: 1px solid #bbb; padding: 2px 4px; vertical-align: top; }
th { background: #eee; font-weight: 600; text-align: left; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
table.grid { table-layout: fixed; width: 100%; font-size: 8pt; }
table.grid th, table.grid td { text-align: center; padding: 1px 0; overflow: hidden; }
table.grid th.who, table.grid td.who { text-align: left; padding-left: 3px; width: 11em;
  white-space: nowrap; text-overflow: ellipsis; }
table.grid col.tot { width: 3.2em; }
table.grid col.who { width: 11em; }
table.grid .we { background: #e3e7ef; }
table.grid th.we { background: #c9d1e0; }
table.grid .we, table.grid .hol { border-left: 1px solid #556; border-right: 1px solid #556; }
table.grid .hol { background: #f3e1c0; }
table.grid td.off { color: #999; }
table.grid td.leave { background: repeating-linear-gradient(45deg, #fff, #fff 3px, #ddd 3px,
  #ddd 5px); color: #666; }
table.grid tr.cover td { font-size: 7.5pt; }
table.grid tr.first-cover td, table.grid tr.first-cover th { border-top: 2px solid #333; }
td.short { background: #f6c6c6 !important; font-weight: 700; }
td.under { background: #fbe8c8 !important; }
td.over { background: #d9ecf9 !important; }
.hard { color: #a40000; font-weight: 700; }
.verdict { font-size: 12pt; padding: .5em .8em; border: 2px solid #2a7a2a; display: inline-block; }
.verdict.bad { border-color: #a40000; }
.caution { border-left: 4px solid #c77d00; background: #fff6e5; padding: .4em .8em;
  max-width: 60em; }
.small { font-size: 8.5pt; color: #444; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
h2, h3 { break-after: avoid; page-break-after: avoid; }
@media print {
  body { margin: 0; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
"""


def esc(value: object) -> str:
    """Text safe inside an element or a quoted attribute."""
    return escape(str(value), quote=True)


def page(title: str, body: Iterable[str]) -> str:
    """A complete HTML document; `title` is escaped here, `body` is trusted markup."""
    return "".join([
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n",
        "<meta name=\"generator\" content=\"rostertui\">\n",
        f"<title>{esc(title)}</title>\n<style>{CSS}</style>\n</head>\n<body>\n",
        "\n".join(body),
        "\n</body>\n</html>\n",
    ])


def row(cells: Iterable[str], tag: str = "td") -> str:
    """A table row of already escaped (or built) cells, each wrapped in `tag`."""
    return "<tr>" + "".join(f"<{tag}>{c}</{tag}>" for c in cells) + "</tr>"


def table(header: Iterable[str], rows: Iterable[Iterable[str]], cls: str = "") -> str:
    """A table: the header texts are escaped, the row cells are trusted markup."""
    head = row((esc(h) for h in header), "th")
    body = "\n".join(row(r) for r in rows)
    attr = f' class="{esc(cls)}"' if cls else ""
    return f"<table{attr}>\n<thead>{head}</thead>\n<tbody>\n{body}\n</tbody>\n</table>"
