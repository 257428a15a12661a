"""The plan canvas: scene mirroring the model, view with zoom and pan, items, snapping, grid."""
