"""Test-wide settings.

Hypothesis runs derandomized by default, so `make test` and CI see the same
examples every run and a red build always reproduces. To search wider, run
``pytest --hypothesis-profile=explore`` (random examples, more of them).
"""

from hypothesis import settings

settings.register_profile("repeatable", derandomize=True, print_blob=True)
settings.register_profile("explore", derandomize=False, max_examples=500, print_blob=True)
settings.load_profile("repeatable")
