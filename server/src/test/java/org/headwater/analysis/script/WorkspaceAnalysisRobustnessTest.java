package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** One unreadable script in a workspace costs only its own analysis (found by ScriptFuzzTest). */
class WorkspaceAnalysisRobustnessTest {
    @TempDir
    Path temp;

    @Test
    void aBrokenNotebookAndANonUtf8ScriptLeaveTheOtherScriptsAnalysed() throws Exception {
        Path workspace = Workspaces.demoCopy(temp.resolve("lab"));
        int before = new WorkspaceAnalysis().analyze(workspace, AnalysisContext.defaults()).size();
        Files.writeString(workspace.resolve("broken.ipynb"), "{\"cells\": [ {\"cell_type\": \"code\", \"source\": [\n");
        // 0xC3 0x28 is an invalid UTF-8 sequence (RFC 3629 section 3: a lead byte without its continuation)
        Files.write(workspace.resolve("latin.py"), new byte[] {'x', ' ', '=', ' ', '"', (byte) 0xC3, 0x28, '"', '\n'});
        var analyses = new WorkspaceAnalysis().analyze(workspace, AnalysisContext.defaults());
        assertThat(analyses).hasSize(before);
        assertThat(analyses).extracting(a -> a.script().toString()).doesNotContain("broken.ipynb", "latin.py");
    }
}
