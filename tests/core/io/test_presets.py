"""Each shipped preset's numbers checked against the instrument and article it cites."""

from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from rostertui.core.io.presets import preset_names, presets_dir
from rostertui.core.models.rules import PresetFile


def preset(name: str) -> dict[str, object]:
    model = PresetFile.model_validate(tomllib.loads((presets_dir() / f"{name}.toml").read_text()))
    return {r.id: r for r in model.rule}


def test_the_three_presets_ship() -> None:
    assert {"eu-working-time", "uk-working-time", "care-ward"} <= set(preset_names())


@pytest.mark.parametrize("name", ["eu-working-time", "uk-working-time", "care-ward"])
def test_every_preset_rule_has_a_source_and_names_shifts_only_by_night(name: str) -> None:
    for rule in preset(name).values():
        assert rule.source, f"{name}: {rule.id} has no source"
        for key in ("shift", "first"):
            value = getattr(rule, key, None)
            assert value in (None, "@night"), f"{name}: {rule.id} names a unit's code {value!r}"
        for value in getattr(rule, "then", None) or []:
            assert value in ("@night", "-")


# Directive 2003/88/EC (OJ L 299, 18.11.2003)
def test_eu_daily_rest_is_11_consecutive_hours__directive_2003_88_art_3() -> None:
    rule = preset("eu-working-time")["daily-rest"]
    assert (rule.kind, rule.hours, rule.hard) == ("min-rest", 11, True)
    assert "Art. 3" in rule.source


def test_eu_weekly_rest_is_24_plus_11_hours_per_7_days__directive_2003_88_art_5() -> None:
    rule = preset("eu-working-time")["weekly-rest"]
    assert (rule.kind, rule.hours, rule.window_days, rule.hard) == ("weekly-rest", 24 + 11, 7, True)
    assert "Art. 5" in rule.source


def test_eu_average_48_hours_over_at_most_4_months__directive_2003_88_art_6_and_16b() -> None:
    rule = preset("eu-working-time")["average-48h"]
    assert (rule.kind, rule.hours, rule.hard) == ("max-average-weekly-hours", 48, True)
    # Art. 16(b): a reference period not exceeding four months. The shortest four
    # consecutive calendar months (Feb-May in a common year) have 28+31+30+31 = 120 days;
    # 17 weeks = 119 days is the longest whole number of weeks inside any of them.
    assert rule.weeks * 7 <= 28 + 31 + 30 + 31
    assert (rule.weeks + 1) * 7 > 28 + 31 + 30 + 31
    assert "Art. 6" in rule.source and "16(b)" in rule.source


# Working Time Regulations 1998 (SI 1998/1833)
def test_uk_daily_rest_is_11_hours__wtr_1998_reg_10() -> None:
    rule = preset("uk-working-time")["daily-rest"]
    assert (rule.kind, rule.hours, rule.hard) == ("min-rest", 11, True)
    assert "reg. 10" in rule.source


def test_uk_weekly_rest_is_24_hours_in_each_7_days__wtr_1998_reg_11() -> None:
    rule = preset("uk-working-time")["weekly-rest"]
    assert (rule.kind, rule.hours, rule.window_days, rule.hard) == ("weekly-rest", 24, 7, True)
    assert "reg. 11" in rule.source


def test_uk_average_48_hours_over_17_weeks__wtr_1998_reg_4() -> None:
    rule = preset("uk-working-time")["average-48h"]
    assert (rule.kind, rule.hours, rule.weeks, rule.hard) == (
        "max-average-weekly-hours", 48, 17, True)
    assert "reg. 4" in rule.source


def test_care_ward_is_marked_as_practice_without_a_published_source() -> None:
    rules = preset("care-ward")
    assert all("no published source" in r.source for r in rules.values())
    assert all(not r.hard for r in rules.values()), "practice rules are soft, never hard"
    assert rules["max-nights-in-row"].kind == "max-consecutive-shift"
    assert rules["max-nights-in-row"].shift == "@night"
    assert rules["max-days-in-row"].kind == "max-consecutive-days"
    assert rules["complete-weekends"].kind == "complete-weekends"
    assert {rules["fair-nights"].metric, rules["fair-weekends"].metric} == {"nights", "weekends"}


def test_presets_folder_is_the_checkout_rules_folder_when_not_installed() -> None:
    here = Path(__file__).resolve().parents[3]
    if (Path(__import__("rostertui").__file__).parent / "_presets").is_dir():
        pytest.skip("running from an installed wheel: the bundled copy is used")
    assert presets_dir() == here / "rules"
