"""The report stage: text and JSON of results, mode geometry for the views."""
