"""Alexander and Conway polynomials by Fox calculus.

:mod:`.fox` normalises the polynomial (Conway normalisation, signs of links fixed by ∇);
:mod:`.matrix` builds the Alexander matrix and computes its minor determinant exactly.
"""

from .fox import *  # noqa: F401,F403
from .fox import __all__  # noqa: F401
