#!/usr/bin/python3
"""The CLI on every case of tests/bad_inputs.json: exit code 2, exactly one line on standard
error, the line reads "<field>: <problem>" and holds the expected fragment.

usage: bad_inputs_cli.py HEDGELEAF_CLI SOURCE_DIR [--print]   (--print shows each message)
"""
import json, pathlib, subprocess, sys


def merge_patch(target, patch):
    """RFC 7386 JSON merge patch: objects merge, null removes, anything else replaces."""
    if not isinstance(patch, dict):
        return patch
    out = dict(target) if isinstance(target, dict) else {}
    for key, value in patch.items():
        if value is None:
            out.pop(key, None)
        else:
            out[key] = merge_patch(out.get(key), value)
    return out


def expand(node):
    """{"$repeat": [s, n]} -> s * n, anywhere in the document."""
    if isinstance(node, dict):
        if list(node) == ["$repeat"]:
            text, count = node["$repeat"]
            return text * count
        return {k: expand(v) for k, v in node.items()}
    if isinstance(node, list):
        return [expand(v) for v in node]
    return node


def document_text(table, case):
    """The bytes a case feeds to the engine."""
    if "text" in case:
        return case["text"]
    return json.dumps(expand(merge_patch(table["bases"][case["base"]], case["patch"])))


def main():
    cli, root = sys.argv[1], pathlib.Path(sys.argv[2])
    show = "--print" in sys.argv
    table = json.loads((root / "tests/bad_inputs.json").read_text())
    failed = 0
    for case in table["cases"]:
        run = subprocess.run([cli, case["command"], "-"], input=document_text(table, case).encode(),
                             capture_output=True)
        err = run.stderr.decode("utf-8", "replace")
        lines = err.splitlines()
        line = lines[0] if lines else ""
        prefix = case["field"] + ": " if case["field"] else ""
        problems = []
        if run.returncode != 2:
            problems.append(f"exit {run.returncode}, expected 2")
        if len(lines) != 1 or not err.endswith("\n"):
            problems.append(f"{len(lines)} lines on stderr, expected 1")
        if not line.startswith(prefix):
            problems.append(f"does not start with {prefix!r}")
        if case["message"] not in line:
            problems.append(f"lacks {case['message']!r}")
        if run.stdout:
            problems.append("printed a result on stdout")
        if show:
            print(f"{case['kind']:>16} | {case['name']:<40} | {line[:160]}")
        if problems:
            failed += 1
            print(f"FAIL {case['name']}: {'; '.join(problems)}\n     got: {line[:300]}")
    print(f"bad inputs (CLI): {len(table['cases']) - failed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
