"""Test configuration: reproducible property-based tests in CI.

Under ``CI=true`` hypothesis runs derandomised (the same examples every run), so a CI
result can be reproduced exactly; locally it explores new examples each run.
"""

import os

from hypothesis import settings

settings.register_profile("ci", derandomize=True, print_blob=True)
if os.environ.get("CI", "").lower() in ("1", "true", "yes"):
    settings.load_profile("ci")
