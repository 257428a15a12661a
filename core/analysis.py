"""The one entry point the GUI and the command line call: ``analyse(project) -> Results``."""

from __future__ import annotations

from core.arrays import frozen_array
from core.errors import AnalysisError
from core.lateral.evaluation import lateral_checks
from core.model import Project
from core.results import Results
from core.solve.assembly import assemble_mass, assemble_stiffness, floor_masses
from core.solve.diagnostics import check_layout, check_stiffness
from core.solve.modal import modal_analysis


def analyse(project: Project) -> Results:
    """Masses, stiffness and modes of ``project``; raises AnalysisError if it cannot stand."""
    if not project.levels:
        raise AnalysisError("the project has no levels: draw a floor outline first")
    check_layout(project)
    floors = floor_masses(project)
    K = assemble_stiffness(project, floors)
    check_stiffness(project, floors, K)
    M = assemble_mass(floors)
    modes = modal_analysis(K, M, floors)
    lateral = lateral_checks(project, floors, K, modes)
    return Results(
        floors=floors, stiffness=frozen_array(K), mass=frozen_array(M), modes=modes, lateral=lateral
    )
