"""Python client adapters for the striae PostgreSQL extension (psycopg 3).

    import psycopg, striae_client
    with psycopg.connect() as conn:
        striae_client.register(conn)
        p, = conn.execute("SELECT '110/64'::plane").fetchone()   # Plane(strike=110.0, dip=64.0)
        conn.execute("SELECT pole(%s)", [striae_client.Plane(110, 64)])

register() teaches a connection (or a cursor) the striae types, in text and in
binary format, in both directions:

    plane          Plane(strike, dip)
    lineation      Lineation(trend, plunge)
    fault_slip     FaultSlip(strike, dip, rake)
    cone           Cone(kind, a, b, half_angle)
    stress_tensor  StressTensor(components, n, misfit, cones, phi_interval, friction, flags)
    sphere_grid    SphereGrid(kind, spacing, n, values)   values: a numpy float64 array

and arrays of them (plane[] comes back as a list of Plane). Values read back
are the values stored: numbers round-trip exactly in both formats (floats are
written with repr, the shortest text that reads back to the same double).

Values are checked by the server, not here: a Plane(400, 10) is sent as it is
and the server raises its own error. Angles are degrees, axes North-East-Down,
stress compression positive, as in the extension (README.md, "Conventions").
"""

from __future__ import annotations

import json
import math
import struct
from dataclasses import dataclass, field
from typing import Optional, Tuple

import numpy as np
from psycopg.adapt import Dumper, Loader
from psycopg.pq import Format
from psycopg.types import TypeInfo

__all__ = ["Plane", "Lineation", "FaultSlip", "Cone", "StressTensor", "SphereGrid", "register",
           "grid_nodes", "line_vectors"]

_WIRE_VERSION = 1  # the version byte of every striae binary format


def _num(x: float) -> str:
    """Shortest text that reads back to the same double (what float8 output does)."""
    r = repr(float(x))
    return r[:-2] if r.endswith(".0") else r


def line_vectors(trend, plunge) -> np.ndarray:
    """Unit vectors (north, east, down) of lines given in degrees, shape (..., 3)."""
    t, p = np.radians(np.asarray(trend, float)), np.radians(np.asarray(plunge, float))
    return np.stack([np.cos(p) * np.cos(t), np.cos(p) * np.sin(t), np.sin(p)], axis=-1)


# ---- value types --------------------------------------------------------------------

@dataclass(frozen=True)
class Plane:
    """A plane: right-hand-rule strike and dip, degrees."""
    strike: float
    dip: float

    @property
    def dip_direction(self) -> float:
        return (self.strike + 90.0) % 360.0

    def pole(self) -> "Lineation":
        """Lower-hemisphere pole (trend strike - 90, plunge 90 - dip)."""
        return Lineation((self.strike - 90.0) % 360.0, 90.0 - self.dip)

    def __str__(self) -> str:
        return f"{_num(self.strike)}/{_num(self.dip)}"


@dataclass(frozen=True)
class Lineation:
    """A line (axis), lower hemisphere: trend and plunge, degrees."""
    trend: float
    plunge: float

    def vector(self) -> np.ndarray:
        """Unit vector (north, east, down)."""
        return line_vectors(self.trend, self.plunge)

    def __str__(self) -> str:
        return f"{_num(self.trend)}/{_num(self.plunge)}"


@dataclass(frozen=True)
class FaultSlip:
    """A fault-slip datum or nodal plane: strike, dip, Aki & Richards rake, degrees."""
    strike: float
    dip: float
    rake: float

    @property
    def plane(self) -> Plane:
        return Plane(self.strike, self.dip)

    def __str__(self) -> str:
        return f"{_num(self.strike)}/{_num(self.dip)}/{_num(self.rake)}"


_CONE_KINDS = {0: "region", 1: "line", 2: "plane"}


