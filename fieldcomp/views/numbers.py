"""Numbers as reports print them: finite, or said to be missing. A check whose capacity is zero
or less has no finite ratio (engine.model.results.Check.ratio is then infinite) and fails; JSON
gives its ratio as null with a note, text prints "n/a", and no report holds NaN or Infinity."""

from __future__ import annotations

import json
import math
from typing import Any

NO_CAPACITY = "capacity is zero or less: no finite ratio; the check fails"


def finite(value: float | None, digits: int = 3) -> float | None:
    """`value` rounded to `digits` (Python's round of a float, numpy's of a numpy number, as
    given), or None when it is missing, NaN or infinite."""
    if value is None or not math.isfinite(value):
        return None
    return float(round(value, digits))


def ratio_json(ratio: float) -> dict[str, Any]:
    """{"ratio": 0.523}, or {"ratio": None, "ratio_note": NO_CAPACITY} for an infinite ratio."""
    value = finite(ratio)
    return {"ratio": value} if value is not None else {"ratio": None, "ratio_note": NO_CAPACITY}


def ratio_text(ratio: float) -> str:
    """'0.52', or 'n/a' for a ratio that is not finite."""
    return f"{ratio:.2f}" if math.isfinite(ratio) else "n/a"


def json_text(data: Any, **options: Any) -> str:
    """`json.dumps` that never writes NaN or Infinity (not JSON): any left in `data` become null."""
    try:
        return json.dumps(data, allow_nan=False, **options)
    except ValueError:
        return json.dumps(_nulled(data), allow_nan=False, **options)


def _nulled(data: Any) -> Any:
    if isinstance(data, float):
        return data if math.isfinite(data) else None
    if isinstance(data, dict):
        return {k: _nulled(v) for k, v in data.items()}
    if isinstance(data, (list, tuple)):
        return [_nulled(v) for v in data]
    return data
