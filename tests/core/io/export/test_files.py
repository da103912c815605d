"""From format name to files: default paths in WS/export/, --out as a file or a folder,
one calendar per person in a folder, and nothing written without a roster."""

from __future__ import annotations

from pathlib import Path

import pytest

from rostertui.core.io.export import FORMATS, NoRoster, default_path, export, render
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.conftest import DEMO, copy_ws

EXPECTED = {
    "csv": "export/roster.csv",
    "csv-grid": "export/roster-grid.csv",
    "ics": "export/roster.ics",
    "ics-per-person": "export/calendars",
    "html": "export/roster.html",
    "audit-html": "export/audit.html",
}


@pytest.mark.parametrize("fmt", FORMATS)
def test_default_paths_are_in_the_workspace_export_folder(
    fmt: str, hostile: Path, hostile_loaded: Workspace
) -> None:
    assert default_path(hostile_loaded, fmt) == hostile / EXPECTED[fmt]
    written = export(hostile_loaded, fmt)
    assert written and all(p.is_file() and p.stat().st_size > 0 for p in written)
    if fmt == "ics-per-person":
        assert sorted(p.name for p in written) == ["p1.ics", "p2.ics", "p3.ics"]
        assert {p.parent for p in written} == {hostile / EXPECTED[fmt]}
    else:
        assert written == [hostile / EXPECTED[fmt]]
    assert not list((hostile / "export").rglob("*.tmp"))  # atomic writes leave no debris


def test_out_names_a_file_or_an_existing_folder(hostile_loaded: Workspace,
                                                tmp_path: Path) -> None:
    file = tmp_path / "deep" / "er" / "mine.html"
    assert export(hostile_loaded, "html", file) == [file]
    assert file.read_text(encoding="utf-8").startswith("<!DOCTYPE html>")
    folder = tmp_path / "out"
    folder.mkdir()
    assert export(hostile_loaded, "audit-html", folder) == [folder / "audit.html"]
    cals = tmp_path / "cals"
    assert {p.parent for p in export(hostile_loaded, "ics-per-person", cals)} == {cals}


def test_re_export_replaces_the_file(hostile_loaded: Workspace, tmp_path: Path) -> None:
    path = tmp_path / "r.csv"
    path.write_text("old content", encoding="utf-8")
    export(hostile_loaded, "csv", path)
    assert path.read_text(encoding="utf-8-sig").startswith("person,date,shift")


def test_no_roster_writes_nothing(tmp_path: Path) -> None:
    ws = load_workspace(copy_ws(DEMO / "clinic", tmp_path, "clinic"))
    assert ws.roster is None
    with pytest.raises(NoRoster, match="roster.toml"):
        export(ws, "csv")
    assert not (tmp_path / "clinic" / "export").exists()


def test_unknown_format_is_refused(hostile_loaded: Workspace) -> None:
    with pytest.raises(ValueError, match="unknown export format 'pdf'"):
        render(hostile_loaded, "pdf")