@dataclass(frozen=True)
class Cone:
    """Axes within half_angle degrees of an axis: kind 'line' (a, b = trend,
    plunge) or 'plane' (a, b = strike, dip of the plane whose pole is the axis)."""
    kind: str
    a: float
    b: float
    half_angle: float

    @classmethod
    def around(cls, axis, half_angle: float) -> "Cone":
        if isinstance(axis, Lineation):
            return cls("line", axis.trend, axis.plunge, half_angle)
        if isinstance(axis, Plane):
            return cls("plane", axis.strike, axis.dip, half_angle)
        raise TypeError("a cone is around a Lineation or a Plane")

    def __str__(self) -> str:
        return f"{self.kind} {_num(self.a)}/{_num(self.b)} within {_num(self.half_angle)}"


_FLAG_MISFIT, _FLAG_CONES, _FLAG_PHI, _FLAG_FOCAL, _FLAG_NOT_CONVERGED, _FLAG_FRICTION = (1, 2, 4, 8, 16, 32)
_FLAG_NAMES = {"focal_joint": _FLAG_FOCAL, "not_converged": _FLAG_NOT_CONVERGED}


@dataclass(frozen=True)
class StressTensor:
    """A reduced stress tensor (compression positive, NED, trace 0, unit norm)
    with its data count and the optional quality measures (None when undefined)."""
    components: Tuple[float, float, float, float, float, float]  # nn, ee, dd, ne, nd, ed
    n: int
    misfit: Optional[float] = None
    cones: Optional[Tuple[float, float, float]] = None
    phi_interval: Optional[Tuple[float, float]] = None
    friction: Optional[float] = None
    flags: Tuple[str, ...] = field(default_factory=tuple)

    def matrix(self) -> np.ndarray:
        """The symmetric 3x3 matrix (north, east, down), compression positive."""
        nn, ee, dd, ne, nd, ed = self.components
        return np.array([[nn, ne, nd], [ne, ee, ed], [nd, ed, dd]], float)

    def principal_axes(self) -> Tuple[np.ndarray, np.ndarray]:
        """(values, axes): principal stresses in descending order (sigma1 first)
        and their unit axes as the columns of a 3x3 array."""
        w, v = np.linalg.eigh(self.matrix())
        return w[::-1], v[:, ::-1]

    def to_json(self) -> dict:
        d = {"components": list(self.components), "n": self.n}
        if self.misfit is not None:
            d["misfit"] = self.misfit
        if self.cones is not None:
            d["cones"] = list(self.cones)
        if self.phi_interval is not None:
            d["phi_interval"] = list(self.phi_interval)
        if self.friction is not None:
            d["friction"] = self.friction
        if self.flags:
            d["flags"] = list(self.flags)
        return d

    @classmethod
    def from_json(cls, d: dict) -> "StressTensor":
        opt = lambda k: tuple(d[k]) if k in d else None  # noqa: E731
        return cls(tuple(float(x) for x in d["components"]), int(d["n"]), d.get("misfit"), opt("cones"),
                   opt("phi_interval"), d.get("friction"), tuple(d.get("flags", ())))

    def __str__(self) -> str:
        def enc(v):
            if isinstance(v, list):
                return "[" + ", ".join(enc(x) for x in v) + "]"
            if isinstance(v, str):
                return json.dumps(v)
            if isinstance(v, int):
                return str(v)
            return _num(v)
        return "{" + ", ".join(f'"{k}": {enc(v)}' for k, v in self.to_json().items()) + "}"


_GRID_KINDS = {1: "density", 2: "right_dihedra"}


