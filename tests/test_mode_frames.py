"""Frame geometry of the animated mode shapes (core.report.mode_frames), checked without a display.

The rigid floor motion is checked against an independent formula: a plan point as a complex
number z moves under a floor motion (u, θ) about the floor's mass centre c to
c + u + (z − c)·e^{iθ} (rotation in the complex plane, any complex-analysis text). Its small-motion
limit is checked against the line vector a = [c, s, s(x − x_m) − c(y − y_m)] of design.md, which
the stiffness assembly uses.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.model import (
    BracedFrame,
    BracePattern,
    Element,
    ElementKind,
    Level,
    MomentFrame,
    Project,
    ShearWall,
    Spring,
)
from core.report.mode_frames import (
    BASE,
    QUAD_ROWS,
    AttachedPoints,
    LayerMotion,
    ViewAngle,
    building_geometry,
    height_profile,
    peak_scale,
    unit_peak,
)
from core.results import FloorMass, Mode

L_SHAPE = ((0.0, 0.0), (30.0, 0.0), (30.0, 12.0), (12.0, 12.0), (12.0, 24.0), (0.0, 24.0))


def _mode(shape: list[list[float]]) -> Mode:
    """A Mode carrying only a shape: these tests are about geometry, not about the eigenproblem."""
    return Mode(
        number=1,
        omega=2 * math.pi,
        shape=np.array(shape, dtype=float),
        participation=(0.0, 0.0, 0.0),
        mass_ratio=(0.0, 0.0, 0.0),
        cumulative=(0.0, 0.0, 0.0),
        shares=(1.0, 0.0, 0.0),
    )


@pytest.fixture
def l_building() -> tuple[Project, tuple[FloorMass, ...]]:
    """A 3-level L-shaped building with one element of each kind; masses centred off the centroid."""
    levels = tuple(
        Level(name=f"L{j + 1}", height=3.5, outline=L_SHAPE, openings=(((2.0, 2.0), (5.0, 2.0), (5.0, 6.0)),))
        for j in range(3)
    )
    elements = (
        Element("B1", (0.0, 0.0), (12.0, 0.0), 0, 3, BracedFrame(pattern=BracePattern.CROSS, bays=2)),
        Element("B2", (30.0, 0.0), (30.0, 12.0), 0, 2, BracedFrame(pattern=BracePattern.SINGLE)),
        Element("B3", (0.0, 24.0), (12.0, 24.0), 1, 3, BracedFrame(pattern=BracePattern.CHEVRON)),
        Element("W1", (0.0, 6.0), (0.0, 18.0), 0, 3, ShearWall()),
        Element("M1", (15.0, 12.0), (30.0, 12.0), 0, 3, MomentFrame(bays=3)),
        Element("S1", (12.0, 14.0), (12.0, 22.0), 0, 3, Spring((1e5, 1e5, 1e5))),
    )
    project = Project(levels=levels, elements=elements)
    floors = tuple(
        FloorMass(j + 1, f"L{j + 1}", 3.5 * (j + 1), 500.0, 400.0, (11.0 + j, 9.5 - j), 4.0e4)
        for j in range(3)
    )
    return project, floors


def _all_layers(geometry) -> dict[str, AttachedPoints]:
    layers = {
        "outlines": geometry.outlines,
        "ground": geometry.ground,
        "walls": geometry.wall_panels,
        "mass": geometry.mass_markers,
        "mass_axis": geometry.mass_axis,
    }
    for kind in ElementKind:
        layers[f"plan_{kind.value}"] = geometry.plan_elements[kind]
        layers[f"lines_{kind.value}"] = geometry.frame_lines[kind]
    return layers


SHAPE = [[0.010, -0.004, 0.0008], [0.021, -0.007, 0.0015], [0.030, -0.011, 0.0021]]


def test_phase_zero_is_the_undeformed_building(l_building):
    project, floors = l_building
    geometry = building_geometry(project, floors)
    layers = _all_layers(geometry)
    motion = LayerMotion(layers, floors, np.array(SHAPE), scale=300.0)
    frame = motion.plan(0.0)
    for name, points in layers.items():
        np.testing.assert_allclose(frame[name], points.xy, atol=1e-12, err_msg=name)


def test_peak_is_the_original_plus_the_scaled_rigid_motion(l_building):
    """At phase π/2 each point sits at c + s·u + (p − c)·e^{i s θ} (complex-plane rotation)."""
    project, floors = l_building
    geometry = building_geometry(project, floors)
    layers = _all_layers(geometry)
    scale = 300.0
    motion = LayerMotion(layers, floors, np.array(SHAPE), scale=scale)
    frame = motion.plan(math.pi / 2)
    for name, points in layers.items():
        for (x, y), floor, moved in zip(points.xy, points.floor, frame[name], strict=True):
            if floor == BASE:
                expected = complex(x, y)
            else:
                c = complex(*floors[floor].centre)
                ux, uy, theta = SHAPE[floor]
                expected = c + scale * complex(ux, uy) + (complex(x, y) - c) * np.exp(1j * scale * theta)
            assert moved[0] == pytest.approx(expected.real, abs=1e-9), name
            assert moved[1] == pytest.approx(expected.imag, abs=1e-9), name


def test_half_cycle_later_the_motion_is_reversed(l_building):
    project, floors = l_building
    layers = {"outlines": building_geometry(project, floors).outlines}
    motion = LayerMotion(layers, floors, np.array(SHAPE), scale=1.0)
    points = layers["outlines"]
    ahead, behind = motion.plan(math.pi / 2)["outlines"], motion.plan(-math.pi / 2)["outlines"]
    # Translations cancel and the two turns ±θ average to a shrink by cos θ about the centre.
    centres = np.array([floors[f].centre for f in points.floor])
    cos_theta = np.cos([SHAPE[f][2] for f in points.floor])[:, None]
    np.testing.assert_allclose((ahead + behind) / 2, centres + (points.xy - centres) * cos_theta, atol=1e-12)


def test_small_motion_matches_the_assembly_line_vector(l_building):
    """Along an element's line the displacement is s·a·φ, a = [c, s, s(x − x_m) − c(y − y_m)] (design.md)."""
    project, floors = l_building
    geometry = building_geometry(project, floors)
    scale = 1e-4
    points = geometry.plan_elements[ElementKind.BRACED_FRAME]
    motion = LayerMotion({"plan": points}, floors, np.array(SHAPE), scale)
    moved = motion.plan(math.pi / 2)["plan"]
    for i in range(0, len(points), 2):  # each segment is one element on one floor
        start, end, floor = points.xy[i], points.xy[i + 1], int(points.floor[i])
        c, s = (end - start) / np.linalg.norm(end - start)
        xm, ym = floors[floor].centre
        a = np.array([c, s, s * (start[0] - xm) - c * (start[1] - ym)])
        along = float(np.dot(moved[i] - start, (c, s)))
        assert along == pytest.approx(scale * a @ np.array(SHAPE[floor]), rel=1e-6)


