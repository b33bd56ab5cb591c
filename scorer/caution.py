"""The one caution text of ionicity's estimates.

Every place that warns a reader (the melting columns' descriptions, the
melting-model columns, ``ionicity explain``, ``fit-melting``) quotes
:data:`CAUTION`. This module imports nothing, so the lightest command-line
module can quote it too.
"""

__all__ = ["CAUTION", "WATER_CAUTION", "caution_sentence"]

CAUTION = (
    "estimates for screening, not for process safety: decomposition, hydration and pressure are not"
    " modelled; check measured data and the safety data sheet before heating anything"
)


#: the water columns' words (scorer.water): every row that reacts with water or
#: gives an acidic or basic solution carries them (kept short: output files
#: write it in full on every such row; SDS is the safety data sheet, said in full
#: in the README and in the columns' descriptions)
WATER_CAUTION = "screening rule, not a hazard assessment: see the SDS, local codes and qualified people"


def caution_sentence() -> str:
    """:data:`CAUTION` written as a sentence, for text a person reads.

    >>> caution_sentence()[:30]
    'Estimates for screening, not f'
    """
    return CAUTION[0].upper() + CAUTION[1:] + "."
