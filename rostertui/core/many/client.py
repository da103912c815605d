"""The client side of a many-unit run: send every unit, take results as they come,
referee each roster and write it if its roster.toml is as it was when sent.

The cluster is anything with `submit`, `completed` and `cancel` (cluster.py adapts
Dask); its workers' news (a unit started, its best penalty and bound) come to
`ManyRun.news` from the cluster's own thread, so the states are guarded by a lock and
every change is passed to `on_change` (the command line's live lines).
"""

from __future__ import annotations

import threading
import time
from collections.abc import Callable, Iterator
from pathlib import Path
from typing import Protocol

from rostertui.core.errors import RosterError
from rostertui.core.many.files import ROSTER, read_files
from rostertui.core.many.task import UnitOptions, UnitResult
from rostertui.core.many.units import UnitState, UnitStatus, WorkerNews, unit_names
from rostertui.core.many.write import RosterChanged, accept, digest, write_if_unchanged


class Cluster(Protocol):
    def submit(self, unit: str, files: dict[str, bytes], options: UnitOptions) -> None: ...

    def completed(self) -> Iterator[tuple[str, UnitResult | BaseException]]: ...

    def cancel(self) -> None: ...


class ManyRun:
    """One run over many workspaces; `run(cluster)` does it, `units` says how it went."""

    def __init__(self, folders: list[Path], options: UnitOptions,
                 on_change: Callable[[UnitState], None] | None = None):
        self.options = options
        self.units = [UnitState(name, folder)
                      for name, folder in zip(unit_names(folders), folders, strict=True)]
        self.by_name = {u.name: u for u in self.units}
        self.on_change = on_change
        self.lock = threading.Lock()
        self.started = time.monotonic()
        self.seconds = 0.0
        self.interrupted = False
        self._sent: dict[str, dict[str, bytes]] = {}
        self._seen: dict[str, str | None] = {}

    # -- from the cluster's thread ---------------------------------------------------------
    def news(self, news: WorkerNews) -> None:
        unit = self.by_name.get(news.unit)
        if unit is None:
            return
        with self.lock:
            if unit.finished:
                return
            if news.kind == "started":
                unit.attempts += 1
                unit.status, unit.worker = "solving", news.worker
                unit.started_at = time.monotonic()
                unit.penalty = unit.bound = None
            else:
                unit.penalty, unit.bound = news.penalty, news.bound
        self._changed(unit)

    # -- the run ---------------------------------------------------------------------------
    def run(self, cluster: Cluster) -> None:
        """Send every unit, then write each result as it arrives. Ctrl-C cancels what is
        not finished (rosters already written stay) and sets `interrupted`."""
        try:
            for unit in self.units:
                self._send(cluster, unit)
            for name, result in cluster.completed():
                self._finish(self.by_name[name], result)
        except KeyboardInterrupt:
            self.interrupted = True
            cluster.cancel()
            for unit in self.units:
                if not unit.finished:
                    self._set(unit, "cancelled", "stopped by Ctrl-C before it finished")
        finally:
            self.seconds = time.monotonic() - self.started

    def _send(self, cluster: Cluster, unit: UnitState) -> None:
        try:
            files = read_files(unit.folder)
        except OSError as exc:
            where = exc.filename or unit.folder
            unit.bad_input = True
            self._set(unit, "failed", f"{where}: cannot be read: {exc.strerror or exc}")
            return
        # the roster as sent is the one compared before writing
        self._sent[unit.name], self._seen[unit.name] = files, digest(files.get(ROSTER))
        cluster.submit(unit.name, files, self.options)

    def _finish(self, unit: UnitState, result: UnitResult | BaseException) -> None:
        if isinstance(result, BaseException):
            self._set(unit, "failed", f"{type(result).__name__}: {result}"
                      if not isinstance(result, RosterError) else str(result))
            return
        with self.lock:
            unit.solve_status, unit.seconds = result.solve_status, result.seconds
            unit.warnings = list(result.warnings)
            unit.bad_input = result.bad_input
            if result.roster_toml is not None:
                unit.penalty, unit.bound = result.objective, result.bound
        if result.roster_toml is None:
            self._set(unit, "failed", result.error or "no roster")
            return
        try:
            roster, _check = accept(self._sent[unit.name], result.roster_toml,
                                    result.objective)
            notices = write_if_unchanged(unit.folder, roster, self._seen[unit.name])
        except RosterError as exc:
            self._set(unit, "refused" if isinstance(exc, RosterChanged) else "failed",
                      str(exc))
            return
        except OSError as exc:
            self._set(unit, "failed", f"{exc.filename or unit.folder}: cannot be written: "
                      f"{exc.strerror or exc}")
            return
        with self.lock:
            unit.written = True
            unit.warnings += [str(n) for n in notices]
        self._set(unit, "done", None)

    def _set(self, unit: UnitState, status: UnitStatus, error: str | None) -> None:
        with self.lock:
            unit.status, unit.error = status, error
        self._changed(unit)

    def _changed(self, unit: UnitState) -> None:
        if self.on_change is not None:
            self.on_change(unit)

    # -- how it went -----------------------------------------------------------------------
    def count(self, status: UnitStatus) -> int:
        return sum(1 for u in self.units if u.status == status)

    @property
    def all_done(self) -> bool:
        return all(u.status == "done" for u in self.units)

    @property
    def nothing_read(self) -> bool:
        """Every unit failed on its input: nothing could be read (exit 2)."""
        return all(u.bad_input for u in self.units)
