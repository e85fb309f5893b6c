#!/usr/bin/env bash
# Report benchmark: the demo programme through the command line, its
# composite bootstrap two ways (composite.ts), and synthetic programmes of 4
# and 50 species made in one process. Prints seconds, peak memory and ratios
# against reference runs of this same run.
#   bash bench/report/run.sh            (build the command line first:
#                                        npx vite build --config vite.cli.config.ts)
set -euo pipefail
cd "$(dirname "$0")/../.."
out="node_modules/.cache/tallywise-bench/report-programme.mjs"
npx esbuild bench/report/programme.ts --bundle --platform=node --format=esm --packages=external --outfile="$out" --log-level=warning \
  --alias:@shared=./src-shared
composite="node_modules/.cache/tallywise-bench/report-composite.mjs"
npx esbuild bench/report/composite.ts --bundle --platform=node --format=esm --packages=external --outfile="$composite" --log-level=warning \
  --alias:@shared=./src-shared

dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
if [ -f out/cli/tallywise.mjs ]; then
  echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg)"
  /usr/bin/time -f '%e %U %S %M' -o "$dir/time" node bin/tallywise report --demo --out "$dir/demo" >/dev/null 2>"$dir/log" || { cat "$dir/log"; exit 1; }
  read -r demo_s demo_user demo_sys demo_kb <"$dir/time"
  echo "demo programme (tallywise report --demo): ${demo_s} s wall, $(awk -v u="$demo_user" -v s="$demo_sys" 'BEGIN { printf "%.2f", u + s }') s CPU (all threads), peak ${demo_kb%???} MB; target <= 15 s: $(awk -v s="$demo_s" 'BEGIN { printf "%.2f", s / 15 }') of it; load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
  node "$composite"
else
  echo "demo programme: skipped (no out/cli/tallywise.mjs; run npx vite build --config vite.cli.config.ts)"
  demo_s=""
fi

four=$(node "$out" 4)
fifty=$(node "$out" 50)
echo "synthetic, 4 species:  $four"
echo "synthetic, 50 species: $fifty"
node -e '
const [a, b, demo] = [JSON.parse(process.argv[1]), JSON.parse(process.argv[2]), process.argv[3]];
console.log(`50 species over 4 species: ${(b.totalS / a.totalS).toFixed(1)} x the wall time, ${(b.totalCpuS / a.totalCpuS).toFixed(1)} x the CPU time (${(b.species / a.species).toFixed(1)} x the species), ${(b.peakRssMb / a.peakRssMb).toFixed(2)} x the peak memory`);
if (demo) console.log(`demo over synthetic 4 species: ${(Number(demo) / a.totalS).toFixed(2)} x the time (the demo run includes starting Node, the demo simulation and the composite bootstrap)`);
' "$four" "$fifty" "$demo_s"
