"""The independent roster checker: every violation of rules.md, with units and penalty.

Pure: no printing, no file access, no solver. The CLI's `check` and the solver's
referee both call `check_roster`.
"""

from rostertui.core.check.builtin import check_locks
from rostertui.core.check.result import CheckResult, Violation
from rostertui.core.check.run import EVALUATORS, check_roster

__all__ = ["EVALUATORS", "CheckResult", "Violation", "check_locks", "check_roster"]
