"""Colouring invariants: colouring matrix, invariant factors, determinant, Fox colourings.

:mod:`.matrix` builds the colouring matrix; :mod:`.spectrum` is the general route (its
Smith form, determinant and counts; it re-exports every public name); :mod:`.mod_p` finds
colourings modulo a prime; :mod:`.sparse_elimination` is the fast elimination of unit pivots that reduces the
Smith form of a family member to a small dense block for python-flint.
"""

from .spectrum import *  # noqa: F401,F403
from .spectrum import __all__  # noqa: F401
