"""A small planar frame and truss model, condensed to one lateral DOF per floor.

The model lives in the element's own vertical plane: x along its line from its start, z up from
its base. Every node sits on a floor and carries (u, w, θ): lateral and vertical translation and
rotation, counter-clockwise positive. All nodes of a floor share that floor's lateral DOF (the
floor is rigid in its plane); nodes on the base (floor 0) are fixed against translation and, if
asked, against rotation. Every other DOF is condensed out statically, which is exact here because
no load acts on the condensed DOFs:

    K = K_ll − K_li K_ii⁻¹ K_il,        d_i = −K_ii⁻¹ K_il d_l.

Members are straight two-node elements: trusses (axial only) and beams with axial, flexural and
optional shear flexibility — the exact Timoshenko stiffness, Euler–Bernoulli when the shear
stiffness is infinite — with optional end hinges. A rotation that nothing resists (the node of a
truss-only joint) is not made a DOF at all, so pin-jointed frames carry no spurious mechanism.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import numpy.typing as npt
from scipy.linalg import LinAlgError, cho_factor, cho_solve

from core.arrays import FloatArray, frozen_array
from core.errors import ModelError

IntArray = npt.NDArray[np.intp]
_MemberRow = tuple[int, int, float, float, float, bool, bool]
"""Start and end node, EA (kN), EI (kN·m², 0 for a truss), κGA (kN, infinite for
Euler–Bernoulli), moment-free start, moment-free end."""


class PlanarFrame:
    """Builder of a planar model over given storeys: add nodes and members, then condense."""

    def __init__(self, storey_heights: tuple[float, ...]) -> None:
        self.floors = len(storey_heights)
        self.elevations = np.concatenate(([0.0], np.cumsum(storey_heights)))
        self._x: list[float] = []
        self._floor: list[int] = []
        self._fixed_rotation: list[bool] = []
        self._members: list[_MemberRow] = []

    def add_node(self, x: float, floor: int, fixed_rotation: bool = False) -> int:
        """A node at ``x`` on ``floor`` (0 = the base: translations fixed); returns its index."""
        self._x.append(x)
        self._floor.append(floor)
        self._fixed_rotation.append(fixed_rotation)
        return len(self._x) - 1

    def add_grid(self, length: float, bays: int, fixed_base: bool = False) -> list[list[int]]:
        """Nodes at the ``bays + 1`` column lines of equal bays over ``length`` on every floor, from
        the base up: ``grid[floor][line]``; ``fixed_base`` fixes the base nodes' rotation."""
        width = length / bays
        return [
            [self.add_node(k * width, f, fixed_rotation=fixed_base and f == 0) for k in range(bays + 1)]
            for f in range(len(self.elevations))
        ]

    def add_truss(self, start: int, end: int, axial: float) -> int:
        """A pin-ended axial member of stiffness EA = ``axial``; returns its index."""
        return self._add((start, end, axial, 0.0, math.inf, False, False))

    def add_beam(
        self,
        start: int,
        end: int,
        axial: float,
        flexural: float,
        shear: float = math.inf,
        hinge_start: bool = False,
        hinge_end: bool = False,
    ) -> int:
        """A frame member (EA, EI, κGA) with optional moment-free ends; returns its index."""
        return self._add((start, end, axial, flexural, shear, hinge_start, hinge_end))

    def _add(self, member: _MemberRow) -> int:
        if abs(self._floor[member[0]] - self._floor[member[1]]) > 1:
            raise ValueError("a member may join nodes on the same or adjacent floors only")
        self._members.append(member)
        return len(self._members) - 1

    def condense(self, what: str) -> CondensedFrame:
        """Assemble and condense; ModelError if the model is unstable or its numbers degenerate.

        ``what`` names the element in the message.
        """
        try:
            with np.errstate(over="raise", invalid="raise", divide="raise"):
                return self._condense()
        except (LinAlgError, ValueError, FloatingPointError) as error:
            raise ModelError(
                "",
                f"the planar model of this {what} is unstable or degenerate; check its sizes and sections",
            ) from error

    def _condense(self) -> CondensedFrame:
        n = self.floors
        floor = np.array(self._floor, dtype=np.intp)
        x = np.array(self._x)
        z = self.elevations[floor]
        columns = list(zip(*self._members, strict=True))
        start, end = np.array(columns[0], dtype=np.intp), np.array(columns[1], dtype=np.intp)
        EA, EI, GA = (np.array(c, dtype=float) for c in columns[2:5])
        hinges = np.column_stack((np.array(columns[5], dtype=bool), np.array(columns[6], dtype=bool)))

        # Lateral DOFs first (one per floor), then vertical ones, then rotations. A node's rotation
        # is a DOF only where a beam is rigidly connected and no support fixes it.
        lateral = np.where(floor > 0, floor - 1, -1)
        vertical = np.full(len(x), -1, dtype=np.intp)
        vertical[floor > 0] = n + np.arange(np.count_nonzero(floor > 0))
        rigid_end = (EI > 0.0)[:, None] & ~hinges
        turns = np.zeros(len(x), dtype=bool)
        turns[start[rigid_end[:, 0]]] = True
        turns[end[rigid_end[:, 1]]] = True
        turns &= ~np.array(self._fixed_rotation, dtype=bool)
        rotation = np.full(len(x), -1, dtype=np.intp)
        rotation[turns] = n + np.count_nonzero(floor > 0) + np.arange(np.count_nonzero(turns))
        total = n + np.count_nonzero(floor > 0) + np.count_nonzero(turns)

        end_rotation = np.where(rigid_end, np.column_stack((rotation[start], rotation[end])), -1)
        dofs = np.column_stack(
            (
                lateral[start],
                vertical[start],
                end_rotation[:, 0],
                lateral[end],
                vertical[end],
                end_rotation[:, 1],
            ),
        )
        dofs = np.where(dofs < 0, total, dofs)  # fixed DOFs point at a trailing zero slot

        local, transform = _member_matrices(x[end] - x[start], z[end] - z[start], EA, EI, GA)
        _release(local, hinges & (EI > 0.0)[:, None])
        force_matrix = local @ transform
        global_k = transform.transpose(0, 2, 1) @ force_matrix
        size = total + 1
        flat = (dofs[:, :, None] * size + dofs[:, None, :]).ravel()
        K = np.asarray(np.bincount(flat, weights=global_k.ravel(), minlength=size * size), dtype=np.float64)
        K = K.reshape(size, size)
        stiffness, recovery = _condense(K[:total, :total], n)

        lower_is_end = floor[end] < floor[start]
        return CondensedFrame(
            stiffness=frozen_array(stiffness),
            recovery=recovery,
            member_dofs=dofs,
            force_matrix=force_matrix,
            direction=transform[:, 0, :2].copy(),
            storey=np.where(floor[start] != floor[end], np.minimum(floor[start], floor[end]), -1),
            lower_end=lower_is_end.astype(np.intp),
            lower_x=np.where(lower_is_end, x[end], x[start]),
        )


