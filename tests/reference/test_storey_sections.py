"""Sections that change storey by storey, against independent references.

Sources:
- OpenSeesPy (PyPI ``openseespy``, the Python interpreter of OpenSees, an independent general
  finite-element library; checked with 3.7.1.2): planar models (ndm 2, ndf 3) of the same members,
  floors rigid by ``equalDOF`` on the lateral DOF, ``Truss`` braces and columns,
  ``elasticBeamColumn`` frame members, ``ElasticTimoshenkoBeam`` wall storeys, each storey with its
  own section; lumped floor masses and ``eigen -fullGenLapack`` for the periods. The 3D check of a
  whole stepped building uses tests/reference/opensees_building.py.
- Plane-section formulas for the generic steel shapes (Roark's Formulas for Stress and Strain,
  7th ed., Table A.1: hollow rectangle, hollow circle, I section), worked by hand below.
"""

from __future__ import annotations

from dataclasses import replace
from importlib.metadata import version
from types import ModuleType

import numpy as np
import pytest
from scipy.linalg import eigh

from core.analysis import analyse
from core.elements import condensed_stiffness
from core.errors import ModelError
from core.model import BracedFrame, BracePattern, Element, Level, MomentFrame, Project, ShearWall
from core.model.properties import BraceStorey, FrameStorey, WallStorey
from core.model.sections import CATALOGUE, steel_shape
from tests.reference.opensees_building import opensees_modes
from tests.reference.opensees_loader import load_opensees

AGREEMENT = 1e-8
"""Same planar model in both: they agree to rounding; 1e-8 of the largest entry."""
PERIODS = 1e-6
"""Relative agreement of periods asked by the acceptance list."""


@pytest.fixture(scope="module")
def ops() -> ModuleType:
    return load_opensees()


# ------------------------------------------------------------------ generic steel shapes


def test_hollow_and_i_shapes_match_hand_values() -> None:
    """Hand calculations (Roark Table A.1, sharp corners, no fillets), in mm:

    SHS 150×8: A = 150² − 134² = 4544; I = (150⁴ − 134⁴)/12 = 15 319 338.7.
    RHS 200×100×8: A = 200·100 − 184·84 = 4544; I = (100·200³ − 84·184³)/12 = 23 060 138.7.
    CHS 168.3×8: A = π/4 (168.3² − 152.3²) = π/4 · 5129.6 = 4028.78;
                 I = π/64 (168.3⁴ − 152.3⁴) = 12 972 712 (168.3⁴ = 802 299 394, 152.3⁴ = 538 021 478).
    I 300×150×10×7: A = 2·150·10 + 280·7 = 4960; I = (150·300³ − 143·280³)/12 = 75 905 333.3.
    """
    mm2, mm4 = 1e-6, 1e-12
    cases = {
        "SHS 150×8": (4544.0, 15_319_338.7),
        "RHS 200x100x8": (4544.0, 23_060_138.7),
        "CHS 168.3×8": (4028.78, 12_972_712),
        "I 300×150×10×7": (4960.0, 75_905_333.3),
    }
    for name, (area, inertia) in cases.items():
        shape = steel_shape(name)
        assert shape.area == pytest.approx(area * mm2, rel=1e-6), name
        assert shape.inertia == pytest.approx(inertia * mm4, rel=1e-7), name


def test_every_catalogue_size_is_a_valid_shape_named_as_it_prints() -> None:
    for name in CATALOGUE:
        shape = steel_shape(name)
        assert shape.designation == name
        assert 0 < shape.area < 0.1 and 0 < shape.inertia < 0.01


@pytest.mark.parametrize(
    ("name", "words"),
    [("HEX 100", "unknown section family"), ("SHS 100", "side × wall"), ("SHS 100×60", "too thick"),
     ("I 300×150×10", "depth × flange width"), ("pipe", "not a section name"), ("CHS 0.1×0.01", "0.5 to 5000")],
)  # fmt: skip
def test_bad_shape_names_are_refused_with_what_is_wrong(name: str, words: str) -> None:
    with pytest.raises(ModelError, match=words):
        steel_shape(name)


