"""ionicity's science: formula -> ions and oxidation states -> bond, lattice and melting descriptors.

Pure and importable alone: no file I/O beyond its packaged data, no pandas.
"""
from scorer.formula import Composition, FormulaError, parse_formula
from scorer.madelung import madelung_constant
from scorer.record import score_formula

__all__ = ["Composition", "FormulaError", "madelung_constant", "parse_formula", "score_formula", "__version__"]

__version__ = "0.1.0"
