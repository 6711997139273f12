package org.headwater.harvest.format.csv;

/** The narrowest type that every non-missing value of a column fits. */
public enum LogicalType {
  INTEGER,
  DECIMAL,
  BOOLEAN,
  DATE,
  TIMESTAMP,
  TEXT
}
