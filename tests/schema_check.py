#!/usr/bin/python3
"""Every example trade validates against schema/trade.schema.json (a comparison against
schema/comparison.schema.json), and the CLI accepts it; documents the schema forbids are refused by
the CLI too (the schema and the reader agree)."""
import json, pathlib, subprocess, sys
import jsonschema

root = pathlib.Path(sys.argv[2])
cli = sys.argv[1]
schema = json.loads((root / "schema/trade.schema.json").read_text())
validator = jsonschema.Draft202012Validator(schema)
# The market snapshot schema refers into the trade schema's market definition.
market_schema = json.loads((root / "schema/market.schema.json").read_text())
store = {schema["$id"]: schema, market_schema["$id"]: market_schema}
market_validator = jsonschema.Draft202012Validator(
    market_schema, resolver=jsonschema.RefResolver.from_schema(market_schema, store=store))
comparison_schema = json.loads((root / "schema/comparison.schema.json").read_text())
# The comparison's alternatives refer to the trade schema by its $id.
resolver = jsonschema.RefResolver.from_schema(comparison_schema, store={schema["$id"]: schema})
comparison_validator = jsonschema.Draft202012Validator(comparison_schema, resolver=resolver)
passed = failed = 0

def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL:", what)

for path in sorted((root / "examples").glob("*.json")):
    doc = json.loads(path.read_text())
    is_comparison = "comparison" in doc
    errors = list((comparison_validator if is_comparison else validator).iter_errors(doc))
    check(not errors, f"{path.name} against the schema: {[e.message for e in errors[:3]]}")
    run = subprocess.run([cli, "compare" if is_comparison else "price", str(path)], capture_output=True, text=True)
    check(run.returncode == 0, f"{path.name} run by the CLI: {run.stderr.strip()}")

base = {"market": {"spot": 100, "volatility": 0.2, "rate": 0.03},
        "option": {"type": "call", "strike": 100, "expiry_years": 1}}
bad_docs = [
    {**base, "market": {**base["market"], "volatility": -0.2}},
    {**base, "market": {**base["market"], "volatilty": 0.2}},
    {**base, "option": {**base["option"], "type": "straddle"}},
    {**base, "lattice": {"steps": 0}},
    {**base, "side": "short"},
]
for doc in bad_docs:
    check(not validator.is_valid(doc), f"schema refuses {json.dumps(doc)}")
    run = subprocess.run([cli, "price", "-"], input=json.dumps(doc), capture_output=True, text=True)
    check(run.returncode == 2, f"CLI refuses {json.dumps(doc)}")

# Market snapshots: each one in examples/markets validates, a trade without a market is priced
# in it, and a snapshot the schema forbids (no as_of, a grid cell out of bounds) is refused.
for path in sorted((root / "examples/markets").glob("*.json")):
    doc = json.loads(path.read_text())
    if "market" in doc or "spot" not in doc:
        continue  # a trade to price in a snapshot
    errors = list(market_validator.iter_errors(doc))
    check(not errors, f"{path.name} against the market schema: {[e.message for e in errors[:3]]}")
    trade = root / "examples/markets/collar-trade.json"
    run = subprocess.run([cli, "price", str(trade), "--market", str(path)], capture_output=True, text=True)
    check(run.returncode == 0, f"{trade.name} priced in {path.name}: {run.stderr.strip()}")
snapshot = {"as_of": "2026-12-02T16:30:00Z", "spot": 100, "rate": 0.03,
            "volatility": {"expiries": [1], "strikes": [90, 110], "vols": [[0.2, 0.21]]}}
check(market_validator.is_valid(snapshot), "market schema takes a grid snapshot")
bad_snapshots = [
    {k: v for k, v in snapshot.items() if k != "as_of"},
    {**snapshot, "volatility": {**snapshot["volatility"], "vols": [[0.2, 6]]}},
    {**snapshot, "borrow": -0.01},
]
for doc in bad_snapshots:
    check(not market_validator.is_valid(doc), f"market schema refuses {json.dumps(doc)}")
# The solve's bounds: above 0, except the volatility solve on a smile without a leg, which finds a
# parallel move of the whole smile and may search below 0 (core/commands/solve.cpp); schema and CLI agree.
smile_trade = {**base, "market": {**base["market"], "volatility": {"expiries": [1], "strikes": [80, 120],
                                                                  "vols": [[0.2, 0.2]]}}}
flat_price = json.loads(subprocess.run([cli, "price", "-"], input=json.dumps(base), capture_output=True,
                                       text=True).stdout)["premium"]
parallel = {**smile_trade, "solve": {"for": "volatility", "target_premium": flat_price, "lower": -0.05, "upper": 0.1}}
check(validator.is_valid(parallel), "schema takes a parallel move of a smile searched from below 0")
run = subprocess.run([cli, "solve", "-"], input=json.dumps(parallel), capture_output=True, text=True)
check(run.returncode == 0 and abs(json.loads(run.stdout or "{}").get("solution", 1)) < 1e-6,
      f"CLI solves the parallel move searched from below 0 (a flat 20 % grid: move 0): {run.stderr.strip()}")
for doc in [{**base, "solve": {**parallel["solve"]}},
            {**smile_trade, "solve": {**parallel["solve"], "leg": 0}},
            {**base, "solve": {"for": "strike", "lower": -1}}]:
    check(not validator.is_valid(doc), f"schema refuses solve bounds below 0 in {json.dumps(doc['solve'])}")
    run = subprocess.run([cli, "solve", "-"], input=json.dumps(doc), capture_output=True, text=True)
    check(run.returncode == 2, f"CLI refuses solve bounds below 0 in {json.dumps(doc['solve'])}")
# A comparison the schema forbids, the CLI refuses too: five alternatives, one of them broken, a stray key.
alternatives = [base] * 5
bad_comparisons = [
    {"comparison": {"alternatives": alternatives}},
    {"comparison": {"alternatives": [base, bad_docs[0]]}},
    {"comparison": {"alternatives": [base], "colour": "red"}},
    {"comparison": {"alternatives": []}},
]
for doc in bad_comparisons:
    check(not comparison_validator.is_valid(doc), f"comparison schema refuses {json.dumps(doc)[:80]}")
    run = subprocess.run([cli, "compare", "-"], input=json.dumps(doc), capture_output=True, text=True)
    check(run.returncode == 2, f"CLI compare refuses {json.dumps(doc)[:80]}")
check(comparison_validator.is_valid({"comparison": {"title": "two", "alternatives": [base, base]}}),
      "comparison schema accepts two alternatives")

print(f"schema: {passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
