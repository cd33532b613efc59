"""Job files: the pydantic model, load and atomic save, conversion to engine inputs, inspection logs."""
