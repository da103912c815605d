"""The effective rule set: presets + local rules, ids unique, scopes resolved."""

from __future__ import annotations

from rostertui.core.io.report import Report
from rostertui.core.models.rules import Rule
from rostertui.core.models.staff import Staff
from rostertui.core.models.workspace import EffectiveRule


def resolve_scope(rule: Rule, staff: Staff) -> tuple[str, ...]:
    """Person ids a rule applies to, in staff order (rules.md, "Scope")."""
    if rule.people is None and rule.groups is None:
        chosen = [p.id for p in staff.person]
    else:
        named = set(rule.people or [])
        groups = set(rule.groups or [])
        chosen = [p.id for p in staff.person if p.id in named or groups.intersection(p.groups)]
    out = set(rule.except_)
    return tuple(pid for pid in chosen if pid not in out)


def merge_rules(
    presets: list[tuple[str, str, list[Rule]]],
    local: list[Rule],
    staff: Staff,
    report: Report,
) -> list[EffectiveRule]:
    """Join preset rules (origin, file label, rules) and local rules into one set.

    A local rule whose id equals a preset rule's id replaces it; any other
    repeated id is an error naming both places.
    """
    chosen: dict[str, tuple[str, str, int, Rule]] = {}
    for origin, file, rules in presets:
        for i, rule in enumerate(rules):
            if rule.id in chosen:
                first = chosen[rule.id]
                report.error(
                    file,
                    ("rule", i, "id"),
                    f"rule id {rule.id!r} is also defined in {first[1]}; ids must be unique "
                    "across presets (replace it with a local rule in unit.toml instead)",
                )
                continue
            chosen[rule.id] = (origin, file, i, rule)
    local_seen: dict[str, int] = {}
    for i, rule in enumerate(local):
        if rule.id in local_seen:
            report.error(
                "unit.toml",
                ("rule", i, "id"),
                f"rule id {rule.id!r} is already used by rule[{local_seen[rule.id]}]",
            )
            continue
        local_seen[rule.id] = i
        chosen[rule.id] = ("unit.toml", "unit.toml", i, rule)
    return [
        EffectiveRule(rule=rule, origin=origin, people=resolve_scope(rule, staff))
        for origin, _file, _i, rule in chosen.values()
    ]
