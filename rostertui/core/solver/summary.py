"""Plain words for a solve's outcome, shared by the CLI and the UI."""

from __future__ import annotations

from rostertui.core.solver.outcome import SolveOutcome

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


def improvement_story(outcome: SolveOutcome) -> str:
    """Which method found each better roster: 'warm start 652 at 0.0 s, CP-SAT search
    640 at 3.2 s, RINS 612 at 20.1 s' (a run of one method's gains as its last one)."""
    steps: list[tuple[float, int, str]] = []
    for seconds, penalty, method in outcome.improvements:
        if steps and steps[-1][2] == method:
            steps[-1] = (seconds, penalty, method)
        else:
            steps.append((seconds, penalty, method))
    if not steps:
        return "none"
    return ", ".join(f"{method} {penalty} at {seconds:.1f} s" for seconds, penalty, method in steps)
