#!/usr/bin/env bash
# Bundles bench/fit/run.ts with esbuild (installed with vite) and runs it with Node.
set -euo pipefail
cd "$(dirname "$0")/../.."
# Written under node_modules/.cache so that the bundle finds the installed packages.
out="node_modules/.cache/tallywise-bench/fit.mjs"
npx esbuild bench/fit/run.ts --bundle --platform=node --format=esm --packages=external --outfile="$out" --log-level=warning \
  --define:__dirname='"'"$PWD/bench/fit"'"'
node "$out"
