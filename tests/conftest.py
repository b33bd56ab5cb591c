"""Fixtures shared by several test files."""
from __future__ import annotations

import pytest


@pytest.fixture
def fast_pipeline(monkeypatch):
    """The real melting pipeline with fewer boosting rounds, so the tests stay fast."""
    from ionicity.pipelines import melting_fit as mf  # scikit-learn only where a test asks for it

    real = mf.make_melting_pipeline

    def quick(seed=0, features=None):
        pipe = real(seed, features)
        pipe.named_steps["regressor"].regressor.set_params(max_iter=40, learning_rate=0.15)
        return pipe

    monkeypatch.setattr(mf, "make_melting_pipeline", quick)
