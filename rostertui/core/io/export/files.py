"""One export, from format name to files on disk: default paths, rendering, atomic writes.

Formats: `csv` (long form), `csv-grid`, `ics` (everyone in one calendar),
`ics-per-person` (a folder of `<person-id>.ics`), `html` (printable roster) and
`audit-html` (audit report). Defaults live in `WS/export/`. Everything is rendered
before the first byte is written, and each file is written atomically, so a
failure (no roster, bad data) leaves nothing half-written behind.
"""

from __future__ import annotations

from collections.abc import Callable
from datetime import datetime
from pathlib import Path

from rostertui.core.io.atomic import write_atomic
from rostertui.core.io.export.common import need_roster
from rostertui.core.io.export.csv_out import grid_csv, long_csv
from rostertui.core.io.export.html_audit import audit_html
from rostertui.core.io.export.html_roster import roster_html
from rostertui.core.io.export.ics import ics_all, ics_per_person
from rostertui.core.models.workspace import Workspace

EXPORT_FOLDER = "export"
DEFAULT_NAMES: dict[str, str] = {
    "csv": "roster.csv",
    "csv-grid": "roster-grid.csv",
    "ics": "roster.ics",
    "ics-per-person": "calendars",  # a folder
    "html": "roster.html",
    "audit-html": "audit.html",
}
FORMATS: tuple[str, ...] = tuple(DEFAULT_NAMES)
FOLDER_FORMATS = frozenset({"ics-per-person"})

SINGLE: dict[str, Callable[[Workspace, datetime | None], str]] = {
    "csv": lambda ws, now: long_csv(ws),
    "csv-grid": lambda ws, now: grid_csv(ws),
    "ics": ics_all,
    "html": lambda ws, now: roster_html(ws),
    "audit-html": lambda ws, now: audit_html(ws),
}


def default_path(ws: Workspace, fmt: str) -> Path:
    """`WS/export/<default name>` (the current folder when the workspace has no path)."""
    base = ws.path if ws.path is not None else Path.cwd()
    return base / EXPORT_FOLDER / DEFAULT_NAMES[fmt]


def target(ws: Workspace, fmt: str, out: str | Path | None) -> Path:
    """Where a format goes: `out`, or the default. A single-file format given an
    existing folder goes into it under its default name."""
    if out is None:
        return default_path(ws, fmt)
    path = Path(out)
    if fmt not in FOLDER_FORMATS and path.is_dir():
        return path / DEFAULT_NAMES[fmt]
    return path


def render(
    ws: Workspace, fmt: str, out: str | Path | None = None, now: datetime | None = None
) -> dict[Path, str]:
    """Every file of the export (path -> text), nothing written yet.

    Raises `NoRoster` without a roster and `ValueError` for an unknown format."""
    if fmt not in DEFAULT_NAMES:
        raise ValueError(f"unknown export format {fmt!r}; one of {', '.join(FORMATS)}")
    need_roster(ws)
    path = target(ws, fmt, out)
    if fmt in FOLDER_FORMATS:
        return {path / name: text for name, text in ics_per_person(ws, now).items()}
    return {path: SINGLE[fmt](ws, now)}


def export(
    ws: Workspace, fmt: str, out: str | Path | None = None, now: datetime | None = None
) -> list[Path]:
    """Render, then write each file atomically (folders made as needed); the paths."""
    files = render(ws, fmt, out, now)
    for path, text in files.items():
        path.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(path, text)
    return list(files)
