package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.util.List;
import org.headwater.analysis.script.document.CodePiece;
import org.headwater.analysis.script.document.MarkdownChunks;
import org.headwater.analysis.script.document.NotebookCells;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Code taken out of notebooks and R Markdown / Quarto documents. // reference: nbformat 4 JSON schema
 * (source as a string or a list of lines), IPython docs on line and cell magics, knitr chunk option
 * eval and Quarto's #| cell options, all from memory
 */
class DocumentsTest {
    @TempDir
    Path ws;

    @Test
    void notebookMagicAndShellLinesAreBlankedKeepingLineNumbers() throws Exception {
        List<CodePiece> cells = NotebookCells.read("{\"cells\": ["
                + "{\"cell_type\": \"markdown\", \"source\": \"# title\"},"
                + "{\"cell_type\": \"code\", \"source\": [\"%load_ext autoreload\\n\", \"!pip list\\n\", \"x = 1\"]},"
                + "{\"cell_type\": \"code\", \"source\": \"%%bash\\nls\"},"
                + "{\"cell_type\": \"code\", \"source\": \"%%time\\ny = 2\"}], \"metadata\": {}}");
        assertThat(cells).extracting(c -> c.cell() + ":" + c.code().replace("\n", "|")).containsExactly("1:||x = 1", "3:|y = 2");
    }

    @Test
    void notebookWithAnRKernelIsAnalysedAsR() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("nb/r.ipynb", "{\"cells\": [{\"cell_type\": \"code\", \"source\": \"d <- read.csv('../raw/a.csv')\"}],"
                + " \"metadata\": {\"kernelspec\": {\"language\": \"R\", \"name\": \"ir\"}}}").analyze("nb/r.ipynb");
        assertThat(Refs.of(a)).containsExactly("READ raw/a.csv @cell0:1");
    }

    @Test
    void quartoChunksWithEvalFalseOptionAreLeftOutAndOthersKeepTheirFileLines() {
        List<CodePiece> chunks = MarkdownChunks.read(String.join("\n", "---", "title: q", "---", "",
                "```{r}", "#| eval: false", "read.csv('no.csv')", "```", "",
                "```{python}", "import pandas as pd", "pd.read_csv('yes.csv')", "```", "",
                "~~~{r, eval=F}", "x", "~~~", ""));
        assertThat(chunks).extracting(c -> c.language() + "@" + c.lineOffset() + ":" + c.code().strip())
                .containsExactly("python@10:import pandas as pd\npd.read_csv('yes.csv')");
    }

    @Test
    void pythonChunksOfAQuartoDocumentAreAnalysedToo() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("doc/report.qmd", "---", "title: q", "---", "",
                "```{python}", "import pandas as pd", "pd.read_csv('data.csv')", "```").analyze("doc/report.qmd");
        assertThat(Refs.of(a)).containsExactly("READ doc/data.csv @7");
    }
}
