#!/usr/bin/python3
"""The engine's vocabulary (hedgeleaf --vocabulary, built from core/contract/limits.hpp) is the one
source of words and limits; the JSON Schema and the TypeScript declarations are held to it here:

  - every field the vocabulary lists has, in schema/trade.schema.json, the same JSON Schema keywords
    (type, minimum, maximum, exclusiveMinimum, minItems, maxItems, maxLength, enum, default);
  - every bound, enum and default the schema states is one the vocabulary lists (no bound the
    engine does not enforce, none it enforces left out);
  - wasm/hedgeleaf.d.ts: the CommandName union is the command table; its word unions (shape, method,
    option type, exercise, side, margin_type) are the vocabulary's lists; the module declares
    vocabulary();
  - the version is one: CMake's project(VERSION) = the engine's = web/package.json's.

    python3 tests/vocabulary_check.py CLI ROOT"""
import json
import pathlib
import re
import subprocess
import sys

KEYWORDS = ("type", "minimum", "maximum", "exclusiveMinimum", "exclusiveMaximum", "minItems", "maxItems",
            "maxLength", "enum", "default")
failures = []


def check(ok, what):
    if not ok:
        failures.append(what)


def resolve(schema, node):
    """Follow a $ref into $defs."""
    while "$ref" in node:
        node = schema["$defs"][node["$ref"].split("/")[-1]]
    return node


def branches(schema, node):
    """The node and the branches of its oneOf / anyOf / allOf, each resolved."""
    node = resolve(schema, node)
    out = [node]
    for key in ("oneOf", "anyOf", "allOf"):
        for branch in node.get(key, []):
            out.extend(branches(schema, branch))
    return out


def children(schema, node, step):
    """The schema nodes a path step ("name" or "[]") leads to from `node`."""
    out = []
    for b in branches(schema, node):
        if step == "[]" and "items" in b:
            out.append(resolve(schema, b["items"]))
        elif step != "[]" and step in b.get("properties", {}):
            out.append(resolve(schema, b["properties"][step]))
    return out


def nodes_at(schema, path):
    nodes = [schema]
    for step in re.findall(r"\[\]|[^.\[\]]+", path):
        nodes = [c for n in nodes for c in children(schema, n, step)]
    return nodes


def keywords_of(schema, node):
    """The keywords a field's schema states (merged over its branches; a `const` kind is not a bound)."""
    out = {}
    types = []
    for b in branches(schema, node):
        for k in KEYWORDS:
            if k == "type" and k in b:
                types += [t for t in (b[k] if isinstance(b[k], list) else [b[k]]) if t not in types]
            elif k in b:
                out[k] = b[k]
    if types:  # a field with several forms (a number or a grid): the types of all of them
        out["type"] = types[0] if len(types) == 1 else types
    return out


def schema_fields(schema, node=None, path=""):
    """Every path in the schema that states a bound, an enum or a default, with its keywords."""
    node = schema if node is None else node
    found = {}
    for b in branches(schema, node):
        for name, child in b.get("properties", {}).items():
            child_path = f"{path}.{name}" if path else name
            child = resolve(schema, child)
            stated = {k: v for k, v in keywords_of(schema, child).items() if k != "type"}
            if stated:
                found.setdefault(child_path, {}).update(keywords_of(schema, child))
            found.update({k: {**found.get(k, {}), **v} for k, v in schema_fields(schema, child, child_path).items()})
        if "items" in b and path:
            item = resolve(schema, b["items"])
            stated = {k: v for k, v in keywords_of(schema, item).items() if k != "type"}
            if stated:
                found.setdefault(path + "[]", {}).update(keywords_of(schema, item))
            found.update(schema_fields(schema, item, path + "[]"))
    return found


def same(a, b):
    if isinstance(a, list) and isinstance(b, str):  # one of a field's forms
        return b in a
    if isinstance(a, list) and isinstance(b, list):
        return sorted(map(str, a)) == sorted(map(str, b))
    if isinstance(a, (int, float)) and isinstance(b, (int, float)) and not isinstance(a, bool):
        return float(a) == float(b)
    return a == b


def check_schema(vocabulary, schema):
    fields = vocabulary["fields"]
    for path, rules in fields.items():
        nodes = nodes_at(schema, path)
        check(nodes, f"schema: no field {path} (the engine reads it)")
        stated = {}  # over the branches that define the field (a oneOf's variants)
        for node in nodes:
            stated.update(keywords_of(schema, node))
        for k, v in rules.items():
            check(k in stated and same(stated[k], v), f"schema: {path} {k} is {stated.get(k, 'missing')}, the engine's is {v}")
    for path, stated in schema_fields(schema).items():
        rules = fields.get(path)
        check(rules is not None, f"schema: {path} states {stated}, a field the engine's vocabulary does not list")
        for k, v in stated.items():
            if rules is not None and k != "type":
                check(k in rules and same(rules[k], v), f"schema: {path} {k} {v} is not the engine's ({rules.get(k, 'none')})")


def union(text, pattern):
    """The string literals of the first union matched by `pattern` in the d.ts."""
    match = re.search(pattern, text)
    if not match:
        return None
    return re.findall(r'"([^"]+)"', match.group(1))


def check_declarations(vocabulary, dts):
    lists = vocabulary["lists"]
    expected = {
        "CommandName": (r"export type CommandName = ([^;]+);", [c["name"] for c in vocabulary["commands"]]),
        "structure shape": (r"shape: ([^;]+);", [s["name"] for s in lists["structure_shapes"]]),
        "structure exercise": (r"structure\?: \{[^}]*exercise\?: ([^;]+);", lists["structure_exercise_styles"]),
        "lattice method": (r"method\?: ([^;]+);", lists["lattice_methods"]),
        "option type": (r"interface OptionTerms \{\s*type: ([^;]+);", lists["option_types"]),
        "option exercise": (r"interface OptionTerms \{[^}]*exercise\?: ([^;]+);", lists["exercise_styles"]),
        "side": (r"side\?: ([^;]+);", lists["sides"]),
        "margin_type": (r"margin_type: ([^;]+);", lists["margin_types"]),
    }
    for what, (pattern, words) in expected.items():
        found = union(dts, pattern)
        check(found is not None, f"hedgeleaf.d.ts: no {what} union")
        if found is not None:
            check(sorted(found) == sorted(words), f"hedgeleaf.d.ts: {what} is {found}, the engine's is {words}")
    check(re.search(r"\bvocabulary\(\): string;", dts), "hedgeleaf.d.ts: the module's vocabulary() is not declared")


def check_version(vocabulary, root):
    cmake = re.search(r"project\(hedgeleaf VERSION ([0-9.]+)", (root / "CMakeLists.txt").read_text())
    package = json.loads((root / "web/package.json").read_text())["version"]
    check(cmake and cmake.group(1) == vocabulary["engine_version"],
          f"version: CMake {cmake and cmake.group(1)}, engine {vocabulary['engine_version']}")
    check(package == vocabulary["engine_version"], f"version: web/package.json {package}, engine {vocabulary['engine_version']}")


def main():
    cli, root = sys.argv[1], pathlib.Path(sys.argv[2])
    vocabulary = json.loads(subprocess.run([cli, "--vocabulary"], capture_output=True, text=True, check=True).stdout)
    check_schema(vocabulary, json.loads((root / "schema/trade.schema.json").read_text()))
    check_declarations(vocabulary, (root / "wasm/hedgeleaf.d.ts").read_text())
    check_version(vocabulary, root)
    for f in failures:
        print("FAIL", f)
    print(f"vocabulary: {len(vocabulary['fields'])} fields, {len(failures)} failure(s)")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
