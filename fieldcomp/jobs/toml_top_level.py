"""Job-file text patched block by block: the fast way to save a large job.

A job file is a run of top-level blocks: ``[project]`` and the rows of ``[[deck]]``, ``[[slab]]``
and ``[[beam]]``, each with its sub-tables (``[beam.studs]``, ``[[beam.finding]]``). Only the
blocks of rows that an edit changed are parsed (tomlkit) and patched (`toml_text.patch_table`);
every other block is kept as its text, so saving one edit in a 2,000-beam job does not parse
2,000 beams. Each rewritten block is read back (tomllib) and compared with the edited row. Text
whose blocks cannot be told apart safely (multi-line strings, quoted or out-of-order headers,
keys before the first table) gets None here, and is patched as a whole document instead.
"""

from __future__ import annotations

import re
import tomllib
from dataclasses import dataclass
from typing import Any

import tomlkit
from pydantic import BaseModel, ValidationError
from tomlkit.items import AoT, SingleKey

from fieldcomp.jobs.toml_blocks import new_block
from fieldcomp.jobs.toml_text import aligned, minimal, patch_table

_BRACKET_LINE = re.compile(r"^[ \t]*\[.*$", re.M)
_HEADER = re.compile(r"[ \t]*(\[\[?)[ \t]*([A-Za-z0-9_-]+)[ \t]*((?:\.[ \t]*[A-Za-z0-9_-]+[ \t]*)*)(\]\]?)[ \t]*(?:#.*)?")


@dataclass(slots=True)
class Block:
    """One top-level block: its table's name, whether it is a row, its text up to the blank and
    comment lines that end it (`core`), and those lines (`trailer`: the gap or the comment that
    introduces what comes next)."""

    key: str
    row: bool
    core: str
    trailer: str


def _loose(line: str) -> bool:
    stripped = line.strip()
    return not stripped or stripped.startswith("#")


def split_blocks(body: str) -> tuple[str, list[Block]] | None:
    """(the text before the first table, the blocks), or None when they cannot be told apart."""
    if '"""' in body or "'''" in body or (body and not body.endswith("\n")):
        return None
    starts: list[tuple[int, str, bool]] = []
    for found in _BRACKET_LINE.finditer(body):
        match = _HEADER.fullmatch(found.group(0).rstrip("\r"))
        if match is None or len(match.group(1)) != len(match.group(4)):
            return None
        if not match.group(3).strip():
            starts.append((found.start(), match.group(2), match.group(1) == "[["))
        elif not starts or starts[-1][1] != match.group(2):
            return None  # a sub-table away from its table
    first = starts[0][0] if starts else len(body)
    if not all(_loose(line) for line in body[:first].splitlines()):
        return None
    blocks = []
    for n, (at, key, row) in enumerate(starts):
        text = body[at:starts[n + 1][0] if n + 1 < len(starts) else len(body)]
        cut = len(text)
        while True:  # back over the blank and comment lines that end the block
            line_start = text.rfind("\n", 0, cut - 1) + 1
            if line_start == 0 or not _loose(text[line_start:cut]):
                break
            cut = line_start
        blocks.append(Block(key, row, text[:cut], text[cut:]))
    return body[:first], blocks


def patch_blocks(body: str, old: BaseModel, new: BaseModel) -> str | None:
    """`body` (which reads as `old`) patched block by block to read as `new`; None when the text
    is not made of plain blocks or a rewritten block does not read back as its row."""
    split = split_blocks(body)
    if split is None:
        return None
    head, blocks = split
    fields = type(new).model_fields
    if any(b.key not in fields for b in blocks):
        return None
    named = {b.key for b in blocks}
    if any(getattr(new, name) != getattr(old, name) for name in fields if name not in named):
        return None  # a table or rows the file did not have: written by the whole-document patch
    out: list[Block] = []
    for name in _in_order(blocks, fields):
        mine = [b for b in blocks if b.key == name]
        before, after = getattr(old, name), getattr(new, name)
        if isinstance(after, BaseModel):
            if len(mine) != 1 or mine[0].row:
                return None
            if after != before or not keeps_keys(before, after):
                core = _patched(mine[0], before, after)
                if core is None:
                    return None
                mine[0].core = core
            out += mine
            continue
        if not isinstance(after, list) or len(mine) != len(before) or not all(b.row for b in mine) or (after and not mine):
            return None
        rows = _rows(name, mine, before, after)
        if rows is None:
            return None
        out += rows
    return head + "".join(b.core + b.trailer for b in out)


