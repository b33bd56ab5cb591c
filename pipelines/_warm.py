"""Imported once by the workers' forkserver (:mod:`ionicity.pipelines.pool`
names it as the forkserver's preload): every worker forked from there starts
with the scorer loaded and warm. The main process never imports this module
(a 10-row table must not pay for the warm-up)."""
from ionicity.pipelines.pool import warm_forkserver

warm_forkserver()
