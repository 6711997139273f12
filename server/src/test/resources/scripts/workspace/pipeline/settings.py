"""Shared locations of the cooperative's pipeline (relative to the workspace root)."""
import os

RAW = "raw"
SCALES_DIR = os.path.join(RAW, "scales")
SEASON = 2024
