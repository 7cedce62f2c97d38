#!/usr/bin/env bash
# The project's test command: installs the outside reference tools the tests compare against when they are
# missing (Debian packages), runs every test project, and fails when no test ran or any test was skipped.
set -euo pipefail
cd "$(dirname "$0")/.."

missing=()
command -v qconvex >/dev/null 2>&1 || missing+=(qhull-bin)
command -v glpsol >/dev/null 2>&1 || missing+=(glpk-utils)
command -v rsvg-convert >/dev/null 2>&1 || missing+=(librsvg2-bin)
/usr/bin/python3 -c 'import scipy.optimize' >/dev/null 2>&1 || missing+=(python3-scipy)
if ((${#missing[@]})); then
  echo "installing reference tools: ${missing[*]}"
  if [ "$(id -u)" -ne 0 ]; then sudo=sudo; else sudo=; fi
  export DEBIAN_FRONTEND=noninteractive
  # Another install may hold the package lock: wait for it (up to 10 min) instead of failing at once.
  $sudo apt-get -o DPkg::Lock::Timeout=600 update -qq
  $sudo apt-get -o DPkg::Lock::Timeout=600 install -y -qq "${missing[@]}" >/dev/null
fi

log=$(mktemp)
trap 'rm -f "$log"' EXIT
set +e
dotnet test Hull.sln -c Release --nologo 2>&1 | tee "$log"
status=${PIPESTATUS[0]}
set -e

# Sum the per-project summary lines, e.g. "Passed!  - Failed:     0, Passed:    12, Skipped:     0, Total:    12".
read -r passed failed skipped < <(awk '
  /(Passed|Failed)! +- +Failed:/ {
    gsub(/,/, "");
    for (i = 1; i <= NF; i++) {
      if ($i == "Failed:") f += $(i + 1);
      if ($i == "Passed:") p += $(i + 1);
      if ($i == "Skipped:") s += $(i + 1);
    }
  }
  END { printf "%d %d %d\n", p, f, s }' "$log")

# Problems first, so that the count line is always the last line printed.
rc=$status
if [ "$passed" -eq 0 ]; then echo "error: no test ran" >&2; rc=1; fi
if [ "$skipped" -ne 0 ]; then echo "error: ${skipped} test(s) skipped; skips are not allowed" >&2; rc=1; fi
if [ "$status" -ne 0 ] && [ "$failed" -eq 0 ]; then echo "error: the test run failed (build error or crashed test host)" >&2; fi
echo "${passed} passed, ${failed} failed, ${skipped} skipped"
exit "$rc"
