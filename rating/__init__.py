"""pintruss: load rating of existing pin-connected truss bridges by LRFR.

Data flow (no module reaches back up the chain):
inventory -> model -> analysis / capacity -> lrfr -> results -> report; cli is thin.
"""

__version__ = "0.1.0"
