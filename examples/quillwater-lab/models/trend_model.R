# Quillwater basin: linear nitrate trend per station, January-June 2025.
#
# Run from the workspace root:
#   Rscript models/trend_model.R derived/station_monthly_summary.csv
#
# Reads   derived/station_monthly_summary.csv (or the path given as first argument)
#         derived/lab_merged.csv
# Writes  derived/trend_coefficients.csv
#         bulletin/figures/fig1_no3_trend.png
#         bulletin/figures/fig3_ion_balance.pdf

suppressPackageStartupMessages({
  library(readr)
  library(dplyr)
  library(tidyr)
  library(ggplot2)
})

args <- commandArgs(trailingOnly = TRUE)
summary_path <- if (length(args) >= 1) args[[1]] else file.path("derived", "station_monthly_summary.csv")
lab_path <- file.path("derived", "lab_merged.csv")
fig_dir <- file.path("bulletin", "figures")

monthly <- read_csv(summary_path, show_col_types = FALSE)
lab <- readr::read_csv(lab_path, show_col_types = FALSE)
# previous_year <- read_csv(file.path("derived", "station_monthly_summary_2024.csv"))

fit_trend <- function(d, key) {
  fit <- lm(mean_nitrate_mg_l ~ month, data = d)
  tibble(
    slope_mg_l_per_month = unname(coef(fit)[["month"]]),
    intercept_mg_l = unname(coef(fit)[["(Intercept)"]]),
    r_squared = summary(fit)$r.squared,
    n_months = nrow(d)
  )
}

coefficients <- monthly |>
  group_by(station_code) |>
  group_modify(fit_trend) |>
  ungroup() |>
  mutate(across(c(slope_mg_l_per_month, intercept_mg_l, r_squared), ~ round(.x, 4)))

write_csv(coefficients, file.path("derived", "trend_coefficients.csv"))

trend_plot <- ggplot(monthly, aes(x = month, y = mean_nitrate_mg_l, colour = station_code)) +
  geom_line() +
  geom_point() +
  scale_x_continuous(breaks = 1:6, labels = month.abb[1:6]) +
  labs(title = "Quillwater basin - NO3 trend 2025", x = NULL, y = "nitrate (mg/L)", colour = NULL) +
  theme_minimal(base_size = 8)

ggsave("bulletin/figures/fig1_no3_trend.png", trend_plot, width = 3.2, height = 2, dpi = 100)

ion_means <- lab |>
  filter(!is.na(chloride_mg_l)) |>
  group_by(station_code) |>
  summarise(chloride = mean(chloride_mg_l), sulfate = mean(sulfate_mg_l), .groups = "drop") |>
  pivot_longer(c(chloride, sulfate), names_to = "ion", values_to = "mg_l")

ion_plot <- ggplot(ion_means, aes(x = station_code, y = mg_l, fill = ion)) +
  geom_col(position = "dodge") +
  labs(title = "Quillwater basin - ion balance 2025", x = NULL, y = "mg/L", fill = NULL) +
  theme_minimal(base_size = 9)

ggsave(file.path(fig_dir, "fig3_ion_balance.pdf"), ion_plot, width = 6, height = 4)
