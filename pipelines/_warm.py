"""Imported once by the workers' forkserver (:mod:`ionicity.pipelines.pool`
names it as the forkserver's preload): every worker forked from there starts
with the scorer loaded and warm. The main process never imports this module
(a 10-row table must not pay for the warm-up).

numpy reads its thread variables when it loads, so they are set here,
before the import below loads the scorer and numpy with it (``import
ionicity`` and ``import ionicity.pipelines`` load neither; a test holds them
to that).
"""
import os

# Each worker scores one formula at a time; a BLAS thread pool per worker
# would only spin beside it on the cores the other workers need (measured:
# DEVELOPERS.md, "How a large run is laid out"). The user's own setting stands.
for _name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")

from ionicity.pipelines.pool import warm_forkserver  # noqa: E402

warm_forkserver()
