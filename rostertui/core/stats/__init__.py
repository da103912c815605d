"""Statistics of a roster, per person and per group (rules.md, "Terms").

Pure: no printing, no file access, no solver, no UI. Built on the checker's
`Grid`, so hours, nights, weekends and stretches mean exactly what they mean to
the rules (and agree with the `balance` metrics).

Decisions where the spec is silent:

* Hours are exact (`Fraction`); nothing here is rounded. A person's hours rule is
  the first effective `hours` rule whose scope includes them; its `min`, `max`
  and `target` are the person's bounds.
* Hours deviation = hours - target; with no target, hours - (min + max) / 2 when
  the rule gives both bounds; otherwise (a lone bound, or no hours rule) none,
  and the person is left out of the group's deviation summary.
* Weekend days worked count working days on weekend days *and* holidays (the
  days of `Grid.weekends`); holidays worked count working days on holidays.
* A request is granted when honoured (want "off" -> off; want a code -> that
  code; avoid a code -> anything else); requests dated outside the period are
  ignored, so granted + denied = requests inside the period.
* The longest working stretch is judged like the checker's stretches: only
  stretches with a day in the period, and one touching the period start runs on
  into the days `history.toml` gives, which count towards its length.
* Groups: every group named in staff.toml, in order of first appearance, then an
  "everyone" entry (`GroupStats.everyone` is True) holding every person.
* With no roster at all, everything is zero (leave credit and request outcomes
  included: nothing has been decided yet); the hours bounds are still given.
"""

from rostertui.core.stats.compute import roster_stats
from rostertui.core.stats.result import EVERYONE, GroupStats, PersonStats, RosterStats, Summary

__all__ = ["EVERYONE", "GroupStats", "PersonStats", "RosterStats", "Summary", "roster_stats"]
