"""fieldcomp engine: pure computation for unshored composite steel floor beams.

No file, terminal or network access; no pydantic. Units inside: kip, inch, ksi, kip-in.
"""
