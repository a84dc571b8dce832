#!/usr/bin/env python3
"""Check JSON documents of the equipoise command against the repository's
JSON Schema with python3-jsonschema (a Debian package; scripts/setup.sh
installs it), and check that every key they use is documented.

Usage: validate.py SCHEMA KIND DOC_MD FILE...
  KIND    run | description | listing: the $defs entry each FILE must match
          (the documents must also match the schema as a whole)
  DOC_MD  docs/json-output.md: every key found in a FILE must be listed
          there as `key` in a table row
"""
import json
import re
import sys

try:
    import jsonschema
except ImportError:
    sys.exit("validate.py: python3-jsonschema is missing (scripts/setup.sh installs it)")

# Objects whose keys are data (names of parameters, of solids), not layout.
DATA_KEYS = {"params", "saturation_index"}


def keys_of(node, out):
    if isinstance(node, dict):
        for k, v in node.items():
            out.add(k)
            if k not in DATA_KEYS:
                keys_of(v, out)
    elif isinstance(node, list):
        for v in node:
            keys_of(v, out)


def documented_keys(md_path):
    names = set()
    with open(md_path, encoding="utf-8") as f:
        for line in f:
            if line.startswith("|"):
                names.update(re.findall(r"`([A-Za-z_][A-Za-z0-9_]*)`", line))
    return names


def main(argv):
    if len(argv) < 5:
        sys.exit(__doc__)
    schema_path, kind, md_path, files = argv[1], argv[2], argv[3], argv[4:]
    with open(schema_path, encoding="utf-8") as f:
        schema = json.load(f)
    cls = jsonschema.Draft202012Validator
    cls.check_schema(schema)
    whole = cls(schema)
    part = cls({"$ref": "#/$defs/" + kind, "$defs": schema["$defs"]})
    documented = documented_keys(md_path)
    failed = 0
    for path in files:
        with open(path, encoding="utf-8") as f:
            try:
                doc = json.load(f)
            except ValueError as e:
                print(f"FAIL {path}: not JSON: {e}")
                failed += 1
                continue
        errors = sorted(part.iter_errors(doc), key=lambda e: list(e.path))
        for e in errors[:5]:
            where = "/".join(str(p) for p in e.path)
            print(f"FAIL {path}: at /{where}: {e.message[:200]}")
        if not errors and not whole.is_valid(doc):
            print(f"FAIL {path}: matches '{kind}' but not the schema as a whole")
            errors = [None]
        used = set()
        keys_of(doc, used)
        missing = sorted(used - documented)
        if missing:
            print(f"FAIL {path}: keys not documented in {md_path}: {', '.join(missing)}")
        if errors or missing:
            failed += 1
        else:
            print(f"ok   {path} ({kind})")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
