"""ionicity's batch side: table I/O, engines and the command line.

``score_table`` scores a pandas DataFrame; ``score_file`` streams a CSV, TSV
or Parquet file into another. Both add the columns of
``scorer.columns.output_columns()``.
"""
from pipelines.batch import ScoreConfig, Summary, score_file, score_table
from pipelines.io import InputError

__all__ = ["ScoreConfig", "Summary", "InputError", "score_file", "score_table"]