def test_pure_torsion_of_a_doubly_symmetric_plan_leaves_the_mass_centre_fixed():
    """Four equal walls symmetric about both axes: the torsion mode is pure and the centre stays put."""
    from core.analysis import analyse  # the lead's engine; the mode must come out of a real analysis

    square = ((0.0, 0.0), (20.0, 0.0), (20.0, 20.0), (0.0, 20.0))
    levels = tuple(Level(name=f"L{j + 1}", height=3.0, outline=square) for j in range(2))
    walls = (
        Element("W1", (0.0, 6.0), (0.0, 14.0), 0, 2, ShearWall()),
        Element("W2", (20.0, 6.0), (20.0, 14.0), 0, 2, ShearWall()),
        Element("W3", (6.0, 0.0), (14.0, 0.0), 0, 2, ShearWall()),
        Element("W4", (6.0, 20.0), (14.0, 20.0), 0, 2, ShearWall()),
    )
    project = Project(levels=levels, elements=walls)
    results = analyse(project)
    torsion = max(results.modes, key=lambda m: m.shares[2])
    assert torsion.shares[2] == pytest.approx(1.0, abs=1e-9)
    geometry = building_geometry(project, results.floors)
    scale = peak_scale(geometry, results.floors, torsion, peak=2.0)
    layers = {"mass": geometry.mass_markers, "outlines": geometry.outlines}
    frame = LayerMotion(layers, results.floors, torsion.shape, scale).plan(math.pi / 2)
    for j, floor in enumerate(results.floors):
        marker = frame["mass"][geometry.mass_markers.floor == j]
        undeformed = geometry.mass_markers.xy[geometry.mass_markers.floor == j]
        np.testing.assert_allclose(marker.mean(axis=0), floor.centre, atol=1e-9)  # the centre itself stays
        assert np.max(np.abs(marker - undeformed)) > 0.0  # while the marker turns about it
    # The far corner turns on a circle: chord 2r·sin(α/2) where the linear measure r·α was set to 2 m.
    angle = scale * np.max(np.abs(torsion.shape[:, 2]))
    reach = 2.0 / angle
    corners = frame["outlines"] - geometry.outlines.xy
    assert np.max(np.hypot(corners[:, 0], corners[:, 1])) == pytest.approx(2 * reach * math.sin(angle / 2))


def test_peak_scale_sets_the_largest_outline_displacement(l_building):
    project, floors = l_building
    geometry = building_geometry(project, floors)
    mode = _mode(SHAPE)
    scale = peak_scale(geometry, floors, mode, peak=1.5)
    assert scale * unit_peak(geometry.outlines, floors, mode.shape) == pytest.approx(1.5)
    # The farthest outline point of the top floor from its centre, by hand: θ ẑ×r added to u.
    cx, cy = floors[2].centre
    ux, uy, th = SHAPE[2]
    by_hand = max(math.hypot(ux - th * (y - cy), uy + th * (x - cx)) for x, y in L_SHAPE)
    assert unit_peak(geometry.outlines, floors, mode.shape) == pytest.approx(by_hand)
    assert peak_scale(geometry, floors, _mode([[0, 0, 0]] * 3), peak=1.0) == 0.0


