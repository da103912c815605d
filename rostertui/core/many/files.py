"""A workspace as data that can travel: which folders are workspaces, their files as
`{relative path: bytes}`, and those files put back in a folder on another machine.

What travels is what `load_workspace` reads: the workspace's top-level TOML files (not
hidden ones) and the local presets its unit.toml includes, which may lie in a sub-folder
(`presets/local.toml`) or beside the workspace (`../common.toml`). Shipped presets (bare
names) are not sent: every worker has them with its installed rostertui.
"""

from __future__ import annotations

import os
import tomllib
from pathlib import Path, PurePosixPath

from rostertui.core.errors import InputError, Problem

MARK = "unit.toml"  # a folder holding it is a workspace
ROSTER = "roster.toml"


def find_workspaces(paths: list[Path]) -> list[Path]:
    """Each path is a workspace, or a folder whose sub-folders (one level down) include
    workspaces; InputError names every path that is neither."""
    found: list[Path] = []
    problems: list[Problem] = []
    for path in paths:
        if (path / MARK).is_file():
            found.append(path)
            continue
        if not path.is_dir():
            why = "no such folder" if not path.exists() else "is a file, not a folder"
            problems.append(Problem(str(path), "", why))
            continue
        inner = sorted(p for p in path.iterdir()
                       if p.is_dir() and not p.name.startswith(".") and (p / MARK).is_file())
        if not inner:
            problems.append(Problem(str(path), "", f"neither a workspace (no {MARK}) nor a "
                                    f"folder of workspaces (no sub-folder holds {MARK})"))
        found.extend(inner)
    if problems:
        raise InputError(problems)
    unique: dict[str, Path] = {}
    for path in found:
        unique.setdefault(os.path.realpath(path), path)  # the same folder named twice: once
    return list(unique.values())


def read_files(folder: Path) -> dict[str, bytes]:
    """The files `load_workspace(folder)` reads, keyed by their path relative to it (POSIX,
    normalised; `../x.toml` for a preset beside the workspace). OSError if one of them
    cannot be read; a file that is missing is simply absent (the loader says so)."""
    files: dict[str, bytes] = {}
    for path in sorted(folder.glob("*.toml")):
        if not path.name.startswith(".") and path.is_file():
            files[path.name] = path.read_bytes()
    for name in _local_includes(files.get(MARK, b"")):
        path = folder / name
        if path.is_file():
            files[name] = path.read_bytes()
    return files


def _local_includes(unit_toml: bytes) -> list[str]:
    """The local presets unit.toml includes, as normalised relative paths. A unit.toml
    that does not parse gives none: the loader on the worker reports it."""
    try:
        data = tomllib.loads(unit_toml.decode("utf-8"))
    except (UnicodeDecodeError, tomllib.TOMLDecodeError):
        return []
    include = data.get("include")
    names = [n for n in include if isinstance(n, str)] if isinstance(include, list) else []
    out = []
    for name in names:
        if name.endswith(".toml") and not PurePosixPath(name).is_absolute():
            out.append(os.path.normpath(name).replace(os.sep, "/"))
    return out


def ups(rel: str) -> int:
    """How many folders above the workspace a relative path climbs (`../../x.toml`: 2)."""
    parts = PurePosixPath(rel).parts
    n = 0
    while n < len(parts) and parts[n] == "..":
        n += 1
    return n


def place_files(files: dict[str, bytes], root: Path) -> Path:
    """Write `files` under the empty folder `root` so that a workspace folder below it
    reads exactly them (a preset `../x.toml` lands beside that folder, inside `root`);
    returns the workspace folder. ValueError for a path that would leave `root`."""
    depth = max((ups(rel) for rel in files), default=0)
    folder = root.joinpath(*(["in"] * depth), "workspace")
    folder.mkdir(parents=True)
    for rel, data in files.items():
        path = PurePosixPath(rel)
        if path.is_absolute() or ".." in path.parts[ups(rel):] or not path.parts:
            raise ValueError(f"{rel!r} is not a path relative to the workspace")
        target = folder.joinpath(*path.parts)
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    return folder
