"""Job-file text patched in place: a save rewrites only what an edit changed.

The previous text is parsed with tomlkit (which keeps every comment, blank line and spelling),
the job as that text said it is compared field by field with the edited job, and only the
differences are written: a changed value replaces that value (its line's comment stays), a
cleared key is removed, a key the file did not have is written only when its value changed,
added and removed rows (``[[beam.finding]]``, pours, beams) are added and removed blocks. A
default is never written. The byte-order mark and CRLF line endings of the file are kept.
"""

from __future__ import annotations

from difflib import SequenceMatcher
from typing import Any

import tomlkit
from pydantic import BaseModel
from tomlkit.container import Container
from tomlkit.items import AoT, Array, InlineTable, Integer, Item, String, StringType, Table

from fieldcomp.jobs.toml_blocks import add_block, insert_row, remove_block, remove_row

BOM = "\ufeff"


def split_form(text: str) -> tuple[bool, bool, str]:
    """(has a byte-order mark, every line ends CRLF, the text with neither)."""
    bom = text.startswith(BOM)
    body = text[1:] if bom else text
    crlf = "\r\n" in body and body.count("\r\n") == body.count("\n")
    return bom, crlf, body.replace("\r\n", "\n") if crlf else body


def join_form(bom: bool, crlf: bool, body: str) -> str:
    """The text in the file's own form again (the inverse of `split_form`)."""
    return (BOM if bom else "") + (body.replace("\n", "\r\n") if crlf else body)


def patch_text(text: str, old: BaseModel, new: BaseModel) -> str:
    """`text` (which reads as `old`) changed so that it reads as `new`, touching only what differs.
    Unchanged, the text is returned as it was, byte for byte."""
    bom, crlf, body = split_form(text)
    doc = tomlkit.parse(body)
    doc.parsing(True)  # no formatting of its own: blank lines and places are chosen here
    if not patch_table(doc, old, new):
        return text
    return join_form(bom, crlf, tomlkit.dumps(doc))


def patch_table(table: Any, old: BaseModel, new: BaseModel) -> bool:
    """Make the tomlkit table (document, table or inline table) that reads as `old` read as
    `new`; True when anything was written."""
    freed: list[int] = []  # where cleared keys stood: a key set in the same edit takes the place
    removed = [name for name in type(new).model_fields
               if name in table and (getattr(new, name) is None or name not in new.model_fields_set)]
    for name in removed:  # cleared: unset means the default, which is never written
        freed += _place_of(table, name)
        remove_block(table, name)
    changed = bool(removed)
    for name in type(new).model_fields:
        before, after = getattr(old, name), getattr(new, name)
        present = name in table
        if after is None or name in removed:
            continue
        if isinstance(after, BaseModel):
            if present:
                changed |= patch_table(table[name], before, after)
            elif after != before and minimal(after):
                add_block(table, name, minimal(after))
                changed = True
        elif _rows(before) and _rows(after) and (before or after):
            if present:
                changed |= patch_rows(table, name, before, after)
            elif after != before:
                add_block(table, name, [minimal(row) for row in after])
                changed = True
        elif after != before:
            set_leaf(table, name, after, freed)
            changed = True
    return changed


def _place_of(table: Any, key: str) -> list[int]:
    """The body index of plain key `key` in a (non-inline) table, to put a replacing key there."""
    if isinstance(table, (InlineTable, Array)) or isinstance(table[key], (Table, AoT)):
        return []
    body = table if isinstance(table, Container) else table.value
    return [i for i, (k, _) in enumerate(body.body) if k is not None and k.key == key][:1]


def patch_rows(table: Any, key: str, before: list[BaseModel], after: list[BaseModel]) -> bool:
    """Rows (an array of tables) edited: rows that stayed are patched in place, removed rows'
    blocks go, added rows' blocks are written where they were added."""
    if not after:
        remove_block(table, key)
        return True
    rows = table[key]
    changed = False
    for tag, i1, i2, j1, j2 in reversed(aligned(before, after)):
        kept = min(i2 - i1, j2 - j1) if tag in ("equal", "replace") else 0
        for k in range(kept):
            changed |= patch_table(rows[i1 + k], before[i1 + k], after[j1 + k])
        for i in reversed(range(i1 + kept, i2)):
            remove_row(rows, i)
            changed = True
        for n, j in enumerate(range(j1 + kept, j2)):
            insert_row(rows, i1 + kept + n, minimal(after[j]))
            changed = True
    return changed


