"""The solve stage: floor masses, K and M, stability diagnostics, the eigenproblem."""
