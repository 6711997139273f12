package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.treesitter.TSLanguage;
import org.treesitter.TSParser;
import org.treesitter.TreeSitterBash;
import org.treesitter.TreeSitterPython;
import org.treesitter.TreeSitterR;

class TreeSitterSmokeTest {
    private static String parse(TSLanguage lang, String code) {
        TSParser p = new TSParser();
        p.setLanguage(lang);
        return p.parseString(null, code).getRootNode().toString();
    }

    @Test
    void pythonParses() {
        System.out.println(parse(new TreeSitterPython(), "import pandas as pd\ndf = pd.read_csv(f'a/{m:02d}.csv')\nif False:\n  x = 1\n"));
    }

    @Test
    void rParses() {
        System.out.println(parse(new TreeSitterR(), "x <- readr::read_csv(file.path('a', 'b.csv'))\nif (FALSE) y <- 2\nf(a = 1)\n"));
    }

    @Test
    void bashParses() {
        System.out.println(parse(new TreeSitterBash(), "python3 scripts/a.py --out \"x y\" 'z'\nRscript m.R $HOME/a\n"));
    }
}
