package org.headwater.harvest.format;

import org.apache.parquet.format.ConvertedType;
import org.apache.parquet.format.LogicalType;
import org.apache.parquet.format.SchemaElement;
import org.apache.parquet.format.Type;

/**
 * Maps a Parquet leaf's types to Headwater's logical types {integer, decimal, boolean, date, timestamp,
 * text, binary}, after Parquet's LogicalTypes.md: the logical type decides, then the legacy converted
 * type, then the physical type.
 */
final class ParquetTypes {

    private ParquetTypes() {
    }

    static String headwaterType(SchemaElement e) {
        LogicalType l = e.getLogicalType();
        if (l != null && l.getSetField() != null) {
            switch (l.getSetField()) {
                case STRING: case ENUM: case JSON: case UUID:
                    return "text";
                // Headwater has no time-of-day type; a TIME is shown as text, its Parquet type kept in details.
                case TIME:
                    return "text";
                case DATE:
                    return "date";
                case TIMESTAMP:
                    return "timestamp";
                case DECIMAL: case FLOAT16:
                    return "decimal";
                case INTEGER:
                    return "integer";
                case BSON: case VARIANT: case GEOMETRY: case GEOGRAPHY:
                    return "binary";
                default:
                    break; // UNKNOWN (a column of nulls) and anything newer: by the physical type
            }
        } else if (e.isSetConverted_type()) {
            ConvertedType c = e.getConverted_type();
            switch (c) {
                case UTF8: case ENUM: case JSON: case TIME_MILLIS: case TIME_MICROS:
                    return "text";
                case DATE:
                    return "date";
                case TIMESTAMP_MILLIS: case TIMESTAMP_MICROS:
                    return "timestamp";
                case DECIMAL:
                    return "decimal";
                case INT_8: case INT_16: case INT_32: case INT_64: case UINT_8: case UINT_16: case UINT_32: case UINT_64:
                    return "integer";
                // INTERVAL is three little-endian counts in twelve bytes; BSON is a document: neither is plain text.
                case BSON: case INTERVAL:
                    return "binary";
                default:
                    break;
            }
        }
        return physical(e.getType());
    }

    private static String physical(Type type) {
        if (type == null) {
            return "binary";
        }
        switch (type) {
            case BOOLEAN:
                return "boolean";
            case INT32: case INT64:
                return "integer";
            // INT96 holds the legacy nanosecond timestamps of Impala, Hive and Spark
            // (common practice, no source; the format spec only calls it deprecated).
            case INT96:
                return "timestamp";
            case FLOAT: case DOUBLE:
                return "decimal";
            default:
                return "binary";
        }
    }
}
