"""A lower bound on the penalty by Dantzig-Wolfe decomposition and column generation.

The roster problem splits into one problem per person (their row must keep their own
hard rules; it costs their own soft rules and requests) joined only by cover (and by
`balance`, which is left out: its penalty is never negative, so the bound stays
valid). Dantzig & Wolfe (1960, "Decomposition principle for linear programs",
Operations Research 8) give the master LP over whole rows, one convexity row per
person; column generation prices new rows per person, as in the nurse rostering
branch-and-price of Burke & Curtois (2014, "New approaches to nurse rostering
benchmark instances", EJOR 237) and He & Qu (2012, "A constraint programming based
column generation approach to nurse rostering problems", Computers & OR 39), whose
pricing is a constraint program, as here (CP-SAT on the person's own model).

- `rows.py`: the cover rows of the master and their exact Lagrangian terms;
- `master.py`: the restricted master LP (GLOP) and its duals;
- `pricing.py`: one person's CP-SAT model, built by the same code as the full model;
- `loop.py`: column generation with the Lagrangian bound at every iteration.
"""

from rostertui.core.solver.decompose.loop import Decomposition, DecompositionProgress, decompose

__all__ = ["Decomposition", "DecompositionProgress", "decompose"]
