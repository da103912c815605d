"""The monthly cycle: the next period's workspace from the current one.

lookback.py (how many days of history the effective rules need), history.py (rows and
hours_before from what was worked), nextperiod.py (the plan: every file as text),
preview.py (the plan in words), write.py (the new folder, whole or not at all).
"""

from rostertui.core.cycle.nextperiod import Plan, default_target, plan_next
from rostertui.core.cycle.preview import preview_lines
from rostertui.core.cycle.write import write_plan

__all__ = ["Plan", "default_target", "plan_next", "preview_lines", "write_plan"]
