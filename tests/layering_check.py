#!/usr/bin/python3
"""The core's layers read bottom-up (DEVELOPERS.md has the picture; CMakeLists.txt the glob):

    contract -> numerics -> analytics -> commands -> dispatch

A file under core/<layer>/ may include only files of its own layer or of a layer below,
written with the layer folder ("contract/trade.hpp"); only commands and dispatch may see
JSON (nlohmann/json); no core file includes emscripten; every core file sits in a layer folder.

    python3 tests/layering_check.py [ROOT]        check ROOT/core (default: this repository)
    python3 tests/layering_check.py --self-test   show that each rule fails on a bad tree

Each violation is printed as "<file>:<line>: <include>: <rule broken>"; exit 1 if any."""
import pathlib
import re
import sys
import tempfile

LAYERS = ["contract", "numerics", "analytics", "commands", "dispatch"]
JSON_LAYERS = {"commands", "dispatch"}
GENERATED = {"contract/version.hpp"}  # written by CMake from contract/version.hpp.in
INCLUDE = re.compile(r'^\s*#\s*include\s*([<"])([^>"]+)[>"]')


def violations(root):
    """Every broken rule under root/core, as (file, line, include, rule)."""
    core = root / "core"
    found = []
    for path in sorted(p for p in core.rglob("*") if p.is_file()):
        relative = path.relative_to(root)
        parts = path.relative_to(core).parts
        if len(parts) != 2 or parts[0] not in LAYERS:
            found.append((relative, 0, "", f"not in a layer folder ({', '.join(LAYERS)})"))
            continue
        layer = parts[0]
        for number, text in enumerate(path.read_text(errors="replace").splitlines(), 1):
            match = INCLUDE.match(text)
            if not match:
                continue
            quoted, name = match.group(1) == '"', match.group(2)
            if name.startswith("emscripten/"):
                found.append((relative, number, name, "emscripten in the core (wasm/bindings.cpp is the glue)"))
            if name.startswith("nlohmann/") and layer not in JSON_LAYERS:
                found.append((relative, number, name, f"JSON in {layer} (only commands and dispatch see JSON)"))
            if not quoted:
                continue
            target = name.split("/")[0]
            if target not in LAYERS:
                found.append((relative, number, name, "a core include names its layer folder, e.g. \"contract/trade.hpp\""))
            elif LAYERS.index(target) > LAYERS.index(layer):
                found.append((relative, number, name, f"{layer} includes {target}, a layer above it"))
            elif not (core / name).is_file() and name not in GENERATED:
                found.append((relative, number, name, "no such file in core/"))
    return found


def report(root):
    found = violations(root)
    for file, line, name, rule in found:
        print(f"{file}:{line}: {name}: {rule}" if name else f"{file}: {rule}")
    print(f"layering: {len(found)} violation(s) in {root / 'core'}")
    return 1 if found else 0


def self_test():
    """A tree with one violation of each rule: the check must report exactly these."""
    files = {
        "core/contract/trade.hpp": '#include "contract/limits.hpp"\n',
        "core/contract/limits.hpp": "#include <vector>\n",
        "core/numerics/lattice.cpp": '#include "numerics/lattice.hpp"\n#include "analytics/pricing.hpp"\n',
        "core/numerics/lattice.hpp": '#include "contract/trade.hpp"\n',
        "core/analytics/pricing.hpp": '#include "numerics/lattice.hpp"\n#include <nlohmann/json.hpp>\n',
        "core/analytics/hedge.cpp": '#include "commands/json_read.hpp"\n#include "lattice.hpp"\n',
        "core/commands/json_read.hpp": "#include <nlohmann/json.hpp>\n",
        "core/dispatch/dispatch.cpp": '#include "commands/json_read.hpp"\n#include "contract/missing.hpp"\n',
        "core/contract/glue.cpp": "#include <emscripten/bind.h>\n",
        "core/loose.hpp": "\n",
    }
    expected = {
        ("core/numerics/lattice.cpp", 2, "analytics/pricing.hpp"),
        ("core/analytics/pricing.hpp", 2, "nlohmann/json.hpp"),
        ("core/analytics/hedge.cpp", 1, "commands/json_read.hpp"),
        ("core/analytics/hedge.cpp", 2, "lattice.hpp"),
        ("core/dispatch/dispatch.cpp", 2, "contract/missing.hpp"),
        ("core/contract/glue.cpp", 1, "emscripten/bind.h"),
        ("core/loose.hpp", 0, ""),
    }
    with tempfile.TemporaryDirectory() as tmp:
        root = pathlib.Path(tmp)
        for name, text in files.items():
            (root / name).parent.mkdir(parents=True, exist_ok=True)
            (root / name).write_text(text)
        got = {(str(f), line, name) for f, line, name, _ in violations(root)}
        report(root)
    if got != expected:
        print(f"layering self-test FAILED: missed {sorted(expected - got)}, unexpected {sorted(got - expected)}")
        return 1
    print("layering self-test: every rule fails on a tree that breaks it")
    return 0


if __name__ == "__main__":
    if sys.argv[1:] == ["--self-test"]:
        sys.exit(self_test())
    sys.exit(report(pathlib.Path(sys.argv[1]) if len(sys.argv) > 1 else pathlib.Path(__file__).resolve().parent.parent))
