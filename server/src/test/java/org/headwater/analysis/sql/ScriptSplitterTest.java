package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Cutting scripts into statements; the lexical rules are PostgreSQL's (manual 4.1 "Lexical Structure"). */
class ScriptSplitterTest {

    @Test
    void splitsAtTopLevelSemicolonsAndRecordsStartLines() {
        List<ScriptSplitter.Piece> pieces = ScriptSplitter.split("select 1;\n\n  select 2 ;select 3");

        assertThat(pieces).containsExactly(
                new ScriptSplitter.Piece("select 1", 1),
                new ScriptSplitter.Piece("select 2", 3),
                new ScriptSplitter.Piece("select 3", 3));
    }

    @Test
    void semicolonsInsideLiteralsIdentifiersAndCommentsDoNotSplit() {
        List<ScriptSplitter.Piece> pieces = ScriptSplitter.split(
                "select 'a;b', \"c;d\", E'it\\'s;' /* x; /* nested; */ y; */ from t -- z;\n;select 2");

        assertThat(pieces).extracting(ScriptSplitter.Piece::text).containsExactly(
                "select 'a;b', \"c;d\", E'it\\'s;' /* x; /* nested; */ y; */ from t -- z;", "select 2");
    }

    @Test
    void dollarQuotedBodiesStayWholeButParametersAreNoQuotes() {
        List<ScriptSplitter.Piece> pieces = ScriptSplitter.split(
                "create function f() returns int as $fn$ select 1; $$ still; $fn$ language sql; select $1; select a$b from t");

        assertThat(pieces).extracting(ScriptSplitter.Piece::text).containsExactly(
                "create function f() returns int as $fn$ select 1; $$ still; $fn$ language sql",
                "select $1",
                "select a$b from t");
    }

    @Test
    void emptyStatementsAndCommentOnlyTailsAreDropped() {
        assertThat(ScriptSplitter.split(";;  -- only a comment\n /* and another */")).isEmpty();
    }
}
