"""ANSI/AISC 360-22 Specification for Structural Steel Buildings: one module per chapter section used."""
