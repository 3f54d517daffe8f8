#!/usr/bin/env bash
# Regenerates the committed reports of the worked scenarios (reports/<name>/) at their default sizes.
# tests/committed_reports.rs checks that doing so changes nothing but timing and the build's commit.
set -euo pipefail
cd "$(dirname "$0")/.."
cargo build --release --quiet
for f in scenarios/*.yaml; do
  name=$(basename "$f" .yaml)
  # The script owns reports/: the old folder goes first, so that files a newer motley no longer
  # writes (or an older one did not list in .motley-written) never block the rewrite.
  rm -rf "reports/$name"
  ./target/release/motley run "$f" --out "reports/$name" --quiet
done
