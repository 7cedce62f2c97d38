"""The generated wire modules, imported in one place so that a missing generation says what to run."""

try:
    from hullclient._wire.google.rpc import error_details_pb2, status_pb2
    from hullclient._wire.hull.v1 import (
        corrections_pb2,
        corrections_pb2_grpc,
        curation_pb2,
        curation_pb2_grpc,
        datasets_pb2,
        datasets_pb2_grpc,
        defects_pb2,
        defects_pb2_grpc,
        diagnostics_pb2,
        diagnostics_pb2_grpc,
        electrochemistry_pb2,
        electrochemistry_pb2_grpc,
        entries_pb2,
        figures_pb2,
        figures_pb2_grpc,
        stability_pb2,
        stability_pb2_grpc,
        thermo_pb2,
        thermo_pb2_grpc,
        uncertainty_pb2,
        uncertainty_pb2_grpc,
        windows_pb2,
        windows_pb2_grpc,
    )
except ImportError as error:  # pragma: no cover - only without a generation
    raise ImportError(
        "hullclient's wire stubs are not generated (or are incomplete): run "
        "`/usr/bin/python3 clients/python/generate_stubs.py` in the repository, then import again"
    ) from error

# Every generated module that declares services: the client-coverage test reads their descriptors.
SERVICE_MODULES = (corrections_pb2, curation_pb2, datasets_pb2, defects_pb2, diagnostics_pb2, electrochemistry_pb2,
                   figures_pb2, stability_pb2, thermo_pb2, uncertainty_pb2, windows_pb2)

__all__ = [
    "SERVICE_MODULES",
    "corrections_pb2",
    "corrections_pb2_grpc",
    "curation_pb2",
    "curation_pb2_grpc",
    "datasets_pb2",
    "datasets_pb2_grpc",
    "defects_pb2",
    "defects_pb2_grpc",
    "diagnostics_pb2",
    "diagnostics_pb2_grpc",
    "electrochemistry_pb2",
    "electrochemistry_pb2_grpc",
    "entries_pb2",
    "error_details_pb2",
    "figures_pb2",
    "figures_pb2_grpc",
    "stability_pb2",
    "stability_pb2_grpc",
    "status_pb2",
    "thermo_pb2",
    "thermo_pb2_grpc",
    "uncertainty_pb2",
    "uncertainty_pb2_grpc",
    "windows_pb2",
    "windows_pb2_grpc",
]
