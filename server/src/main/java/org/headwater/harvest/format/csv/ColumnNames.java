package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/** Makes one unique, non-empty name per column. */
final class ColumnNames {

  private ColumnNames() {}

  /** column_1, column_2, ... for a file without a header. */
  static List<String> generated(int width) {
    List<String> names = new ArrayList<>(width);
    for (int i = 1; i <= width; i++) {
      names.add("column_" + i);
    }
    return names;
  }

  /**
   * Header cells, trimmed; an empty or missing one becomes column_N (N its 1-based position);
   * a repeated one gets _2, _3, ... (the first keeps its name), skipping names already used.
   */
  static List<String> fromHeader(List<String> header, int width) {
    List<String> wanted = new ArrayList<>(width);
    for (int i = 0; i < width; i++) {
      String name = i < header.size() ? Cells.trim(header.get(i)) : "";
      wanted.add(name.isEmpty() ? "column_" + (i + 1) : name);
    }
    Set<String> taken = new HashSet<>(wanted);
    Set<String> used = new HashSet<>();
    List<String> names = new ArrayList<>(width);
    for (String name : wanted) {
      String unique = name;
      int n = 2;
      while (used.contains(unique) || !unique.equals(name) && taken.contains(unique)) {
        unique = name + "_" + n++;
      }
      used.add(unique);
      names.add(unique);
    }
    return names;
  }
}
