"""Validates layouts (as JSON instances) against segmask's layout schema with the
`jsonschema` package from PyPI (JSON Schema draft 2020-12, json-schema.org), an
independent validator.

Usage: check_schema.py SCHEMA.json INSTANCES.json
INSTANCES.json is a list of {"name", "doc", "expect": "valid" | "invalid"}. Prints one
line per instance; exits 1 if the schema itself is not valid draft 2020-12 or any
instance's verdict differs from what is expected.
"""
import json
import sys

import jsonschema

schema = json.load(open(sys.argv[1], encoding="utf-8"))
instances = json.load(open(sys.argv[2], encoding="utf-8"))
jsonschema.Draft202012Validator.check_schema(schema)
validator = jsonschema.Draft202012Validator(schema)
wrong = 0
for inst in instances:
    errors = sorted(validator.iter_errors(inst["doc"]), key=lambda e: list(e.absolute_path))
    got = "invalid" if errors else "valid"
    why = ""
    if errors:
        e = errors[0]
        why = " at /" + "/".join(str(p) for p in e.absolute_path) + ": " + e.message[:120]
    mark = "ok " if got == inst["expect"] else "WRONG"
    if got != inst["expect"]:
        wrong += 1
    print(f"{mark} {inst['name']}: {got} (expected {inst['expect']}){why}")
print(f"{len(instances) - wrong} passed, {wrong} failed")
sys.exit(1 if wrong else 0)
