"""The primal heuristics in turn, within one time budget, sharing the incumbent."""

from __future__ import annotations

import threading
import time
from collections.abc import Callable

from rostertui.core.solver.decompose import Decomposition
from rostertui.core.solver.fixing import Values, evaluate, values_of
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.primal import rins
from rostertui.core.solver.primal.pool import Rows, integer_master
from rostertui.core.solver.primal.rins import Incumbent

# method names, as the progress line and the summaries show them (solver/summary.py)
POOL, RINS, FIRST, LNS = "integer master", "RINS", "first roster", "neighbourhood search"
EVALUATE_CAP = 30.0  # seconds for the exact objective of one roster (polish takes ~1 s
#                      at 2014 people)

ARTIFICIAL = 1e-7  # master artificial use treated as none

Offer = Callable[[Values, int, str], None]  # a better roster, its objective, the method


def improve(built: BuiltModel, dw: Decomposition, start: Incumbent | None, *, deadline: float,
            pool_share: float, workers: int, seed: int, offer: Offer,
            stop: Callable[[int], bool], cancel: threading.Event | None = None
            ) -> Incumbent | None:
    """The integer master over the pool (for `pool_share` of the time to `deadline`),
    then RINS from the best roster so far to `deadline`. `stop(objective)`: cancel, or
    a roster that meets the proven bound. Returns the best roster found (or `start`)."""
    best = start
    # with the artificial variables in use, no mix of the pool's rows meets the cover
    # minimums, so no choice of one row each does: the pool would be searched in vain
    if dw.columns and not dw.infeasible and dw.artificial <= ARTIFICIAL:
        found: list[Rows] = []

        def on_rows(rows: Rows, objective: int) -> None:
            found.append(rows)
            if best is None or objective < best.objective:
                offer(values_of(built, rows), objective, POOL)

        share = pool_share * (deadline - time.monotonic())
        integer_master(dw, len(built.cells.people), share, workers, seed, on_rows,
                       cutoff=best.objective if best is not None else None,
                       stop=stop, cancel=cancel)
        if found:
            values = values_of(built, found[-1])
            exact = evaluate(built, values, EVALUATE_CAP)
            if exact is not None and (best is None or exact[0] < best.objective):
                best = Incumbent(values, exact[0], exact[1])
                offer(values, exact[0], POOL)
    # RINS from a roster the master did not give, with the master unconverged, was
    # measured worse than the plain search on the clinic demo (first roster 2225, RINS
    # 1486, then the search: 812 median of 3 seeds at 60 s, against 768 without RINS)
    if best is None or stop(best.objective) or not dw.columns:
        return best
    return rins.search(built, dw, best, deadline, workers, seed,
                       lambda values, objective: offer(values, objective, RINS), stop, cancel)
