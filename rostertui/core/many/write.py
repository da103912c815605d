"""The client's write of a unit's roster: refereed, then compare and refuse.

When a unit is sent, the client notes what its roster.toml held (a digest of its bytes,
or that there was none). Just before writing the roster that came back, under the
workspace's lock (`transaction`), it compares: if the file changed in between (the
user edited it, another run wrote it), nothing is written and the unit is refused.
The write itself is `transaction`'s: a fsynced temporary beside the file, then a
rename, so a reader sees the old roster or the new one, never half of one.
"""

from __future__ import annotations

import hashlib
import tempfile
import tomllib
from pathlib import Path

from pydantic import ValidationError

from rostertui.core.check import CheckResult
from rostertui.core.errors import InputError, Problem, RosterError
from rostertui.core.io.load import load_workspace
from rostertui.core.io.transaction import transaction
from rostertui.core.many.files import ROSTER, place_files
from rostertui.core.models.roster import Roster
from rostertui.core.solver.outcome import RefereeError
from rostertui.core.solver.run import referee


class RosterChanged(RosterError):
    """roster.toml changed after the unit was sent: the new roster was not written."""


class NotAccepted(RosterError):
    """The checker on the client does not accept the roster a worker returned."""


def digest(data: bytes | None) -> str | None:
    """What roster.toml held: a SHA-256 of its bytes, None when there was none."""
    return None if data is None else hashlib.sha256(data).hexdigest()


def current_digest(folder: Path) -> str | None:
    try:
        return digest((folder / ROSTER).read_bytes())
    except FileNotFoundError:
        return None


def accept(files: dict[str, bytes], roster_toml: str, objective: int | None) -> tuple[
        Roster, CheckResult]:
    """The returned roster, refereed on the client against the files that were sent: no
    hard violation and the checker's penalty equal to the solver's, else NotAccepted."""
    try:
        roster = Roster.model_validate(tomllib.loads(roster_toml))
    except (tomllib.TOMLDecodeError, ValidationError) as exc:
        raise NotAccepted(f"the roster that came back is not a valid roster.toml: {exc}") \
            from None
    with tempfile.TemporaryDirectory(prefix="rostertui-referee-") as scratch:
        try:
            ws = load_workspace(place_files(files, Path(scratch)))
            return roster, referee(ws, roster, objective)
        except (InputError, ValueError) as exc:  # the worker read them; the client cannot
            raise NotAccepted(f"the client cannot read the files it sent: {exc}") from None
        except RefereeError as exc:
            raise NotAccepted(f"the checker does not accept the roster: {exc}") from None


def write_if_unchanged(folder: Path, roster: Roster, seen: str | None) -> list[Problem]:
    """Write `roster` to folder/roster.toml if the file still holds what it held when the
    unit was sent (`seen`, a `digest`); RosterChanged (nothing written) if not. Returns
    the save's notices (a previous text with comments is kept in .rostertui/backup/)."""
    with transaction(folder, "solve-many") as tx:
        now = current_digest(folder)
        if now != seen:
            if seen is None:
                why = "roster.toml appeared"
            elif now is None:
                why = "roster.toml was deleted"
            else:
                why = "roster.toml changed"
            raise RosterChanged(f"{why} after the unit was sent (edited, or written by "
                                "another run); the new roster was not written over it")
        tx.save(roster)
    return tx.notices
