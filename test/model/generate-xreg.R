# Reference fixtures for automatic selection with regressors: forecast::auto.arima(x, xreg =) tests the
# differencing orders on the residuals of lm(x ~ xreg), so a level shift carried by a regressor is not taken
# for a unit root. Records, per case, the series, the regressors and the orders auto.arima chose with and
# without them.
#
#   Rscript test/model/generate-xreg.R        (from the repository root)
suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
})
num_array <- function(x) structure(paste0("[", paste(sprintf("%.17g", as.numeric(x)), collapse = ","), "]"), class = "json")

cases <- list()
add <- function(id, source, x, xreg) {
  with_xreg <- auto.arima(x, xreg = xreg)$arma
  without <- auto.arima(x)$arma
  cases[[length(cases) + 1]] <<- list(
    id = unbox(id), source = unbox(source), period = unbox(frequency(x)), values = num_array(x),
    xreg = lapply(seq_len(ncol(xreg)), function(j) num_array(xreg[, j])),
    d = unbox(with_xreg[6]), D = unbox(with_xreg[7]), dWithout = unbox(without[6]), DWithout = unbox(without[7])
  )
}
add("nile-step", "datasets::Nile, annual flow 1871-1970; regressor: a level shift from 1899 (Cobb 1978)", Nile,
    cbind(step = as.numeric(time(Nile) >= 1899)))
add("seatbelts-law", "datasets::Seatbelts, log(drivers) monthly 1969-1984; regressor: the seat-belt law",
    log(Seatbelts[, "drivers"]), cbind(law = as.numeric(Seatbelts[, "law"])))
set.seed(17)
sim <- ts(arima.sim(list(ar = 0.5), 120) + 6 * (1:120 > 60), frequency = 12)
add("simulated-step", "AR(1), phi = 0.5, unit innovations (set.seed(17), arima.sim) plus a step of 6 at value 61",
    sim, cbind(step = as.numeric(1:120 > 60)))
writeLines(toJSON(list(generator = unbox(sprintf("test/model/generate-xreg.R with %s, forecast %s", R.version.string,
                                                 packageVersion("forecast"))), cases = cases),
                  json_verbatim = TRUE, auto_unbox = FALSE),
           file.path("test", "model", "fixtures", "auto-arima-xreg.json"))
