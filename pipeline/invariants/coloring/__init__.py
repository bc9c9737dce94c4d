"""Colouring invariants: colouring matrix, invariant factors, determinant, Fox colourings.

:mod:`.spectrum` is the general route (the colouring matrix of any diagram and its Smith
form); :mod:`.sparse_elimination` is the fast elimination of unit pivots that reduces the
Smith form of a family member to a small dense block for python-flint.
"""

from .spectrum import *  # noqa: F401,F403
from .spectrum import __all__  # noqa: F401