def _in_order(blocks: list[Block], fields: Any) -> list[str]:
    """The tables in the order their blocks stand; each table's blocks must stand together."""
    order: list[str] = []
    for b in blocks:
        if not order or order[-1] != b.key:
            order.append(b.key)
    if len(order) != len(set(order)):
        return ["\0"]  # scattered blocks: no such field, so patch_blocks gives None
    return order


def _rows(name: str, mine: list[Block], before: list[BaseModel], after: list[BaseModel]) -> list[Block] | None:
    rows = list(mine)
    for tag, i1, i2, j1, j2 in reversed(aligned(before, after)):
        kept = min(i2 - i1, j2 - j1) if tag in ("equal", "replace") else 0
        for k in range(kept):
            if before[i1 + k] != after[j1 + k] or not keeps_keys(before[i1 + k], after[j1 + k]):
                core = _patched(rows[i1 + k], before[i1 + k], after[j1 + k])
                if core is None:
                    return None
                rows[i1 + k].core = core
        for i in reversed(range(i1 + kept, i2)):
            gone = rows.pop(i)
            if i > 0:
                rows[i - 1].trailer = gone.trailer  # its introduction goes with it; the next row's stays
        for n, j in enumerate(range(j1 + kept, j2)):
            core = _rendered(name, minimal(after[j]))
            if not _reads_as(name, True, core, after[j]):
                return None
            at = i1 + kept + n
            gap = _gap(rows, at)
            if at > 0:
                rows.insert(at, Block(name, True, core, rows[at - 1].trailer))
                rows[at - 1].trailer = gap
            else:
                rows.insert(0, Block(name, True, core, gap))
    return rows


def _gap(rows: list[Block], at: int) -> str:
    """The blank lines between two rows, as `toml_blocks` chooses them."""
    n = len(rows)
    source = rows[at - 1] if 0 < at < n else rows[n - 2] if at == n and n >= 2 else rows[0] if n >= 2 else None
    if source is None:
        return ""
    return "".join(line for line in source.trailer.splitlines(keepends=True) if not line.strip())


def _patched(block: Block, before: BaseModel, after: BaseModel) -> str | None:
    doc = tomlkit.parse(block.core)
    doc.parsing(True)
    patch_table(doc[block.key][0] if block.row else doc[block.key], before, after)
    text = tomlkit.dumps(doc)
    return text if _reads_as(block.key, block.row, text, after) else None


def _rendered(key: str, data: dict[str, Any]) -> str:
    doc = tomlkit.document()
    doc.parsing(True)
    doc._raw_append(SingleKey(key), AoT([new_block(data, True)], name=key, parsed=True))  # type: ignore[list-item]
    return tomlkit.dumps(doc)


def _reads_as(key: str, row: bool, text: str, model: BaseModel) -> bool:
    try:
        data = tomllib.loads(text)
        value = data[key][0] if row else data[key]
        return len(data) == 1 and (not row or len(data[key]) == 1) and type(model).model_validate(value) == model
    except (tomllib.TOMLDecodeError, ValidationError, KeyError, IndexError, TypeError):
        return False


def keeps_keys(old: BaseModel, new: BaseModel) -> bool:
    """True when every key `old` was given is still given in `new` (nested tables and rows too):
    nothing of the old text needs to go."""
    if old is new:
        return True
    if not old.model_fields_set <= new.model_fields_set:
        return False
    for name in old.model_fields_set:
        a, b = getattr(old, name), getattr(new, name)
        if b is None:
            return False
        if isinstance(a, BaseModel) and isinstance(b, BaseModel) and not keeps_keys(a, b):
            return False
        if isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
            if not all(keeps_keys(x, y) for x, y in zip(a, b) if isinstance(x, BaseModel) and isinstance(y, BaseModel)):
                return False
    return True
