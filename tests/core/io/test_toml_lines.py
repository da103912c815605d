"""Tests for the TOML key-path -> line locator (rostertui.core.io.toml_lines)."""

from __future__ import annotations

import datetime as dt
import random
import tomllib
from collections.abc import Iterator
from typing import Any

import pytest

from rostertui.core.io.toml_lines import KeyPath, key_lines, line_of

# --- exact line numbers, one construct at a time ------------------------------------------


def test_arrays_of_tables_example() -> None:
    text = '[[person]]\nid = "p01"\nskills = ["rn",\n   "triage"]\n[[person]]\nid = "p02"\n'
    assert key_lines(text) == {
        ("person",): 1,
        ("person", 0): 1,
        ("person", 0, "id"): 2,
        ("person", 0, "skills"): 3,
        ("person", 0, "skills", 0): 3,
        ("person", 0, "skills", 1): 4,
        ("person", 1): 5,
        ("person", 1, "id"): 6,
    }


def test_comments_and_blank_lines() -> None:
    text = """# top comment, with a = 1 and [table] in it

a = 1  # trailing, b = 2
# between
b = "x"   # "quoted # in a comment"

c = [  # opens, 9 ]
  1,   # one, two ]
  # a whole comment line with ] and , and {
  2,
]  # closes
d = 4
"""
    assert key_lines(text) == {
        ("a",): 3,
        ("b",): 5,
        ("c",): 7,
        ("c", 0): 8,
        ("c", 1): 10,
        ("d",): 12,
    }


def test_table_headers_dotted_quoted_and_spaced() -> None:
    text = """[server]
host = "h"
[ server . "ip.v4" . 'alt name' ]
port = 80
[a.b.c]
x = 1
["quoted \\"key\\"".'lit']
y = 2
"""
    tomllib.loads(text)  # the fixture itself is valid TOML
    assert key_lines(text) == {
        ("server",): 1,
        ("server", "host"): 2,
        ("server", "ip.v4"): 3,
        ("server", "ip.v4", "alt name"): 3,
        ("server", "ip.v4", "alt name", "port"): 4,
        ("a",): 5,
        ("a", "b"): 5,
        ("a", "b", "c"): 5,
        ("a", "b", "c", "x"): 6,
        ('quoted "key"',): 7,
        ('quoted "key"', "lit"): 7,
        ('quoted "key"', "lit", "y"): 8,
    }


def test_nested_arrays_of_tables_and_subtables() -> None:
    text = """[[fruit]]
name = "apple"
[fruit.physical]
color = "red"
[[fruit.variety]]
name = "red delicious"
[[ fruit . variety ]]
name = "granny smith"
[[fruit]]
name = "banana"
[[fruit.variety]]
name = "plantain"
"""
    lines = key_lines(text)
    assert lines[("fruit",)] == 1
    assert lines[("fruit", 0)] == 1
    assert lines[("fruit", 0, "name")] == 2
    assert lines[("fruit", 0, "physical")] == 3
    assert lines[("fruit", 0, "physical", "color")] == 4
    assert lines[("fruit", 0, "variety")] == 5
    assert lines[("fruit", 0, "variety", 0)] == 5
    assert lines[("fruit", 0, "variety", 0, "name")] == 6
    assert lines[("fruit", 0, "variety", 1)] == 7
    assert lines[("fruit", 0, "variety", 1, "name")] == 8
    assert lines[("fruit", 1)] == 9
    assert lines[("fruit", 1, "name")] == 10
    assert lines[("fruit", 1, "variety", 0)] == 11
    assert lines[("fruit", 1, "variety", 0, "name")] == 12
    assert ("fruit", 2) not in lines


def test_dotted_keys() -> None:
    text = """name = "x"
site.address.city = "Porto"
site . "post code" = "4000"
[unit]
rest.min_hours = 11
"""
    assert key_lines(text) == {
        ("name",): 1,
        ("site",): 2,
        ("site", "address"): 2,
        ("site", "address", "city"): 2,
        ("site", "post code"): 3,
        ("unit",): 4,
        ("unit", "rest"): 5,
        ("unit", "rest", "min_hours"): 5,
    }


