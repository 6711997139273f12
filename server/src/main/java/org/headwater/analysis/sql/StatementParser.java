package org.headwater.analysis.sql;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.regex.Pattern;
import net.sf.jsqlparser.JSQLParserException;
import net.sf.jsqlparser.parser.CCJSqlParserUtil;
import net.sf.jsqlparser.statement.Statement;

/**
 * Parses one statement with JSqlParser. The parser runs on a worker thread so that its own
 * time-out (JSqlParser's default, a few seconds) can stop a pathological statement; one worker
 * serves a whole script rather than one thread per statement.
 */
final class StatementParser implements AutoCloseable {

    /**
     * Routine bodies are another language (PL/pgSQL and the like): their text is skipped, not
     * parsed, because it is no lineage of this script's tables.
     */
    private static final Pattern ROUTINE = Pattern.compile(
            "(?is)^(create\\s+(or\\s+replace\\s+)?(function|procedure|trigger|aggregate)\\b|do\\b).*");

    /** Either a statement or the reason it could not be parsed. */
    record Outcome(Statement statement, String error) {}

    private final ExecutorService worker = Executors.newSingleThreadExecutor(runnable -> {
        Thread thread = new Thread(runnable, "headwater-sql-parser");
        thread.setDaemon(true);
        return thread;
    });

    static boolean isRoutine(String statementText) {
        return ROUTINE.matcher(statementText).matches();
    }

    Outcome parse(String statementText) {
        try {
            return new Outcome(CCJSqlParserUtil.parse(statementText, worker, null), null);
        } catch (JSQLParserException e) {
            return new Outcome(null, firstLine(e));
        }
    }

    private static String firstLine(Throwable e) {
        Throwable cause = e.getCause() != null ? e.getCause() : e;
        String message = cause.getMessage() == null ? cause.toString() : cause.getMessage();
        return message.lines().findFirst().orElse(message).strip();
    }

    @Override
    public void close() {
        worker.shutdownNow();
    }
}
