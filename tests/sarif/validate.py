"""Validate SARIF logs against the official SARIF 2.1.0 schema.

Usage: validate.py LOG.json [LOG.json ...]; prints one line per invalid log
and exits 1 if any is invalid, 0 if all are valid.
"""

import json
import sys
from pathlib import Path

import jsonschema

SCHEMA = json.loads((Path(__file__).parent / "sarif-2.1.0.json").read_text())


def main() -> int:
    validator = jsonschema.Draft4Validator(SCHEMA)
    bad = 0
    for name in sys.argv[1:]:
        log = json.loads(Path(name).read_text())
        errors = sorted(validator.iter_errors(log), key=lambda e: list(e.path))
        if errors:
            bad += 1
            first = errors[0]
            where = "/".join(str(p) for p in first.path)
            print(f"{name}: invalid at /{where}: {first.message}")
    return 1 if bad else 0


if __name__ == "__main__":
    sys.exit(main())