def test_quoted_keys_are_unquoted_like_tomllib() -> None:
    text = """"\\u00e9t\\u00E9" = 1
"tab\\tkey" = 2
'C:\\raw' = 3
"" = 4
"a.b" = 5
"big \\U0001F600" = 6
"""
    assert set(key_lines(text)) == {(key,) for key in tomllib.loads(text)}
    assert key_lines(text) == {
        ("été",): 1,
        ("tab\tkey",): 2,
        ("C:\\raw",): 3,
        ("",): 4,
        ("a.b",): 5,
        ("big \U0001f600",): 6,
    }


def test_hash_and_brackets_inside_strings_are_text() -> None:
    text = '''a = "# not a comment [not = a table]"
b = 'literal # [x] \\ no escapes'
c = "escaped \\" quote # still a string, ]"
d = """
multi-line basic with # and [header]
e = "not a key"
two quotes "" and an escaped \\""" inside
"""
f = \'\'\'
literal [[x]] # "
g = 1 \'\'\'
h = """ends with a quote""""
j = """\\
    folded \\
    text"""
k = \'\'\'it's\'\'\'\'
i = 'last'
'''
    assert set(tomllib.loads(text)) == {"a", "b", "c", "d", "f", "h", "j", "k", "i"}
    assert key_lines(text) == {
        ("a",): 1,
        ("b",): 2,
        ("c",): 3,
        ("d",): 4,
        ("f",): 9,
        ("h",): 12,
        ("j",): 13,
        ("k",): 16,
        ("i",): 17,
    }


def test_numbers_booleans_dates_and_times() -> None:
    keys = [
        "int = +1_000",
        "hex = 0xDEAD_beef",
        "oct = 0o755",
        "bin = 0b1101",
        "float = -3.14e+2",
        "ninf = -inf",
        "nan = nan",
        "yes = true",
        "no = false",
        "odt = 1979-05-27T07:32:00.999-07:00",
        "odt_space = 1979-05-27 07:32:00Z",
        "ldt = 1979-05-27T07:32:00",
        "ld = 1979-05-27",
        "lt = 07:32:00.5",
        "dates = [1979-05-27 07:32:00, 2027-03-05]",
        'end = "done"',
    ]
    text = "\n".join(keys) + "\n"
    tomllib.loads(text)
    lines = key_lines(text)
    for number, line in enumerate(keys, start=1):
        assert lines[(line.split(" = ")[0],)] == number
    assert lines[("dates", 1)] == 15
    assert ("dates", 2) not in lines


def test_multi_line_and_nested_arrays() -> None:
    text = """grid = [
  [1, 2],
  [
    3,
    [4, "]"],
  ],
]
flat = [ "a", "b", ]
empty = [ ]
after = 1
"""
    assert key_lines(text) == {
        ("grid",): 1,
        ("grid", 0): 2,
        ("grid", 0, 0): 2,
        ("grid", 0, 1): 2,
        ("grid", 1): 3,
        ("grid", 1, 0): 4,
        ("grid", 1, 1): 5,
        ("grid", 1, 1, 0): 5,
        ("grid", 1, 1, 1): 5,
        ("flat",): 8,
        ("flat", 0): 8,
        ("flat", 1): 8,
        ("empty",): 9,
        ("after",): 10,
    }


def test_inline_tables() -> None:
    text = """contract = { hours = 37.5, start = 2027-03-05, site.name = "A" }
request = [ {person="a"}, {person="b", date=2027-03-05} ]
empty = {}
nested = { a = { b = [1, { c = 2 }] } }
"""
    assert key_lines(text) == {
        ("contract",): 1,
        ("contract", "hours"): 1,
        ("contract", "start"): 1,
        ("contract", "site"): 1,
        ("contract", "site", "name"): 1,
        ("request",): 2,
        ("request", 0): 2,
        ("request", 0, "person"): 2,
        ("request", 1): 2,
        ("request", 1, "person"): 2,
        ("request", 1, "date"): 2,
        ("empty",): 3,
        ("nested",): 4,
        ("nested", "a"): 4,
        ("nested", "a", "b"): 4,
        ("nested", "a", "b", 0): 4,
        ("nested", "a", "b", 1): 4,
        ("nested", "a", "b", 1, "c"): 4,
    }


