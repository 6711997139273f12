package org.headwater.analysis.script.syntax;

import java.util.ArrayList;
import java.util.List;
import org.treesitter.TSNode;

/** A read-only view of one syntax node, with its text and position in the script file. */
public final class Node {
    private final TSNode ts;
    private final SourceText source;

    Node(TSNode ts, SourceText source) {
        this.ts = ts;
        this.source = source;
    }

    public String type() {
        return ts.getType();
    }

    public boolean isNamed() {
        return ts.isNamed();
    }

    public boolean hasError() {
        return ts.hasError();
    }

    public String text() {
        return source.text(ts.getStartByte(), ts.getEndByte());
    }

    public int line() {
        return source.line(ts.getStartPoint().getRow());
    }

    public int column() {
        return source.column(ts.getStartPoint().getRow(), ts.getStartByte());
    }

    /** The notebook cell this node came from, or {@code null} outside notebooks. */
    public Integer cell() {
        return source.cell();
    }

    /** The child in a grammar field; when a field repeats (the R grammar's {@code else}), the named one. */
    public Node field(String name) {
        TSNode direct = ts.getChildByFieldName(name);
        if (direct == null || direct.isNull()) {
            return null;
        }
        if (direct.isNamed()) {
            return new Node(direct, source); // the common case: one native call
        }
        Node found = null;
        for (int i = 0; i < ts.getChildCount(); i++) {
            if (name.equals(ts.getFieldNameForChild(i))) {
                TSNode child = ts.getChild(i);
                if (child.isNamed()) {
                    return new Node(child, source);
                }
                if (found == null) {
                    found = new Node(child, source);
                }
            }
        }
        return found;
    }

    /** Every child in a repeated field, in source order. */
    public List<Node> fields(String name) {
        List<Node> out = new ArrayList<>();
        for (int i = 0; i < ts.getChildCount(); i++) {
            if (name.equals(ts.getFieldNameForChild(i)) && ts.getChild(i).isNamed()) {
                out.add(new Node(ts.getChild(i), source));
            }
        }
        return out;
    }

    /** The field name under which a child of this node sits, or {@code null}. */
    public String fieldOf(int childIndex) {
        return ts.getFieldNameForChild(childIndex);
    }

    public List<Node> children() {
        List<Node> out = new ArrayList<>(ts.getChildCount());
        for (int i = 0; i < ts.getChildCount(); i++) {
            out.add(new Node(ts.getChild(i), source));
        }
        return out;
    }

    /** Named children, skipping comments: commented-out code never reaches the analysis. */
    public List<Node> named() {
        List<Node> out = new ArrayList<>(ts.getNamedChildCount());
        for (int i = 0; i < ts.getNamedChildCount(); i++) {
            TSNode child = ts.getNamedChild(i);
            if (!"comment".equals(child.getType())) {
                out.add(new Node(child, source));
            }
        }
        return out;
    }

    public Node firstNamed() {
        List<Node> all = named();
        return all.isEmpty() ? null : all.get(0);
    }

    public boolean is(String typeName) {
        return typeName.equals(type());
    }

    @Override
    public String toString() {
        return type() + "@" + line() + ":" + column() + " " + text();
    }
}