def _member_matrices(
    dx: FloatArray, dz: FloatArray, EA: FloatArray, EI: FloatArray, GA: FloatArray
) -> tuple[FloatArray, FloatArray]:
    """Local stiffness (m, 6, 6) and global-to-local rotation (m, 6, 6) of every member.

    Local DOFs [u', w', θ] at each end, x' from start to end. The bending block is the exact
    Timoshenko beam stiffness with Φ = 12EI/(κGA·L²) (Przemieniecki, Theory of Matrix Structural
    Analysis, §5.6 [memory]); Φ = 0 gives the Euler–Bernoulli beam.
    """
    L = np.hypot(dx, dz)
    c, s = dx / L, dz / L
    phi = 12.0 * EI / (GA * L**2)
    D = EI / ((1.0 + phi) * L**3)
    a, b12, b6, b4, b2 = EA / L, 12.0 * D, 6.0 * L * D, (4.0 + phi) * L**2 * D, (2.0 - phi) * L**2 * D
    k = np.zeros((len(L), 6, 6))
    k[:, 0, 0] = k[:, 3, 3] = a
    k[:, 0, 3] = k[:, 3, 0] = -a
    k[:, 1, 1] = k[:, 4, 4] = b12
    k[:, 1, 4] = k[:, 4, 1] = -b12
    k[:, 1, 2] = k[:, 2, 1] = k[:, 1, 5] = k[:, 5, 1] = b6
    k[:, 2, 4] = k[:, 4, 2] = k[:, 4, 5] = k[:, 5, 4] = -b6
    k[:, 2, 2] = k[:, 5, 5] = b4
    k[:, 2, 5] = k[:, 5, 2] = b2
    T = np.zeros((len(L), 6, 6))
    for o in (0, 3):
        T[:, o, o] = T[:, o + 1, o + 1] = c
        T[:, o, o + 1] = s
        T[:, o + 1, o] = -s
        T[:, o + 2, o + 2] = 1.0
    return k, T


