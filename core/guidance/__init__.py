"""Guidance: where an element should go. The what-if map of one element's position, the
derivatives of the measures with respect to moving each element, the target zone of the centre of
rigidity, a suggested position, and the loss of each element (robustness)."""
