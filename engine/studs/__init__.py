"""Studs rib by rib: ribs and stations, detailing limits, layout, placement, design, sheet data."""
