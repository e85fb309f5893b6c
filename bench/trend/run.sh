#!/usr/bin/env bash
# Bundles a trend benchmark with esbuild (installed with vite) and runs it with Node.
#   bash bench/trend/run.sh [replicates] [fixed|random]   coverage of the slope limits (default 2000)
#   bash bench/trend/run.sh --pool [replicates]           bootstrap in-thread vs worker pool (default 100)
set -euo pipefail
cd "$(dirname "$0")/../.."
name=coverage
if [ "${1:-}" = "--pool" ]; then name=bootstrap-pool; shift; fi
out="node_modules/.cache/tallywise-bench/trend-$name.mjs"
npx esbuild "bench/trend/$name.ts" --bundle --platform=node --format=esm --packages=external --outfile="$out" --log-level=warning \
  --alias:@shared=./src-shared
node "$out" "$@"
