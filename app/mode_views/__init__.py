"""Mode-shape views: the animated plan, the 3D building and the modal charts, in one panel."""

from app.mode_views.panel import ModeViewsPanel, install

__all__ = ["ModeViewsPanel", "install"]
