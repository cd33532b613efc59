"""Workbench widgets: they render engine results and ask for edits; no engineering here."""
