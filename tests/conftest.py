"""Test-suite settings.

Under CI (environment variable CI set) hypothesis runs derandomized, so a submission's CI run
is reproducible and cannot fail on a new random example that the author never saw; local runs
keep exploring new examples (report any failure they find as a bug, with its seed).
"""

import os

from hypothesis import settings

settings.register_profile("ci", derandomize=True, print_blob=True)
settings.register_profile("dev", print_blob=True)
settings.load_profile("ci" if os.environ.get("CI") else "dev")
