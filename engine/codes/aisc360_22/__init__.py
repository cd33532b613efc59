"""Clause layer: small pure functions named after the symbols of ANSI/AISC 360-22.

Each function's docstring names its clause on the second line. Domain modules
(`engine.finished.slab_force`, `engine.construction.evaluate`, `engine.studs.layout`, ...) compose them.
"""
