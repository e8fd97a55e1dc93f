"""Structural analysis of one plane truss: stiffness solve, dead load, influence lines,
moving-load extremes, lateral distribution, tension-only members."""
