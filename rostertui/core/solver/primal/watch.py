"""Stop a CP-SAT solve the moment the user cancels, even between its solutions."""

from __future__ import annotations

import threading
from collections.abc import Iterator
from contextlib import contextmanager

from ortools.sat.python import cp_model


@contextmanager
def stop_on_cancel(solver: cp_model.CpSolver, cancel: threading.Event | None) -> Iterator[None]:
    if cancel is None:
        yield
        return
    done = threading.Event()

    def watch() -> None:
        while not done.is_set():
            if cancel.wait(0.1):
                solver.stop_search()
                return

    threading.Thread(target=watch, daemon=True, name="rostertui-cancel").start()
    try:
        yield
    finally:
        done.set()