def test_a_named_shape_sets_the_area_and_inertia() -> None:
    frame = BracedFrame(brace_shape="chs 168.3 x 8", brace_area=1.0)
    assert frame.brace_shape == "CHS 168.3×8"
    assert frame.brace_area == pytest.approx(steel_shape("CHS 168.3×8").area)
    storey = FrameStorey(column_shape="I 400×300×24×13.5")
    assert storey.column_inertia == pytest.approx(steel_shape("I 400×300×24×13.5").inertia)


def test_per_storey_sections_keep_the_element_fields_at_the_lowest_storey() -> None:
    wall = ShearWall(thickness=0.9, storeys=(WallStorey(0.35, 0.5), WallStorey(0.2, 0.6)))
    assert (wall.thickness, wall.stiffness_factor) == (0.35, 0.5)
    with pytest.raises(ModelError, match="needs 3 values"):
        Element("W1", (0, 0), (5, 0), 0, 3, wall)


# ------------------------------------------------------------------ planar OpenSees models


def _solve(ops: ModuleType, masters: list[int], n: int) -> np.ndarray:
    """Condensed K = F⁻¹ from a unit load at each master node in turn (linear static)."""
    F = np.empty((n, n))
    for j in range(n):
        ops.timeSeries("Linear", j + 1)
        ops.pattern("Plain", j + 1, j + 1)
        ops.load(masters[j], 1.0, 0.0, 0.0)
        ops.constraints("Transformation")
        ops.numberer("RCM")
        ops.system("FullGeneral")
        ops.algorithm("Linear")
        ops.integrator("LoadControl", 1.0)
        ops.analysis("Static")
        assert ops.analyze(1) == 0
        F[:, j] = [ops.nodeDisp(m, 1) for m in masters]
        ops.remove("loadPattern", j + 1)
        ops.wipeAnalysis()
        ops.setTime(0.0)
        for tag in ops.getNodeTags():
            for dof in (1, 2, 3):
                ops.setNodeDisp(tag, dof, 0.0, "-commit")
    return np.linalg.inv(F)


def _periods(ops: ModuleType, masters: list[int], masses: list[float]) -> np.ndarray:
    for node, m in zip(masters, masses, strict=True):
        ops.mass(node, m, 1e-12 * m, 1e-12 * m)
    return 2 * np.pi / np.sqrt(np.array(ops.eigen("-fullGenLapack", len(masters))))


def _braced_opensees(ops: ModuleType, frame: BracedFrame, length: float, heights: tuple[float, ...]) -> list[int]:
    """A one-bay cross-braced truss: columns and braces with each storey's own area."""
    ops.wipe()
    ops.model("basic", "-ndm", 2, "-ndf", 3)
    z = np.concatenate(([0.0], np.cumsum(heights)))
    for f, zf in enumerate(z):
        ops.node(10 * f + 1, 0.0, float(zf))
        ops.node(10 * f + 2, length, float(zf))
        ops.fix(10 * f + 1, *((1, 1, 1) if f == 0 else (0, 0, 1)))
        ops.fix(10 * f + 2, *((1, 1, 1) if f == 0 else (0, 0, 1)))
    ops.uniaxialMaterial("Elastic", 1, frame.modulus)
    tag = iter(range(1, 10_000))
    for i, storey in enumerate(frame.storeys):
        lo, up = 10 * i, 10 * (i + 1)
        for a, b in ((lo + 1, up + 1), (lo + 2, up + 2)):
            ops.element("Truss", next(tag), a, b, storey.column_area, 1)
        for a, b in ((lo + 1, up + 2), (lo + 2, up + 1)):
            ops.element("Truss", next(tag), a, b, storey.brace_area, 1)
        ops.equalDOF(up + 1, up + 2, 1)
    return [10 * f + 1 for f in range(1, len(z))]


