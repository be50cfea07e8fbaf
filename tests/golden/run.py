#!/usr/bin/python3
"""Golden outputs of the CLI: every case of tests/golden/cases.json (every example through every
command, plus the test trades) is run and its output compared, byte for byte, with
tests/golden/expected/. A refactor must leave every file unchanged; a deliberate change of figures
regenerates them:

    python3 tests/golden/run.py --update [CLI]      (default CLI: build/native/hedgeleaf)

and, when build/wasm/hedgeleaf.js is built, also the module's fingerprints (tests/golden/module.mjs).
Review the diff of tests/golden/ before committing it.

Usage in ctest: run.py CLI ROOT [--close]. --close (the sanitize and debug builds) lets numbers
differ by 1e-9 relative: GCC contracts multiply-adds (-ffp-contract=fast, the default outside ISO C)
differently at -O1 than in the release build, so only the last digits differ there; text, keys,
order and refusals must still be identical. Files: <case>.<command>.json (accepted, the JSON printed),
<case>.<command>.<table|csv>.txt (the --table / --csv rendering), <case>.<command>.refused.txt
("exit N" and the message on stderr)."""
import json
import pathlib
import re
import subprocess
import sys

HERE = pathlib.Path(__file__).resolve().parent


def expand(text):
    """A case's raw text: a string, or {"$repeat": [s, n]}."""
    if isinstance(text, dict):
        piece, count = text["$repeat"]
        return piece * count
    return text


def runs(root):
    """Every (file stem, command, format, argument, stdin text) the golden set holds."""
    spec = json.loads((HERE / "cases.json").read_text())
    for path in sorted((root / "examples").glob("*.json")):
        formats = spec["example_formats"].get(path.name, {})
        # A comparison document (several trades) is the compare command's alone.
        is_comparison = "comparison" in json.loads(path.read_text())
        for command in spec["comparison_commands"] if is_comparison else spec["example_commands"]:
            for fmt in ["json"] + formats.get(command, []):
                yield path.stem, command, fmt, str(path), None
    for case in spec["cases"]:
        text = json.dumps(case["doc"]) if "doc" in case else expand(case["text"])
        for command in case["commands"]:
            for fmt in ["json"] + case.get("formats", {}).get(command, []):
                yield case["name"], command, fmt, "-", text


def run_one(cli, command, fmt, argument, text):
    """(file suffix, recorded text) of one CLI run."""
    args = [cli, command, argument] + ([] if fmt == "json" else ["--" + fmt])
    done = subprocess.run(args, input=text if text is not None else "", capture_output=True, text=True)
    if done.returncode != 0:
        return ("" if fmt == "json" else fmt + ".") + "refused.txt", f"exit {done.returncode}\n{done.stderr}"
    return ("json" if fmt == "json" else fmt + ".txt"), done.stdout


NUMBER = re.compile(r"-?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?")


def close(a, b):
    return abs(a - b) <= 1e-9 * max(1.0, abs(b))


def same_json(got, want):
    """Equal up to 1e-9 relative in numbers; keys in the same order."""
    if isinstance(want, bool) or not isinstance(want, (int, float)):
        if isinstance(want, dict):
            return isinstance(got, dict) and list(got) == list(want) and all(same_json(got[k], want[k]) for k in want)
        if isinstance(want, list):
            return isinstance(got, list) and len(got) == len(want) and all(map(same_json, got, want))
        return got == want
    return isinstance(got, (int, float)) and not isinstance(got, bool) and close(got, want)


def same_text(got, want):
    """Equal with every number within 1e-9 relative (a table or CSV rendering)."""
    if NUMBER.sub("#", got) != NUMBER.sub("#", want):
        return False
    return all(close(float(g), float(w)) for g, w in zip(NUMBER.findall(got), NUMBER.findall(want)))


def matches(name, got, want, loose):
    if got == want:
        return True
    if not loose:
        return False
    if name.endswith(".json"):
        return same_json(json.loads(got), json.loads(want))
    return same_text(got, want)


def main():
    args = [a for a in sys.argv[1:] if a not in ("--update", "--close")]
    update = "--update" in sys.argv[1:]
    loose = "--close" in sys.argv[1:]
    root = pathlib.Path(args[1]) if len(args) > 1 else HERE.parent.parent
    cli = args[0] if args else str(root / "build/native/hedgeleaf")
    expected_dir = HERE / "expected"
    if update:
        expected_dir.mkdir(exist_ok=True)
        for old in expected_dir.iterdir():
            old.unlink()
    seen = set()
    passed = failed = 0
    for stem, command, fmt, argument, text in runs(root):
        suffix, output = run_one(cli, command, fmt, argument, text)
        name = f"{stem}.{command}.{suffix}"
        seen.add(name)
        target = expected_dir / name
        if update:
            target.write_text(output)
            continue
        if not target.exists():
            print(f"FAIL {name}: no such expected file (another outcome than recorded?)")
            failed += 1
        elif not matches(name, output, target.read_text(), loose):
            want = target.read_text().splitlines()
            got = output.splitlines()
            line = next((i for i, (a, b) in enumerate(zip(want, got)) if a != b), min(len(want), len(got)))
            print(f"FAIL {name}: line {line + 1} differs\n  want: {want[line] if line < len(want) else '<end>'}"
                  f"\n  got:  {got[line] if line < len(got) else '<end>'}")
            failed += 1
        else:
            passed += 1
    if update:
        print(f"golden: wrote {len(seen)} files to {expected_dir}")
        module = root / "build/wasm/hedgeleaf.js"
        if module.exists():
            subprocess.run(["node", str(HERE / "module.mjs"), "--update", str(module)], check=True)
        else:
            print("golden: build/wasm/hedgeleaf.js not built; module fingerprints left as they are")
        return 0
    stale = sorted(p.name for p in expected_dir.iterdir() if p.name not in seen)
    for name in stale:
        print(f"FAIL {name}: expected file no case produces")
    failed += len(stale)
    print(f"golden: {passed} passed, {failed} failed" + (" (numbers within 1e-9)" if loose else ""))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