def test_element_lines_per_storey(l_building):
    project, floors = l_building
    geometry = building_geometry(project, floors)
    braced = geometry.frame_lines[ElementKind.BRACED_FRAME]
    # B1: 3 storeys × (beam + 3 columns + 2 bays × 2 braces) = 24; B2: 2 × (1 + 2 + 1) = 8;
    # B3 (storeys 2-3, chevron): 2 × (1 + 2 + 2) = 10 segments.
    assert len(braced) == 2 * (24 + 8 + 10)
    moment = geometry.frame_lines[ElementKind.MOMENT_FRAME]
    assert len(moment) == 2 * 3 * (1 + 4)
    spring = geometry.frame_lines[ElementKind.SPRING]
    assert len(spring) == 2 * 3 * 2
    assert len(geometry.wall_panels) == QUAD_ROWS * 3
    # The first storey's columns stand on the fixed base; their tops are on floor 0.
    base_rows = braced.floor == BASE
    assert np.all(braced.z[base_rows] == 0.0)
    assert set(braced.floor[~base_rows]) == {0, 1, 2}
    # B3 starts at level 1, so base rows come only from storey 1 of B1 (3 columns, 4 braces)
    # and of B2 (2 columns, 1 brace).
    assert np.count_nonzero(base_rows) == 7 + 3
    # Plan lines: each element once on every floor it reaches.
    assert len(geometry.plan_elements[ElementKind.BRACED_FRAME]) == 2 * (3 + 2 + 2)
    assert len(geometry.outlines) == 3 * 2 * (6 + 3)


def test_rigidity_markers_follow_their_floor(l_building):
    project, floors = l_building
    centres = [(14.0, 8.0), None, (15.0, 9.0)]
    geometry = building_geometry(project, floors, centres)
    assert set(geometry.rigidity_markers.floor) == {0, 2}
    np.testing.assert_allclose(geometry.rigidity_markers.on_floor(2).xy.mean(axis=0), (15.0, 9.0))
    assert len(geometry.rigidity_axis) == 2  # only base → floor 0: floors 0-1 and 1-2 lack a pair
    frame = LayerMotion({"cr": geometry.rigidity_markers}, floors, np.array(SHAPE), 100.0).plan(math.pi / 2)
    moved = frame["cr"][geometry.rigidity_markers.floor == 2].mean(axis=0)
    c = complex(*floors[2].centre)
    ux, uy, theta = SHAPE[2]
    expected = c + 100.0 * complex(ux, uy) + (complex(15.0, 9.0) - c) * np.exp(1j * 100.0 * theta)
    assert moved == pytest.approx((expected.real, expected.imag), abs=1e-9)


def test_view_angle_projection():
    front = ViewAngle(azimuth=math.radians(-90.0), elevation=0.0)
    screen = front.project(np.array([[3.0, 7.0]]), np.array([5.0]))
    np.testing.assert_allclose(screen, [[3.0, 5.0]], atol=1e-12)  # front elevation: x right, z up
    side = ViewAngle(azimuth=0.0, elevation=0.0)
    screen = side.project(np.array([[3.0, 7.0]]), np.array([5.0]))
    np.testing.assert_allclose(screen, [[7.0, 5.0]], atol=1e-12)  # side elevation from +x: y right
    oblique = ViewAngle(math.radians(-35.0), math.radians(30.0))
    A = oblique.axes
    np.testing.assert_allclose(A @ A.T, np.eye(2), atol=1e-12)
    rng = np.random.default_rng(5)
    xy, z = rng.normal(size=(50, 2)), rng.normal(size=50)
    lengths = np.hypot(*oblique.project(xy, z).T)
    assert np.all(lengths <= np.sqrt((xy**2).sum(axis=1) + z**2) + 1e-12)  # a fixed range fits every angle
    assert oblique.rotated(0.0, 10.0).elevation == ViewAngle.MAX_ELEVATION


def test_height_profile_scales_twist_by_radius_of_gyration(l_building):
    _, floors = l_building
    profile = height_profile(floors, _mode(SHAPE))
    radius = floors[0].radius_of_gyration
    assert radius == pytest.approx(10.0)
    np.testing.assert_allclose(profile.elevation, [0.0, 3.5, 7.0, 10.5])
    largest = max(abs(v) for row in SHAPE for v in (row[0], row[1], row[2] * radius))
    np.testing.assert_allclose(profile.twist, [0.0] + [row[2] * radius / largest for row in SHAPE])
    np.testing.assert_allclose(profile.u_x, [0.0] + [row[0] / largest for row in SHAPE])
    assert max(np.max(np.abs(profile.u_x)), np.max(np.abs(profile.u_y)), np.max(np.abs(profile.twist))) == 1.0


def test_a_shape_for_another_building_is_refused(l_building):
    project, floors = l_building
    with pytest.raises(ValueError, match="2 floors"):
        LayerMotion({"o": building_geometry(project, floors).outlines}, floors, np.zeros((2, 3)), 1.0)
