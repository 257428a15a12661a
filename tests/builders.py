"""Small invented buildings that tests build in code (units kN, m, t, s), and the numbers of a JSON tree."""

from __future__ import annotations

from core.model import GRAVITY, Element, Level, Project, Spring


def square(size: float, origin: tuple[float, float] = (0.0, 0.0)) -> tuple[tuple[float, float], ...]:
    x0, y0 = origin
    return ((x0, y0), (x0 + size, y0), (x0 + size, y0 + size), (x0, y0 + size))


def rectangle(width: float, depth: float) -> tuple[tuple[float, float], ...]:
    return ((0.0, 0.0), (width, 0.0), (width, depth), (0.0, depth))


def uniform_levels(count: int, floor_mass: float, height: float = 3.0, size: float = 10.0) -> tuple[Level, ...]:
    """``count`` identical square floors of ``floor_mass`` t each."""
    weight = floor_mass * GRAVITY / (size * size)
    return tuple(Level(f"L{j}", height, square(size), seismic_weight=weight) for j in range(1, count + 1))


def spring_building(storey_stiffness: list[float], floor_masses: list[float], size: float = 10.0) -> Project:
    """A doubly symmetric shear building: four spring lines at the edges of a square plan, each
    carrying half the storey stiffness in its direction, so x and y translation are uncoupled."""
    n = len(storey_stiffness)
    levels = tuple(
        Level(f"L{j + 1}", 3.0, square(size), seismic_weight=floor_masses[j] * GRAVITY / (size * size))
        for j in range(n)
    )
    half = tuple(k / 2 for k in storey_stiffness)
    lines = {
        "SX1": ((0.0, 0.0), (size, 0.0)),
        "SX2": ((0.0, size), (size, size)),
        "SY1": ((0.0, 0.0), (0.0, size)),
        "SY2": ((size, 0.0), (size, size)),
    }
    elements = tuple(Element(i, a, b, 0, n, Spring(half)) for i, (a, b) in lines.items())
    return Project(name="spring building", levels=levels, elements=elements)


def numbers(value: object, path: str = "") -> dict[str, float]:
    """Every number in a JSON tree, keyed by its path (strings and text are not compared)."""
    found: dict[str, float] = {}
    if isinstance(value, dict):
        for key, item in value.items():
            found.update(numbers(item, f"{path}.{key}"))
    elif isinstance(value, list):
        for index, item in enumerate(value):
            found.update(numbers(item, f"{path}[{index}]"))
    elif isinstance(value, bool) or value is None:
        pass
    elif isinstance(value, int | float):
        found[path] = float(value)
    return found
