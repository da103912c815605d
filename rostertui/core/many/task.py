"""One unit's solve as a pure function of its files: what a cluster worker runs.

`solve_unit(files, options)` puts the files in a scratch folder, reads them with the one
loader, solves as `rostertui solve` does (one deadline for loading and solving, the
roster refereed by the checker) and returns the roster as roster.toml's text with its
`[solve]` record, or why there is none. Nothing here knows about Dask (cluster.py).
"""

from __future__ import annotations

import tempfile
import time
from dataclasses import dataclass, field
from pathlib import Path

from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import dumps
from rostertui.core.many.files import place_files
from rostertui.core.models.roster import SolveStatus
from rostertui.core.solver import SolveOptions, solve
from rostertui.core.solver.outcome import ProgressCallback


@dataclass(frozen=True)
class UnitOptions:
    """The solve options of every unit: those of `rostertui solve`."""

    time_limit: float = 60.0
    workers: int = 1  # CP-SAT search threads per unit
    seed: int = 0
    decompose: bool = True


@dataclass(frozen=True)
class UnitResult:
    """What a worker sends back: a roster (roster.toml's text) or why there is none."""

    roster_toml: str | None
    solve_status: SolveStatus | None  # None: the input could not be read
    objective: int | None = None
    bound: int | None = None
    gap: float | None = None
    seconds: float = 0.0  # loading and solving, on the worker
    error: str | None = None  # the loader's problems, or why no roster was found
    warnings: list[str] = field(default_factory=list)

    @property
    def bad_input(self) -> bool:
        return self.solve_status is None


def solve_unit(files: dict[str, bytes], options: UnitOptions,
               on_progress: ProgressCallback | None = None) -> UnitResult:
    """Solve the workspace made of `files` (`{relative path: bytes}`, files.read_files).

    Bad input is a result (the loader's every problem in `error`), not an exception, so
    that it is not retried. A RefereeError (the checker disagrees with the solver) is
    raised: a bug, which the caller reports.
    """
    started = time.monotonic()
    deadline = started + options.time_limit  # the limit covers loading, as in `solve`
    with tempfile.TemporaryDirectory(prefix="rostertui-unit-") as scratch:
        try:
            folder = place_files(files, Path(scratch))
            ws = load_workspace(folder)
        except InputError as exc:
            return UnitResult(None, None, seconds=time.monotonic() - started,
                              error=exc.summary())
        except ValueError as exc:  # a path that would leave the scratch folder
            return UnitResult(None, None, seconds=time.monotonic() - started, error=str(exc))
        solve_options = SolveOptions(time_limit=options.time_limit, workers=options.workers,
                                     seed=options.seed, deadline=deadline,
                                     decompose=options.decompose)
        outcome = solve(ws, solve_options, on_progress=on_progress)
    warnings = [str(p) for p in ws.warnings]
    seconds = time.monotonic() - started
    if outcome.roster is None:
        why = ("no roster keeps every hard rule: the rules, cover, leave and locks "
               "contradict each other (rostertui explain says why)"
               if outcome.status == "infeasible" else
               f"no roster found within {options.time_limit:g} s (not proven impossible "
               "either); try a longer --time-limit")
        return UnitResult(None, outcome.status, seconds=seconds, error=why, warnings=warnings)
    return UnitResult(dumps(outcome.roster), outcome.status, outcome.objective, outcome.bound,
                      outcome.gap, seconds, warnings=warnings)
