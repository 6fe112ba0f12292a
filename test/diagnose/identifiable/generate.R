# Reference values for the tests of identifiable seasonality (src/diagnose/): R's stats::anova on lm fits
# (one-way by season for the stable-seasonality F; two-way cycles + seasons for the moving-seasonality F)
# and stats::kruskal.test, on the seasonal-irregular values against a centred moving average (stats::filter),
# for open datasets that ship with R. Writes fixtures/identifiable.json (committed, so CI needs no R).
#   apt-get install -y r-base-core r-cran-jsonlite
#   Rscript test/diagnose/identifiable/generate.R
# Sources (R documentation, ?name): AirPassengers, nottem, USAccDeaths, UKgas, sunspot.month, WWWusage.
suppressPackageStartupMessages(library(jsonlite))
here <- dirname(normalizePath(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))

ma <- function(x, p) {
  w <- if (p %% 2 == 0) c(0.5, rep(1, p - 1), 0.5) / p else rep(1 / p, p)
  as.numeric(stats::filter(as.numeric(x), w, sides = 2))
}
case <- function(id, x, p, mult, source) {
  x <- as.numeric(x)
  n <- length(x)
  tr <- ma(x, p)
  si <- if (mult) 100 * x / tr else x - tr
  season <- factor((seq_len(n) - 1) %% p)
  fs <- anova(lm(si ~ season))
  # Whole cycles: blocks of p values from the first defined one, kept when every value is defined.
  first <- which(!is.na(si))[1]
  starts <- seq(first, n - p + 1, by = p)
  rows <- list()
  for (k in seq_along(starts)) {
    idx <- starts[k]:(starts[k] + p - 1)
    if (all(!is.na(si[idx]))) rows[[length(rows) + 1]] <- data.frame(a = abs(si[idx] - if (mult) 100 else 0), cycle = k, season = seq_len(p))
  }
  d <- do.call(rbind, rows)
  fm <- anova(lm(a ~ factor(cycle) + factor(season), data = d))
  # Rounded to 9 significant digits, so values equal in exact arithmetic tie in R as they do in ours.
  kw <- kruskal.test(signif(si, 9), season)
  list(
    id = id, source = source, period = p, multiplicative = mult,
    values = x,
    stable = list(statistic = fs$`F value`[1], df1 = fs$Df[1], df2 = fs$Df[2], p = fs$`Pr(>F)`[1]),
    moving = list(statistic = fm$`F value`[1], df1 = fm$Df[1], df2 = fm$Df[3], p = fm$`Pr(>F)`[1]),
    kruskal = list(statistic = unname(kw$statistic), df = unname(kw$parameter), p = kw$p.value)
  )
}
gap <- as.numeric(nottem)
gap[50] <- NA
cases <- list(
  case("air-passengers", AirPassengers, 12, TRUE, "R datasets: AirPassengers"),
  case("nottem", nottem, 12, FALSE, "R datasets: nottem"),
  case("nottem-gap", gap, 12, FALSE, "R datasets: nottem, value 50 removed"),
  case("us-accidental-deaths", USAccDeaths, 12, FALSE, "R datasets: USAccDeaths"),
  case("uk-gas", UKgas, 4, TRUE, "R datasets: UKgas"),
  case("sunspots-1950", window(sunspot.month, start = c(1950, 1), end = c(1969, 12)), 12, FALSE,
       "R datasets: sunspot.month, 1950-1969"),
  case("www-usage", WWWusage, 12, FALSE, "R datasets: WWWusage (no seasonality; grouped by 12 to test the arithmetic)")
)
writeLines(toJSON(cases, auto_unbox = TRUE, digits = NA, na = "null", pretty = FALSE), file.path(here, "fixtures", "identifiable.json"))
