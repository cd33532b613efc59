"""fieldcomp engine: pure computation (no files, terminal, network or UI), kip / inch / ksi inside."""
