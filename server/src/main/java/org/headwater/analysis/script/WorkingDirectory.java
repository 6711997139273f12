package org.headwater.analysis.script;

/** Where a script is assumed to run from, since relative paths in code are relative to it. */
public enum WorkingDirectory {
    /** The workspace root: projects driven by a top-level shell script or Makefile run this way. */
    WORKSPACE_ROOT,
    /** The script's own folder: Jupyter starts a notebook's kernel there. */
    SCRIPT_FOLDER
}
