"""Python exceptions for the server's refusals and for bad local input.

Every refused call raises a subclass of HullError carrying what the server said: the gRPC status, its stable
reason code (google.rpc.ErrorInfo), the message, the ErrorInfo metadata and the field violations
(google.rpc.BadRequest), plus which call to which server failed. Programs branch on the class or on `reason`,
never on the message, which may be reworded.
"""

from dataclasses import dataclass
from typing import Mapping, Optional, Tuple

import grpc


@dataclass(frozen=True)
class FieldViolation:
    """One bad field as the server names it (`entries[12].formula`), with the row it maps to when known."""

    field: str
    description: str
    # For an import: the DataFrame index label or the file and line of the row the field belongs to.
    row: Optional[str] = None


@dataclass(frozen=True)
class PreconditionViolation:
    type: str
    subject: str
    description: str


class HullError(Exception):
    """A call the server refused, or that could not reach it."""

    def __init__(self, *, status: grpc.StatusCode, message: str, method: str, address: str, reason: str = "",
                 domain: str = "", metadata: Optional[Mapping[str, str]] = None,
                 field_violations: Tuple[FieldViolation, ...] = (),
                 precondition_violations: Tuple[PreconditionViolation, ...] = (),
                 resource_name: str = "", resource_type: str = ""):
        self.status = status
        self.message = message
        self.method = method
        self.address = address
        self.reason = reason
        self.domain = domain
        self.metadata = dict(metadata or {})
        self.field_violations = tuple(field_violations)
        self.precondition_violations = tuple(precondition_violations)
        self.resource_name = resource_name
        self.resource_type = resource_type
        super().__init__(self._text())

    def _text(self):
        code = self.status.name if isinstance(self.status, grpc.StatusCode) else str(self.status)
        head = f"{code}" + (f" ({self.reason})" if self.reason else "")
        text = f"{head} from {self.method} at {self.address}: {self.message}"
        for v in self.field_violations:
            where = f"{v.row}: " if v.row else ""
            if v.description != self.message:
                text += f"\n  {where}{v.field}: {v.description}"
            elif where:
                text += f"\n  {where}{v.field}"
        return text

    def with_rows(self, label_of_field):
        """The same error with each violation's row filled in by `label_of_field(field) -> str | None`."""
        rows = tuple(FieldViolation(v.field, v.description, label_of_field(v.field) or v.row) for v in self.field_violations)
        clone = type(self)(status=self.status, message=self.message, method=self.method, address=self.address,
                           reason=self.reason, domain=self.domain, metadata=self.metadata, field_violations=rows,
                           precondition_violations=self.precondition_violations, resource_name=self.resource_name,
                           resource_type=self.resource_type)
        return clone

    def __reduce__(self):
        # Keyword-only construction: pickle (multiprocessing workers, say) rebuilds from the attributes.
        return _rebuild, (type(self), dict(self.__dict__))

    @property
    def rows(self):
        """The rows named by the violations (DataFrame index labels or file lines), in order, without repeats."""
        seen = []
        for v in self.field_violations:
            if v.row and v.row not in seen:
                seen.append(v.row)
        return tuple(seen)


def _rebuild(cls, state):
    error = cls.__new__(cls)
    error.__dict__.update(state)
    Exception.__init__(error, error._text())
    return error


class InvalidArgumentError(HullError, ValueError):
    """INVALID_ARGUMENT: a malformed request or a bad row; `field_violations` names each field (and row)."""


class NotFoundError(HullError, LookupError):
    """NOT_FOUND: an unknown dataset, version, entry or import session."""


class AlreadyExistsError(HullError):
    """ALREADY_EXISTS: a dataset name taken, or an imported id already stored under the reject policy."""


class FailedPreconditionError(HullError):
    """FAILED_PRECONDITION: the data cannot answer as it stands (e.g. an element without a reference)."""


class PermissionDeniedError(HullError, PermissionError):
    """PERMISSION_DENIED (a wrong write token) or UNAUTHENTICATED (none given to a server that needs one)."""


class ResourceExhaustedError(HullError):
    """RESOURCE_EXHAUSTED: past a documented server limit; metadata `limit` and `limit_value` name it."""


class UnavailableError(HullError, ConnectionError):
    """UNAVAILABLE: the server cannot be reached, or its TLS certificate is not trusted (see `ca_file`)."""


