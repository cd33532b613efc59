"""Model profiles to W shapes. Dimensions: AISC Shapes Database v16.0 (W18X35: d 17.7, bf 6.00,
tw 0.300, tf 0.425 in; W18X40: d 17.9, bf 6.02, tw 0.315, tf 0.525 in)."""

import pytest

from fieldcomp.jobs.shape_match import Section, ShapeMatchError, match_section


def test_a_table_name_is_taken_as_it_is():
    shape, how = match_section(Section("w18x35"))
    assert (shape.name, how) == ("W18X35", "")


def test_a_metric_name_is_matched_by_its_dimensions_in_millimetres():
    """W460X52 as a metric model gives it: 450 x 152 mm, web 7.6 mm, flange 10.8 mm (the W18X35
    dimensions in mm, rounded to 0.1 mm)."""
    shape, how = match_section(Section("W460X52", 450 / 25.4, 152 / 25.4, 7.6 / 25.4, 10.8 / 25.4))
    assert shape.name == "W18X35"
    assert "matched to W18X35 by its dimensions" in how


def test_a_name_whose_dimensions_disagree_is_refused():
    with pytest.raises(ShapeMatchError, match="are not W18X35's"):
        match_section(Section("W18X35", 17.9, 6.02, 0.315, 0.525))  # W18X40's dimensions


@pytest.mark.parametrize("section, message", [
    (Section("PL12X300"), "not a W shape of the table and gives no I-section dimensions"),
    (Section("", 30.0, 2.0, 1.0, 1.0), "matches no W shape"),
])
def test_what_matches_nothing_is_refused(section, message):
    with pytest.raises(ShapeMatchError, match=message):
        match_section(section)
