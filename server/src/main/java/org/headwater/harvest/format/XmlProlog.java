package org.headwater.harvest.format;

/**
 * Finds the root element's name of XML text without parsing the document: skips the XML declaration,
 * processing instructions, comments and a DOCTYPE (XML 1.0 section 2.8, "prolog"). Enough to tell SVG from
 * other XML on a file's first bytes; the full, secure parse is {@link SvgFigure}'s.
 */
final class XmlProlog {

    /**
     * @param name the root element's name as written (with its prefix), or null when none was found
     * @param undecided true when the text ended inside the prolog, before any root element
     */
    record Root(String name, boolean undecided) {
        /** True when the root element's local name is {@code svg}. */
        boolean svg() {
            return name != null && (name.equals("svg") || name.endsWith(":svg"));
        }
    }

    private static final Root NOT_XML = new Root(null, false);
    private static final Root UNDECIDED = new Root(null, true);

    private XmlProlog() {
    }

    static Root root(String text) {
        int i = text.startsWith("\uFEFF") ? 1 : 0;
        int n = text.length();
        // Every branch moves i forward or returns, so the walk ends within the text's length.
        while (i < n) {
            char c = text.charAt(i);
            if (Character.isWhitespace(c)) {
                i++;
            } else if (text.startsWith("<?", i)) {
                int end = text.indexOf("?>", i + 2);
                if (end < 0) {
                    return UNDECIDED;
                }
                i = end + 2;
            } else if (text.startsWith("<!--", i)) {
                int end = text.indexOf("-->", i + 4);
                if (end < 0) {
                    return UNDECIDED;
                }
                i = end + 3;
            } else if (text.startsWith("<!DOCTYPE", i)) {
                int end = endOfDoctype(text, i + 9);
                if (end < 0) {
                    return UNDECIDED;
                }
                i = end + 1;
            } else if (c == '<') {
                int start = i + 1;
                int end = start;
                while (end < n && isNameChar(text.charAt(end))) {
                    end++;
                }
                if (end == n) {
                    return UNDECIDED;
                }
                return end > start ? new Root(text.substring(start, end), false) : NOT_XML;
            } else {
                return NOT_XML;
            }
        }
        return UNDECIDED;
    }

    /** The index of the '>' closing a DOCTYPE, past quoted literals and an internal subset in brackets; -1 if absent. */
    private static int endOfDoctype(String text, int from) {
        int depth = 0;
        char quote = 0;
        for (int i = from; i < text.length(); i++) {
            char c = text.charAt(i);
            if (quote != 0) {
                if (c == quote) {
                    quote = 0;
                }
            } else if (c == '"' || c == '\'') {
                quote = c;
            } else if (c == '[') {
                depth++;
            } else if (c == ']') {
                depth--;
            } else if (c == '>' && depth <= 0) {
                return i;
            }
        }
        return -1;
    }

    // XML 1.0 section 2.3 NameChar, reduced to what ends a name in practice: whitespace, '/', '>'.
    private static boolean isNameChar(char c) {
        return !Character.isWhitespace(c) && c != '/' && c != '>' && c != '<';
    }
}
