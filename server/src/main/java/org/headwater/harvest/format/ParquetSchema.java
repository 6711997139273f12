package org.headwater.harvest.format;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.parquet.format.ConvertedType;
import org.apache.parquet.format.FieldRepetitionType;
import org.apache.parquet.format.LogicalType;
import org.apache.parquet.format.SchemaElement;
import org.apache.parquet.format.TimeUnit;

/**
 * Turns a Parquet footer's flat schema list into leaf columns. The footer stores the schema tree depth-first,
 * each group saying how many children follow it (parquet.thrift, {@code FileMetaData.schema} and
 * {@code SchemaElement.num_children}); this rebuilds the tree, names each leaf by its path and maps its
 * types to Headwater's.
 */
final class ParquetSchema {
    // Deeper nesting than this is taken for a damaged footer rather than walked, so the walk cannot overflow.
    static final int MAX_DEPTH = 64;

    /**
     * One leaf column.
     *
     * @param name the path in dot notation, {@code []} after each repeated level, lists and maps shown as
     *     {@code tags[]} and {@code attrs[].key} rather than through their wrapper groups
     * @param parquetPath the path through every group as the file spells it, dot-separated
     * @param physicalType the Parquet physical type as parquet.thrift names it ({@code INT64}, {@code BYTE_ARRAY}…)
     * @param logicalType the Parquet logical type annotation, or null
     * @param repetition the leaf's own repetition: {@code REQUIRED}, {@code OPTIONAL} or {@code REPEATED}
     * @param nullable true when the leaf or any group above it is OPTIONAL: then a row may hold no value
     * @param type the Headwater logical type
     */
    record Column(String name, String parquetPath, String physicalType, String logicalType, String repetition,
            boolean nullable, String type) {
    }

    private final List<SchemaElement> elements;
    private final List<Column> columns = new ArrayList<>();
    private int next;

    private ParquetSchema(List<SchemaElement> elements) {
        this.elements = elements;
    }

    /** The leaf columns of a footer's schema list, in file order. */
    static List<Column> columns(List<SchemaElement> elements) throws UnreadableFileException {
        if (elements == null || elements.isEmpty()) {
            throw new UnreadableFileException("invalid", "The Parquet footer holds no schema");
        }
        ParquetSchema schema = new ParquetSchema(elements);
        SchemaElement root = elements.get(0);
        schema.next = 1;
        schema.children(root, "", "", false, 1);
        if (schema.next != elements.size()) {
            throw new UnreadableFileException("invalid", "The Parquet schema lists " + elements.size()
                    + " elements but its root's tree holds " + schema.next);
        }
        return schema.columns;
    }

    private void children(SchemaElement group, String name, String path, boolean nullable, int depth)
            throws UnreadableFileException {
        if (depth > MAX_DEPTH) {
            throw new UnreadableFileException("invalid", "The Parquet schema nests deeper than " + MAX_DEPTH + " levels");
        }
        int count = group.getNum_children();
        if (count < 0 || count > elements.size() - next) {
            throw new UnreadableFileException("invalid", "Parquet schema group '" + group.getName() + "' claims "
                    + count + " children; only " + (elements.size() - next) + " elements follow");
        }
        SchemaElement only = count == 1 ? elements.get(next) : null;
        if (only != null && isWrapper(group) && only.getRepetition_type() == FieldRepetitionType.REPEATED) {
            // Parquet LogicalTypes.md, "Nested Types": a LIST or MAP group holds one repeated group (or, in
            // the older two-level lists, one repeated field). The repeated level becomes "[]" on the list's name.
            next++;
            String listName = name + "[]";
            String listPath = join(path, only.getName());
            if (isLeaf(only)) {
                leaf(only, listName, listPath, nullable);
            } else if (isThreeLevelList(group, only)) {
                // The repeated group's single field is the element itself; it adds no name of its own.
                SchemaElement element = elements.get(next++);
                boolean elementNullable = nullable || element.getRepetition_type() == FieldRepetitionType.OPTIONAL;
                String elementPath = join(listPath, element.getName());
                if (isLeaf(element)) {
                    leaf(element, listName, elementPath, elementNullable);
                } else {
                    children(element, listName, elementPath, elementNullable, depth + 2);
                }
            } else {
                children(only, listName, listPath, nullable, depth + 1);
            }
            return;
        }
        for (int i = 0; i < count; i++) {
            field(elements.get(next++), name, path, nullable, depth);
        }
    }

