"""Jones polynomial through the Kauffman bracket.

:mod:`.frontier` is the general route (a frontier dynamic programme over planar matchings,
for any diagram); :mod:`.tangle_bracket` is the linear-time route for diagrams built from
rational tangles (two-bridge, pretzel, Montesinos), cross-checked against the general one.
"""

from .frontier import *  # noqa: F401,F403
from .frontier import __all__ as _frontier_all
from .tangle_bracket import bracket_of_notation, montesinos_bracket, two_bridge_bracket

__all__ = [*_frontier_all, "bracket_of_notation", "montesinos_bracket", "two_bridge_bracket"]
