"""Change a TOML file's data in place, keeping its comments, order and layout.

`merge_text` edits the tomlkit document of a file until it holds the new data. A value equal
to the old one (type included: `true` is not `1`, `1` is not `1.0`) keeps its text; tables
recurse; keys gone are removed; new keys go after the table's last key. Arrays of tables and
of inline tables are matched item by item (`pairs`): removed items are deleted, kept ones
merged, new ones appended; if the kept items' order changed the array is written whole.
tomlkit files the comments between two `[[x]]` entries under the entry above; they are moved
so that they stay put when that entry goes. Read the result back before trusting it.
"""

from __future__ import annotations

from difflib import SequenceMatcher
from typing import Any, cast

import tomlkit
from tomlkit.items import AoT, Array, Comment, InlineTable, Table, Whitespace


def same_data(a: Any, b: Any) -> bool:
    """Equal as TOML data, types included: True is not 1 and 1 is not 1.0."""
    if isinstance(a, dict) and isinstance(b, dict):
        return a.keys() == b.keys() and all(same_data(a[k], b[k]) for k in a)
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(map(same_data, a, b))
    return type(a) is type(b) and a == b


def pairs(old: list[Any], new: list[Any]) -> list[tuple[int, int]]:
    """(old index, new index) of the items kept, in new order: matched on `id`, else `code`
    when every item has a distinct one, else by position around the unchanged items."""
    for key in ("id", "code"):
        ids = [[r.get(key) if isinstance(r, dict) else None for r in rows] for rows in (old, new)]
        if all(isinstance(v, str) for v in ids[0] + ids[1]) and all(
                len(set(v)) == len(v) for v in ids):
            where = {v: i for i, v in enumerate(ids[0])}
            return [(where[v], j) for j, v in enumerate(ids[1]) if v in where]
    canon = [[repr(sorted(r.items()) if isinstance(r, dict) else r) for r in rows]
             for rows in (old, new)]
    ops = SequenceMatcher(None, canon[0], canon[1], autojunk=False).get_opcodes()
    return [(i + t, j + t) for tag, i, i2, j, j2 in ops if tag in ("equal", "replace")
            for t in range(min(i2 - i, j2 - j))]


def merge_text(original: str, new_data: dict[str, Any]) -> str:
    """`original` changed as little as possible so that it reads as `new_data`."""
    doc = tomlkit.parse(original)
    _merge_table(doc, new_data)
    return doc.as_string()


def _plain(value: Any) -> Any:
    return value.unwrap() if hasattr(value, "unwrap") else value  # items, tables, proxies


def _rows(value: Any) -> bool:
    return isinstance(value, list) and bool(value) and all(isinstance(v, dict) for v in value)


def _trailing(table: Any, pop: bool = False) -> list[Comment | Whitespace]:
    """The comments and blank lines after a table's last key (they lead to what follows)."""
    body = table.value.body if isinstance(table, Table) else []
    start = len(body)
    while start and body[start - 1][0] is None:
        start -= 1
    block = [item for _, item in body[start:] if isinstance(item, Comment | Whitespace)]
    if pop:
        del body[start:]
    return block


def _noted(block: list[Comment | Whitespace]) -> bool:
    return any(isinstance(item, Comment) for item in block)


def _lead(table: Table, block: list[Comment | Whitespace]) -> None:
    table.trivia.indent = "".join(item.as_string() for item in block) + table.trivia.indent


def _merge_table(table: Any, new: dict[str, Any]) -> None:
    body = table.value.body if isinstance(table, Table) else getattr(table, "body", [])
    for key in [k for k in table if k not in new]:
        old = table[key]
        block = _trailing(old[-1] if isinstance(old, AoT) else old, pop=True)
        at = next((i for i, (k, _) in enumerate(body) if k is not None and k.key == key), -1)
        del table[key]
        after = [v for k, v in body[at + 1:] if k is not None] if at >= 0 else []
        if at > 0 and isinstance(body[at - 1][1], Whitespace) and _noted(block):
            block = block[[isinstance(item, Comment) for item in block].index(True):]
        if _noted(block) and after and isinstance(after[0], Table | AoT):
            _lead(after[0] if isinstance(after[0], Table) else after[0][0], block)
        elif _noted(block):  # what followed the table was the end of the file
            for item in block:
                table.add(item)
    for key, value in new.items():
        plain = [i for i, (k, v) in enumerate(body)
                 if k is not None and not isinstance(v, Table | AoT)]
        if key in table:
            if not same_data(_plain(table[key]), value):
                _merge_value(table, key, value)
        elif isinstance(value, dict) or _rows(value) or not plain or plain[-1] + 1 == len(body):
            table[key] = _fresh(value)
        else:  # after the last key, not after the comments that open the next table
            (table.value if isinstance(table, Table) else table)._insert_at(
                plain[-1] + 1, key, value)
            if isinstance(table, Table):  # a Table mirrors its container's keys
                dict.__setitem__(table, key, table.value[key])


