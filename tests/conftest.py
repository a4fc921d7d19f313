"""Hypothesis profiles for the whole suite: "ci" (the default) keeps the suite fast; "long" runs many
more examples, chosen with HYPOTHESIS_PROFILE=long. Nothing else belongs here."""

import os

from hypothesis import settings

# ci: hypothesis's usual 100 examples per test (the fuzz tests take a share of it, see test_fuzz.py),
# no per-example deadline because a solve takes a variable tenth of a second
settings.register_profile("ci", max_examples=100, deadline=None, print_blob=True)
settings.register_profile("long", max_examples=2000, deadline=None, print_blob=True)
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "ci"))
