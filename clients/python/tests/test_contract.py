"""The client follows the contract: every call declared in protos/hull/v1 has its Python method, and the
generated stubs are those a fresh generation makes from the protos."""

import re
import subprocess
import sys

from conftest import CLIENT_DIR, REPO
from hullclient import HullClient
from hullclient._stubs import SERVICE_MODULES

_SERVICE = re.compile(r"^service\s+(\w+)\s*\{(.*?)^\}", re.MULTILINE | re.DOTALL)
_RPC = re.compile(r"^\s*rpc\s+(\w+)\s*\(", re.MULTILINE)


def declared_calls():
    """'hull.v1.Service/Method' for every rpc in the .proto sources (read as text, independent of the stubs)."""
    calls = set()
    for proto in sorted((REPO / "protos" / "hull" / "v1").glob("*.proto")):
        text = re.sub(r"//[^\n]*", "", proto.read_text(encoding="utf-8"))
        for service, body in _SERVICE.findall(text):
            calls.update(f"hull.v1.{service}/{method}" for method in _RPC.findall(body))
    return calls


def test_every_declared_call_has_a_client_method():
    declared = declared_calls()
    assert len(declared) >= 24  # the contract as this client was written; later calls only add to it
    missing = sorted(declared - set(HullClient.calls()))
    assert not missing, ("calls without a Python method in clients/python/src/hullclient/client.py "
                         f"(add one marked @_calls(service, method)): {missing}")


def test_every_client_method_names_a_call_of_the_generated_stubs():
    generated = {f"{s.full_name}/{m.name}" for module in SERVICE_MODULES
                 for s in module.DESCRIPTOR.services_by_name.values() for m in s.methods}
    assert set(HullClient.calls()) <= generated
    assert generated == declared_calls(), ("the generated stubs differ from the protos: regenerate "
                                           "(generate_stubs.py), and import a new proto's stubs in hullclient/_stubs.py")


def test_the_stubs_are_not_stale_against_the_protos():
    run = subprocess.run([sys.executable, str(CLIENT_DIR / "generate_stubs.py"), "--check"], capture_output=True, text=True)
    assert run.returncode == 0, run.stderr


def test_every_window_call_takes_every_field_of_its_request():
    # Read from the generated descriptors: a field added to a window request (or to WindowSettings, which all four
    # carry) without a keyword on its Python method fails here. The compound field is the method's `compound`
    # argument; `settings` is spread over the WindowSettings keywords.
    import inspect
    from hullclient import _stubs as wire

    settings = [f.name for f in wire.windows_pb2.WindowSettings.DESCRIPTOR.fields]
    assert "gas_molecules" in settings
    methods = {"GetStabilityWindowRequest": HullClient.get_stability_window,
               "SliceStabilityWindowRequest": HullClient.slice_stability_window,
               "GetDopantLimitsRequest": HullClient.get_dopant_limits,
               "DrawWindowFigureRequest": HullClient.draw_window_figure}
    for request, method in methods.items():
        parameters = set(inspect.signature(method).parameters)
        fields = [f.name for f in getattr(wire.windows_pb2, request).DESCRIPTOR.fields if f.name != "settings"]
        missing = sorted(set(fields + settings) - parameters)
        assert not missing, f"{method.__name__} has no argument for {request} fields {missing}"
