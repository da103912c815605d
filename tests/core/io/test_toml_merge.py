"""Saving keeps what the user typed: comments, layout and untouched values stay byte for byte."""

from __future__ import annotations

import difflib
import tomllib
from datetime import date
from pathlib import Path

import pytest
import tomli_w

from rostertui.core.io import save as save_module
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import FILE_NAMES, dumps, save
from rostertui.core.io.toml_merge import merge_text, pairs, same_data
from rostertui.core.models.requests import Request
from rostertui.core.models.staff import Person
from rostertui.core.models.workspace import Workspace
from tests.conftest import DEMO, EXAMPLES, FIXTURES, copy_ws, example_cases, need_shared

OWN = [FIXTURES / "good", *sorted(p for p in DEMO.glob("*") if p.is_dir())]
CLINIC = DEMO / "clinic"


def file_models(ws: Workspace) -> list:
    models = [ws.unit, ws.staff, ws.shifts, ws.requests, ws.history, ws.roster]
    return [m for m in models if m is not None]


def changed_lines(before: str, after: str) -> tuple[list[str], list[str]]:
    """(lines removed, lines added) between two texts."""
    diff = list(difflib.ndiff(before.splitlines(), after.splitlines()))
    return [d[2:] for d in diff if d[:2] == "- "], [d[2:] for d in diff if d[:2] == "+ "]


def comment_lines(text: str) -> list[str]:
    return [line for line in text.splitlines() if "#" in line]


def edited(src: Path, tmp_path: Path, name: str, edit) -> tuple[str, str, Path]:
    """Copy a workspace, load it, change one file model with `edit`, save it; the file
    before and after, and the copy."""
    ws_dir = copy_ws(src, tmp_path)
    before = (ws_dir / name).read_text(encoding="utf-8")
    ws = load_workspace(ws_dir)
    model = edit(ws)
    assert FILE_NAMES[type(model)] == name
    save(model, ws_dir)
    after = (ws_dir / name).read_text(encoding="utf-8")
    assert type(model).model_validate(tomllib.loads(after)) == model  # reads back as meant
    return before, after, ws_dir


# -- saving an unchanged model changes nothing ------------------------------------------------

@pytest.mark.parametrize("src", OWN, ids=[p.name for p in OWN])
def test_saving_unchanged_models_gives_byte_identical_files(src: Path, tmp_path: Path) -> None:
    ws_dir = copy_ws(src, tmp_path)
    for model in file_models(load_workspace(ws_dir)):
        path = save(model, ws_dir)
        assert path.read_bytes() == (src / path.name).read_bytes(), path.name


CASES = example_cases()


@pytest.mark.parametrize("src", CASES, ids=[p.name for p in CASES])
def test_spec_examples_keep_their_layout_too(src: Path, tmp_path: Path) -> None:
    ws_dir = copy_ws(src, tmp_path)
    for model in file_models(load_workspace(ws_dir)):
        path = save(model, ws_dir)
        if path.name != "roster.toml":  # the tool's own file: always in the spec layout
            assert path.read_bytes() == (src / path.name).read_bytes(), path.name


# -- edits from the UI change only what they change --------------------------------------------

def test_adding_a_person_appends_one_entry(tmp_path: Path) -> None:
    def add(ws: Workspace):
        ws.staff.person.append(Person(id="c15", name="Ada Nova", skills=["rn"],
                                      groups=["full-time"]))
        return ws.staff

    before, after, ws_dir = edited(CLINIC, tmp_path, "staff.toml", add)
    assert after.startswith(before)
    assert after[len(before):] == ('\n[[person]]\nid = "c15"\nname = "Ada Nova"\n'
                                   'skills = ["rn"]\ngroups = ["full-time"]\n')
    assert [p.id for p in load_workspace(ws_dir).staff.person][-1] == "c15"


def test_renaming_a_person_changes_one_line(tmp_path: Path) -> None:
    def rename(ws: Workspace):
        ws.staff.person[2].name = "Inês Salgueiral-Moura"
        return ws.staff

    before, after, ws_dir = edited(CLINIC, tmp_path, "staff.toml", rename)
    assert changed_lines(before, after) == (['name = "Inês Salgueiral"'],
                                            ['name = "Inês Salgueiral-Moura"'])
    assert load_workspace(ws_dir).staff.person[2].name == "Inês Salgueiral-Moura"


