package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Python idioms one by one; expected values follow Python 3 semantics as its docs state them (from memory). */
class PythonIdiomsTest {
    @TempDir
    Path ws;

    @Test
    void mainGuardRunsAndFunctionArgumentsFlowIn() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py",
                "import pandas as pd",
                "def load(name, folder='raw'):",
                "    return pd.read_csv(f'{folder}/{name}.csv')",
                "def main():",
                "    load('hives')",
                "    load('sites', folder='ref')",
                "if __name__ == '__main__':",
                "    main()").analyze("job.py");
        // reference: Python 3 docs, __main__: the guard is true when the file runs as a script
        assertThat(Refs.of(a)).containsExactly("READ raw/hives.csv @3", "READ ref/sites.csv @3");
    }

    @Test
    void unknownFileModeCountsAsReadAndWriteWithHalfConfidence() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import sys", "f = open('work/x.txt', sys.argv[1])").analyze("job.py");
        assertThat(a.references()).extracting(r -> r.direction() + " " + r.confidence())
                .containsExactly("READ 0.5", "WRITE 0.5");
    }

    @Test
    void environmentDefaultGivesTheDefaultAndKeepsTheVariableUnresolved() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import os", "import pandas as pd",
                "pd.read_csv(os.getenv('HIVES_CSV', 'raw/hives.csv'))").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ ? @3 [os.getenv('HIVES_CSV', 'raw/hives.csv')]", "READ raw/hives.csv @3");
    }

    @Test
    void globCallGivesAResolvedPatternWithoutInstances() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import glob", "import pandas as pd",
                "for f in glob.glob('raw/scales/*.csv'):", "    pd.read_csv(f)").analyze("job.py");
        DataReference r = a.references().get(0);
        assertThat(List.of(r.pathPattern(), r.isGlob(), r.resolved(), r.instances())).containsExactly("raw/scales/*.csv", true, true, List.of());
    }

    @Test
    void loopOverValuesNotShownKeepsOnlyAShapeAndStaysUnresolved() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd", "names = fetch_names()",
                "for n in names:", "    pd.read_csv(f'raw/{n}.csv')").analyze("job.py");
        DataReference r = a.references().get(0);
        assertThat(List.of(String.valueOf(r.pathPattern()), r.resolved())).containsExactly("raw/*.csv", false);
    }

    @Test
    void pathlibGlobAndListdirGivePatternsOfTheFolder() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import os", "from pathlib import Path", "import pandas as pd",
                "for p in Path('raw').glob('*.parquet'):", "    pd.read_parquet(p)",
                "for name in os.listdir('inbox'):", "    pd.read_json(os.path.join('inbox', name))").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ raw/*.parquet @5", "READ inbox/* @7");
    }

    @Test
    void workspaceModuleImportedWholeGivesItsConstants() throws Exception {
        ScriptAnalysis a = new Snippets(ws)
                .file("lib/paths.py", "import os", "BASE = os.path.join('data', 'v2')")
                .file("lib/job.py", "import paths as P", "import pandas as pd", "pd.read_csv(P.BASE + '/x.csv')").analyze("lib/job.py");
        assertThat(Refs.of(a)).containsExactly("READ data/v2/x.csv @3");
    }

    @Test
    void fileRelativePathsResolveAgainstTheScriptsFolder() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("pipeline/job.py", "import os", "from pathlib import Path", "import pandas as pd",
                "HERE = os.path.dirname(os.path.abspath(__file__))",
                "pd.read_csv(os.path.join(HERE, 'lookup.csv'))",
                "pd.read_csv(Path(__file__).resolve().parent.parent / 'raw' / 'x.csv')").analyze("pipeline/job.py");
        assertThat(Refs.of(a)).containsExactly("READ pipeline/lookup.csv @5", "READ raw/x.csv @6");
    }

    @Test
    void branchesWithUnknownConditionGiveBothPaths() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import sys", "import pandas as pd",
                "if len(sys.argv) > 5:", "    src = 'raw/full.csv'", "else:", "    src = 'raw/sample.csv'", "pd.read_csv(src)").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ raw/full.csv @7", "READ raw/sample.csv @7");
        assertThat(a.references()).extracting(DataReference::confidence).containsExactly(0.9, 0.9);
    }

    @Test
    void percentFormattingAndStrFormatOfLoopItemsEnumerate() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import numpy as np",
                "for year in [2023, 2024]:", "    np.save('work/w_%d.npy' % year, None)",
                "for n in range(3):", "    np.load('work/part{:02d}.npy'.format(n))").analyze("job.py");
        assertThat(a.references()).extracting(DataReference::instances).containsExactly(
                List.of("work/w_2023.npy", "work/w_2024.npy"), List.of("work/part00.npy", "work/part01.npy", "work/part02.npy"));
    }

    @Test
    void toCsvWithoutAPathWritesNoDataset() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd", "df = pd.read_csv('raw/a.csv')", "text = df.to_csv()").analyze("job.py");
        // reference: pandas docs, DataFrame.to_csv returns the text when path_or_buf is None
        assertThat(Refs.of(a)).containsExactly("READ raw/a.csv @2");
    }

    @Test
    void urlsAndAbsolutePathsOutsideTheWorkspaceStayAsWritten() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd",
                "pd.read_csv('https://example.org/hives.csv')", "pd.read_parquet('/srv/shared/sites.parquet')").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ https://example.org/hives.csv @2", "READ /srv/shared/sites.parquet @3");
    }

    @Test
    void syntaxErrorsAreReportedAndTheRestIsStillFound() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd", "pd.read_csv('raw/a.csv')", "def broken(:", "    pass").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ raw/a.csv @2");
        assertThat(a.warnings()).contains("syntax errors: the parser recovered, references near them may be missing");
    }

    @Test
    void assignColumnFromAnotherFrameKeepsThatFramesOrigin() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd",
                "a = pd.read_csv('raw/a.csv')", "b = pd.read_csv('raw/b.csv')",
                "out = a[['k']]", "out['v'] = b['value'].fillna(0)", "out.to_csv('work/out.csv')").analyze("job.py");
        assertThat(Refs.flowsInto(a, "work/out.csv")).containsExactly("k <- raw/a.csv#k (direct)", "v <- raw/b.csv#value (derived)");
    }

    @Test
    void unknownFrameOperationLeavesTheFlowDatasetLevelOnly() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd",
                "a = pd.read_csv('raw/a.csv')", "a.pivot_table(index='k').to_csv('work/p.csv')").analyze("job.py");
        assertThat(a.flows()).singleElement().satisfies(f -> {
            assertThat(f.datasetLevelOnly()).isTrue();
            assertThat(f.sources()).containsExactly("raw/a.csv");
            assertThat(f.columns()).isEmpty();
        });
    }

    @Test
    void readsInsideAnImportedWorkspaceFunctionArePlacedAtTheCallInThisScript() throws Exception {
        ScriptAnalysis a = new Snippets(ws)
                .file("helpers.py", "import pandas as pd", "", "", "def load(name):", "    return pd.read_csv(f'raw/{name}.csv')")
                .file("job.py", "from helpers import load", "sites = load('sites')").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ raw/sites.csv @2");
        assertThat(a.references().get(0).expressionText()).isEqualTo("load('sites')");
        assertThat(a.references().get(0).confidence()).isEqualTo(0.9);
    }

    @Test
    void streamFunctionsReportTheOpenCallOnceAndUnknownStreamsAsUnresolved() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import json", "import sys", "import csv",
                "with open('raw/cfg.json') as fh:", "    cfg = json.load(fh)",
                "json.dump(cfg, sys.stdout)",
                "def save(rows, out):", "    csv.writer(out).writerows(rows)").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ raw/cfg.json @4", "WRITE ? @8 [out]");
        assertThat(a.references()).extracting(DataReference::function).containsExactly("builtins.open", "csv.writer");
    }

    @Test
    void readSqlWithABareNameReadsThatTable() throws Exception {
        ScriptAnalysis a = new Snippets(ws).file("job.py", "import pandas as pd", "t = pd.read_sql('hive_weights', con)",
                "q = pd.read_sql_query('select * from coop.sites s join coop.hives h on s.id = h.site', con)").analyze("job.py");
        assertThat(Refs.of(a)).containsExactly("READ table:hive_weights @2", "READ table:coop.sites @3", "READ table:coop.hives @3");
    }
}
