"""ionicity's science: formula -> ions and oxidation states -> bond, lattice and melting descriptors.

Pure and importable alone: no file I/O beyond its packaged data, no pandas.
"""
from ionicity import __version__
from ionicity.scorer.formula import FormulaError, ParsedFormula, parse_formula
from ionicity.scorer.madelung import madelung_constant
from ionicity.scorer.record import score_formula

__all__ = ["ParsedFormula", "FormulaError", "madelung_constant", "parse_formula", "score_formula", "__version__"]
