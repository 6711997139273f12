package org.headwater.harvest.format;

import java.io.StringReader;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.xml.XMLConstants;
import javax.xml.stream.XMLInputFactory;
import javax.xml.stream.XMLStreamConstants;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamReader;

/**
 * Reads an SVG's size, title, description and metadata (SVG 1.1 sections 5.4, 5.11, 7.2 and 7.7) with the
 * JDK's streaming XML parser, configured so that no DTD is processed: no external entity or DTD is
 * fetched and no entity is expanded (XXE and "billion laughs" safe). A reference to an entity declared in
 * a DOCTYPE is therefore an undeclared entity and the file is reported invalid.
 */
final class SvgFigure {
    static final int WHOLE_CAP = 8 * 1024 * 1024;
    private static final String SVG_NS = "http://www.w3.org/2000/svg";
    // Dublin Core element set and terms: the vocabulary SVG 1.1 section 21 shows inside <metadata>.
    private static final List<String> DUBLIN_CORE = List.of("http://purl.org/dc/elements/1.1/", "http://purl.org/dc/terms/");
    private static final XMLInputFactory XML = secureFactory();
    private static final Pattern DECLARED_ENCODING = Pattern.compile("^<\\?xml[^>]*?encoding\\s*=\\s*[\"']([A-Za-z0-9._-]{1,40})[\"']");

    private SvgFigure() {
    }

    /** The JDK's own StAX implementation (not whichever the class path offers), with DTDs off. */
    private static XMLInputFactory secureFactory() {
        XMLInputFactory f = XMLInputFactory.newDefaultFactory();
        f.setProperty(XMLInputFactory.SUPPORT_DTD, false);
        f.setProperty(XMLInputFactory.IS_SUPPORTING_EXTERNAL_ENTITIES, false);
        f.setProperty(XMLConstants.ACCESS_EXTERNAL_DTD, "");
        f.setProperty(XMLConstants.ACCESS_EXTERNAL_SCHEMA, "");
        f.setProperty(XMLInputFactory.IS_COALESCING, true);
        return f;
    }

    static Map<String, Object> read(Sample sample) throws UnreadableFileException {
        Optional<byte[]> whole = Figures.wholeIfReadable(sample, WHOLE_CAP);
        return parse(whole.orElse(sample.head()), whole.isPresent());
    }

    /** Collects what the walk finds; each text is capped while it is gathered. */
    private static final class Found {
        final Map<String, Object> root = new LinkedHashMap<>();
        final StringBuilder title = new StringBuilder();
        final StringBuilder description = new StringBuilder();
        final StringBuilder metadataText = new StringBuilder();
        final TextEntries dublinCore = new TextEntries();
        boolean rootSeen;
        boolean rootClosed;
        boolean titleSeen;
        boolean descriptionSeen;

        Map<String, Object> details(boolean partial) {
            Map<String, Object> out = new LinkedHashMap<>(root);
            if (titleSeen) {
                out.put("title", collapse(title));
            }
            if (descriptionSeen) {
                out.put("description", collapse(description));
            }
            if (metadataText.length() > 0) {
                out.put("metadata_text", collapse(metadataText));
            }
            if (!dublinCore.isEmpty()) {
                out.put("metadata", dublinCore.asMap());
            }
            if (dublinCore.truncated()) {
                out.put("metadata_truncated", true);
            }
            if (partial) {
                out.put("read_to_end", false);
            }
            return out;
        }
    }

    private static Map<String, Object> parse(byte[] bytes, boolean whole) throws UnreadableFileException {
        Found found = new Found();
        XMLStreamReader r = null;
        try {
            r = XML.createXMLStreamReader(new StringReader(decode(bytes)));
            walk(r, found);
            return found.details(false);
        } catch (XMLStreamException | RuntimeException e) {
            boolean cut = found.rootSeen && !found.rootClosed && !endsWithRootEnd(bytes);
            if (cut && !whole) {
                // Only the head was read and it ends inside the document: what came before still counts.
                return found.details(true);
            }
            String where = e instanceof XMLStreamException x && x.getLocation() != null
                    ? " at line " + x.getLocation().getLineNumber() + ", column " + x.getLocation().getColumnNumber() : "";
            throw new UnreadableFileException(cut ? "truncated" : "invalid", (cut ? "The SVG ends early" : "Invalid SVG")
                    + where + ": " + parserMessage(e));
        } finally {
            close(r);
        }
    }

