"""Tables, JSON and CSV of a solved drive, and the margins of its ratings."""

from .margins import (
    case_names,
    check_row,
    loads_and_margins_csv,
    margins_rows,
    margins_table,
    margins_tables,
    margins_text,
    ratings_to_dict,
)
from .results import mesh_summary, result_to_dict, rows, table_rows, tables, to_csv, to_json, to_text

__all__ = [
    "case_names", "check_row", "loads_and_margins_csv", "margins_rows", "margins_table", "margins_tables",
    "margins_text", "mesh_summary", "ratings_to_dict", "result_to_dict", "rows", "table_rows", "tables", "to_csv",
    "to_json", "to_text",
]
