"""The CP-SAT roster solver: one module per rule family, one objective, a referee.

`build_model(ws)` turns a workspace into a CP-SAT model whose objective is the
rules.md penalty; `solve(ws, options)` runs it with live progress and returns the
roster, judged afterwards by the independent checker (`rostertui.core.check`).

Where each rule lives (a rule kind's encoder is the function named like the kind in
the module of its family, models/rules.py, as the checker's evaluator is in
check/<family>.py; shared.py holds what families share):

* cells.py          one shift a day, leave, `requires`, locks, history
* cover.py          cover min / max / ideal
* requests.py       requests
* rest.py           min-rest, weekly-rest
* stretches.py      max/min-consecutive-days, min-consecutive-off, max-consecutive-shift
* sequences.py      forbidden-sequence
* counts.py         max/min-shifts
* hours.py          hours, max-average-weekly-hours (scaled_hours.py: exact hours)
* weekends.py       max-weekends, complete-weekends
* not_available.py  not-available (hard: cells it rules out have no variable)
* balance.py        balance

and the bounds: lp_bound.py (the LP relaxation of the model, GLOP) and decompose/
(Dantzig-Wolfe decomposition by column generation, one pricing model per person).
"""

from rostertui.core.solver.outcome import SolveOptions, SolveOutcome, SolveProgress
from rostertui.core.solver.run import solve

__all__ = ["SolveOptions", "SolveOutcome", "SolveProgress", "solve"]
