"""Argument types and small formatting helpers shared by the verbs that change a roster."""

from __future__ import annotations

import argparse
from datetime import date

from rostertui.core.check import Violation
from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.diff import CellDiff
from rostertui.core.words import weekday_day

day = weekday_day  # 'Mon 4 Mar', this module's name for it


def iso_date(text: str) -> date:
    """argparse type: a date as YYYY-MM-DD (argparse then exits 2 with this message)."""
    try:
        return date.fromisoformat(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a date; write YYYY-MM-DD") from None


def search_options(p: argparse.ArgumentParser) -> None:
    """--time-limit, --workers and --seed, as `solve` and `repair` take them."""
    p.add_argument("--time-limit", type=float, default=60.0, metavar="S",
                   help="seconds to search (default 60)")
    p.add_argument("--workers", type=int, default=0, metavar="N",
                   help="search threads (default: every core)")
    p.add_argument("--seed", type=int, default=0, metavar="N", help="random seed (default 0)")


def version_number(text: str) -> int:
    """argparse type: a published version, `3` or `v3`."""
    raw = text[1:] if text[:1] in "vV" else text
    if not raw.isdigit() or int(raw) < 1:
        raise argparse.ArgumentTypeError(f"{text!r} is not a version number (1, 2, ... or v1)")
    return int(raw)


def code(c: str) -> str:
    return "off" if c == OFF else c


def person(ws: Workspace, pid: str | None) -> str:
    if pid is None:
        return "cover"
    found = ws.person_by_id.get(pid)
    return f"{found.name} ({pid})" if found else pid


def cell_line(ws: Workspace, c: CellDiff) -> str:
    return f"{person(ws, c.person):<32} {day(c.date):<11} {code(c.before):>4} -> {code(c.after)}"


def violation_line(v: Violation) -> str:
    tag = "HARD" if v.hard else f"soft {v.penalty}"
    who = f"{v.person}: " if v.person else ""
    return f"{tag:<9} {who}{v.rule}: {v.message}"
