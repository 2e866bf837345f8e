"""Write results_schema_check.json: the verdict of the `jsonschema` library (Draft 2020-12)
on dutyline results documents and on deliberately wrong copies of one of them, checked
against docs/results.schema.json.

Run from the repository root after `cargo build`:
    python3 tests/reference/check_results_schema.py   (needs `pip install jsonschema`)
The binary is target/debug/dutyline unless DUTYLINE names another. The Rust test
tests/results_schema.rs validates the same documents and mutations with its own minimal
validator and must reach the same verdicts.
"""

import copy
import importlib.metadata
import json
import os
import subprocess

import jsonschema

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
BIN = os.environ.get("DUTYLINE", os.path.join(ROOT, "target/debug/dutyline"))

DESIGNS = [
    "examples-demo/orchard-lift-rev-a.duty",
    "examples-demo/orchard-lift-rev-b.duty",
    "examples-demo/kestrel-booster.duty",
    "tests/designs/recompute-pressure-si.duty",
    "tests/designs/recompute-pressure-us.duty",
    "tests/designs/stress.duty",
    "tests/designs/no-duty.duty",
]

# Wrong copies of the first document: (JSON pointer, operation, value).
MUTATIONS = [
    ("/cases/0/static_head_m", "set", "12.5"),
    ("/selection", "remove", None),
    ("/cases/0/an_extra_key", "set", 1),
    ("/cases/0/pumps/0/arrangement/count", "set", -1),
    ("/warnings/0/line", "set", 1.5),
    ("/project/revision", "set", 3),
    ("/cases/0/pumps/0/duty", "set", [1, 2]),
    ("/cases/0/system_curve/head_m/0", "set", None),
    ("/selection/recommended", "set", None),
    ("/cases/0/segments", "set", []),
]


def pointer_parts(pointer):
    return [p for p in pointer.split("/")[1:]]


def mutate(doc, pointer, op, value):
    doc = copy.deepcopy(doc)
    *parents, last = pointer_parts(pointer)
    node = doc
    for p in parents:
        node = node[int(p)] if isinstance(node, list) else node[p]
    if op == "remove":
        del node[last]
    elif isinstance(node, list):
        node[int(last)] = value
    else:
        node[last] = value
    return doc


def main():
    with open(os.path.join(ROOT, "docs/results.schema.json")) as f:
        schema = json.load(f)
    jsonschema.Draft202012Validator.check_schema(schema)
    validator = jsonschema.Draft202012Validator(schema)
    rows = []
    first = None
    for design in DESIGNS:
        out = subprocess.run(
            [BIN, "results", "--format", "json", "--exit-zero", design],
            cwd=ROOT, capture_output=True, check=True,
        )
        doc = json.loads(out.stdout)
        first = first or doc
        rows.append({"design": design, "pointer": None, "op": None, "value": None,
                     "valid": validator.is_valid(doc)})
    for pointer, op, value in MUTATIONS:
        doc = mutate(first, pointer, op, value)
        rows.append({"design": DESIGNS[0], "pointer": pointer, "op": op, "value": value,
                     "valid": validator.is_valid(doc)})
    result = {
        "source": "jsonschema " + importlib.metadata.version("jsonschema")
        + " (Draft202012Validator) on docs/results.schema.json",
        "checks": rows,
    }
    with open(os.path.join(os.path.dirname(os.path.abspath(__file__)),
                           "results_schema_check.json"), "w") as f:
        json.dump(result, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
