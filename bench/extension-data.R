# Open series for the forecast-extension study (bench/extension-study.js): monthly and quarterly series that
# ship with R (datasets), forecast and AER, and the daily Icelandic river series of tseries. Writes
# bench/data/extension-study.json; each series names its data set.
#
#   Rscript bench/extension-data.R        (from the repository root)
suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
  library(tseries)
  library(AER)
})
data("ice.river", package = "tseries")
data("UKNonDurables", package = "AER")
data("USProdIndex", package = "AER")
data("UKInflation", package = "AER")
s <- list(
  list("AirPassengers", AirPassengers, "datasets::AirPassengers"),
  list("USAccDeaths", USAccDeaths, "datasets::USAccDeaths"),
  list("ldeaths", ldeaths, "datasets::ldeaths"),
  list("mdeaths", mdeaths, "datasets::mdeaths"),
  list("fdeaths", fdeaths, "datasets::fdeaths"),
  list("nottem", nottem, "datasets::nottem"),
  list("UKDriverDeaths", UKDriverDeaths, "datasets::UKDriverDeaths"),
  list("Seatbelts-front", Seatbelts[, "front"], "datasets::Seatbelts[, 'front']"),
  list("Seatbelts-rear", Seatbelts[, "rear"], "datasets::Seatbelts[, 'rear']"),
  list("Seatbelts-kms", Seatbelts[, "kms"], "datasets::Seatbelts[, 'kms']"),
  list("Seatbelts-VanKilled", Seatbelts[, "VanKilled"], "datasets::Seatbelts[, 'VanKilled']"),
  list("wineind", wineind, "forecast::wineind"),
  list("gas", gas, "forecast::gas"),
  list("USProdIndex", USProdIndex[, 1], "AER::USProdIndex (unadjusted)"),
  list("UKgas", UKgas, "datasets::UKgas"),
  list("JohnsonJohnson", JohnsonJohnson, "datasets::JohnsonJohnson"),
  list("austres", austres, "datasets::austres"),
  list("woolyrnq", woolyrnq, "forecast::woolyrnq"),
  list("UKNonDurables", UKNonDurables, "AER::UKNonDurables"),
  list("presidents", presidents, "datasets::presidents (6 missing values)"),
  list("UKInflation-actual", UKInflation[, "actual"], "AER::UKInflation[, 'actual']"),
  list("BJsales-q", ts(BJsales[seq(1, 148, 3)], frequency = 4), "datasets::BJsales, every third value as a quarterly series"),
  list("ice.river-flow.vat", ice.river[, "flow.vat"], "tseries::ice.river, daily flow of the Vatnsdalsa 1972-1974"),
  list("ice.river-flow.jok", ice.river[, "flow.jok"], "tseries::ice.river, daily flow of the Jokulsa Eystri 1972-1974"),
  list("ice.river-temp", ice.river[, "temp"], "tseries::ice.river, daily temperature at Hveravellir 1972-1974")
)
out <- lapply(s, function(x) {
  f <- frequency(x[[2]])
  list(id = unbox(x[[1]]), source = unbox(x[[3]]),
       frequency = unbox(if (f == 12) "monthly" else if (f == 4) "quarterly" else "daily"),
       values = as.numeric(x[[2]]))
})
writeLines(toJSON(list(generator = unbox(paste("bench/extension-data.R with", R.version.string)), series = out),
                  digits = NA, na = "null"), "bench/data/extension-study.json")
cat(length(out), "series\n")