def _release(local: FloatArray, hinges: npt.NDArray[np.bool_]) -> None:
    """Make hinged member ends moment-free by condensing their rotation out of the member (in place).

    k ← k − k[:, r] k[r, :] / k[r, r] for the rotation r of each hinged end; the row and column of
    r become zero, so that end rotates freely and carries no moment.
    """
    for side, r in ((0, 2), (1, 5)):
        rows = np.flatnonzero(hinges[:, side])
        if rows.size:
            k = local[rows]
            local[rows] = k - k[:, :, r, None] * k[:, None, r, :] / k[:, r, r, None, None]


def _condense(K: FloatArray, n: int) -> tuple[FloatArray, FloatArray]:
    """Condensed n × n stiffness and the recovery matrix d_i = R d_l of the internal DOFs.

    Cholesky factors both K_ii and the result, so a mechanism raises LinAlgError.
    """
    K_ll, K_li, K_ii = K[:n, :n], K[:n, n:], K[n:, n:]
    internal = cho_solve(cho_factor(K_ii), K_li.T)
    condensed = K_ll - K_li @ internal
    condensed = 0.5 * (condensed + condensed.T)
    cho_factor(condensed)
    return condensed, -internal


@dataclass(frozen=True)
class CondensedFrame:
    """A condensed planar model: its lateral stiffness and what is needed to recover members."""

    stiffness: FloatArray
    """n × n lateral stiffness, kN/m, DOF i = floor i + 1 relative to the base (read-only)."""
    recovery: FloatArray
    """(internal DOFs, n): internal displacements per unit floor displacement."""
    member_dofs: IntArray
    """(members, 6) DOF numbers of each member's end DOFs; the last number is a fixed zero."""
    force_matrix: FloatArray
    """(members, 6, 6) local end forces per unit global end displacement (k_local · T)."""
    direction: FloatArray
    """(members, 2) unit vector (cos, sin) of each member from its start to its end."""
    storey: IntArray
    """(members,) 0-based storey each member crosses (its lower end on that storey's base), −1 if none."""
    lower_end: IntArray
    """(members,) 0 if the member's start is its lower end, 1 if its end is."""
    lower_x: FloatArray
    """(members,) x of each member's lower end."""

    def end_forces(self, displacements: FloatArray) -> FloatArray:
        """(members, 6) local end forces [N, V, M] at start and end acting on each member.

        For any member the axial force, tension positive, is the entry at index 3.
        """
        q = np.concatenate((displacements, self.recovery @ displacements, [0.0]))
        forces: FloatArray = np.einsum("mij,mj->mi", self.force_matrix, q[self.member_dofs])
        return forces

    def storey_resultants(self, forces: FloatArray) -> tuple[FloatArray, FloatArray]:
        """Storey shear (kN) and overturning moment at each storey's base (kN·m) from end forces.

        A cut just above floor i − 1 meets the members of storey i; the forces at their lower ends
        balance the floor loads above, so V_i = −Σ f_x and M_i = Σ (x·f_z + m) over the cut
        (Σ f_z = 0 under lateral load, so the moment does not depend on where x is measured from).
        """
        n = self.stiffness.shape[0]
        crossing = self.storey >= 0
        rows = np.arange(len(self.storey))[crossing]
        offset = 3 * self.lower_end[crossing]
        axial = forces[rows, offset]
        transverse = forces[rows, offset + 1]
        moment = forces[rows, offset + 2]
        c, s = self.direction[crossing, 0], self.direction[crossing, 1]
        fx = c * axial - s * transverse
        fz = s * axial + c * transverse
        storey = self.storey[crossing]
        shear = -np.asarray(np.bincount(storey, weights=fx, minlength=n), dtype=np.float64)
        overturning = np.asarray(
            np.bincount(storey, weights=self.lower_x[crossing] * fz + moment, minlength=n), dtype=np.float64
        )
        return shear, overturning


@dataclass(frozen=True)
class FrameModel:
    """A kind's condensed planar model: its matrix, and the storey resultants of a displacement
    (the part the frame, wall and braced models share; each adds its member numbers)."""

    frame: CondensedFrame

    @property
    def stiffness(self) -> FloatArray:
        return self.frame.stiffness

    def resultants(self, displacements: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray]:
        """Member end forces (members, 6), storey shears (n,) and overturning moments (n,)."""
        end_forces = self.frame.end_forces(displacements)
        shear, overturning = self.frame.storey_resultants(end_forces)
        return end_forces, shear, overturning
