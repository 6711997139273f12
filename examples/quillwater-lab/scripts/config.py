"""Shared path constants for the Quillwater lab scripts.

All paths are relative to the workspace root: run the scripts from there
(``python3 scripts/<name>.py``), as ``run_all.sh`` does.
"""
import os

FIELD_DIR = "field"
LAB_DIR = "lab"
DERIVED_DIR = "derived"

STATION_REGISTER = os.path.join("stations", "station_register.csv")
NITRATE_RESULTS = os.path.join(LAB_DIR, "nitrate_results_2025.csv")