def grid_nodes(spacing: float) -> Tuple[np.ndarray, np.ndarray]:
    """Trend and plunge (degrees) of the nodes of a sphere_grid of the given
    spacing, in the order of its values: rings of constant plunge 0, s, 2s, ...,
    a ring at plunge p with round(360 cos p / s) nodes evenly spaced in trend
    from 0 (the horizontal ring over trends [0, 180) only), one node at 90."""
    rings = int(math.floor(90.0 / spacing + 0.5))
    trends, plunges = [], []
    for i in range(rings + 1):
        if i == rings:
            trends.append(0.0)
            plunges.append(90.0)
            break
        p = i * spacing
        m = max(1, int(math.floor(360.0 * math.cos(math.radians(p)) / spacing + 0.5)))
        if i == 0:
            m = (m + 1) // 2
        step = (180.0 if i == 0 else 360.0) / m
        trends.extend(j * step for j in range(m))
        plunges.extend([p] * m)
    return np.array(trends), np.array(plunges)


@dataclass(frozen=True, eq=False)
class SphereGrid:
    """Values at the nodes of a lower-hemisphere grid (density in multiples of
    uniform density, or right-dihedra percentages)."""
    kind: str
    spacing: float
    n: int
    values: np.ndarray

    def nodes(self) -> Tuple[np.ndarray, np.ndarray]:
        """(trend, plunge) arrays of the nodes, in the order of values."""
        return grid_nodes(self.spacing)

    def vectors(self) -> np.ndarray:
        """Unit vectors (north, east, down) of the nodes, shape (len(values), 3)."""
        return line_vectors(*self.nodes())

    def __eq__(self, other) -> bool:
        return (isinstance(other, SphereGrid) and (self.kind, self.spacing, self.n) ==
                (other.kind, other.spacing, other.n) and np.array_equal(self.values, other.values))

    def __str__(self) -> str:
        vals = ", ".join(_num(v) for v in self.values)
        return f'{{"kind": "{self.kind}", "spacing": {_num(self.spacing)}, "n": {self.n}, "values": [{vals}]}}'


# ---- loaders ------------------------------------------------------------------------

def _text(data) -> str:
    return bytes(data).decode()


def _fields(data) -> list:
    return [float(x) for x in _text(data).split("/")]


def _check_version(buf, name):
    if not buf or buf[0] != _WIRE_VERSION:
        raise ValueError(f"unknown binary format version of {name}: {buf[:1]!r}")


class _PlaneText(Loader):
    def load(self, data):
        return Plane(*_fields(data))


class _PlaneBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "plane")
        return Plane(*struct.unpack("!2d", b[1:17]))


class _LineText(Loader):
    def load(self, data):
        return Lineation(*_fields(data))


class _LineBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "lineation")
        return Lineation(*struct.unpack("!2d", b[1:17]))


class _FaultText(Loader):
    def load(self, data):
        return FaultSlip(*_fields(data))


class _FaultBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "fault_slip")
        return FaultSlip(*struct.unpack("!3d", b[1:25]))


class _ConeText(Loader):
    def load(self, data):
        kind, axis, _, radius = _text(data).split(" ")
        a, b = (float(x) for x in axis.split("/"))
        return Cone(kind, a, b, float(radius))


class _ConeBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "cone")
        kind, a, bb, r = struct.unpack("!i3d", b[1:29])
        return Cone(_CONE_KINDS[kind], a, bb, r)


class _StressText(Loader):
    def load(self, data):
        return StressTensor.from_json(json.loads(_text(data)))


class _StressBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "stress_tensor")
        f = struct.unpack("!13d", b[1:105])
        count, flags = struct.unpack("!qi", b[105:117])
        return StressTensor(
            tuple(f[0:6]), count,
            f[6] if flags & _FLAG_MISFIT else None,
            tuple(f[7:10]) if flags & _FLAG_CONES else None,
            tuple(f[10:12]) if flags & _FLAG_PHI else None,
            f[12] if flags & _FLAG_FRICTION else None,
            tuple(k for k, bit in _FLAG_NAMES.items() if flags & bit))


class _GridText(Loader):
    def load(self, data):
        d = json.loads(_text(data))
        return SphereGrid(d["kind"], float(d["spacing"]), int(d["n"]), np.array(d["values"], float))


