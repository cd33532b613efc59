"""The construction stage: pour plan, stage-by-stage response, bare steel while wet, camber."""
