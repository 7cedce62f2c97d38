"""Fixtures: the real hull server (the Release build of src/Hull.Server) on a free loopback port with a throwaway
store, the demo scenario imported through this client, and the C# CLI for consistency checks.

The server and CLI are the builds `scripts/test.sh` makes (`dotnet test Hull.sln -c Release`); run
`dotnet build Hull.sln -c Release` first when calling pytest directly. A missing build fails, it never skips.
"""

import json
import os
import shutil
import subprocess
import sys
import threading
import time
from pathlib import Path

import pytest

CLIENT_DIR = Path(__file__).resolve().parents[1]
REPO = CLIENT_DIR.parents[1]
sys.path.insert(0, str(CLIENT_DIR / "src"))

from hullclient import HullClient  # noqa: E402

DEMO = REPO / "data-demo"
ROUND1 = [DEMO / "round1" / "01-elements-binaries-ternaries.csv", DEMO / "round1" / "02-layered-oxides.csv",
          DEMO / "round1" / "03-coatings.json"]
ROUND2 = DEMO / "round2" / "04-rerelaxed-layered.csv"
DEMO_DATASET = "cathodes"
# A cold server (JIT, SQLite open) prints its line within seconds; a loaded 2-core machine needs more.
START_SECONDS = 120


def _build(path_env, relative):
    path = Path(os.environ.get(path_env) or REPO / relative)
    if not path.is_file():
        pytest.fail(f"{path} is not built: run `dotnet build Hull.sln -c Release` (or set {path_env})", pytrace=False)
    return path


def server_dll():
    return _build("HULL_SERVER_DLL", "src/Hull.Server/bin/Release/net10.0/Hull.Server.dll")


def cli_dll():
    return _build("HULL_CLI_DLL", "src/Hull.Cli/bin/Release/net10.0/hull.dll")


class RunningServer:
    """A hull server process; `url` once it said it listens."""

    def __init__(self, data_dir, *extra):
        command = ["dotnet", str(server_dll()), "--data-dir", str(data_dir), "--port", "0", "--log-level", "Warning", *extra]
        self.process = subprocess.Popen(command, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        self.stderr = []
        threading.Thread(target=lambda: self.stderr.extend(self.process.stderr), daemon=True).start()
        self.url = self._wait_for_address()

    def _wait_for_address(self):
        found = []

        def read():
            for line in self.process.stdout:
                if line.startswith("hull server listening on "):
                    found.append(line.split()[4])
                    return
        reader = threading.Thread(target=read, daemon=True)
        reader.start()
        reader.join(START_SECONDS)
        if not found:
            self.stop()
            pytest.fail(f"the server did not start within {START_SECONDS} s: {''.join(self.stderr)[-2000:]}", pytrace=False)
        return found[0]

    @property
    def port(self):
        return int(self.url.rsplit(":", 1)[1])

    def stop(self):
        if self.process.poll() is None:
            self.process.terminate()
            try:
                self.process.wait(20)
            except subprocess.TimeoutExpired:
                self.process.kill()
                self.process.wait()


@pytest.fixture(scope="session")
def server(tmp_path_factory):
    running = RunningServer(tmp_path_factory.mktemp("store"))
    yield running
    running.stop()


@pytest.fixture(scope="session")
def client(server):
    with HullClient(server.url, timeout=60) as hull:
        yield hull


@pytest.fixture(scope="session")
def demo(client):
    """The demo scenario as `hull demo` imports it: round 1 one version per file, then round 2 as a replacement."""
    client.create_dataset(DEMO_DATASET, "invented cathode-screening scenario (data-demo/)")
    versions = [client.import_table(DEMO_DATASET, path).dataset_version for path in ROUND1]
    versions.append(client.import_table(DEMO_DATASET, ROUND2, on_duplicate="replace").dataset_version)
    return versions


def run_cli(server_url, *args, check=True):
    """The C# CLI against the same server; returns (exit code, stdout, stderr)."""
    run = subprocess.run(["dotnet", str(cli_dll()), *args, "--server", server_url], capture_output=True, text=True,
                         timeout=300)
    if check and run.returncode != 0:
        raise AssertionError(f"hull {' '.join(args)} exited {run.returncode}: {run.stderr}")
    return run.returncode, run.stdout, run.stderr


def cli_json(server_url, *args):
    return json.loads(run_cli(server_url, *args, "--json")[1])


@pytest.fixture(scope="session")
def openssl():
    path = shutil.which("openssl")
    if path is None:
        pytest.fail("openssl not found: install Debian's openssl", pytrace=False)
    return path


def self_signed(openssl_path, folder, name, ip="127.0.0.1"):
    """A self-signed certificate and key for `ip` (PEM files)."""
    cert, key = folder / f"{name}.crt", folder / f"{name}.key"
    subprocess.run([openssl_path, "req", "-x509", "-newkey", "rsa:2048", "-nodes", "-keyout", str(key), "-out", str(cert),
                    "-days", "1", "-subj", f"/CN={name}", "-addext", f"subjectAltName=IP:{ip},DNS:localhost"],
                   check=True, capture_output=True)
    return cert, key


def wait_until(predicate, seconds=10.0):
    end = time.monotonic() + seconds
    while time.monotonic() < end:
        if predicate():
            return True
        time.sleep(0.05)
    return predicate()
