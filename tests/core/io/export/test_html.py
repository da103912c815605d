"""The printable roster and the audit report: self-contained HTML that the standard
library parser reads, with every piece of data as text and never as an element."""

from __future__ import annotations

from collections.abc import Callable
from html.parser import HTMLParser
from pathlib import Path

import pytest

from rostertui.core.io.export import audit_html, roster_html
from rostertui.core.io.export.html_audit import CAUTION
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.core.io.export.helpers import (
    FORMULA_NAME,
    MARKUP_NAME,
    QUOTED_NAME,
    SCRIPT_NOTE,
    hostile_ws,
)

Render = Callable[[Workspace], str]
RENDERERS = pytest.mark.parametrize("render", [roster_html, audit_html],
                                    ids=["roster", "audit"])


class Page(HTMLParser):
    def __init__(self, text: str) -> None:
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, tuple[tuple[str, str | None], ...]]] = []
        self.chunks: list[str] = []
        self.feed(text)
        self.close()

    def handle_starttag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        self.tags.append((tag, tuple(attrs)))

    def handle_data(self, data: str) -> None:
        self.chunks.append(data)

    @property
    def text(self) -> str:
        return "".join(self.chunks)


@RENDERERS
def test_data_survives_as_text_and_never_as_an_element(
    render: Render, hostile_loaded: Workspace, tmp_path: Path
) -> None:
    page = Page(render(hostile_loaded))
    tame = Page(render(load_workspace(hostile_ws(tmp_path / "tame", tame=True))))
    assert page.tags == tame.tags  # the data added no element and no attribute
    names = {tag for tag, _ in page.tags}
    assert not names & {"script", "img", "i", "link", "iframe", "object"}
    assert all(key not in ("src", "href") and not key.startswith("on")
               for _, attrs in page.tags for key, _ in attrs)
    for text in (FORMULA_NAME, MARKUP_NAME, "Ward & <i>B</i>"):
        assert text in page.text
    assert SCRIPT_NOTE in page.text


@RENDERERS
def test_self_contained_and_printable(render: Render, hostile_loaded: Workspace) -> None:
    text = render(hostile_loaded)
    assert text.startswith("<!DOCTYPE html>")
    assert "@page { size: landscape" in text
    assert "<script" not in text and "http" not in text.replace("http-equiv", "")
    page = Page(text)
    assert [t for t, _ in page.tags].count("style") == 1


def test_roster_grid_legend_cover_and_hours(hostile_loaded: Workspace) -> None:
    text = roster_html(hostile_loaded)
    page = Page(text)
    cells = [dict(a).get("class") or "" for t, a in page.tags if t == "td"]
    # 3 people x 7 days, weekend (Sat 27, Sun 28) and holiday (Fri 26) columns marked
    assert sum("we" in c.split() for c in cells) >= 3 * 2
    assert sum("hol" in c.split() for c in cells) >= 3
    assert sum("leave" in c.split() for c in cells) == 1  # p2 on 25 Mar
    assert "22:00-07:00 (+1 day)" in page.text  # the legend's night
    assert "E min 1 ideal 2" in page.text  # the cover entry's row
    assert "Hours per person" in page.text
    assert "Smith, &quot;Jo&quot;" in text and QUOTED_NAME in page.text


def test_audit_has_verdict_rules_sources_violations_and_caution(
    hostile_loaded: Workspace,
) -> None:
    page = Page(audit_html(hostile_loaded))
    text = page.text
    assert "Compliant: no hard rule broken; penalty 85." in text
    assert CAUTION in text
    assert "Directive 2003/88/EC, Art. 3 <i>" in text  # the source, as text
    assert "note <img src=x onerror=alert(2)>" in text
    assert f"{FORMULA_NAME} (p1)" in text  # violations grouped by person
    assert "asked not to work E on 23 Mar, has E" in text
    assert "23 Mar: E 07:00-15:00" in text  # the shift worked and its times
    assert "Cover and unit-wide" in text
    assert "max-shifts" in text and "request" in text  # penalty by kind


def test_audit_says_not_compliant(clinic_rostered: Path) -> None:
    text = Page(audit_html(load_workspace(clinic_rostered))).text
    assert "NOT compliant: 5 hard violations; penalty 1208." in text
    assert "E on 24 Mar, a leave day" in text
