"""The properties panel: the selected elements' fields, or the project's when nothing is selected.

Every edit goes through the model's validation; a refused value stays in its field with the
model's message and the project is unchanged.
"""

from __future__ import annotations

import dataclasses

from PySide6.QtWidgets import QLabel, QScrollArea, QVBoxLayout, QWidget

from app.commands import respan, set_length_and_angle
from app.document import ProjectDocument
from app.kinds import app_kind, app_kinds
from app.panels.fields import FieldForm, Row
from app.panels.storey_sections import StoreySectionTable
from app.units import (
    ACCELERATION,
    DEGREES,
    DRIFT,
    LENGTH,
    PERCENT,
    PLAIN,
    SECONDS,
    degrees_of,
)
from core.errors import ModelError
from core.lateral.rules import registered_rule_sets, rules_for
from core.model import (
    Element,
    Kind,
    LoadMethod,
    Project,
    SystemType,
    default_properties,
)
from core.report.figures import CODE_LIMITS


def _with_kind(element: Element, kind: Kind) -> Element:
    if kind is element.kind:
        return element
    return dataclasses.replace(element, properties=default_properties(kind, storeys=element.storey_count))


def _with_angle(element: Element, angle: float) -> Element:
    return set_length_and_angle(element, element.length, angle)


def _angle(element: Element) -> float:
    return degrees_of(element.end[0] - element.start[0], element.end[1] - element.start[1])


def element_rows(project: Project, elements: list[Element]) -> list[Row]:
    """Rows for the selected elements (coordinates only for a single one, kind fields only if
    all share a kind)."""
    single = len(elements) == 1
    kinds = {e.kind for e in elements}
    bottoms = [("Base", 0)] + [(lv.name, i) for i, lv in enumerate(project.levels[:-1], start=1)]
    tops = [(lv.name, i) for i, lv in enumerate(project.levels, start=1)]
    rows: list[Row] = []
    if single:
        rows.append(Row("Id", "id", "text"))
    rows.append(
        Row(
            "Kind",
            kind="choice",
            choices=[(spec.label, spec.kind) for spec in app_kinds()],
            getter=lambda e: e.kind,
            setter=_with_kind,
            tip="Changing the kind gives the element that kind's default sections.",
        )
    )
    rows.append(
        Row(
            "From level",
            kind="choice",
            choices=bottoms,
            getter=lambda e: e.bottom,
            setter=lambda e, v: respan(e, v, e.top),
            tip="The element stands on this level (Base = the foundation).",
        )
    )
    rows.append(
        Row(
            "To level",
            kind="choice",
            choices=tops,
            getter=lambda e: e.top,
            setter=lambda e, v: respan(e, e.bottom, v),
            tip="The highest floor the element reaches.",
        )
    )
    if single:
        rows += [
            Row("Start x", "start[0]", "number", LENGTH),
            Row("Start y", "start[1]", "number", LENGTH),
            Row("End x", "end[0]", "number", LENGTH),
            Row("End y", "end[1]", "number", LENGTH),
            Row(
                "Length",
                kind="number",
                quantity=LENGTH,
                getter=lambda e: e.length,
                setter=lambda e, v: set_length_and_angle(e, v, _angle(e)),
                tip="Changes the end point; the start stays.",
            ),
            Row(
                "Angle",
                kind="number",
                quantity=DEGREES,
                getter=_angle,
                setter=_with_angle,
                tip="Direction from start to end, counter-clockwise from +x.",
            ),
        ]
    if len(kinds) != 1:
        return rows
    return rows + app_kind(elements[0].kind).property_rows()


OWN_LIMIT = "own"
"""The drift-limit choice that keeps the project's own value."""


def drift_limit_rows(project: Project) -> list[Row]:
    """The drift limits of the project's code limits to choose from, or the project's own value."""
    rules = rules_for(project.settings)
    choices = [(f"{r.ratio:.2%} · {r.label}", r.key) for r in rules.drift_limits] + [("own value", OWN_LIMIT)]

    def read(p: Project) -> str:
        return OWN_LIMIT if p.settings.drift_limit is not None else rules.drift_row(p.settings).key

    def write(p: Project, key: str) -> Project:
        if key == OWN_LIMIT:
            settings = dataclasses.replace(p.settings, drift_limit=rules.drift_limit(p.settings).ratio)
        else:
            settings = dataclasses.replace(p.settings, drift_limit=None, drift_basis=key)
        return dataclasses.replace(p, settings=settings)

    rows = [
        Row(
            "Drift limit",
            "settings.drift_basis",
            "choice",
            choices=choices,
            getter=read,
            setter=write,
            tip="; ".join(f"{r.ratio:g}·h: {r.label} ({r.clause})" for r in rules.drift_limits),
        )
    ]
    if project.settings.drift_limit is not None:
        rows.append(Row("Own drift limit", "settings.drift_limit", "number", DRIFT, tip="Storey drift over height."))
    return rows