def aligned(before: list[BaseModel], after: list[BaseModel]) -> list[tuple[str, int, int, int, int]]:
    """Old rows matched to new ones (difflib opcodes): whole rows first, then, among rows that
    differ, by their first field (a beam's mark, a slab's id, a pour's name), so an edited row
    is patched in place of itself rather than of a removed neighbour."""
    if len(before) == len(after) and [_first(r) for r in before] == [_first(r) for r in after]:
        return [("replace", 0, len(before), 0, len(after))]  # the same rows, edited or not: each patched in place
    ops: list[tuple[str, int, int, int, int]] = []
    whole = SequenceMatcher(None, [r.model_dump_json() for r in before], [r.model_dump_json() for r in after],
                            autojunk=False)
    for tag, i1, i2, j1, j2 in whole.get_opcodes():
        if tag != "replace":
            ops.append((tag, i1, i2, j1, j2))
            continue
        ident = SequenceMatcher(None, [_first(r) for r in before[i1:i2]], [_first(r) for r in after[j1:j2]],
                                autojunk=False)
        ops += [(t, i1 + a1, i1 + a2, j1 + b1, j1 + b2) for t, a1, a2, b1, b2 in ident.get_opcodes()]
    return ops


def _first(row: BaseModel) -> str:
    return repr(getattr(row, next(iter(type(row).model_fields))))


def _rows(value: Any) -> bool:
    return isinstance(value, list) and all(isinstance(v, BaseModel) for v in value)


def minimal(model: BaseModel) -> dict[str, Any]:
    """A new row or table as plain data: required keys and keys whose value is not the default
    (never None); nested tables and rows the same way, left out when empty."""
    out: dict[str, Any] = {}
    for name, field in type(model).model_fields.items():
        value = getattr(model, name)
        if value is None or (not field.is_required() and value == field.get_default(call_default_factory=True)):
            continue
        if isinstance(value, BaseModel):
            value = minimal(value)
            if not value and not field.is_required():
                continue
        elif _rows(value):
            value = [minimal(v) for v in value]
        out[name] = value
    return out


def set_leaf(table: Any, key: str, value: Any, freed: list[int] | None = None) -> None:
    """Write one value, in the form the file gave the old one where the value allows it (a
    whole number is written without a decimal point unless the old value had one, a literal
    string stays literal); the comment on its line stays."""
    old = table.get(key) if key in table else None
    item = _leaf_item(value, old)
    if old is not None:
        item.trivia.comment_ws, item.trivia.comment = old.trivia.comment_ws, old.trivia.comment
        table[key] = item
    else:
        add_key(table, key, item, freed.pop(0) if freed else None)
        if freed:
            freed[:] = [i + 1 for i in freed]


def _leaf_item(value: Any, old: Item | None) -> Item:
    if isinstance(value, float) and value.is_integer() and abs(value) < 2**53 and (old is None or isinstance(old, Integer)):
        return tomlkit.item(int(value))
    if (isinstance(value, str) and isinstance(old, String) and old.type == StringType.SLL
            and "'" not in value and value.isprintable()):
        return tomlkit.string(value, literal=True)
    return tomlkit.item(value)


def add_key(table: Any, key: str, item: Item, at: int | None = None) -> None:
    """A key the table did not have: at body index `at` (where a key it replaces stood), else
    after its last plain key (before its sub-tables and any comment that introduces them)."""
    if isinstance(table, (InlineTable, Array)):
        table[key] = item
        return
    body: Container = table if isinstance(table, Container) else table.value
    if at is None:
        at = 0
        for i, (k, v) in enumerate(body.body):
            if k is not None and not isinstance(v, (Table, AoT)):
                at = i + 1
    if at < len(body.body):
        body._insert_at(at, key, item)  # tomlkit's own insert: no blank line added
    else:
        body.append(key, item)