def test_array_of_inline_tables_over_many_lines() -> None:
    text = """request = [
  # weekend swaps
  { person = "c01", date = 2027-03-20, want = "off" },

  { person = "c07", date = 2027-03-18 },  # a comment, with { and ]
  {
    person = "c14", date = 2027-03-21,
    want = "E",
  },
]
"""
    lines = key_lines(text)  # the last item is TOML 1.1 style: tolerated, still located
    assert lines[("request",)] == 1
    assert lines[("request", 0)] == 3
    assert lines[("request", 0, "want")] == 3
    assert lines[("request", 1)] == 5
    assert lines[("request", 1, "date")] == 5
    assert lines[("request", 2)] == 6
    assert lines[("request", 2, "person")] == 7
    assert lines[("request", 2, "date")] == 7
    assert lines[("request", 2, "want")] == 8
    assert ("request", 3) not in lines


def test_rows_table() -> None:
    text = """[rows]
p01 = ["E", "E", "L"]
p07 = ["E", "-", "N"]

[hours_before]
p07 = 664.5
"""
    lines = key_lines(text)
    assert lines[("rows", "p07")] == 3
    assert lines[("rows", "p07", 2)] == 3
    assert lines[("hours_before", "p07")] == 6


def test_crlf_line_endings_give_the_same_lines() -> None:
    for text in DOCUMENTS.values():
        assert key_lines(text.replace("\n", "\r\n")) == key_lines(text)


def test_byte_order_mark_is_skipped() -> None:
    assert key_lines('\ufeffa = 1\nb = "x"\n') == {("a",): 1, ("b",): 2}


# --- line_of --------------------------------------------------------------------------------


def test_line_of_exact_prefix_and_unknown() -> None:
    lines = key_lines('[[person]]\nid = "p01"\nskills = ["rn",\n   "triage"]\n')
    assert line_of(lines, ("person", 0, "skills", 1)) == 4
    assert line_of(lines, ("person", 0, "skills", 5)) == 3  # falls back to the array
    assert line_of(lines, ("person", 0, "nickname")) == 1  # to the [[person]] header
    assert line_of(lines, ("person", 3, "id")) == 1  # to the first [[person]]
    assert line_of(lines, ("unit", "name")) is None
    assert line_of(lines, ()) is None
    assert line_of({}, ("person",)) is None


# --- every leaf of realistic documents is located --------------------------------------------

STAFF = """# The ward team.
#   rn = registered nurse, hca = healthcare assistant

[[person]]
id = "c01"
name = "Marta Quintela"
skills = ["rn", "triage"]
groups = ["full-time"]

[[person]]
id = "c02"
name = "Tomás \\"Tom\\" Arvoredo"   # nickname in quotes
skills = [
  "rn",      # registered
  "triage",  # admission desk, [weekdays]
]
groups = ["full-time", "night-team"]
contract = { hours = 37.5, since = 2019-09-01 }

[[person]]
id = 'c03'
name = "Inês Salgueiral"
skills = ["hca"]
groups = []
"""

SHIFTS = """# Three shifts a day.
[[shift]]
code = "E"
name = "Early"
start = "07:00"
end = "15:00"
paid_hours = 7.5

[[shift]]
code = "N"
name = "Night"
start = "21:00"
end = "07:30"               # ends the next morning
paid_hours = 10.0
night = true

# --- Cover ---
[[cover]]
shift = "E"
days = ["mon", "tue", "wed", "thu", "fri"]
min = 3
ideal = 4
under_weight = 60

[[cover]]
shift = "N"
days = ["sat", "sun"]
skill = "rn"
min = 1
dates = [2027-03-26, 2027-04-02]
"""

REQUESTS = """# Leave is hard; requests are soft.
leave = [
  { person = "c05", from = 2027-03-22, to = 2027-03-26, reason = "annual leave", credit_hours = 7.5 },
  { person = "c13", from = 2027-03-15, to = 2027-03-18, reason = "study # not a comment" },
]

request = [
  { person = "c01", date = 2027-03-20, want = "off", weight = 5, note = "daughter's birthday" },
  # swapped with c09
  { person = "c07", date = 2027-03-18, want = "L", weight = 2 },


  { person = "c14", date = 2027-03-21, want = "E" },  # { and ] in a comment
]
"""  # noqa: E501

