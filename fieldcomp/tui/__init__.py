"""The Textual workbench: app, session (job, undo, recovery), outcomes in workers, screens and widgets."""
