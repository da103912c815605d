"""The effective rule set: presets + local rules, replacement by id, scopes resolved."""

from __future__ import annotations

from pathlib import Path

from rostertui.core.io.load import load_workspace
from rostertui.core.io.ruleset import resolve_scope
from rostertui.core.models.rules import rule_adapter
from rostertui.core.models.staff import Staff

STAFF = Staff.model_validate({"person": [
    {"id": "a", "name": "A", "groups": ["night-team"]},
    {"id": "b", "name": "B", "groups": ["full-time"]},
    {"id": "c", "name": "C", "groups": ["night-team", "full-time"]},
    {"id": "d", "name": "D"},
]})


def rule(**extra: object):
    return rule_adapter.validate_python({"id": "r", "kind": "complete-weekends", **extra})


def test_no_scope_means_everyone_in_staff_order() -> None:
    assert resolve_scope(rule(), STAFF) == ("a", "b", "c", "d")


def test_people_and_groups_combine_and_except_removes() -> None:
    r = rule(people=["d"], groups=["night-team"], **{"except": ["c"]})
    assert resolve_scope(r, STAFF) == ("a", "d")


def test_an_empty_list_means_nobody_and_an_unknown_group_has_no_members() -> None:
    assert resolve_scope(rule(people=[]), STAFF) == ()
    assert resolve_scope(rule(groups=["no-such-group"]), STAFF) == ()


def test_local_rule_replaces_preset_rule_with_the_same_id(good_ws: Path) -> None:
    unit = good_ws / "unit.toml"
    unit.write_text(unit.read_text() + '\n[[rule]]\nid = "daily-rest"\nkind = "min-rest"\n'
                    "hours = 12\nweight = 5\n")
    ws = load_workspace(good_ws)
    (daily,) = [r for r in ws.rules if r.id == "daily-rest"]
    assert (daily.rule.hours, daily.rule.weight, daily.origin) == (12, 5, "unit.toml")
    ids = [r.id for r in ws.rules]
    assert len(ids) == len(set(ids))


def test_effective_set_keeps_origins(good_ws: Path) -> None:
    ws = load_workspace(good_ws)
    origins = {r.id: r.origin for r in ws.rules}
    assert origins["daily-rest"] == "eu-working-time"
    assert origins["max-days-in-row"] == "presets/local.toml"
    assert origins["hours-band"] == "unit.toml"
    assert {r.id: r.people for r in ws.rules}["fair-nights"] == ("t01", "t02", "t03")
    assert {r.id: r.people for r in ws.rules}["hours-band"] == ("t01", "t02")