    private void field(SchemaElement e, String parentName, String parentPath, boolean parentNullable, int depth)
            throws UnreadableFileException {
        if (e.getName() == null) {
            throw new UnreadableFileException("invalid", "A Parquet schema element has no name");
        }
        String name = join(parentName, e.getName()) + (e.getRepetition_type() == FieldRepetitionType.REPEATED ? "[]" : "");
        String path = join(parentPath, e.getName());
        boolean nullable = parentNullable || e.getRepetition_type() == FieldRepetitionType.OPTIONAL;
        if (isLeaf(e)) {
            leaf(e, name, path, nullable);
        } else {
            children(e, name, path, nullable, depth + 1);
        }
    }

    private void leaf(SchemaElement e, String name, String path, boolean nullable) throws UnreadableFileException {
        if (!e.isSetType()) {
            throw new UnreadableFileException("invalid", "Parquet column '" + path + "' has neither a type nor children");
        }
        String physical = e.getType().name();
        String logical = logical(e);
        String repetition = e.isSetRepetition_type() ? e.getRepetition_type().name() : "REQUIRED";
        columns.add(new Column(name, path, physical, logical, repetition, nullable, ParquetTypes.headwaterType(e)));
    }

    private static boolean isLeaf(SchemaElement e) {
        return !e.isSetNum_children() || (e.isSetType() && e.getNum_children() == 0);
    }

    private static boolean isWrapper(SchemaElement group) {
        LogicalType l = group.getLogicalType();
        if (l != null && (l.isSetLIST() || l.isSetMAP())) {
            return true;
        }
        ConvertedType c = group.getConverted_type();
        return c == ConvertedType.LIST || c == ConvertedType.MAP || c == ConvertedType.MAP_KEY_VALUE;
    }

    /**
     * Parquet LogicalTypes.md, "Lists", backward-compatibility rules: a repeated group with one field is the
     * standard three-level form unless it is named {@code array} or {@code <list>_tuple}, which older writers
     * used for two-level lists of one-field structs. Maps always keep their key and value names.
     */
    private boolean isThreeLevelList(SchemaElement list, SchemaElement repeated) {
        boolean isList = (list.getLogicalType() != null && list.getLogicalType().isSetLIST())
                || list.getConverted_type() == ConvertedType.LIST;
        return isList && repeated.getNum_children() == 1 && !repeated.getName().equals("array")
                && !repeated.getName().equals(list.getName() + "_tuple") && next < elements.size();
    }

    /** The annotation as parquet-column's LogicalTypeAnnotation prints it, from the logical or the legacy converted type. */
    static String logical(SchemaElement e) {
        LogicalType l = e.getLogicalType();
        if (l != null && l.getSetField() != null) {
            switch (l.getSetField()) {
                case DECIMAL:
                    return "DECIMAL(" + l.getDECIMAL().getPrecision() + "," + l.getDECIMAL().getScale() + ")";
                case TIMESTAMP:
                    return "TIMESTAMP(" + unit(l.getTIMESTAMP().getUnit()) + "," + l.getTIMESTAMP().isIsAdjustedToUTC() + ")";
                case TIME:
                    return "TIME(" + unit(l.getTIME().getUnit()) + "," + l.getTIME().isIsAdjustedToUTC() + ")";
                case INTEGER:
                    return "INTEGER(" + l.getINTEGER().getBitWidth() + "," + l.getINTEGER().isIsSigned() + ")";
                default:
                    return l.getSetField().name();
            }
        }
        if (!e.isSetConverted_type()) {
            return null;
        }
        ConvertedType c = e.getConverted_type();
        switch (c) {
            case UTF8:
                return "STRING";
            case DECIMAL:
                return "DECIMAL(" + e.getPrecision() + "," + e.getScale() + ")";
            case TIMESTAMP_MILLIS:
            case TIMESTAMP_MICROS:
                // Converted timestamps are UTC-adjusted (LogicalTypes.md, "Timestamp", backward compatibility).
                return "TIMESTAMP(" + c.name().substring("TIMESTAMP_".length()) + ",true)";
            case TIME_MILLIS:
            case TIME_MICROS:
                return "TIME(" + c.name().substring("TIME_".length()) + ",true)";
            case INT_8: case INT_16: case INT_32: case INT_64:
                return "INTEGER(" + c.name().substring("INT_".length()) + ",true)";
            case UINT_8: case UINT_16: case UINT_32: case UINT_64:
                return "INTEGER(" + c.name().substring("UINT_".length()) + ",false)";
            default:
                return c.name();
        }
    }

    private static String unit(TimeUnit unit) {
        if (unit == null || unit.getSetField() == null) {
            return "UNKNOWN";
        }
        return unit.getSetField().name().toUpperCase(Locale.ROOT);
    }

    private static String join(String prefix, String name) {
        return prefix.isEmpty() ? name : prefix + "." + name;
    }
}
