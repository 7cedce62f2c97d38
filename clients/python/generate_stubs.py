#!/usr/bin/python3
"""Generates the Python wire stubs of hullclient from the contract, never by hand.

Inputs: every protos/hull/v1/*.proto of this repository, and google/rpc/status.proto and error_details.proto (the
standard error details the server sends) from the Google.Api.CommonProtos NuGet package at the version the server
builds with, found in the NuGet package folder after `dotnet restore`. Tools: Debian's `protoc`
(protobuf-compiler) and `grpc_python_plugin` (protobuf-compiler-grpc), whose versions match Debian's
python3-protobuf and python3-grpcio.

Output: src/hullclient/_wire/ (not committed). protoc writes absolute imports (`from hull.v1 import ...`); they
are turned into imports inside the package so that the stubs neither need a path entry of their own nor clash
with another copy of the google.rpc messages. A MANIFEST records the SHA-256 of every input and the protoc
version, so that `--check` (and the test that runs it) finds stubs that are stale against the protos.

    /usr/bin/python3 clients/python/generate_stubs.py            # (re)generate
    /usr/bin/python3 clients/python/generate_stubs.py --check    # exit 1 when the stubs differ from a fresh run
"""

import argparse
import filecmp
import hashlib
import os
import re
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

CLIENT_DIR = Path(__file__).resolve().parent
REPO_DIR = CLIENT_DIR.parent.parent
PROTO_ROOT = REPO_DIR / "protos"
WIRE_DIR = CLIENT_DIR / "src" / "hullclient" / "_wire"
PACKAGE = "hullclient._wire"
# The server project names the error-details package it sends; the client reads the same version.
SERVER_PROJECT = REPO_DIR / "src" / "Hull.Server" / "Hull.Server.csproj"
ERROR_PROTOS = ("google/rpc/status.proto", "google/rpc/error_details.proto")
# Where Debian's protobuf-compiler keeps the well-known types (any, duration, timestamp).
SYSTEM_INCLUDE = Path("/usr/include")


class GenerationError(Exception):
    """A missing tool or input; the message says which and what to install or run."""


def contract_protos():
    files = sorted((PROTO_ROOT / "hull" / "v1").glob("*.proto"))
    if not files:
        raise GenerationError(f"no .proto files under {PROTO_ROOT / 'hull' / 'v1'}")
    return [f.relative_to(PROTO_ROOT).as_posix() for f in files]


def common_protos_root():
    text = SERVER_PROJECT.read_text(encoding="utf-8")
    match = re.search(r'Include="Google\.Api\.CommonProtos"\s+Version="([^"]+)"', text)
    if not match:
        raise GenerationError(f"{SERVER_PROJECT} names no Google.Api.CommonProtos version")
    version = match.group(1)
    packages = Path(os.environ.get("NUGET_PACKAGES") or Path.home() / ".nuget" / "packages")
    root = packages / "google.api.commonprotos" / version / "content" / "protos"
    missing = [p for p in ERROR_PROTOS if not (root / p).is_file()]
    if missing:
        raise GenerationError(
            f"{', '.join(missing)} not found under {root}: run `dotnet restore src/Hull.Server` once "
            f"(it fetches Google.Api.CommonProtos {version}, which carries them), or set NUGET_PACKAGES")
    return root


def tool(name, package):
    path = shutil.which(name)
    if path is None:
        raise GenerationError(f"`{name}` not found: install Debian's {package} (apt-get install {package})")
    return path


def protoc_version(protoc):
    return subprocess.run([protoc, "--version"], check=True, capture_output=True, text=True).stdout.strip()


def sha256(path):
    return hashlib.sha256(path.read_bytes()).hexdigest()


def manifest_text(protoc, inputs):
    lines = [f"# Written by generate_stubs.py; do not edit. {protoc_version(protoc)}"]
    lines += [f"{sha256(root / name)}  {name}" for root, name in inputs]
    return "\n".join(lines) + "\n"


ABSOLUTE_IMPORT = re.compile(r"^from (hull\.v1|google\.rpc) import ", re.MULTILINE)


def generate(out_dir):
    protoc = tool("protoc", "protobuf-compiler")
    plugin = tool("grpc_python_plugin", "protobuf-compiler-grpc")
    common = common_protos_root()
    ours = contract_protos()
    inputs = [(common, p) for p in ERROR_PROTOS] + [(PROTO_ROOT, p) for p in ours]

    out_dir.mkdir(parents=True, exist_ok=True)
    base = [protoc, f"-I{PROTO_ROOT}", f"-I{common}", f"-I{SYSTEM_INCLUDE}", f"--python_out={out_dir}"]
    run = subprocess.run(base + list(ERROR_PROTOS), capture_output=True, text=True)
    if run.returncode == 0:
        run = subprocess.run(base + [f"--plugin=protoc-gen-grpc_python={plugin}", f"--grpc_python_out={out_dir}"] + ours,
                             capture_output=True, text=True)
    if run.returncode != 0:
        raise GenerationError(f"protoc failed:\n{run.stderr.strip()}")

    for module in sorted(out_dir.rglob("*.py")):
        text = module.read_text(encoding="utf-8")
        module.write_text(ABSOLUTE_IMPORT.sub(lambda m: f"from {PACKAGE}.{m.group(1)} import ", text), encoding="utf-8")
    for folder in [out_dir] + sorted(p for p in out_dir.rglob("*") if p.is_dir()):
        (folder / "__init__.py").write_text("", encoding="utf-8")
    (out_dir / "MANIFEST").write_text(manifest_text(protoc, inputs), encoding="utf-8")


def differences(fresh, current):
    """Files that differ between two generated trees, as relative paths."""
    def files(root):
        return {p.relative_to(root).as_posix() for p in root.rglob("*") if p.is_file() and "__pycache__" not in p.parts}
    if not current.is_dir():
        return [f"{current} (missing)"]
    a, b = files(fresh), files(current)
    changed = sorted(a ^ b)
    changed += sorted(f for f in a & b if not filecmp.cmp(fresh / f, current / f, shallow=False))
    return changed


def main(argv):
    parser = argparse.ArgumentParser(description="Generate hullclient's wire stubs from protos/.")
    parser.add_argument("--check", action="store_true", help="compare with a fresh generation; exit 1 when stale")
    args = parser.parse_args(argv)
    try:
        if args.check:
            with tempfile.TemporaryDirectory() as tmp:
                fresh = Path(tmp) / "_wire"
                generate(fresh)
                changed = differences(fresh, WIRE_DIR)
            if changed:
                print("stale stubs in " + str(WIRE_DIR) + ": " + ", ".join(changed)
                      + "\nrun: /usr/bin/python3 clients/python/generate_stubs.py", file=sys.stderr)
                return 1
            print(f"stubs in {WIRE_DIR} match the protos")
            return 0
        shutil.rmtree(WIRE_DIR, ignore_errors=True)
        generate(WIRE_DIR)
        print(f"generated {WIRE_DIR}")
        return 0
    except GenerationError as e:
        print(f"generate_stubs.py: {e}", file=sys.stderr)
        return 2


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
