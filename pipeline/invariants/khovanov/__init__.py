"""Khovanov homology (Bar-Natan's conventions) over Q, F_p and Z, Rasmussen's s, width.

:mod:`.homology` is the public surface; :mod:`.tangle` is D. Bar-Natan's local algorithm
("Fast Khovanov homology computations", JKTR 16, 2007) over the dotted cobordisms of
:mod:`.cobordism`; :mod:`.integral` is the integral homology (torsion), :mod:`.data` the census columns;
:mod:`.cube` is the slow cube of resolutions the tests compare with.
"""

from .cube import cube_khovanov, cube_khovanov_z
from .data import KhovanovData, khovanov_data
from .homology import *  # noqa: F401,F403
from .homology import __all__ as _homology_all
from .integral import *  # noqa: F401,F403
from .integral import __all__ as _integral_all

__all__ = [*_homology_all, *_integral_all, "KhovanovData", "khovanov_data", "cube_khovanov",
           "cube_khovanov_z"]
