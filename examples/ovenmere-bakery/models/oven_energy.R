# Ovenmere cooperative: gas used per bake for each shared oven, ISO weeks 10-12 of 2026.
#
# Run from the workspace root:
#   Rscript models/oven_energy.R
#
# Reads   derived/oven_readings_clean.csv
#         ovens/oven_register.csv
# Writes  derived/oven_energy_weekly.csv
#         reports/figures/oven_gas_per_bake.svg

suppressPackageStartupMessages({
  library(readr)
  library(dplyr)
  library(ggplot2)
})

readings <- read_csv(file.path("derived", "oven_readings_clean.csv"), show_col_types = FALSE)
register <- read_csv("ovens/oven_register.csv", show_col_types = FALSE)

weekly <- readings |>
  filter(valid) |>
  mutate(week = strftime(read_at, "%G-W%V")) |>
  group_by(oven_id, week) |>
  summarise(gas_m3 = sum(gas_m3), bakes = n(), .groups = "drop") |>
  mutate(gas_per_bake_m3 = round(gas_m3 / bakes, 3))

write_csv(weekly, file.path("derived", "oven_energy_weekly.csv"))

plot <- ggplot(inner_join(weekly, register, by = "oven_id"), aes(oven_name, gas_per_bake_m3)) +
  geom_col() +
  labs(title = "Gas used per bake", x = NULL, y = "m3 per bake")
ggsave(file.path("reports", "figures", "oven_gas_per_bake.svg"), plot, width = 6, height = 4)
