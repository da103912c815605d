"""Locate TOML key paths by line number.

tomllib parses TOML but forgets where each value came from.  This module is a
small hand-written *locator*: it scans TOML source text and maps every key
path -- the tuples of table keys and 0-based array indexes that pydantic puts
in a validation error's ``loc`` -- to the 1-based line where that key (or
array item) appears, so errors can read ``staff.toml: person[3].skills[1]
(line 17)``.

It understands just enough TOML to step over values without being fooled:
comments, ``[table]`` and ``[[array.of.tables]]`` headers, dotted and quoted
keys, the four string forms (a ``#`` or ``[`` inside a string is harmless),
scalars (numbers, booleans, dates/times), nested and multi-line arrays, and
inline tables.  CRLF line endings are fine.

It is not a parser: it builds no values and does not check types, escapes,
numbers, dates or duplicate keys.  On malformed text it stops and returns what
it found so far; it never raises -- tomllib reports the real syntax error.
"""

from __future__ import annotations

import re
from bisect import bisect_left
from contextlib import suppress

KeyPath = tuple[str | int, ...]

# Blanks, newlines and comments.  Possessive (*+): never give back a comment's
# tail, whose "c" in "# a, c" would otherwise pass for a value or separator.
_WS = r"(?:[ \t\r\n]+|#[^\n]*)*+"
_KEY = r"""[A-Za-z0-9_-]+|"[^"\\\n]*(?:\\.[^"\\\n]*)*"|'[^'\n]*'"""
_DOTTED_KEY = rf"(?:{_KEY})(?:[ \t]*\.[ \t]*(?:{_KEY}))*"
_STRING = (  # multi-line forms first; a '#' or '[' inside is just text
    r'"""[^"\\]*(?:(?:\\[\s\S]|"(?!""))[^"\\]*)*"{3,5}'
    r"|'''[^']*(?:'(?!'')[^']*)*'{3,5}"
    r'|"[^"\\\n]*(?:\\.[^"\\\n]*)*"'
    r"|'[^'\n]*'"
)
# Numbers, booleans, inf/nan, dates and times (incl. "1979-05-27 07:32:00Z").
_SCALAR = r"\d{4}-\d\d-\d\d \d\d:[\w+\-.:]*|[\w+\-.:]+"

_THEN = rf"{_WS}(?P<sep>[,\]}}]?)"  # what follows a value: , ] } or nothing
_VALUE = rf"(?:(?:{_STRING}|{_SCALAR}){_THEN}|(?P<open>[\[{{]))"
# The empty group (?P<at>) marks where the key or array item starts.
_KEYVAL = re.compile(
    rf"{_WS}(?P<at>)(?:(?P<bare>[A-Za-z0-9_-]+)|(?P<key>{_DOTTED_KEY}))"
    rf"[ \t]*=[ \t]*{_VALUE}"
)
_ITEM = re.compile(rf"{_WS}(?P<at>){_VALUE}")
_HEADER = re.compile(rf"(\[\[?)[ \t]*({_DOTTED_KEY})[ \t]*(\]\]?)")
_SKIP = re.compile(_WS)
_NEXT = re.compile(_THEN)
_KEY_PART = re.compile(_KEY)
_ESCAPE = re.compile(r"\\(?:u([0-9a-fA-F]{4})|U([0-9a-fA-F]{8})|(.))", re.S)
_SIMPLE_ESCAPES = {"b": "\b", "t": "\t", "n": "\n", "f": "\f", "r": "\r", '"': '"', "\\": "\\"}


class _Malformed(Exception):
    """Raised internally when the text stops looking like TOML."""


def _unescape(match: re.Match[str]) -> str:
    code = match.group(1) or match.group(2)
    if code is None:
        return _SIMPLE_ESCAPES.get(match.group(3), match.group())
    number = int(code, 16)
    return chr(number) if number <= 0x10FFFF else match.group()


def _split_key(dotted: str) -> list[str]:
    """The parts of a dotted key such as ``a . "b.c" . 'd'``, unquoted."""
    parts = []
    for raw in _KEY_PART.findall(dotted):
        if raw[0] == '"':
            raw = _ESCAPE.sub(_unescape, raw[1:-1])
        elif raw[0] == "'":
            raw = raw[1:-1]
        parts.append(raw)
    return parts


