"""The CP-SAT roster solver: one module per rule family, one objective, a referee.

`build_model(ws)` turns a workspace into a CP-SAT model whose objective is the
rules.md penalty; `solve(ws, options)` runs it with live progress and returns the
roster, judged afterwards by the independent checker (`rostertui.core.check`).
"""

from rostertui.core.solver.run import SolveOptions, SolveOutcome, SolveProgress, solve

__all__ = ["SolveOptions", "SolveOutcome", "SolveProgress", "solve"]