def _merge_value(table: Any, key: str, new: Any) -> None:
    old = table[key]
    if isinstance(new, dict) and isinstance(old, Table):  # a split table is written whole
        _merge_table(old, new)
    elif isinstance(new, dict) and isinstance(old, InlineTable):
        table[key] = _inline(new, old)
    elif not (_rows(new) and isinstance(old, AoT | Array) and _merge_list(old, new)):
        block = _trailing(old[-1], pop=True) if isinstance(old, AoT) and _rows(new) else []
        table[key] = _fresh(new, old)
        for item in block:  # the comments after the array stay after it
            table[key][-1].add(item)


def _merge_list(old: AoT | Array, new: list[dict[str, Any]]) -> bool:
    """Merge an array of tables item by item; False when it must be written whole."""
    aot = isinstance(old, AoT)
    if not (aot or all(isinstance(item, InlineTable) for item in old)):
        return False
    matched = pairs([_plain(item) for item in old], new)
    kept, pad = [i for i, _ in matched], _padded(old)
    if kept != sorted(kept) or [j for _, j in matched] != list(range(len(matched))):
        return False
    for i in reversed([i for i in range(len(old)) if i not in kept]):
        if isinstance(old, AoT):
            _delete_table(old, i)
        else:
            del old[i]
    for j, row in enumerate(new):
        if j >= len(kept) and isinstance(old, AoT):
            _append_table(old, row)
        elif j >= len(kept):
            old.append(_inline(row, pad=pad))
        elif aot:
            _merge_table(old[j], row)
        elif not same_data(_plain(old[j]), row):
            old[j] = _inline(row, cast(InlineTable, old[j]))
    return True


def _delete_table(aot: AoT, i: int) -> None:
    """Delete entry i; the comments after it (about the next entries) stay where they were."""
    block, last = _trailing(aot[i], pop=True), i == len(aot) - 1
    del aot[i]
    if i == 0 and len(aot) and _noted(block):
        _lead(aot[0], block)
    elif i > 0 and (last or _noted(block)):
        if not _noted(_trailing(aot[i - 1])):  # blank lines only: the deleted ones replace them
            _trailing(aot[i - 1], pop=True)
        for item in block:
            aot[i - 1].add(item)


def _append_table(aot: AoT, row: dict[str, Any]) -> None:
    """Append an entry after a blank line, before the comments that close the array."""
    block = _trailing(aot[-1], pop=True) if len(aot) else []
    if len(aot) and aot._parsed:  # tomlkit spaces the entries of arrays it made itself
        aot[-1].add(tomlkit.nl())
    aot.append(row)
    for item in block:
        aot[-1].add(item)


def _fresh(value: Any, like: Any = None) -> Any:
    """`value` as a new item: arrays of tables as `[[x]]` unless `like` was inline."""
    if not _rows(value):
        return value
    if isinstance(like, Array):
        array = tomlkit.array().multiline("\n" in like.as_string())
        array.extend(_inline(row, pad=_padded(like)) for row in value)
        return array
    aot = tomlkit.aot()
    for row in value:
        _append_table(aot, row)
    return aot


def _padded(old: Any) -> bool:
    """Whether inline tables are written `{ a = 1 }` (the default) rather than `{a = 1}`."""
    first = old if isinstance(old, InlineTable) else next(iter(old), None)
    return not isinstance(first, InlineTable) or first.as_string().startswith("{ ")


def _inline(new: dict[str, Any], old: InlineTable | None = None, pad: bool = True) -> Any:
    return tomlkit.parse(f"x = {_text(new, old, pad)}")["x"]


def _text(value: Any, old: Any = None, pad: bool = True) -> str:
    """`value` as inline TOML; keys and values unchanged from `old` keep their text."""
    if old is not None and same_data(_plain(old), value):
        return cast(str, old.as_string())
    if isinstance(value, list):
        return "[" + ", ".join(_text(v) for v in value) + "]"
    if not isinstance(value, dict):
        return cast(str, tomlkit.item(value).as_string())
    body = old.value.body if isinstance(old, InlineTable) else []
    kept = {k.key: (k.as_string().strip(), v) for k, v in body if k is not None}
    order = [k for k in kept if k in value] + [k for k in value if k not in kept]
    parts = [f"{kept.get(k, (tomlkit.key(k).as_string(),))[0]} = "
             f"{_text(value[k], kept.get(k, (None, None))[1])}" for k in order]
    space = " " if parts and (_padded(old) if isinstance(old, InlineTable) else pad) else ""
    return f"{{{space}{', '.join(parts)}{space}}}"
