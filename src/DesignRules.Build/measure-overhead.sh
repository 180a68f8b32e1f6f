#!/usr/bin/env bash
# Measures what the DesignRules check adds to `dotnet build example-design`, as the README reports it:
#   off          the same build with the evaluation switched off (-p:DesignRulesEnabled=false)
#   incremental  a second build with nothing changed (the check target is skipped)
#   full         a build after touching every design (the check runs in full)
# Needs hyperfine (apt-get install hyperfine). Extra arguments go to every build, e.g.
#   src/DesignRules.Build/measure-overhead.sh "-p:DesignRulesLevels=DR702=off"
# The incremental build skips when the last check had no error, and then replays its warnings.
set -euo pipefail
cd "$(dirname "$0")/../.."
extra="${*:-}"
runs="${RUNS:-5}"
# Build the task and everything once, so that all three variants measure the same warm, up-to-date tree.
dotnet build example-design $extra > /dev/null || true
# One --prepare per command, in command order (a single --prepare would apply to all three).
hyperfine --warmup 1 --runs "$runs" --ignore-failure --export-markdown "${OUT:-/tmp/designrules-overhead.md}" \
  --prepare "true" --prepare "true" --prepare "touch example-design/designs/*.yaml" \
  --command-name off "dotnet build example-design -p:DesignRulesEnabled=false $extra" \
  --command-name incremental "dotnet build example-design $extra" \
  --command-name full "dotnet build example-design $extra"
