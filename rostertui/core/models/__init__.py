"""Pydantic models of every workspace file and every rule kind (the spec's shapes)."""

from rostertui.core.models.history import History
from rostertui.core.models.requests import Leave, Request, RequestsFile
from rostertui.core.models.roster import Lock, Roster, SolveRecord
from rostertui.core.models.rules import Rule, RuleBase
from rostertui.core.models.shifts import Cover, Shift, ShiftsFile
from rostertui.core.models.staff import Person, Staff
from rostertui.core.models.unit import Unit
from rostertui.core.models.workspace import EffectiveRule, Workspace

__all__ = [
    "Cover",
    "EffectiveRule",
    "History",
    "Leave",
    "Lock",
    "Person",
    "Request",
    "RequestsFile",
    "Roster",
    "Rule",
    "RuleBase",
    "Shift",
    "ShiftsFile",
    "SolveRecord",
    "Staff",
    "Unit",
    "Workspace",
]
