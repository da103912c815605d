"""Each rule family's model: optimal penalties worked out by hand, on tiny units.

Every solve below also passes the referee inside `solve()`: the checker's penalty
of the returned roster equals the objective and it finds no hard violation. Every
rule kind has at least one test here named `test_<kind with _>_...`
(tests/core/test_kinds.py checks it).
"""

from __future__ import annotations

from collections.abc import Callable

from rostertui.core.solver import SolveOutcome

Solve = Callable[..., SolveOutcome]

E_ONLY = '[[shift]]\ncode = "E"\nname = "Early"\nstart = "07:00"\nend = "15:00"\n'


def cover(shift: str, *, min: int | None = None, ideal: int | None = None, under: int = 0,
          over: int = 0, dates: list[str] | None = None, days: list[str] | None = None) -> str:
    text = f'[[cover]]\nshift = "{shift}"\n'
    if dates is not None:
        text += "dates = [" + ", ".join(dates) + "]\n"
    if days is not None:
        text += "days = [" + ", ".join(f'"{d}"' for d in days) + "]\n"
    if min is not None:
        text += f"min = {min}\n"
    if ideal is not None:
        text += f"ideal = {ideal}\nunder_weight = {under}\nover_weight = {over}\n"
    return text


def test_cover_ideal_out_of_reach_costs_under_weight_per_person_short(solve_ws: Solve) -> None:
    out = solve_ws(["a"], 3, shifts=E_ONLY, cover=cover("E", ideal=2, under=10))
    assert (out.status, out.objective) == ("optimal", 3 * 10)
    assert out.roster.rows["a"] == ["E", "E", "E"]


def test_cover_over_ideal_is_avoided_when_it_costs(solve_ws: Solve) -> None:
    out = solve_ws(["a", "b"], 2, shifts=E_ONLY, cover=cover("E", min=1, ideal=1, under=10,
                                                              over=3))
    assert out.objective == 0
    assert sorted(row.count("E") for row in out.roster.rows.values()) == [0, 2] or all(
        [out.roster.rows["a"][d], out.roster.rows["b"][d]].count("E") == 1 for d in range(2))