class DeadlineExceededError(HullError, TimeoutError):
    """DEADLINE_EXCEEDED: the call's deadline (`timeout`) passed first."""


class ServerError(HullError):
    """INTERNAL, UNIMPLEMENTED, UNKNOWN and other faults of the server or transport."""


_CLASS_OF_STATUS = {
    grpc.StatusCode.INVALID_ARGUMENT: InvalidArgumentError,
    grpc.StatusCode.OUT_OF_RANGE: InvalidArgumentError,
    grpc.StatusCode.NOT_FOUND: NotFoundError,
    grpc.StatusCode.ALREADY_EXISTS: AlreadyExistsError,
    grpc.StatusCode.FAILED_PRECONDITION: FailedPreconditionError,
    grpc.StatusCode.PERMISSION_DENIED: PermissionDeniedError,
    grpc.StatusCode.UNAUTHENTICATED: PermissionDeniedError,
    grpc.StatusCode.RESOURCE_EXHAUSTED: ResourceExhaustedError,
    grpc.StatusCode.UNAVAILABLE: UnavailableError,
    grpc.StatusCode.DEADLINE_EXCEEDED: DeadlineExceededError,
}

_DETAILS_TRAILER = "grpc-status-details-bin"


def from_rpc_error(error: grpc.RpcError, method: str, address: str) -> HullError:
    """The HullError for a failed call: the status and message, and the google.rpc details when sent."""
    from hullclient._stubs import error_details_pb2, status_pb2

    status = error.code() if hasattr(error, "code") else grpc.StatusCode.UNKNOWN
    message = (error.details() if hasattr(error, "details") else None) or str(error)
    kwargs = dict(reason="", domain="", metadata={}, field_violations=(), precondition_violations=(),
                  resource_name="", resource_type="")
    trailers = error.trailing_metadata() if hasattr(error, "trailing_metadata") else None
    for key, value in trailers or ():
        if key != _DETAILS_TRAILER:
            continue
        rich = status_pb2.Status.FromString(value)
        message = rich.message or message
        violations, preconditions = [], []
        for detail in rich.details:
            if detail.Is(error_details_pb2.ErrorInfo.DESCRIPTOR):
                info = error_details_pb2.ErrorInfo()
                detail.Unpack(info)
                if not kwargs["reason"]:
                    kwargs.update(reason=info.reason, domain=info.domain, metadata=dict(info.metadata))
            elif detail.Is(error_details_pb2.BadRequest.DESCRIPTOR):
                bad = error_details_pb2.BadRequest()
                detail.Unpack(bad)
                violations += [FieldViolation(v.field, v.description) for v in bad.field_violations]
            elif detail.Is(error_details_pb2.PreconditionFailure.DESCRIPTOR):
                failure = error_details_pb2.PreconditionFailure()
                detail.Unpack(failure)
                preconditions += [PreconditionViolation(v.type, v.subject, v.description) for v in failure.violations]
            elif detail.Is(error_details_pb2.ResourceInfo.DESCRIPTOR):
                resource = error_details_pb2.ResourceInfo()
                detail.Unpack(resource)
                kwargs.update(resource_name=resource.resource_name, resource_type=resource.resource_type)
        kwargs.update(field_violations=tuple(violations), precondition_violations=tuple(preconditions))
    if status == grpc.StatusCode.UNAVAILABLE:
        message = f"cannot reach the server ({message}); is it running there, and for https:// is its certificate trusted (ca_file)?"
    cls = _CLASS_OF_STATUS.get(status, ServerError)
    return cls(status=status, message=message, method=method, address=address, **kwargs)


class EntryInputError(ValueError):
    """Entries that cannot be sent as they are: the file, line or DataFrame row, the column and what is wrong."""

    def __init__(self, where: str, problem: str):
        self.where = where
        self.problem = problem
        super().__init__(f"{where}: {problem}")

    def __reduce__(self):
        return type(self), (self.where, self.problem)


__all__ = [
    "AlreadyExistsError",
    "DeadlineExceededError",
    "EntryInputError",
    "FailedPreconditionError",
    "FieldViolation",
    "HullError",
    "InvalidArgumentError",
    "NotFoundError",
    "PermissionDeniedError",
    "PreconditionViolation",
    "ResourceExhaustedError",
    "ServerError",
    "UnavailableError",
    "from_rpc_error",
]