SIX_STOREYS = (4.2, 3.6, 3.6, 3.6, 3.6, 3.6)
THREE_BRACE_SIZES = BracedFrame(
    pattern=BracePattern.CROSS,
    storeys=(
        BraceStorey(column_shape="I 400×300×24×13.5", brace_shape="CHS 219.1×10"),
        BraceStorey(column_shape="I 400×300×24×13.5", brace_shape="CHS 219.1×10"),
        BraceStorey(column_shape="I 300×300×19×11", brace_shape="CHS 168.3×8"),
        BraceStorey(column_shape="I 300×300×19×11", brace_shape="CHS 168.3×8"),
        BraceStorey(column_area=6.0e-3, brace_area=2.0e-3),
        BraceStorey(column_area=6.0e-3, brace_area=2.0e-3),
    ),
)
FLOOR_MASSES = [60.0, 55.0, 55.0, 55.0, 55.0, 40.0]


def _poise_periods(K: np.ndarray, masses: list[float]) -> np.ndarray:
    return np.sort(2 * np.pi / np.sqrt(eigh(K, np.diag(masses), eigvals_only=True)))[::-1]


def test_six_storey_braced_frame_with_three_brace_sizes_matches_opensees(ops: ModuleType) -> None:
    """Source: OpenSeesPy (module docstring). Stiffness to 1e-8, the six periods to 1e-6."""
    masters = _braced_opensees(ops, THREE_BRACE_SIZES, 6.0, SIX_STOREYS)
    reference = _solve(ops, masters, 6)
    K = condensed_stiffness(THREE_BRACE_SIZES, 6.0, SIX_STOREYS)
    assert np.abs(K - reference).max() < AGREEMENT * np.abs(reference).max()
    periods = _periods(ops, masters, FLOOR_MASSES)
    source = f"OpenSeesPy {version('openseespy')}"
    np.testing.assert_allclose(_poise_periods(K, FLOOR_MASSES), periods, rtol=PERIODS, err_msg=source)
    # The check can fail: with its lowest sizes throughout, T1 is 0.569 s, not 0.626 s (measured).
    uniform = condensed_stiffness(replace(THREE_BRACE_SIZES, storeys=()), 6.0, SIX_STOREYS)
    assert np.abs(uniform - reference).max() > 0.05 * np.abs(reference).max()


def _wall_opensees(ops: ModuleType, wall: ShearWall, length: float, heights: tuple[float, ...]) -> list[int]:
    """A stack of Timoshenko members, one per storey, each with that storey's thickness and factor."""
    ops.wipe()
    ops.model("basic", "-ndm", 2, "-ndf", 3)
    ops.geomTransf("Linear", 1)
    E, G = wall.modulus, wall.modulus / (2 * (1 + wall.poisson))
    for f, zf in enumerate(np.concatenate(([0.0], np.cumsum(heights)))):
        ops.node(f + 1, length / 2, float(zf))
    ops.fix(1, 1, 1, 1)
    for i, s in enumerate(wall.storeys):
        t, k = s.thickness, s.stiffness_factor
        ops.element(
            "ElasticTimoshenkoBeam", i + 1, i + 1, i + 2, k * E, k * G, t * length, t * length**3 / 12,
            5 / 6 * t * length, 1,
        )  # fmt: skip
    return list(range(2, len(heights) + 2))


STEPPED_WALL = ShearWall(storeys=(*(WallStorey(0.35),) * 3, *(WallStorey(0.20),) * 5))
EIGHT_STOREYS = (4.0, *(3.1,) * 7)


def test_stepped_wall_matches_opensees(ops: ModuleType) -> None:
    """Source: OpenSeesPy (module docstring). A wall 0.35 m thick in storeys 1–3, 0.20 m above."""
    masters = _wall_opensees(ops, STEPPED_WALL, 6.0, EIGHT_STOREYS)
    reference = _solve(ops, masters, 8)
    K = condensed_stiffness(STEPPED_WALL, 6.0, EIGHT_STOREYS)
    assert np.abs(K - reference).max() < AGREEMENT * np.abs(reference).max()
    masses = [80.0] * 7 + [60.0]
    np.testing.assert_allclose(_poise_periods(K, masses), _periods(ops, masters, masses), rtol=PERIODS)


