"""Flight mechanics: pure numpy, SI floats and arrays, angles in radians.

Nothing in this package imports Qt, pint, reportlab or reads files; a test proves it.
Every function broadcasts over numpy arrays, so one call covers all bank angles
of all configurations (and all aircraft of a fleet, if stacked).
"""
