"""Tables, JSON and CSV of a solved drive."""

from .results import result_to_dict, rows, table_rows, tables, to_csv, to_json, to_text

__all__ = ["result_to_dict", "rows", "table_rows", "tables", "to_csv", "to_json", "to_text"]