class _GridBinary(Loader):
    format = Format.BINARY

    def load(self, data):
        b = bytes(data)
        _check_version(b, "sphere_grid")
        kind, spacing, n, count = struct.unpack("!idqi", b[1:25])
        values = np.frombuffer(b, dtype=">f8", count=count, offset=25).astype(np.float64)
        return SphereGrid(_GRID_KINDS[kind], spacing, n, values)


# ---- dumpers ------------------------------------------------------------------------

class _TextDumper(Dumper):
    def dump(self, obj):
        return str(obj).encode()


class _PlaneBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, obj):
        return struct.pack("!B2d", _WIRE_VERSION, obj.strike, obj.dip)


class _LineBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, obj):
        return struct.pack("!B2d", _WIRE_VERSION, obj.trend, obj.plunge)


class _FaultBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, obj):
        return struct.pack("!B3d", _WIRE_VERSION, obj.strike, obj.dip, obj.rake)


class _ConeBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, obj):
        kind = {v: k for k, v in _CONE_KINDS.items()}[obj.kind]
        return struct.pack("!Bi3d", _WIRE_VERSION, kind, obj.a, obj.b, obj.half_angle)


class _StressBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, t):
        flags = 0
        f = list(t.components) + [0.0] * 7
        if t.misfit is not None:
            flags |= _FLAG_MISFIT
            f[6] = t.misfit
        if t.cones is not None:
            flags |= _FLAG_CONES
            f[7:10] = t.cones
        if t.phi_interval is not None:
            flags |= _FLAG_PHI
            f[10:12] = t.phi_interval
        if t.friction is not None:
            flags |= _FLAG_FRICTION
            f[12] = t.friction
        for name in t.flags:
            flags |= _FLAG_NAMES[name]
        return struct.pack("!B13dqi", _WIRE_VERSION, *f, t.n, flags)


class _GridBinaryDumper(Dumper):
    format = Format.BINARY

    def dump(self, g):
        kind = {v: k for k, v in _GRID_KINDS.items()}[g.kind]
        values = np.asarray(g.values, dtype=">f8")
        return struct.pack("!Bidqi", _WIRE_VERSION, kind, g.spacing, g.n, len(values)) + values.tobytes()


_TYPES = [
    ("plane", Plane, _PlaneText, _PlaneBinary, _PlaneBinaryDumper),
    ("lineation", Lineation, _LineText, _LineBinary, _LineBinaryDumper),
    ("fault_slip", FaultSlip, _FaultText, _FaultBinary, _FaultBinaryDumper),
    ("cone", Cone, _ConeText, _ConeBinary, _ConeBinaryDumper),
    ("stress_tensor", StressTensor, _StressText, _StressBinary, _StressBinaryDumper),
    ("sphere_grid", SphereGrid, _GridText, _GridBinary, _GridBinaryDumper),
]


def register(context, schema: Optional[str] = None) -> None:
    """Register the striae types on a psycopg 3 connection or cursor (and so on
    the cursors it makes). The types are looked up by name on the context's
    connection, in `schema` when given (the extension's schema if it is not on
    the search_path). Python objects are sent in binary by default (%b or %s
    placeholders), in text with %t."""
    conn = getattr(context, "connection", context)
    for name, cls, text_loader, binary_loader, binary_dumper in _TYPES:
        info = TypeInfo.fetch(conn, f"{schema}.{name}" if schema else name)
        if info is None:
            raise LookupError(f"type {name} not found: is the striae extension installed"
                              + (f" in schema {schema}?" if schema else " and on the search_path?"))
        info.register(context)  # arrays of the type
        adapters = context.adapters
        adapters.register_loader(info.oid, text_loader)
        adapters.register_loader(info.oid, binary_loader)
        adapters.register_dumper(cls, type(f"{cls.__name__}TextDumper", (_TextDumper,), {"oid": info.oid}))
        adapters.register_dumper(cls, type(f"{cls.__name__}BinaryDumper", (binary_dumper,), {"oid": info.oid}))
