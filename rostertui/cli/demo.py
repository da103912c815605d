"""`rostertui demo [DIR] [--unit clinic|depot] [--no-open]`: copy a bundled demo unit."""

from __future__ import annotations

import argparse
import shutil
import tomllib
from pathlib import Path

from rostertui.cli.output import EXIT_OK, fail

_PACKAGE = Path(__file__).resolve().parents[1]
UNITS = ("clinic", "depot")


def demos_dir() -> Path:
    """Bundled demos: inside an installed wheel, or the checkout's demo/ folder."""
    bundled = _PACKAGE / "_demo"
    return bundled if bundled.is_dir() else _PACKAGE.parent / "demo"


def _unit_name(folder: Path) -> str | None:
    try:
        return tomllib.loads((folder / "unit.toml").read_text(encoding="utf-8")).get("name")
    except (OSError, ValueError):
        return None


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser("demo", help="copy a bundled demo unit to DIR and open it")
    p.add_argument("dir", nargs="?", default="rostertui-demo", help="default ./rostertui-demo")
    p.add_argument("--unit", choices=UNITS, default="clinic", help="which demo (default clinic)")
    p.add_argument("--no-open", action="store_true", help="only copy, do not open")
    p.set_defaults(run=lambda a: do_demo(a.dir, unit=a.unit, open_it=not a.no_open))


def do_demo(folder: str | Path, *, unit: str = "clinic", open_it: bool = True) -> int:
    folder = Path(folder)
    source = demos_dir() / unit
    if not source.is_dir():
        return fail(f"bundled demo {unit!r} not found at {source}")
    if (folder / "unit.toml").exists():
        if _unit_name(folder) != _unit_name(source):
            return fail(f"{folder} already holds another workspace ({_unit_name(folder)}); "
                        f"nothing copied. Give another folder: rostertui demo DIR --unit {unit}")
        print(f"{folder} already holds this demo; opening it as it is (nothing copied)")
    elif folder.exists() and any(folder.iterdir()):
        return fail(f"{folder} exists and is not empty; choose another folder")
    else:
        shutil.copytree(source, folder, dirs_exist_ok=True)
        print(f"copied the {unit} demo to {folder}")
    if not open_it:
        return EXIT_OK
    return open_workspace(folder)


def open_workspace(folder: Path) -> int:
    from rostertui.cli.open import do_open

    return do_open(folder)
