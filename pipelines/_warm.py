"""Imported once by the workers' forkserver: loads the scorer and warms its
caches there, so that every worker forked from it starts ready, sharing
those pages, instead of each worker paying for it. The main process never
imports this module (a 10-row table must not pay for it either)."""
from ionicity.pipelines._workers import one_blas_thread, settle_gc

one_blas_thread()  # before the scorer imports numpy

from ionicity.pipelines._pool import warm_up  # noqa: E402

warm_up()
settle_gc()  # inherited by every worker forked from here
