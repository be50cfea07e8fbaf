#!/usr/bin/env bash
# CLI contract: prices an example, exit 2 with one "<field>: <problem>" line on bad input.
set -u
cli=$1; root=$2; fails=0; passes=0
check() { if eval "$2"; then passes=$((passes+1)); else echo "FAIL: $1"; fails=$((fails+1)); fi; }

out=$("$cli" price "$root/examples/american-put.json"); code=$?
check "price exits 0" '[ $code -eq 0 ]'
check "price prints a premium" 'echo "$out" | grep -q "\"premium\""'
"$cli" price "$root/examples/american-put.json" --table | grep -q "premium"; check "--table prints premium" '[ $? -eq 0 ]'

bad='{"market":{"spot":100,"volatility":-0.2,"rate":0.01},"option":{"type":"call","strike":100,"expiry_years":1}}'
err=$(echo "$bad" | "$cli" price - 2>&1 >/dev/null); code=$?
check "bad volatility exits 2" '[ $code -eq 2 ]'
check "bad volatility message" '[ "$err" = "market.volatility: must be > 0, got -0.2" ]'
check "one line" '[ $(echo "$err" | wc -l) -eq 1 ]'

err=$(echo 'not json' | "$cli" price - 2>&1 >/dev/null); code=$?
check "not JSON exits 2" '[ $code -eq 2 ]'
err=$("$cli" price /nonexistent.json 2>&1 >/dev/null); code=$?
check "missing file exits 2" '[ $code -eq 2 ]'
err=$("$cli" nosuchcommand "$root/examples/american-put.json" 2>&1 >/dev/null); code=$?
check "unknown command exits 2" '[ $code -eq 2 ]'

echo "cli: $passes passed, $fails failed"
[ $fails -eq 0 ]