def project_rows(project: Project) -> list[Row]:
    """Rows for the project's description and analysis settings (spectrum rows by load method)."""
    s = project.settings
    rows = [
        Row("Project", "name", "text"),
        Row("Job number", "job_number", "text"),
        Row("Engineer", "engineer", "text"),
        Row("Revision", "revision", "text"),
        Row(
            CODE_LIMITS,
            "settings.rule_set",
            "choice",
            choices=[(r.title, r.name) for r in registered_rule_sets()],
            tip="Whose limits give pass / warn / fail; the figures themselves are computed either way.",
        ),
        Row(
            "Static load",
            "settings.load_method",
            "choice",
            choices=[
                ("EN 1998-1 spectrum", LoadMethod.EN1998),
                ("ASCE 7 spectrum", LoadMethod.ASCE7),
                ("Base shear coefficient", LoadMethod.COEFFICIENT),
            ],
        ),
    ]
    if s.load_method is LoadMethod.EN1998:
        rows += [
            Row(
                "a_g",
                "settings.eurocode8.ag",
                "number",
                ACCELERATION,
                tip="Design ground acceleration on type A ground.",
            ),
            Row("Ground type", "settings.eurocode8.ground_type", "choice", choices=[(g, g) for g in "ABCDE"]),
            Row("Spectrum type", "settings.eurocode8.spectrum_type", "choice", choices=[("Type 1", 1), ("Type 2", 2)]),
            Row("Behaviour factor q", "settings.eurocode8.behaviour_factor", "number", PLAIN),
            Row("Lower bound β", "settings.eurocode8.lower_bound", "number", PLAIN),
        ]
    elif s.load_method is LoadMethod.ASCE7:
        rows += [
            Row("S_DS", "settings.asce7.sds", "number", ACCELERATION),
            Row("S_D1", "settings.asce7.sd1", "number", ACCELERATION),
            Row("S_1", "settings.asce7.s1", "number", ACCELERATION),
            Row("T_L", "settings.asce7.long_period", "number", SECONDS),
            Row("R", "settings.asce7.response_modification", "number", PLAIN),
            Row("I_e", "settings.asce7.importance", "number", PLAIN),
            Row("C_d", "settings.asce7.deflection_amplification", "number", PLAIN),
        ]
    else:
        rows.append(Row("Base shear / weight", "settings.base_shear_coefficient", "number", PLAIN))
    rows += [
        Row(
            "System",
            "settings.system_type",
            "choice",
            choices=[
                ("Steel moment frame", SystemType.STEEL_MOMENT),
                ("Concrete moment frame", SystemType.CONCRETE_MOMENT),
                ("Eccentric braces", SystemType.ECCENTRIC_BRACED),
                ("Other", SystemType.OTHER),
            ],
            tip="For the codes' approximate period formulas.",
        ),
        Row(
            "Accidental eccentricity",
            "settings.accidental_eccentricity",
            "number",
            PERCENT,
            tip="Share of the plan dimension across the load (EN 1998-1 §4.3.2, ASCE 7 §12.8.4.2: 5 %).",
        ),
        *drift_limit_rows(project),
        Row("Centred load cases", "settings.include_centred_case", "check", tip="Add the cases without eccentricity."),
    ]
    return rows


class PropertiesPanel(QWidget):
    """Fields of the selection, or of the project."""

    def __init__(self, document: ProjectDocument, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.document = document
        self.heading = QLabel()
        self.heading.setStyleSheet("font-weight: bold; padding: 2px 4px;")
        self.heading.setWordWrap(True)
        self.form = FieldForm()
        self.form.apply = self._apply
        self.storeys = StoreySectionTable()
        self.storeys.apply = self._apply
        self.storeys.hide()
        content = QWidget()
        column = QVBoxLayout(content)
        column.setContentsMargins(0, 0, 0, 0)
        column.addWidget(self.form)
        column.addWidget(self.storeys)
        column.addStretch(1)
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setWidget(content)
        scroll.setFrameShape(QScrollArea.Shape.NoFrame)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(2, 2, 2, 2)
        layout.addWidget(self.heading)
        layout.addWidget(scroll, 1)
        document.project_changed.connect(self.refresh)
        document.selection_changed.connect(self.refresh)
        self.refresh()

    def selected(self) -> list[Element]:
        project = self.document.project
        return [project.element(i) for i in self.document.selection]

    def refresh(self) -> None:
        project = self.document.project
        elements = self.selected()
        if elements:
            kinds = {app_kind(e.kind).label for e in elements}
            names = ", ".join(e.id for e in elements[:6]) + (" …" if len(elements) > 6 else "")
            self.heading.setText(f"{' / '.join(sorted(kinds))}: {names}")
            self.form.set_rows(element_rows(project, elements))
            self.form.show_objects(elements)
            self.storeys.show_elements(project, elements)
        else:
            self.storeys.hide()
            self.heading.setText("Project and analysis settings (select an element on the plan to edit it)")
            self.form.set_rows(project_rows(project))
            self.form.show_objects([project])

    def _apply(self, changed: list) -> str | None:
        document = self.document
        if changed and isinstance(changed[0], Project):
            document.apply(changed[0], "Edit project settings")
            self.refresh()  # rows depend on the load method
            return None
        old_ids = list(document.selection)
        by_old = dict(zip(old_ids, changed, strict=True))
        project = document.project
        try:
            project = dataclasses.replace(project, elements=tuple(by_old.get(e.id, e) for e in project.elements))
        except ModelError as error:
            return error.message
        label = ", ".join(old_ids) if len(old_ids) <= 3 else f"{len(old_ids)} elements"
        document.apply(project, f"Edit {label}")
        document.select([e.id for e in changed])
        self.refresh()
        return None
