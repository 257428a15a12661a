"""Exchange with drawings and spreadsheets: DXF underlay import, DXF/PNG/CSV export, menu actions."""
