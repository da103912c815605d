"""The loader's verdict on files not yet written: a scratch copy of the workspace with the
would-be files in place, loaded with `load_workspace`; and the loader's problems about
imported items put back on the CSV lines they came from."""

from __future__ import annotations

import re
import shutil
import tempfile
from pathlib import Path

from rostertui.core.errors import Problem
from rostertui.core.io.load import load_workspace, workspace_files
from rostertui.core.models.workspace import Workspace


def trial_load(files: dict[str, str], source: Path | None = None,
               include: list[str] | None = None) -> Workspace:
    """Load a scratch workspace: the TOML files of `source` (its top-level ones and the
    local presets in `include`), then `files` (name -> text) over them. Raises InputError
    with every problem; the scratch copy is gone afterwards."""
    with tempfile.TemporaryDirectory(prefix="rostertui-intake-") as tmp:
        trial = Path(tmp) / "scratch" / "workspace"  # room for includes like ../x.toml
        trial.mkdir(parents=True)
        if source is not None:
            for path, rel in workspace_files(source, include or []):
                target = (trial / rel).resolve()
                if target.is_relative_to(Path(tmp).resolve()):
                    target.parent.mkdir(parents=True, exist_ok=True)
                    shutil.copyfile(path, target)
        for name, text in files.items():
            (trial / name).write_text(text, encoding="utf-8")
        ws = load_workspace(trial)
    return ws


def relabel(problems: list[Problem], file: str, table: str, lines: dict[int, int],
            label: str, columns: dict[str, str] | None = None) -> list[Problem]:
    """Each problem about `file`'s `table[i]` with i in `lines` (item index -> CSV line)
    as a problem of the CSV `label` on that line, its column named from the item's key
    (`columns` renames keys). The other problems are returned unchanged."""
    pattern = re.compile(rf"{re.escape(table)}\[(\d+)\](?:\.([A-Za-z_]+))?")
    out = []
    for p in problems:
        m = pattern.match(p.key) if p.file == file else None
        if m is None or int(m.group(1)) not in lines:
            out.append(p)
            continue
        key = m.group(2) or ""
        column = (columns or {}).get(key, key)
        out.append(Problem(label, column, p.message, lines[int(m.group(1))]))
    return out