    private static void walk(XMLStreamReader r, Found found) throws XMLStreamException, UnreadableFileException {
        int depth = 0;
        // Path of the Dublin Core elements open inside <metadata>, for keys such as "creator.title".
        List<String> dc = new ArrayList<>();
        List<Boolean> dcOpened = new ArrayList<>();
        StringBuilder current = null;
        boolean inMetadata = false;
        int metadataDepth = 0;
        StringBuilder dcText = new StringBuilder();
        // The parser consumes input on every call to next(), so the walk ends with the bytes.
        while (r.hasNext()) {
            int event = r.next();
            if (event == XMLStreamConstants.START_ELEMENT) {
                depth++;
                String local = r.getLocalName();
                if (depth == 1) {
                    if (!local.equals("svg")) {
                        throw new UnreadableFileException("invalid", "The root element is <" + local + ">, not <svg>");
                    }
                    found.rootSeen = true;
                    rootAttributes(r, found.root);
                } else if (depth == 2 && isSvg(r) && local.equals("title") && !found.titleSeen) {
                    found.titleSeen = true;
                    current = found.title;
                } else if (depth == 2 && isSvg(r) && local.equals("desc") && !found.descriptionSeen) {
                    found.descriptionSeen = true;
                    current = found.description;
                } else if (depth == 2 && isSvg(r) && local.equals("metadata")) {
                    inMetadata = true;
                    metadataDepth = depth;
                }
                if (inMetadata && depth > metadataDepth) {
                    boolean isDc = DUBLIN_CORE.contains(r.getNamespaceURI());
                    dcOpened.add(isDc);
                    if (isDc) {
                        dc.add(local);
                        dcText.setLength(0);
                    }
                }
            } else if (event == XMLStreamConstants.CHARACTERS || event == XMLStreamConstants.CDATA) {
                if (current != null) {
                    append(current, r.getText());
                }
                if (inMetadata) {
                    append(found.metadataText, r.getText());
                    append(found.metadataText, " ");
                    if (!dc.isEmpty()) {
                        append(dcText, r.getText());
                    }
                }
            } else if (event == XMLStreamConstants.END_ELEMENT) {
                if (inMetadata && depth > metadataDepth && !dcOpened.isEmpty()) {
                    if (dcOpened.remove(dcOpened.size() - 1)) {
                        String text = collapse(dcText);
                        if (!text.isEmpty()) {
                            found.dublinCore.put(String.join(".", dc), text);
                        }
                        dc.remove(dc.size() - 1);
                        dcText.setLength(0);
                    }
                }
                if (inMetadata && depth == metadataDepth) {
                    inMetadata = false;
                }
                if (depth == 2) {
                    current = null;
                }
                depth--;
                if (depth == 0) {
                    found.rootClosed = true;
                    return;
                }
            }
        }
    }

    /**
     * Decodes the bytes as XML 1.0 appendix F says: a byte-order mark, else the XML declaration's encoding, else
     * UTF-8. Bytes that do not decode become U+FFFD. Decoding here rather than in the parser keeps the JDK parser
     * from printing "[Fatal Error]" lines to standard error for bad bytes.
     */
    static String decode(byte[] b) {
        if (ContentSniffer.startsWith(b, 0xEF, 0xBB, 0xBF)) {
            return new String(b, 3, b.length - 3, StandardCharsets.UTF_8);
        }
        if (ContentSniffer.startsWith(b, 0xFF, 0xFE)) {
            return new String(b, 2, b.length - 2, StandardCharsets.UTF_16LE);
        }
        if (ContentSniffer.startsWith(b, 0xFE, 0xFF)) {
            return new String(b, 2, b.length - 2, StandardCharsets.UTF_16BE);
        }
        Matcher m = DECLARED_ENCODING.matcher(new String(b, 0, Math.min(b.length, 256), StandardCharsets.ISO_8859_1));
        Charset charset = StandardCharsets.UTF_8;
        if (m.find()) {
            try {
                charset = Charset.forName(m.group(1));
            } catch (IllegalArgumentException unknown) {
                // An encoding this JVM does not know: UTF-8 is the XML default.
            }
        }
        return new String(b, charset);
    }

    /** SVG 1.1 section 7.2 (width, height: lengths with units, kept as written) and 7.7 (viewBox: four numbers). */
    private static void rootAttributes(XMLStreamReader r, Map<String, Object> out) {
        for (int i = 0; i < r.getAttributeCount(); i++) {
            String ns = r.getAttributeNamespace(i);
            if (ns != null && !ns.isEmpty()) {
                continue;
            }
            String name = r.getAttributeLocalName(i);
            String value = r.getAttributeValue(i).strip();
            switch (name) {
                case "width" -> out.put("width", cap(value));
                case "height" -> out.put("height", cap(value));
                case "viewBox" -> {
                    List<Double> box = viewBox(value);
                    if (box != null) {
                        out.put("view_box", box);
                    }
                }
                default -> { }
            }
        }
    }

    /** Four numbers separated by white space and/or a comma (SVG 1.1 section 7.7); null when it is not that. */
    static List<Double> viewBox(String value) {
        String[] parts = value.strip().split("[\\s,]+");
        if (parts.length != 4) {
            return null;
        }
        List<Double> numbers = new ArrayList<>(4);
        for (String p : parts) {
            try {
                double d = Double.parseDouble(p);
                if (!Double.isFinite(d)) {
                    return null;
                }
                numbers.add(d);
            } catch (NumberFormatException e) {
                return null;
            }
        }
        return numbers;
    }

    private static boolean isSvg(XMLStreamReader r) {
        String ns = r.getNamespaceURI();
        // Files without the SVG namespace are common enough to accept their children too.
        return ns == null || ns.isEmpty() || ns.equals(SVG_NS);
    }

    private static void append(StringBuilder to, String text) {
        int room = TextEntries.MAX_CHARS - to.length();
        if (room > 0) {
            to.append(text, 0, Math.min(room, text.length()));
        }
    }

    private static String cap(String value) {
        return value.length() <= TextEntries.MAX_CHARS ? value : value.substring(0, TextEntries.MAX_CHARS);
    }

    private static String collapse(CharSequence text) {
        return text.toString().strip().replaceAll("\\s+", " ");
    }

    private static boolean endsWithRootEnd(byte[] bytes) {
        int from = Math.max(0, bytes.length - 64);
        String end = new String(bytes, from, bytes.length - from, StandardCharsets.ISO_8859_1).strip();
        return end.endsWith("svg>");
    }

    /** The JDK parser's message without its "ParseError at [row,col]" prefix. */
    private static String parserMessage(Exception e) {
        String m = String.valueOf(e.getMessage());
        int at = m.indexOf("Message: ");
        return at >= 0 ? m.substring(at + "Message: ".length()).strip() : m.strip();
    }

    private static void close(XMLStreamReader r) {
        if (r != null) {
            try {
                r.close();
            } catch (XMLStreamException ignored) {
                // Nothing is held open: the input is an in-memory array.
            }
        }
    }
}
