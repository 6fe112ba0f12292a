# Reference fixtures for automatic ARIMA selection: forecast::auto.arima (stepwise, AICc, its defaults) on
# open data sets that ship with R (package datasets) or with forecast. Each case records the series, the
# model auto.arima chose, its AICc, the differencing orders and auto.arima's median time over 3 runs.
#
#   Rscript test/model/generate-auto.R        (from the repository root)
suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
})
num_text <- function(x) {
  x <- as.numeric(x)
  missing <- is.na(x)
  out <- character(length(x))
  ok <- !missing
  out[ok] <- sprintf("%.15g", x[ok])
  for (digits in c(16, 17)) {
    bad <- ok & suppressWarnings(as.numeric(out)) != x
    bad[is.na(bad)] <- FALSE
    out[bad] <- sprintf(paste0("%.", digits, "g"), x[bad])
  }
  out[missing] <- "null"
  out
}
num_array <- function(x) structure(paste0("[", paste(num_text(x), collapse = ","), "]"), class = "json")
num_scalar <- function(x) structure(num_text(x), class = "json")

series <- list(
  list("AirPassengers-log", log(AirPassengers), "datasets::AirPassengers (log), monthly 1949-1960"),
  list("USAccDeaths", USAccDeaths, "datasets::USAccDeaths, monthly 1973-1978"),
  list("ldeaths", ldeaths, "datasets::ldeaths, monthly 1974-1979"),
  list("mdeaths", mdeaths, "datasets::mdeaths, monthly 1974-1979"),
  list("fdeaths", fdeaths, "datasets::fdeaths, monthly 1974-1979"),
  list("nottem", nottem, "datasets::nottem, monthly 1920-1939"),
  list("UKgas-log", log(UKgas), "datasets::UKgas (log), quarterly 1960-1986"),
  list("UKDriverDeaths", UKDriverDeaths, "datasets::UKDriverDeaths, monthly 1969-1984"),
  list("JohnsonJohnson-log", log(JohnsonJohnson), "datasets::JohnsonJohnson (log), quarterly 1960-1980"),
  list("Nile", Nile, "datasets::Nile, annual 1871-1970"),
  list("LakeHuron", LakeHuron, "datasets::LakeHuron, annual 1875-1972"),
  list("lynx-log", log(lynx), "datasets::lynx (log), annual 1821-1934"),
  list("WWWusage", WWWusage, "datasets::WWWusage, per minute"),
  list("austres", austres, "datasets::austres, quarterly 1971-1993"),
  list("BJsales", BJsales, "datasets::BJsales, Box & Jenkins sales"),
  list("lh", lh, "datasets::lh, 10-minute intervals"),
  list("nhtemp", nhtemp, "datasets::nhtemp, annual 1912-1971"),
  list("Seatbelts-front", Seatbelts[, "front"], "datasets::Seatbelts, front-seat passengers, monthly 1969-1984"),
  list("Seatbelts-rear", Seatbelts[, "rear"], "datasets::Seatbelts, rear-seat passengers, monthly 1969-1984"),
  list("wineind", wineind, "forecast::wineind, Australian wine sales, monthly 1980-1994"),
  list("woolyrnq", woolyrnq, "forecast::woolyrnq, Australian woollen yarn, quarterly 1965-1994"),
  list("gas", gas, "forecast::gas, Australian gas production, monthly 1956-1995"),
  list("presidents", presidents, "datasets::presidents, quarterly 1945-1974, 6 missing values"),
  list("airmiles", airmiles, "datasets::airmiles, annual 1937-1960"),
  list("discoveries", discoveries, "datasets::discoveries, annual 1860-1959"),
  list("AirPassengers-10y", window(log(AirPassengers), end = c(1958, 12)), "datasets::AirPassengers (log), first 10 years"),
  list("UKDriverDeaths-10y", window(UKDriverDeaths, end = c(1978, 12)), "datasets::UKDriverDeaths, first 10 years"),
  list("nottem-10y", window(nottem, end = c(1929, 12)), "datasets::nottem, first 10 years")
)

cases <- lapply(series, function(s) {
  x <- s[[2]]
  fit <- auto.arima(x)
  times <- sapply(1:3, function(i) system.time(auto.arima(x))[["elapsed"]])
  ord <- arimaorder(fit)
  m <- frequency(x)
  list(
    id = unbox(s[[1]]), source = unbox(s[[3]]), values = num_array(as.numeric(x)), period = unbox(m),
    order = unname(as.integer(c(ord[1:3], if (length(ord) > 3) ord[4:6] else c(0, 0, 0)))),
    constant = unbox(any(names(coef(fit)) %in% c("intercept", "drift"))),
    aicc = num_scalar(fit$aicc), seconds = num_scalar(median(times))
  )
})
doc <- list(
  description = unbox("forecast::auto.arima (defaults: stepwise, AICc) on open data sets"),
  generator = unbox(sprintf("test/model/generate-auto.R with %s, forecast %s", R.version.string, packageVersion("forecast"))),
  cases = cases
)
writeLines(toJSON(doc, json_verbatim = TRUE, auto_unbox = FALSE, pretty = FALSE), file.path("test", "model", "fixtures", "auto-arima.json"))
cat(length(cases), "cases\n")
