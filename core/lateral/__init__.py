"""The lateral stage: spectra and static loads, load-case response, centres, checks."""
