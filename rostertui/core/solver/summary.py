"""Plain words for a solve's outcome, shared by the CLI and the UI."""

from __future__ import annotations

from rostertui.core.solver.run import SolveOutcome

BOUND_NAMES = {"cp-sat": "CP-SAT search", "lp": "LP relaxation",
               "decomposition": "column generation"}


def bound_sources(outcome: SolveOutcome) -> str:
    """Each method's proven bound, the best first: 'column generation 828, ...'."""
    bounds = dict(outcome.bounds)
    dw = outcome.decomposition
    if dw is not None and dw.bound is not None:
        bounds.setdefault("decomposition", dw.bound)  # shown even when the others beat it
    found = sorted(bounds.items(), key=lambda kv: -kv[1])
    text = ", ".join(f"{BOUND_NAMES.get(name, name)} {b}" for name, b in found) or "none"
    if dw is not None and dw.bound is not None:
        state = "converged" if dw.converged else "stopped before converging"
        text += f" (column generation {state} after {dw.iterations} iterations, " \
                f"{dw.seconds:.1f} s)"
    return text
