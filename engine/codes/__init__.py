"""Equations only, one module per standard and edition; nothing here imports the rest of the engine."""
