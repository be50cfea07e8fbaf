#!/usr/bin/env bash
# C++ layout: every .cpp/.hpp of core/, tools/, wasm/, tests/ and bench/ is as clang-format
# (the repository's .clang-format) writes it. Fix with:
#   clang-format -i $(find core tools wasm tests bench -name '*.cpp' -o -name '*.hpp')
set -u
root=${1:-$(cd "$(dirname "$0")/.." && pwd)}
cd "$root" || exit 1
format=$(command -v clang-format-14 || command -v clang-format) || {
    echo "format: clang-format is not installed (bash tools/setup.sh installs it)" >&2
    exit 1
}
mapfile -t files < <(find core tools wasm tests bench -name '*.cpp' -o -name '*.hpp' | sort)
if ! "$format" --dry-run --Werror "${files[@]}"; then
    echo "format: the files above differ from .clang-format's layout" >&2
    exit 1
fi
echo "format: ${#files[@]} files as .clang-format writes them ($("$format" --version | head -1))"
