"""One season's harvest report; the season comes from the command line."""
import sys

import pandas as pd

season = sys.argv[1]
harvest = pd.read_csv(f"raw/harvest_{season}.csv")
with open(f"reports/harvest_{season}.md", "w") as out:
    out.write(harvest.to_markdown())