def test_removing_a_person_in_the_middle_keeps_the_others_comments(tmp_path: Path) -> None:
    def remove(ws: Workspace):
        ws.staff.person = [p for p in ws.staff.person if p.id != "c08"]
        return ws.staff

    before, after, ws_dir = edited(CLINIC, tmp_path, "staff.toml", remove)
    assert comment_lines(after) == comment_lines(before)
    assert "# --- Healthcare assistants ---" in after  # it sat right below c08
    assert "c08" not in after and "Duarte Mirandola" not in after
    entry = '[[person]]\nid = "c08"\nname = "Duarte Mirandola"\nskills = ["rn"]\n' \
            'groups = ["part-time"]\n\n'
    assert after == before.replace(entry, "")
    assert "c08" not in [p.id for p in load_workspace(ws_dir).staff.person]


def test_removing_the_first_person_keeps_the_section_heading(tmp_path: Path) -> None:
    def remove(ws: Workspace):
        ws.staff.person = ws.staff.person[1:]
        return ws.staff

    before, after, _ = edited(DEMO / "depot", tmp_path, "staff.toml", remove)
    assert comment_lines(after) == comment_lines(before)
    assert "d01" not in after
    assert "# --- Forklift drivers ----" in after.split("[[person]]")[0]


def test_changing_a_cover_min_changes_one_line(tmp_path: Path) -> None:
    def change(ws: Workspace):
        ws.shifts.cover[0].min = 4
        return ws.shifts

    before, after, ws_dir = edited(CLINIC, tmp_path, "shifts.toml", change)
    assert changed_lines(before, after) == (["min = 3"], ["min = 4"])
    assert comment_lines(after) == comment_lines(before)
    assert load_workspace(ws_dir).shifts.cover[0].min == 4


def test_removing_a_cover_entry_keeps_the_comments_with_their_entries(tmp_path: Path) -> None:
    """Cover entries have no id: they are lined up around the unchanged ones."""
    def remove(ws: Workspace):
        del ws.shifts.cover[6]  # Late at weekends
        return ws.shifts

    before, after, ws_dir = edited(CLINIC, tmp_path, "shifts.toml", remove)
    assert comment_lines(after) == comment_lines(before)
    entry = ('[[cover]]\nshift = "L"\ndays = ["sat", "sun"]\nmin = 2\nideal = 3\n'
             'under_weight = 30\nover_weight = 10\n\n')
    assert before.count(entry) == 1 and after == before.replace(entry, "")
    night = after.index("# Night: exactly two every night")
    assert after[night:].split("[[cover]]")[1].startswith('\nshift = "N"\nmin = 2\nmax = 2\n')
    assert len(load_workspace(ws_dir).shifts.cover) == 9


def test_changing_a_local_rule_weight_changes_one_line(tmp_path: Path) -> None:
    def change(ws: Workspace):
        ws.unit.rule[5] = ws.unit.rule[5].model_copy(update={"weight": 12})  # weekends-cap
        return ws.unit

    before, after, ws_dir = edited(CLINIC, tmp_path, "unit.toml", change)
    assert changed_lines(before, after) == (["weight = 10"], ["weight = 12"])
    assert comment_lines(after) == comment_lines(before)
    rules = {r.id: r for r in load_workspace(ws_dir).unit.rule}
    assert rules["weekends-cap"].weight == 12


def test_a_value_set_back_to_its_default_is_removed(tmp_path: Path) -> None:
    def change(ws: Workspace):
        ws.requests.request[0].weight = 1  # the default: the file need not say it
        return ws.requests

    before, after, ws_dir = edited(CLINIC, tmp_path, "requests.toml", change)
    assert changed_lines(before, after) == (["weight = 5"], [])
    assert load_workspace(ws_dir).requests.request[0].weight == 1


def test_adding_a_request_to_an_inline_array(tmp_path: Path) -> None:
    src = EXAMPLES / "case-503"
    need_shared(src)

    def add(ws: Workspace):
        ws.requests.request.append(Request(person="p01", date=date(2027, 3, 20), want="off",
                                           weight=3, note="choir"))
        return ws.requests

    before, after, ws_dir = edited(src, tmp_path, "requests.toml", add)
    removed, added = changed_lines(before, after)
    assert removed == []
    assert added == ['    { person = "p01", date = 2027-03-20, want = "off", weight = 3, '
                     'note = "choir" },']
    assert after.startswith("request = [\n")  # still an inline array
    requests = load_workspace(ws_dir).requests.request
    assert requests[-1].person == "p01" and len(requests) == 9


# -- merge_text itself ----------------------------------------------------------------------

def test_a_type_change_is_a_change() -> None:
    text = "a = 1  # one\nb = true\nc = 2.0\n"
    assert merge_text(text, {"a": 1, "b": True, "c": 2.0}) == text
    assert merge_text(text, {"a": 1.0, "b": 1, "c": 2}) == "a = 1.0  # one\nb = 1\nc = 2\n"


