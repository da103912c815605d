"""Write a planned workspace as a new folder, whole or not at all.

Every file goes into a temporary sibling folder (`.{name}.{pid}-{random}.tmp`), fsynced;
the loader reads it back (a plan that would not load is never published); then the
target name is reserved with an exclusive `mkdir` (it fails if the folder exists) and
the temporary folder is renamed onto that empty reservation. On POSIX a rename onto a
folder that holds anything fails, so a folder that appeared meanwhile is never replaced.
"""

from __future__ import annotations

import contextlib
import os
import shutil
from pathlib import Path

from rostertui.core.cycle.nextperiod import Plan
from rostertui.core.errors import EditError, InputError
from rostertui.core.io.atomic import fsync_dir, temp_name
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace


def _write_file(path: Path, data: bytes) -> None:
    path.parent.mkdir(parents=True, exist_ok=True)
    with open(path, "xb") as fh:
        fh.write(data)
        fh.flush()
        os.fsync(fh.fileno())


def write_plan(plan: Plan) -> Workspace:
    """Create `plan.target` holding `plan.files`; the new workspace as loaded from it.

    Raises EditError (nothing written) when the target exists or the result would not
    load; OSError when the disk refuses (the temporary folder is removed).
    """
    target = plan.target
    parent = target.parent
    if not parent.is_dir():
        raise EditError(f"{parent} is not a folder; the next period's folder goes inside one")
    tmp = parent / temp_name(target.name)
    os.mkdir(tmp)
    reserved = False
    try:
        for rel, data in plan.files.items():
            _write_file(tmp / rel, data)
        fsync_dir(tmp)
        try:
            load_workspace(tmp)
        except InputError as exc:
            raise EditError(f"the new workspace would not load ({exc.summary()})") from None
        try:
            os.mkdir(target)
        except FileExistsError:
            raise EditError(f"{target} exists already; the next period goes to a new "
                            "folder") from None
        reserved = True
        os.rename(tmp, target)
        reserved = False
        fsync_dir(parent)
    except BaseException:
        with contextlib.suppress(OSError):
            shutil.rmtree(tmp)
        if reserved:
            with contextlib.suppress(OSError):
                os.rmdir(target)  # our own empty reservation only: rmdir refuses otherwise
        raise
    return load_workspace(target)
