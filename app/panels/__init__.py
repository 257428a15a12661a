"""Docked panels around the plan: levels strip, properties, results, status bar."""
