"""The measures the guidance maps, differentiates and minimises, and the limit each is judged by.

Each measure is one number per layout, smaller is better:

- ``torsion-ratio``: the worst storey torsion ratio over the load cases in x and y (ASCE 7-16
  Table 12.3-1, limit 1.2 for torsional irregularity, Type 1a);
- ``eccentricity``: the largest e_0/r over the storeys and both directions (EN 1998-1 §4.2.3.2(6)
  Eq. 4.1a, limit 0.30);
- ``torsional-share``: the larger share of kinetic energy in rotation of the first two modes (no
  code sets a number; our threshold is the one that names a mode mixed, 1 − DOMINANT_SHARE).
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum

import numpy as np

from core.arrays import FloatArray
from core.engine.whatif import PositionFigures
from core.lateral.cases import DIRECTIONS
from core.lateral.rules.asce7 import RULES as ASCE7
from core.results import DOMINANT_SHARE, Results

ECCENTRICITY_LIMIT = 0.30
"""e_0/r ≤ 0.30: EN 1998-1 §4.2.3.2(6) Eq. (4.1a)."""


class Measure(StrEnum):
    """What a map shows and a suggestion minimises."""

    TORSION_RATIO = "torsion-ratio"
    ECCENTRICITY = "eccentricity"
    TORSIONAL_SHARE = "torsional-share"

    @property
    def label(self) -> str:
        return MEASURE_TITLES[self]

    @property
    def limit(self) -> Limit:
        return LIMITS[self]


MEASURE_TITLES = {
    Measure.TORSION_RATIO: "worst torsion ratio",
    Measure.ECCENTRICITY: "largest e₀/r",
    Measure.TORSIONAL_SHARE: "torsional share of modes 1–2",
}


@dataclass(frozen=True)
class Limit:
    """The value a measure is judged by, and where it comes from (in words the user reads)."""

    value: float
    source: str
    code: bool
    """True for a code's number, False for our own threshold."""


LIMITS = {
    Measure.TORSION_RATIO: Limit(
        ASCE7.parameters.torsion_irregular, "ASCE 7-16 Table 12.3-1, torsional irregularity 1a", True
    ),
    Measure.ECCENTRICITY: Limit(ECCENTRICITY_LIMIT, "EN 1998-1 §4.2.3.2(6) Eq. (4.1a)", True),
    Measure.TORSIONAL_SHARE: Limit(
        round(1.0 - DOMINANT_SHARE, 12), "Poise's threshold for a translational mode (no code number)", False
    ),
}


def position_values(figures: PositionFigures, measure: Measure) -> FloatArray:
    """(P,) the measure at each position of a what-if (NaN where the layout would not stand)."""
    if measure is Measure.TORSION_RATIO:
        values = figures.torsion_ratio.max(axis=1)
    elif measure is Measure.ECCENTRICITY:
        values = figures.eccentricity_ratio.max(axis=(1, 2))
    else:
        values = figures.rotation_share[:, :2].max(axis=1)
    return np.where(figures.stands, values, np.nan)


def results_value(results: Results, measure: Measure) -> float:
    """The measure of one analysed layout (what :func:`position_values` gives for its position)."""
    lateral = results.lateral
    if measure is Measure.TORSION_RATIO:
        return max(lateral.worst_torsion_ratio(d) for d in DIRECTIONS)
    if measure is Measure.ECCENTRICITY:
        return max((max(s.eccentricity_ratio) for s in lateral.storeys), default=0.0)
    return max(m.shares[2] for m in results.modes[:2])
