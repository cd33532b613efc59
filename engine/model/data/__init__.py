"""Generated data tables (Python modules, no files read at run time)."""