HISTORY = """# The week before the period, oldest first.
[rows]
c01 = ["E", "E", "L", "-", "-", "E", "E"]
c04 = ["-", "-", "-", "N", "N", "N", "N"]
p07 = ["E", "-", "N"]

# Hours already worked in the averaging window.
[hours_before]
c03 = 664.5
c04 = 512
"""

UNIT = '''name = "Alcaravão Community Clinic - Short-Stay Ward"
timezone = "Europe/Lisbon"
start = 2027-03-15          # a Monday
days = 28
weekend = ["sat", "sun"]
holidays = [2027-03-26]     # Good Friday
include = ["eu-working-time", "care-ward"]
notes = """
Four weeks. [rule] tables below are local;
# this is not a comment, and key = "this" is not a key.
"""

[[rule]]
id = "ft-hours-band"
kind = "hours"
groups = ["full-time"]
min = 120
max = 165
note = 'full-time contract, 37.5 h a week'

[[rule]]
id = "night-run"
kind = "sequence"
shifts = ["N", "N", "N"]
window = { days = 7, max = 3 }
weight = 4
params.rest_after_nights = 46

[rule.extra]
"quoted key" = true
'''

DOCUMENTS = {
    "staff": STAFF,
    "shifts": SHIFTS,
    "requests": REQUESTS,
    "history": HISTORY,
    "unit": UNIT,
}


def _leaves(value: Any, path: KeyPath = ()) -> Iterator[tuple[KeyPath, Any]]:
    if isinstance(value, dict) and value:
        for key, item in value.items():
            yield from _leaves(item, (*path, key))
    elif isinstance(value, list) and value:
        for index, item in enumerate(value):
            yield from _leaves(item, (*path, index))
    else:
        yield path, value


def _as_written(value: Any) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, dt.date | dt.time):
        return value.isoformat()
    return str(value)


@pytest.mark.parametrize("name", sorted(DOCUMENTS))
def test_every_leaf_is_on_a_line_that_shows_it(name: str) -> None:
    text = DOCUMENTS[name]
    data = tomllib.loads(text)
    lines = key_lines(text)
    source = text.splitlines()
    for path, value in _leaves(data):
        assert path in lines, path
        line = line_of(lines, path)
        assert line is not None
        shown = path[-1] if isinstance(path[-1], str) else _as_written(value)
        assert str(shown) in source[line - 1], (path, line)


@pytest.mark.parametrize("name", sorted(DOCUMENTS))
def test_every_located_path_exists_in_the_parsed_document(name: str) -> None:
    data = tomllib.loads(DOCUMENTS[name])
    for path in key_lines(DOCUMENTS[name]):
        node = data
        for key in path:
            node = node[key]  # KeyError / IndexError would mean an invented path


# --- malformed text never raises --------------------------------------------------------------


@pytest.mark.parametrize(
    "text",
    [
        'a = "unterminated',
        'a = """never closed\n\nb = 1',
        "a = '''never closed",
        "a = [1, 2",
        "a = [1 2]",
        "a = [1,,2]",
        "a = {x = 1",
        "a = {x = 1 y = 2}",
        "[table",
        "[[aot]",
        "[aot]]",
        "[]",
        "= 1",
        "a =",
        "a.b. = 1",
        "a = 1 ]",
        '"\\U99999999" = 1',
        '"bad escape \\q" = 1',
        "a = [" * 5000,
        "a = " + "{b = " * 5000,
        "\x00\x01",
        "\r\r\r",
        "}",
        "",
    ],
)
def test_malformed_text_does_not_raise(text: str) -> None:
    lines = key_lines(text)
    assert all(isinstance(line, int) and line >= 1 for line in lines.values())


def test_malformed_text_keeps_what_was_found_before_the_problem() -> None:
    text = 'a = 1\n[t]\nb = "x\nc = 2\n'
    assert key_lines(text) == {("a",): 1, ("t",): 2}


def test_truncated_and_mutated_documents_do_not_raise() -> None:
    text = REQUESTS + UNIT
    for end in range(len(text)):
        key_lines(text[:end])
    rng = random.Random(20270315)
    alphabet = "[]{}\"'#=,.\n\r\\ abc1-:"
    for _ in range(500):
        chars = list(text)
        for _ in range(rng.randint(1, 5)):
            chars[rng.randrange(len(chars))] = rng.choice(alphabet)
        key_lines("".join(chars))
