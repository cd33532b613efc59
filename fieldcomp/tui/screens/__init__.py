"""Workbench screens: the workbench itself, the help screen and the small dialogs."""
