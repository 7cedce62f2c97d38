"""hullclient: the Python client of the hull phase-stability service.

    from hullclient import HullClient
    with HullClient("http://127.0.0.1:50551") as hull:
        table = hull.analyze_dataset("cathodes")
        table[table.energy_above_hull_ev_per_atom < 0.025]

Every gRPC call of hull.v1 has one method (HullClient.calls() lists them); tabular answers are pandas DataFrames
with unit-bearing column names, the others small frozen dataclasses; a refused call raises a HullError subclass
carrying the server's reason code and field violations.
"""

from hullclient.client import CoverageWarning, HullClient, SystemProblemWarning
from hullclient.defects import DefectWarning
from hullclient.entries import read_entries, write_entries, write_free_energy_tables
from hullclient.errors import (
    AlreadyExistsError,
    DeadlineExceededError,
    EntryInputError,
    FailedPreconditionError,
    FieldViolation,
    HullError,
    InvalidArgumentError,
    NotFoundError,
    PermissionDeniedError,
    ResourceExhaustedError,
    ServerError,
    UnavailableError,
)
from hullclient.results import coverage_frame, decomposition_products

__version__ = "0.1.0"

__all__ = [
    "AlreadyExistsError",
    "CoverageWarning",
    "DeadlineExceededError",
    "DefectWarning",
    "EntryInputError",
    "FailedPreconditionError",
    "FieldViolation",
    "HullClient",
    "HullError",
    "InvalidArgumentError",
    "NotFoundError",
    "PermissionDeniedError",
    "ResourceExhaustedError",
    "ServerError",
    "SystemProblemWarning",
    "UnavailableError",
    "coverage_frame",
    "decomposition_products",
    "read_entries",
    "write_entries",
    "write_free_energy_tables",
]
