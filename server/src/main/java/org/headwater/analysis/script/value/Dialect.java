package org.headwater.analysis.script.value;

import java.util.Locale;

/** How a language writes numbers, booleans and nothing when they become text. */
public enum Dialect {
    // reference: Python 3 str() of int, float, bool and None
    PYTHON("True", "False", "None"),
    // reference: R as.character() of numbers and logicals, from memory: 6 prints as "6", TRUE as "TRUE"
    R("TRUE", "FALSE", "NULL");

    private final String yes;
    private final String no;
    private final String nothing;

    Dialect(String yes, String no, String nothing) {
        this.yes = yes;
        this.no = no;
        this.nothing = nothing;
    }

    public String number(Value.Num num) {
        if (num.integral() && Math.abs(num.value()) < 1e15) {
            return Long.toString((long) num.value());
        }
        if (this == R && num.value() == Math.rint(num.value()) && Math.abs(num.value()) < 1e15) {
            return Long.toString((long) num.value());
        }
        String text = Double.toString(num.value());
        return text.toLowerCase(Locale.ROOT);
    }

    public String bool(boolean value) {
        return value ? yes : no;
    }

    public String nothing() {
        return nothing;
    }
}
