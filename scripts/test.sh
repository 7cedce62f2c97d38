#!/usr/bin/env bash
# The project's test command: installs the outside reference tools the tests compare against when they are
# missing (Debian packages), runs every test project and the Python client's tests, and fails when no test ran
# (or no Python test ran) or any test was skipped.
set -euo pipefail
cd "$(dirname "$0")/.."

missing=()
command -v qconvex >/dev/null 2>&1 || missing+=(qhull-bin)
command -v glpsol >/dev/null 2>&1 || missing+=(glpk-utils)
command -v rsvg-convert >/dev/null 2>&1 || missing+=(librsvg2-bin)
/usr/bin/python3 -c 'import scipy.optimize' >/dev/null 2>&1 || missing+=(python3-scipy)
# The Python client's tests (clients/python): Debian's python3 packages, the stub generators, the notebook runner.
/usr/bin/python3 -c 'import grpc' >/dev/null 2>&1 || missing+=(python3-grpcio)
/usr/bin/python3 -c 'import google.protobuf' >/dev/null 2>&1 || missing+=(python3-protobuf)
/usr/bin/python3 -c 'import pandas' >/dev/null 2>&1 || missing+=(python3-pandas)
/usr/bin/python3 -c 'import pytest' >/dev/null 2>&1 || missing+=(python3-pytest)
/usr/bin/python3 -c 'import ipykernel' >/dev/null 2>&1 || missing+=(python3-ipykernel)
command -v protoc >/dev/null 2>&1 || missing+=(protobuf-compiler)
command -v grpc_python_plugin >/dev/null 2>&1 || missing+=(protobuf-compiler-grpc)
command -v jupyter-nbconvert >/dev/null 2>&1 || missing+=(jupyter-nbconvert)
command -v openssl >/dev/null 2>&1 || missing+=(openssl)
# The PostgreSQL store's tests run against a throwaway cluster (scripts/postgres-throwaway.sh).
ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || missing+=(postgresql)
if ((${#missing[@]})); then
  echo "installing reference tools: ${missing[*]}"
  if [ "$(id -u)" -ne 0 ]; then sudo=sudo; else sudo=; fi
  export DEBIAN_FRONTEND=noninteractive
  # Another install may hold the package lock: wait for it (up to 10 min) instead of failing at once.
  $sudo apt-get -o DPkg::Lock::Timeout=600 update -qq
  $sudo apt-get -o DPkg::Lock::Timeout=600 install -y -qq "${missing[@]}" >/dev/null
fi

log=$(mktemp)
junit=$(mktemp)
# One throwaway PostgreSQL cluster for every test project (each test takes a schema of its own), stopped and
# removed on exit whatever happens.
pg_dir=$(mktemp -d /tmp/hull-test-postgres.XXXXXX)
chmod 755 "$pg_dir"
trap 'bash scripts/postgres-throwaway.sh stop "$pg_dir" || true; rm -rf "$log" "$junit" "$pg_dir"' EXIT
pg_start=$(date +%s.%N)
HULL_TEST_POSTGRES=$(bash scripts/postgres-throwaway.sh start "$pg_dir")
export HULL_TEST_POSTGRES
echo "test PostgreSQL: ${HULL_TEST_POSTGRES} (started in $(/usr/bin/python3 -c "import sys; print(f'{float(sys.argv[2]) - float(sys.argv[1]):.1f}')" "$pg_start" "$(date +%s.%N)") s)"
set +e
dotnet test Hull.sln -c Release --nologo 2>&1 | tee "$log"
status=${PIPESTATUS[0]}
set -e

# The Python client against the Release server and CLI that `dotnet test` just built: stubs generated from the
# protos first (never committed), then pytest; its counts join the .NET ones below.
set +e
/usr/bin/python3 clients/python/generate_stubs.py
generated=$?
py_status=1
if [ "$generated" -eq 0 ]; then
  /usr/bin/python3 -m pytest clients/python/tests -p no:cacheprovider -rfEs --junitxml="$junit"
  py_status=$?
fi
set -e
read -r py_passed py_failed py_skipped < <(/usr/bin/python3 - "$junit" <<'PY'
import sys, xml.etree.ElementTree as ET
try:
    root = ET.parse(sys.argv[1]).getroot()
except (ET.ParseError, OSError):
    print(0, 0, 0)
    raise SystemExit
suites = [root] if root.tag == "testsuite" else root.findall("testsuite")
n = lambda key: sum(int(s.get(key, 0)) for s in suites)
failed = n("failures") + n("errors")
print(n("tests") - failed - n("skipped"), failed, n("skipped"))
PY
)

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

passed=$((passed + py_passed)); failed=$((failed + py_failed)); skipped=$((skipped + py_skipped))

# Problems first, so that the count line is always the last line printed.
rc=$status
if [ "$generated" -ne 0 ]; then echo "error: the Python client's stubs could not be generated (see above)" >&2; rc=1; fi
if [ "$py_status" -ne 0 ]; then rc=1; fi
if [ "$generated" -eq 0 ] && [ "$py_status" -ne 0 ] && [ "$py_failed" -eq 0 ]; then
  echo "error: the Python test run failed (pytest exit ${py_status}, no test failure counted)" >&2
fi
if [ "$py_passed" -eq 0 ]; then echo "error: no Python client test ran" >&2; rc=1; fi
if [ "$passed" -eq 0 ]; then echo "error: no test ran" >&2; rc=1; fi
if [ "$skipped" -ne 0 ]; then echo "error: ${skipped} test(s) skipped; skips are not allowed" >&2; rc=1; fi
if [ "$status" -ne 0 ] && [ "$failed" -eq 0 ]; then echo "error: the test run failed (build error or crashed test host)" >&2; fi
echo "${passed} passed, ${failed} failed, ${skipped} skipped"
exit "$rc"
