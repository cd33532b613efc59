"""Renderings of engine results: text and JSON reports, CSV (one formula guard), marks and repair sheets."""
