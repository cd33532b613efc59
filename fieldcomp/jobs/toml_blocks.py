"""Blocks of a job file's text added and removed whole: a row of an array of tables
(``[[beam.finding]]``), a new table, a table or list that goes.

In tomlkit the blank lines and comment lines after a table's last key belong to that table (its
"tail"), though a reader takes them as the gap before the next block or as that block's
introduction. Blocks added or removed here carry the tails along: a new last row takes the gap
that followed the old last row, a removed row takes its introduction with it and leaves the next
row's, and rows keep the gaps their neighbours have.
"""

from __future__ import annotations

from typing import Any

import tomlkit
from tomlkit.container import Container
from tomlkit.items import AoT, Array, Comment, InlineTable, Item, Null, SingleKey, Table, Trivia, Whitespace

Tail = list[Item]


def _container(block: Any) -> Container:
    return block if isinstance(block, Container) else block.value


def deep(block: Any) -> Container:
    """The container whose tail ends `block` (a document, table or array of tables): the
    innermost last table."""
    body = _container(block[-1] if isinstance(block, AoT) else block)
    for key, item in reversed(body.body):
        if key is None or isinstance(item, Null):
            continue
        if isinstance(item, AoT) and len(item):
            return deep(item)
        if isinstance(item, Table):
            return deep(item)
        break
    return body


def pop_tail(body: Container) -> Tail:
    """Take the blank lines and comment lines off the end of `body`."""
    tail: Tail = []
    while body.body and body.body[-1][0] is None and isinstance(body.body[-1][1], (Whitespace, Comment, Null)):
        item = body.body.pop()[1]
        if not isinstance(item, Null):
            tail.insert(0, item)
    return tail


def push_tail(body: Container, tail: Tail) -> None:
    body.body.extend((None, item) for item in tail)


def _gap(tail: Tail) -> Tail:
    """The blank lines of a tail, without its comments: the gap between two rows."""
    return [Whitespace(item.s) for item in tail if isinstance(item, Whitespace)]


def _peek_gap(block: Any) -> Tail:
    body = deep(block)
    tail = pop_tail(body)
    push_tail(body, tail)
    return _gap(tail)


def new_block(data: Any, aot_element: bool = False) -> Item:
    """A table (dict) or array of tables (list of dicts) as text blocks: plain keys first, then
    sub-tables, no blank lines of tomlkit's choosing."""
    if isinstance(data, list):
        return AoT([new_block(row, True) for row in data], parsed=True)  # type: ignore[misc]
    table = Table(Container(True), Trivia(indent=""), is_aot_element=aot_element)
    plain = [(k, v) for k, v in data.items() if not _is_block(v)]
    for key, value in plain + [(k, v) for k, v in data.items() if _is_block(v)]:
        table.value._raw_append(SingleKey(key), new_block(value) if _is_block(value) else tomlkit.item(value))
    return table


def _is_block(value: Any) -> bool:
    return isinstance(value, dict) or (isinstance(value, list) and bool(value) and all(isinstance(v, dict) for v in value))


def _inline(data: Any) -> Any:
    """A row of an inline array (``finding = [{...}]``) as an inline table."""
    if isinstance(data, dict):
        table = tomlkit.inline_table()
        for key, value in data.items():
            table[key] = _inline(value)
        return table
    if isinstance(data, list):
        return [_inline(v) for v in data]
    return data


def add_block(table: Any, key: str, data: Any) -> None:
    """A table or rows the file did not have, after the table's last block."""
    if isinstance(table, InlineTable):
        table[key] = _inline(data)
        return
    body = _container(table)
    last = deep(body)
    tail = pop_tail(last)
    block = new_block(data)
    block.name = key  # type: ignore[attr-defined]
    body._raw_append(SingleKey(key), block)
    push_tail(deep(body), tail)


def remove_block(table: Any, key: str) -> None:
    """Remove a key, table or rows; a removed block's tail (the gap or comment before what came
    after it) stays in the file."""
    item = table[key]
    if isinstance(table, InlineTable) or not isinstance(item, (Table, AoT)):
        del table[key]
        return
    body = _container(table)
    index = next(i for i, (k, _) in enumerate(body.body) if k is not None and k.key == key)
    tail = pop_tail(deep(item))
    before = [v for k, v in body.body[:index] if k is not None and not isinstance(v, Null)]
    later = [v for k, v in body.body[index + 1:] if k is not None and not isinstance(v, Null)]
    del table[key]
    if before and isinstance(before[-1], (Table, AoT)):
        prev = deep(before[-1])
        pop_tail(prev)  # the removed block's own introduction goes with it
        push_tail(prev, tail)
    elif not later:
        push_tail(body, tail)


def insert_row(rows: AoT | Array, at: int, data: dict[str, Any]) -> None:
    """A new row at index `at`, with the gap the other rows have between them."""
    if isinstance(rows, Array):
        rows.insert(at, _inline(data))
        return
    gap = _between(rows, at)
    row = new_block(data, aot_element=True)
    if at > 0:
        prev = deep(rows[at - 1])
        tail = pop_tail(prev)  # what introduced the row after (or ended the rows) now follows the new one
        push_tail(prev, gap)
        rows.insert(at, row)
        push_tail(deep(row), tail)
    else:
        rows.insert(0, row)
        push_tail(deep(row), gap)


def _between(rows: AoT, at: int) -> Tail:
    """The gap a row added at `at` leaves before the next: that between the rows around it
    (the last two rows' for a new last row, the first two's for a new first one); none with one row."""
    n = len(rows)
    if 0 < at < n:
        return _peek_gap(rows[at - 1])
    if n < 2:
        return []
    return _peek_gap(rows[n - 2] if at == n else rows[0])


def remove_row(rows: AoT | Array, at: int) -> None:
    """Remove row `at` (there is at least one other); its introduction goes with it, the next
    row's stays."""
    if isinstance(rows, Array):
        del rows[at]
        return
    tail = pop_tail(deep(rows[at]))
    if at > 0:
        prev = deep(rows[at - 1])
        pop_tail(prev)
        push_tail(prev, tail)
    del rows[at]
