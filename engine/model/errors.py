"""The one base class of every error fieldcomp raises on purpose; each subclass names its kind."""

from __future__ import annotations


class FieldcompError(Exception):
    """Base of fieldcomp's own errors: bad input, out-of-scope input, files that cannot be used.
    Handlers catch this (or a subclass) and report the object, never a re-wrapped string."""
