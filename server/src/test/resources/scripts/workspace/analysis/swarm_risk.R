# Swarm-risk scores per hive from weights, queen records and mite counts.
suppressPackageStartupMessages({
  library(readr)
  library(dplyr)
})

args <- commandArgs(trailingOnly = TRUE)
weights_path <- if (length(args) >= 1) args[1] else "work/weights.parquet"
weights <- arrow::read_parquet(weights_path)

queens <- read.csv(file.path("raw", "queen_records.csv"))
sites <- readxl::read_excel(here::here("raw", "apiary_sites.xlsx"))
for (yr in 2022:2024) {
  mites <- read_csv(paste0("raw/mites_", yr, ".csv"))
}
for (i in 1:3) {
  frame_counts <- read_csv(sprintf("raw/frames/frame_%02d.csv", i))
}
# read_csv("raw/commented_out.csv")
if (FALSE) {
  read_csv("raw/never_read.csv")
}
extra <- read_csv(Sys.getenv("BRAMBLECOMBE_EXTRA_CSV"))

scores <- queens |>
  rename(hive_id = hive) |>
  mutate(queen_age = 2024 - queen_year, marked = is_marked) |>
  select(hive_id, queen_age, marked)
write_csv(scores, "work/swarm_scores.csv")

png("reports/swarm_risk.png")
plot(scores$queen_age)
dev.off()
saveRDS(scores, file = "work/swarm_scores.rds")

con <- DBI::dbConnect(RSQLite::SQLite(), "work/coop.db")
DBI::dbWriteTable(con, "swarm_scores", scores)
inspected <- DBI::dbGetQuery(con, "SELECT hive_id FROM hive_inspections")
