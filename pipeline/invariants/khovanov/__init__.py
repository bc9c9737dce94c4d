"""Khovanov homology (Bar-Natan's conventions) over Q and F_p, Rasmussen's s, width.

:mod:`.homology` is the public surface; :mod:`.tangle` is D. Bar-Natan's local algorithm
("Fast Khovanov homology computations", JKTR 16, 2007) over the dotted cobordisms of
:mod:`.cobordism`; :mod:`.cube` is the slow cube of resolutions the tests compare with.
"""

from .cube import cube_khovanov
from .homology import *  # noqa: F401,F403
from .homology import __all__ as _homology_all

__all__ = [*_homology_all, "cube_khovanov"]
