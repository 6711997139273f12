package org.headwater.analysis.script;

/** Whether a script reads or writes a dataset. */
public enum Direction { READ, WRITE }
