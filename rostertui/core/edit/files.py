"""Changing workspace files from the UI: try the change on a scratch copy with the
loader (so every problem is reported in the loader's own words, naming file, key and
line), and only then write the files atomically. Pure: no textual.

Removing a person also removes their row and locks from roster.toml on disk (the
saved roster, not the unsaved hand edits), since the loader rejects a roster row of
someone unknown. Hand edits not yet saved carry over to the new session, and so do
unsaved absences (requests.toml) when the editor changed another file.
"""

from __future__ import annotations

import shutil
import tempfile
import warnings
from pathlib import Path

from pydantic import BaseModel

from rostertui.core.edit.rosters import keep_people
from rostertui.core.edit.session import Session
from rostertui.core.io.atomic import write_atomic
from rostertui.core.io.load import load_workspace, workspace_files
from rostertui.core.io.save import save
from rostertui.core.io.transaction import transaction
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.staff import Staff


def apply(session: Session, changed: list[BaseModel],
          texts: dict[str, str] | None = None) -> Session:
    """Validate `changed` file models (and `texts`: whole files by name, e.g. unit.toml)
    with the loader, write them, and return the new session. Raises InputError (nothing
    written) when the loader finds a problem."""
    texts = texts or {}
    folder = session.ws.path
    assert folder is not None, "a loaded workspace always has a path"
    staff = next((m for m in changed if isinstance(m, Staff)), session.ws.staff)
    ids = [p.id for p in staff.person]
    saved = keep_people(session.saved, ids) if session.had_file else None
    with tempfile.TemporaryDirectory(prefix="rostertui-edit-") as tmp:
        trial = Path(tmp) / "scratch" / "workspace"  # room for includes like ../x.toml
        for path, rel in workspace_files(folder, session.ws.unit.include):
            target = (trial / rel).resolve()
            if target.is_relative_to(Path(tmp).resolve()):
                target.parent.mkdir(parents=True, exist_ok=True)
                shutil.copy2(path, target)
        with warnings.catch_warnings():  # unvalidated on purpose: the loader judges it
            warnings.simplefilter("ignore", UserWarning)
            for model in [*changed, *([saved] if saved is not None else [])]:
                save(model, trial)
        for name, text in texts.items():
            write_atomic(trial / name, text)
        load_workspace(trial)  # raises InputError with every problem; nothing written
    with transaction(folder, "edit") as tx:  # every changed file, or none of them
        for model in changed:
            tx.save(model)
        for name, text in texts.items():
            tx.write(folder / name, text)
        if saved is not None and saved != session.saved:
            tx.save(saved)
    ws = load_workspace(folder)
    requests = None
    if session.requests_dirty and not any(isinstance(m, RequestsFile) for m in changed):
        keep = set(ids)
        requests = session.requests.model_copy(update={
            "leave": [x for x in session.requests.leave if x.person in keep],
            "request": [x for x in session.requests.request if x.person in keep]})
    return Session(ws, roster=keep_people(session.roster, ids), requests=requests)
