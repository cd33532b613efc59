"""JSON Schema of the job file, for editors that validate TOML against a schema."""

from __future__ import annotations

from typing import Any

from fieldcomp.jobs.model import Job


def job_schema() -> dict[str, Any]:
    schema = Job.model_json_schema()
    schema["title"] = "fieldcomp job file"
    schema["$schema"] = "https://json-schema.org/draft/2020-12/schema"
    return schema
