#!/usr/bin/env bash
# Regenerates the committed reports of the worked scenarios (reports/<name>/) at their default sizes.
# tests/committed_reports.rs checks that doing so changes nothing but timing and the build's commit.
set -euo pipefail
cd "$(dirname "$0")/.."
cargo build --release --quiet
for f in scenarios/*.yaml; do
  name=$(basename "$f" .yaml)
  ./target/release/motley run "$f" --out "reports/$name" --overwrite --quiet
done