class _Scanner:
    def __init__(self, text: str) -> None:
        self.text = text
        self.newlines = [m.start() for m in re.finditer("\n", text)]
        self.lines: dict[KeyPath, int] = {}
        self.table: KeyPath = ()  # the table opened by the last [header]
        self.aot_sizes: dict[KeyPath, int] = {}  # [[header]] path -> items

    def line(self, pos: int) -> int:
        return bisect_left(self.newlines, pos) + 1

    def scan(self) -> None:
        text = self.text
        pos = 1 if text.startswith("\ufeff") else 0
        while True:
            skipped = _SKIP.match(text, pos)
            assert skipped is not None  # _WS matches the empty string too
            pos = skipped.end()
            if pos >= len(text):
                return
            if text.startswith("[", pos):
                pos = self.header(pos)
                continue
            match = _KEYVAL.match(text, pos)
            if match is None:
                raise _Malformed
            pos, separator = self.keyval(match, self.table)
            if separator:
                raise _Malformed

    def header(self, pos: int) -> int:
        match = _HEADER.match(self.text, pos)
        if match is None or len(match[1]) != len(match[3]):
            raise _Malformed
        line = self.line(pos)
        *parents, last = _split_key(match[2])
        path: KeyPath = ()
        for key in parents:  # through arrays of tables, to their last item
            path += (key,)
            self.lines.setdefault(path, line)
            if path in self.aot_sizes:
                path += (self.aot_sizes[path] - 1,)
        path += (last,)
        if match[1] == "[[":
            self.lines.setdefault(path, line)
            index = self.aot_sizes.get(path, 0)
            self.aot_sizes[path] = index + 1
            path += (index,)
        self.lines[path] = line
        self.table = path
        return match.end()

    def keyval(self, match: re.Match[str], table: KeyPath) -> tuple[int, str]:
        """Record a `_KEYVAL` match; return the position and separator after it."""
        line = self.line(match.start("at"))
        bare = match["bare"]
        path = table
        for key in (bare,) if bare else _split_key(match["key"]):
            path += (key,)
            self.lines.setdefault(path, line)
        return self.after_value(match, path)

    def after_value(self, match: re.Match[str], path: KeyPath) -> tuple[int, str]:
        """Step over the value `match` starts; return the position and separator."""
        if match["open"] is None:  # a string or scalar: already matched
            return match.end(), match["sep"]
        if match["open"] == "[":
            end = self.array(match.end(), path)
        else:
            end = self.inline_table(match.end(), path)
        after = _NEXT.match(self.text, end)
        assert after is not None  # _THEN matches the empty string too
        return after.end(), after["sep"]

    def close(self, pos: int, bracket: str) -> int:
        """Step over blanks and comments to the expected closing bracket."""
        skipped = _SKIP.match(self.text, pos)
        assert skipped is not None  # _WS matches the empty string too
        pos = skipped.end()
        if not self.text.startswith(bracket, pos):
            raise _Malformed
        return pos + 1

    def array(self, pos: int, path: KeyPath) -> int:
        text = self.text
        index = 0
        while True:
            match = _ITEM.match(text, pos)
            if match is None:  # "]" right after "[" or after a trailing comma
                return self.close(pos, "]")
            item = path + (index,)
            self.lines[item] = self.line(match.start("at"))
            pos, separator = self.after_value(match, item)
            if separator == "]":
                return pos
            if separator != ",":
                raise _Malformed
            index += 1

    def inline_table(self, pos: int, path: KeyPath) -> int:
        while True:  # lenient: allows newlines and a trailing comma (TOML 1.1)
            match = _KEYVAL.match(self.text, pos)
            if match is None:
                return self.close(pos, "}")
            pos, separator = self.keyval(match, path)
            if separator == "}":
                return pos
            if separator != ",":
                raise _Malformed


def key_lines(text: str) -> dict[KeyPath, int]:
    """Map every key path found in the TOML text to its 1-based line number.

    Tables and arrays get the line where they are first named; array items
    the line where the item starts.  Malformed text never raises: the paths
    found before the problem are returned.
    """
    scanner = _Scanner(text)
    with suppress(_Malformed, RecursionError):  # keep what was found so far
        scanner.scan()
    return scanner.lines


def line_of(lines: dict[KeyPath, int], path: KeyPath) -> int | None:
    """The line of `path`, or of its longest prefix that is known (None if nothing)."""
    for end in range(len(path), 0, -1):
        line = lines.get(path[:end])
        if line is not None:
            return line
    return None