def test_new_keys_go_before_the_comments_that_open_the_next_table() -> None:
    text = 'name = "x"\n\n# the rules\n[[rule]]\nid = "a"\n\n# b is strict\n[[rule]]\nid = "b"\n'
    data = tomllib.loads(text)
    data["days"] = 7
    data["rule"][0]["weight"] = 3
    assert merge_text(text, data) == ('name = "x"\ndays = 7\n\n# the rules\n[[rule]]\nid = "a"\n'
                                      'weight = 3\n\n# b is strict\n[[rule]]\nid = "b"\n')


def test_appending_a_table_goes_before_the_comments_after_the_array() -> None:
    text = '[[leave]]\nperson = "a"\n\n# --- Requests\n\n[[request]]\nperson = "b"\n'
    data = tomllib.loads(text)
    data["leave"].append({"person": "c"})
    assert merge_text(text, data) == ('[[leave]]\nperson = "a"\n\n[[leave]]\nperson = "c"\n\n'
                                      '# --- Requests\n\n[[request]]\nperson = "b"\n')


def test_removing_a_whole_array_keeps_the_comments_below_it() -> None:
    text = '# head\n\n[[leave]]\nperson = "a"\n\n# --- Requests\n[[request]]\nperson = "b"\n'
    assert merge_text(text, {"request": [{"person": "b"}]}) == (
        '# head\n\n# --- Requests\n[[request]]\nperson = "b"\n')


def test_reordered_tables_are_written_whole() -> None:
    text = '[[p]]\nid = "a"\n\n[[p]]\nid = "b"  # bee\n'
    out = merge_text(text, {"p": [{"id": "b"}, {"id": "a"}]})
    assert tomllib.loads(out) == {"p": [{"id": "b"}, {"id": "a"}]}


def test_inline_tables_keep_their_comments_and_text() -> None:
    text = 'r = [\n    { id = "a", w = 1 },  # first\n    { id = "b", w = 2 },  # second\n]\n'
    out = merge_text(text, {"r": [{"id": "b", "w": 2.5}, ]})
    assert out == 'r = [\n    { id = "b", w = 2.5 },  # second\n]\n'
    out = merge_text(text, {"r": [{"id": "a", "w": 1}, {"id": "b", "w": 2}, {"id": "c"}]})
    assert out == ('r = [\n    { id = "a", w = 1 },  # first\n    { id = "b", w = 2 },  # second\n'
                   '    { id = "c" },\n]\n')


def test_pairs_match_on_id_then_code_then_around_unchanged_items() -> None:
    assert pairs([{"id": "a"}, {"id": "b"}], [{"id": "b"}, {"id": "c"}]) == [(1, 0)]
    assert pairs([{"code": "E"}, {"code": "L"}], [{"code": "L"}]) == [(1, 0)]
    rows = [{"v": 1}, {"v": 2}, {"v": 3}]
    assert pairs(rows, [rows[0], rows[2]]) == [(0, 0), (2, 1)]
    assert pairs(rows, [rows[0], {"v": 9}, rows[2]]) == [(0, 0), (1, 1), (2, 2)]


def test_same_data_tells_types_apart() -> None:
    assert same_data({"a": [1, "x"]}, {"a": [1, "x"]})
    assert not same_data(1, 1.0) and not same_data(True, 1) and not same_data({"a": 1}, {})


# -- what is never done ---------------------------------------------------------------------

def test_a_merge_that_reads_back_differently_falls_back_to_a_fresh_dump(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    ws_dir = copy_ws(CLINIC, tmp_path)
    staff = load_workspace(ws_dir).staff
    staff.person[0].name = "Someone Else"
    monkeypatch.setattr(save_module, "merge_text", lambda text, data: text)  # a broken merge
    save(staff, ws_dir)
    assert (ws_dir / "staff.toml").read_text(encoding="utf-8") == dumps(staff)


def test_a_file_that_does_not_parse_is_written_fresh(tmp_path: Path) -> None:
    ws_dir = copy_ws(CLINIC, tmp_path)
    staff = load_workspace(ws_dir).staff
    (ws_dir / "staff.toml").write_text("[[person]\nbroken", encoding="utf-8")
    save(staff, ws_dir)
    assert (ws_dir / "staff.toml").read_text(encoding="utf-8") == dumps(staff)


def test_roster_toml_is_always_written_in_the_spec_layout(tmp_path: Path) -> None:
    ws_dir = copy_ws(FIXTURES / "good", tmp_path)
    roster = load_workspace(ws_dir).roster
    other_layout = tomli_w.dumps(roster.model_dump(mode="python", exclude_none=True))
    (ws_dir / "roster.toml").write_text(other_layout, encoding="utf-8")
    save(roster, ws_dir)
    assert (ws_dir / "roster.toml").read_text(encoding="utf-8") == dumps(roster)