def test_max_consecutive_days_soft_charges_days_over(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "run"\nkind = "max-consecutive-days"\ndays = 3\nweight = 7\n'
    out = solve_ws(["a"], 5, shifts=E_ONLY, cover=cover("E", min=1), rules=rules)
    assert out.objective == 2 * 7


def test_max_consecutive_days_counts_history_but_charges_only_period_days(
        solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "run"\nkind = "max-consecutive-days"\ndays = 3\nweight = 7\n'
    out = solve_ws(["a"], 2, shifts=E_ONLY, cover=cover("E", min=1), rules=rules,
                   history={"a": "E E E E E"})
    assert out.objective == 2 * 7  # a stretch of 7 days, 4 over, only 2 inside the period


EL = E_ONLY + '[[shift]]\ncode = "L"\nname = "Late"\nstart = "14:00"\nend = "22:00"\n'


def test_max_consecutive_shift_skips_one_late_rather_than_run_over(solve_ws: Solve) -> None:
    """One person, 4 days, a late wanted every day (2 per day short), at most 2 lates in
    a row (5 per day over). L L L L: a run of 4, 2 over -> 10. Skipping one late in the
    middle (L L E L, L L - L, L - L L, ...) leaves runs of at most 2 -> one day short, 2.
    Skipping two costs 4. The optimum is 2, with three lates."""
    rules = '[[rule]]\nid = "ll"\nkind = "max-consecutive-shift"\nshift = "L"\ncount = 2\n'
    out = solve_ws(["a"], 4, shifts=EL, cover=cover("L", ideal=1, under=2),
                   rules=rules + "weight = 5\n")
    assert (out.status, out.objective) == ("optimal", 2)
    assert out.roster.rows["a"].count("L") == 3
    # hard, the same: the run of four is ruled out, one late is still skipped
    assert solve_ws(["a"], 4, shifts=EL, cover=cover("L", ideal=1, under=2),
                    rules=rules).objective == 2


def test_min_consecutive_off_charges_a_lone_day_off_between_shifts(solve_ws: Solve) -> None:
    """One person, 7 days (Mon 1 - Sun 7 March 2027), earlies needed on 1, 2, 3, 5, 6
    and at most 5 shifts (hard): days 4 and 7 are off. Day 4 is a closed stretch of one
    day off, 1 short of 2 -> 4. Day 7 touches the period end: open, exempt with the
    default edges; with edges = "closed" it is 1 short too -> 8."""
    days = ["2027-03-01", "2027-03-02", "2027-03-03", "2027-03-05", "2027-03-06"]
    cap = '[[rule]]\nid = "cap"\nkind = "max-shifts"\ncount = 5\n'
    rule = '[[rule]]\nid = "off2"\nkind = "min-consecutive-off"\ndays = 2\nweight = 4\n'
    out = solve_ws(["a"], 7, shifts=E_ONLY, cover=cover("E", min=1, dates=days),
                   rules=rule + cap)
    assert (out.status, out.objective) == ("optimal", 4)
    assert out.roster.rows["a"] == ["E", "E", "E", "-", "E", "E", "-"]
    closed = rule.replace("weight = 4", 'edges = "closed"\nweight = 4')
    assert solve_ws(["a"], 7, shifts=E_ONLY, cover=cover("E", min=1, dates=days),
                    rules=closed + cap).objective == 8


def test_min_shifts_three_earlies_for_two_people_who_each_want_two(solve_ws: Solve) -> None:
    """Two people, 3 days, at most one early a day (hard): 3 earlies in all, each person
    should have 2 (3 per shift short). 2 + 1: one short -> 3; 3 + 0: two short -> 6.
    The optimum is 3; as a hard rule (4 earlies needed, 3 possible) it is infeasible."""
    one_a_day = '[[cover]]\nshift = "E"\nmax = 1\n'
    rule = '[[rule]]\nid = "least"\nkind = "min-shifts"\ncount = 2\n'
    out = solve_ws(["a", "b"], 3, shifts=E_ONLY, cover=one_a_day, rules=rule + "weight = 3\n")
    assert (out.status, out.objective) == ("optimal", 3)
    assert sorted(row.count("E") for row in out.roster.rows.values()) == [1, 2]
    assert solve_ws(["a", "b"], 3, shifts=E_ONLY, cover=one_a_day,
                    rules=rule).status == "infeasible"


def test_max_shifts_soft_weighs_shifts_over_against_cover_short(solve_ws: Solve) -> None:
    """One person, 4 days, an early wanted every day (2 per day short), at most 2 shifts
    (5 per shift over). 4 shifts: 2 over -> 10; 3: 5 + 2 -> 7; 2: two days short -> 4;
    fewer costs more. The optimum is 4, with two earlies."""
    rule = '[[rule]]\nid = "most"\nkind = "max-shifts"\ncount = 2\nweight = 5\n'
    out = solve_ws(["a"], 4, shifts=E_ONLY, cover=cover("E", ideal=1, under=2), rules=rule)
    assert (out.status, out.objective) == ("optimal", 4)
    assert out.roster.rows["a"].count("E") == 2


def test_hours_at_least_rounds_the_shortfall_up(solve_ws: Solve) -> None:
    """`min` (at least): 7.6 h shifts, at least 20 h, at most 2 shifts (hard): 15.2 h,
    4.8 h short, rounded up to 5 units -> 5 x 2 = 10. Without the cap three shifts
    (22.8 h) meet it: 0, and so does the hard rule."""
    shifts = E_ONLY + "paid_hours = 7.6\n"
    rule = '[[rule]]\nid = "h"\nkind = "hours"\nmin = 20\n'
    cap = '[[rule]]\nid = "cap"\nkind = "max-shifts"\ncount = 2\n'
    out = solve_ws(["a"], 5, shifts=shifts, rules=rule + "weight = 2\n" + cap)
    assert (out.status, out.objective) == ("optimal", 5 * 2)
    assert out.roster.rows["a"].count("E") == 2
    hard = solve_ws(["a"], 5, shifts=shifts, rules=rule)
    assert (hard.status, hard.objective) == ("optimal", 0)
    assert hard.roster.rows["a"].count("E") >= 3
    assert solve_ws(["a"], 5, shifts=shifts, rules=rule + cap).status == "infeasible"


def test_min_rest_between_late_and_early(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\nweight = 5\n'
    covers = cover("L", min=1, dates=["2027-03-01"]) + cover("E", min=1, dates=["2027-03-02"])
    out = solve_ws(["a"], 2, cover=covers, rules=rules)
    assert out.objective == 5
    hard = rules.replace("weight = 5\n", "")
    assert solve_ws(["a"], 2, cover=covers, rules=hard).status == "infeasible"
    assert solve_ws(["a", "b"], 2, cover=covers, rules=hard).objective == 0


def test_min_rest_across_the_spring_dst_change_uses_real_time(solve_ws: Solve) -> None:
    """L ends 22:00 on 27 Mar 2027, E starts 08:00 on 28 Mar: 10 h on the clock, 9 h
    of real time in Europe/Lisbon (clocks go forward at 01:00)."""
    shifts = ('[[shift]]\ncode = "L"\nname = "Late"\nstart = "14:00"\nend = "22:00"\n'
              '[[shift]]\ncode = "E"\nname = "Early"\nstart = "08:00"\nend = "16:00"\n')
    rules = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 10\nweight = 3\n'
    covers = cover("L", min=1, dates=["2027-03-27"]) + cover("E", min=1, dates=["2027-03-28"])
    lisbon = solve_ws(["a"], 2, start="2027-03-27", timezone="Europe/Lisbon", shifts=shifts,
                      cover=covers, rules=rules)
    utc = solve_ws(["a"], 2, start="2027-03-27", timezone="UTC", shifts=shifts, cover=covers,
                   rules=rules)
    assert (lisbon.objective, utc.objective) == (3, 0)


def test_forbidden_sequence_from_history(solve_ws: Solve) -> None:
    rules = ('[[rule]]\nid = "n-e"\nkind = "forbidden-sequence"\nfirst = "N"\nthen = ["E"]\n'
             "weight = 4\n")
    out = solve_ws(["a"], 1, cover=cover("E", min=1), rules=rules, history={"a": "N"})
    assert out.objective == 4
    assert solve_ws(["a"], 1, cover=cover("E", min=1), history={"a": "N"},
                    rules=rules.replace("weight = 4\n", "")).status == "infeasible"


def test_weekly_rest_soft_costs_one_unit_per_window(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "wr"\nkind = "weekly-rest"\nhours = 35\nweight = 9\n'
    # 2027-03-01 is a Monday: two whole Monday windows, every day needs the one person
    out = solve_ws(["a"], 14, shifts=E_ONLY, cover=cover("E", min=1), rules=rules)
    assert out.objective == 2 * 9
    # with two people sharing the cover, each can take 35 h off in each week
    assert solve_ws(["a", "b"], 14, shifts=E_ONLY, cover=cover("E", min=1),
                    rules=rules).objective == 0


def test_weekly_rest_hard_makes_daily_cover_by_one_person_impossible(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "wr"\nkind = "weekly-rest"\nhours = 24\n'
    assert solve_ws(["a"], 7, shifts=E_ONLY, cover=cover("E", min=1),
                    rules=rules).status == "infeasible"


def test_hours_target_rounds_the_deviation_up(solve_ws: Solve) -> None:
    """7.5 h shifts and a 20 h target: 2 shifts miss by 5 h, 3 by 2.5 h -> 3 units."""
    shifts = E_ONLY + "paid_hours = 7.5\n"
    rules = '[[rule]]\nid = "h"\nkind = "hours"\ntarget = 20\nweight = 1\n'
    out = solve_ws(["a"], 5, shifts=shifts, rules=rules)
    assert out.objective == 3
    assert out.roster.rows["a"].count("E") == 3


def test_hours_max_hard_with_leave_credit(solve_ws: Solve) -> None:
    shifts = E_ONLY + "paid_hours = 8\n"
    rules = '[[rule]]\nid = "h"\nkind = "hours"\nmax = 20\n'
    requests = '[[leave]]\nperson = "a"\nfrom = 2027-03-01\ncredit_hours = 8\n'
    out = solve_ws(["a"], 4, shifts=shifts, rules=rules, requests=requests,
                   cover=cover("E", ideal=1, under=10))
    assert out.roster.rows["a"].count("E") == 1  # 8 h credit + 8 h of work <= 20
    assert out.objective == 3 * 10  # the leave day and two more days without an early


def test_max_average_weekly_hours_with_hours_before(solve_ws: Solve) -> None:
    shifts = E_ONLY + "paid_hours = 10\n"
    rules = ('[[rule]]\nid = "avg"\nkind = "max-average-weekly-hours"\nhours = 48\nweeks = 2\n'
             "weight = 2\n")
    # 90 h before + 2 x 10 h = 110 h over two weeks: 14 h over 96
    out = solve_ws(["a"], 2, shifts=shifts, rules=rules, cover=cover("E", min=1),
                   hours_before={"a": 90})
    assert out.objective == 14 * 2


def test_balance_of_nights_is_the_spread(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "fair"\nkind = "balance"\nmetric = "nights"\nweight = 4\n'
    exactly_one = cover("N", min=1) + '[[cover]]\nshift = "N"\nmax = 1\n'
    out = solve_ws(["a", "b"], 3, cover=exactly_one, rules=rules)
    assert out.objective == 4  # 2 nights and 1 night


def test_complete_weekends_soft_works_the_whole_weekend(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "cw"\nkind = "complete-weekends"\nweight = 6\n'
    out = solve_ws(["a"], 7, shifts=E_ONLY, rules=rules, cover=cover("E", min=1, days=["sat"]))
    assert out.objective == 0
    assert out.roster.rows["a"][5:7] == ["E", "E"]


def test_max_weekends_hard(solve_ws: Solve) -> None:
    rules = '[[rule]]\nid = "mw"\nkind = "max-weekends"\ncount = 1\n'
    assert solve_ws(["a"], 14, shifts=E_ONLY, rules=rules,
                    cover=cover("E", min=1, days=["sun"])).status == "infeasible"


def test_min_consecutive_days_open_and_closed_edges(solve_ws: Solve) -> None:
    covers = cover("E", min=1, dates=["2027-03-03"])
    soft = '[[rule]]\nid = "m"\nkind = "min-consecutive-days"\ndays = 3\nweight = 5\n'
    # one lone day in the middle: closed, 2 short -> the solver lengthens it instead
    out = solve_ws(["a"], 5, shifts=E_ONLY, cover=covers, rules=soft)
    assert out.objective == 0
    assert out.roster.rows["a"].count("E") >= 3
    # a lone day on the last day is open at the end: exempt unless edges = "closed"
    last = cover("E", min=1, dates=["2027-03-05"])
    no_work = '[[rule]]\nid = "cap"\nkind = "max-shifts"\ncount = 1\n'
    assert solve_ws(["a"], 5, shifts=E_ONLY, cover=last, rules=soft + no_work).objective == 0
    closed = soft.replace("weight = 5", 'edges = "closed"\nweight = 5')
    assert solve_ws(["a"], 5, shifts=E_ONLY, cover=last,
                    rules=closed + no_work).objective == 2 * 5


def test_not_available_hard_and_soft(solve_ws: Solve) -> None:
    hard = '[[rule]]\nid = "na"\nkind = "not-available"\ndays = ["mon"]\npeople = ["a"]\n'
    out = solve_ws(["a", "b"], 1, shifts=E_ONLY, rules=hard, cover=cover("E", min=1))
    assert out.roster.rows == {"a": ["-"], "b": ["E"]}
    soft = hard.replace('people = ["a"]', "weight = 3")
    assert solve_ws(["a"], 1, shifts=E_ONLY, rules=soft, cover=cover("E", min=1)).objective == 3


def test_requests_grant_the_cheaper_denial(solve_ws: Solve) -> None:
    requests = ('[[request]]\nperson = "a"\ndate = 2027-03-01\nwant = "off"\nweight = 5\n'
                '[[request]]\nperson = "b"\ndate = 2027-03-01\nwant = "off"\nweight = 2\n')
    out = solve_ws(["a", "b"], 1, shifts=E_ONLY, requests=requests, cover=cover("E", min=1))
    assert out.objective == 2
    assert out.roster.rows == {"a": ["-"], "b": ["E"]}


def test_locks_keep_their_cell(tmp_path) -> None:  # noqa: ANN001
    from rostertui.core.io.load import load_workspace
    from rostertui.core.solver import SolveOptions, solve
    from tests.core.check.helpers import write_ws

    folder = write_ws(tmp_path / "ws", rows={"a": "E - -", "b": "- - -"}, shifts=E_ONLY,
                      cover=cover("E", ideal=1, under=1) + "[[cover]]\nshift = \"E\"\nmax = 1\n",
                      locks='[[lock]]\nperson = "a"\ndates = [2027-03-01, 2027-03-02]\n')
    out = solve(load_workspace(folder), SolveOptions(time_limit=10, workers=2))
    assert out.roster.rows["a"][:2] == ["E", "-"]
    assert out.roster.rows["b"][1] == "E"
    assert out.objective == 0