def test_moment_frame_with_lighter_upper_storeys_matches_opensees(ops: ModuleType) -> None:
    """Source: OpenSeesPy. Two bays, columns and beams of three sizes up four storeys."""
    heavy = FrameStorey(column_shape="I 400×300×24×13.5", beam_shape="I 500×200×16×10")
    middle = FrameStorey(column_shape="I 300×300×19×11", beam_shape="I 400×180×13×8.5")
    light = FrameStorey(column_shape="I 300×150×10×7", beam_shape="I 300×150×10×7")
    frame = MomentFrame(bays=2, storeys=(heavy, middle, middle, light))
    heights = (4.5, 3.5, 3.5, 3.5)
    ops.wipe()
    ops.model("basic", "-ndm", 2, "-ndf", 3)
    ops.geomTransf("Linear", 1)
    z = np.concatenate(([0.0], np.cumsum(heights)))
    for f, zf in enumerate(z):
        for k in range(3):
            ops.node(10 * f + k + 1, 6.0 * k, float(zf))
            if f == 0:
                ops.fix(k + 1, 1, 1, 1)
    tag = iter(range(1, 10_000))
    for i, s in enumerate(frame.storeys):
        for k in range(3):
            ops.element("elasticBeamColumn", next(tag), 10 * i + k + 1, 10 * (i + 1) + k + 1,
                        s.column_area, frame.modulus, s.column_inertia, 1)  # fmt: skip
        for k in range(2):
            ops.element("elasticBeamColumn", next(tag), 10 * (i + 1) + k + 1, 10 * (i + 1) + k + 2,
                        s.beam_area, frame.modulus, s.beam_inertia, 1)  # fmt: skip
        for k in (2, 3):
            ops.equalDOF(10 * (i + 1) + 1, 10 * (i + 1) + k, 1)
    reference = _solve(ops, [10 * f + 1 for f in range(1, 5)], 4)
    K = condensed_stiffness(frame, 12.0, heights)
    assert np.abs(K - reference).max() < AGREEMENT * np.abs(reference).max()


# ------------------------------------------------------------------ a whole stepped building in 3D


def stepped_tower() -> Project:
    """Invented: 8 storeys on a 24 m × 16 m plate; walls 0.35 m thick stepping to 0.20 m at
    level 3, braced frames with three brace sizes and a moment frame lightening up the height."""
    plate = ((0.0, 0.0), (24.0, 0.0), (24.0, 16.0), (0.0, 16.0))
    levels = tuple(Level(f"L{j}", 4.0 if j == 1 else 3.1, plate, seismic_weight=8.0) for j in range(1, 9))
    braces = tuple(
        BraceStorey(brace_shape=b, column_shape=c)
        for b, c in [("CHS 219.1×10", "I 400×300×24×13.5")] * 3
        + [("CHS 168.3×8", "I 300×300×19×11")] * 3
        + [("CHS 139.7×8", "I 300×300×19×11")] * 2
    )
    frame = MomentFrame(
        bays=3,
        storeys=(*(FrameStorey(column_shape="I 500×300×28×14.5", beam_shape="I 500×200×16×10"),) * 4,
                 *(FrameStorey(column_shape="I 400×300×24×13.5", beam_shape="I 400×180×13×8.5"),) * 4),
    )  # fmt: skip
    elements = (
        Element("W1", (2.0, 0.0), (8.0, 0.0), 0, 8, STEPPED_WALL),
        Element("W2", (16.0, 16.0), (22.0, 16.0), 0, 8, STEPPED_WALL),
        Element("B1", (0.0, 5.0), (0.0, 11.0), 0, 8, BracedFrame(storeys=braces)),
        Element("B2", (24.0, 5.0), (24.0, 11.0), 0, 8, BracedFrame(pattern=BracePattern.CHEVRON, storeys=braces)),
        Element("M1", (12.0, 0.0), (12.0, 16.0), 0, 8, frame),
    )
    return Project(name="stepped tower", levels=levels, elements=elements)


def test_stepped_building_periods_match_opensees_3d() -> None:
    """Source: OpenSeesPy 3D (tests/reference/opensees_building.py, each storey its own section).
    Measured with openseespy 3.7.1.2: the six periods agree within 1e-7 (the out-of-plane share)."""
    project = stepped_tower()
    periods = np.array([m.period for m in analyse(project).modes[:6]])
    reference = opensees_modes(project, 6)
    np.testing.assert_allclose(periods, reference.periods, rtol=PERIODS, err_msg=f"OpenSeesPy {version('openseespy')}")
