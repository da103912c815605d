"""Primal heuristics from the decomposition: better rosters from what column generation knows.

The master LP of column generation (decompose/) says, per person, which whole rows
a near-best roster is made of; these methods turn that into rosters:

- `pool.py`: the integer master over the generated rows (the restricted master
  heuristic; Joncour et al. 2010);
- `rins.py`: relaxation-induced neighbourhoods (Danna, Rothberg & Le Pape 2005),
  the cells where the master LP and the incumbent disagree re-solved by CP-SAT on
  the full model;
- `portfolio.py`: both within one time budget, sharing the incumbent, before the
  CP-SAT search (run.py) starts from the best roster with the proven bound.

Every roster they find is judged exactly by the full model, and the one `solve`
returns by the checker (the referee), as any other.
"""

from rostertui.core.solver.primal.portfolio import improve
from rostertui.core.solver.primal.rins import Incumbent

__all__ = ["Incumbent", "improve"]
