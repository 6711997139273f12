# Invented demo: one read or write per idiom, each with a literal path, in many syntactic places.
# The R-parser reference test lists every call here whose first argument is a string literal;
# Headwater must find each one that is a read or write in its table.
library(readr)
library(data.table)
library(ggplot2)

sites <- read.csv("raw/sites.csv")
sites2 <- read.csv2("raw/sites_semicolon.csv")
tab <- read.table("raw/table.txt", header = TRUE)
tsv <- read.delim("raw/delimited.tsv")
model <- readRDS("work/model.rds")
load("work/session.RData")
lines <- readLines("raw/notes.txt")
con <- file("work/out.txt", "w")
inp <- file("raw/in.txt")

fast <- fread("raw/big.csv")
typed <- readr::read_csv("raw/typed.csv")
tabbed <- read_tsv("raw/tabbed.tsv")
piped <- read_delim("raw/pipes.txt", delim = "|")
raw_lines <- read_lines("raw/lines.txt")
sheet <- readxl::read_excel("raw/sheet.xlsx")
sheet2 <- readxl::read_xlsx("raw/sheet2.xlsx")
pq <- arrow::read_parquet("raw/events.parquet")
ft <- arrow::read_feather("raw/events.feather")
ds <- arrow::open_dataset("raw/dataset")
js <- jsonlite::read_json("raw/config.json")
js2 <- jsonlite::fromJSON("raw/records.json")
literal_json <- jsonlite::fromJSON("[1, 2, 3]")

draw <- function() {
  png("figures/a.png")
  plot(1:3)
  dev.off()
  pdf("figures/b.pdf", width = 6)
  dev.off()
  svg("figures/c.svg")
  dev.off()
  jpeg("figures/d.jpg")
  dev.off()
  ggsave("figures/e.png")
}

results <- lapply(1:2, function(i) readRDS("work/lapply_body.rds"))
safe <- tryCatch(read_csv("raw/maybe.csv"), error = function(e) read_csv("raw/fallback.csv"))
local({
  read_csv("raw/in_local.csv")
})
if (nrow(sites) > 0) {
  read_csv("raw/then_branch.csv")
} else {
  read_csv("raw/else_branch.csv")
}
if (FALSE) {
  read_csv("raw/never.csv")
}
for (k in 1:2) {
  fread("raw/in_loop.csv")
}
