# Reference autocorrelations of ARMA processes for src/model/arma-autocovariance.ts, computed by R itself.
#
#   Rscript test/model/generate-acf.R        (from the repository root)
#
# Writes test/model/fixtures/arma-acf.json: stats::ARMAacf(ar, ma, lag.max) for a few stationary models,
# seasonal products among them (the polynomials multiplied out here, as stats::arima does). R's sign
# convention is ours: x_t = sum ar_j x_{t-j} + e_t + sum ma_j e_{t-j}.

suppressPackageStartupMessages(library(jsonlite))

seasonal <- function(ar, sar, period) {
  out <- c(ar, rep(0, length(sar) * period))
  for (j in seq_along(sar)) {
    out[j * period] <- out[j * period] + sar[j]
    for (i in seq_along(ar)) out[j * period + i] <- out[j * period + i] - ar[i] * sar[j]
  }
  out
}
seasonal_ma <- function(ma, sma, period) {
  out <- c(ma, rep(0, length(sma) * period))
  for (j in seq_along(sma)) {
    out[j * period] <- out[j * period] + sma[j]
    for (i in seq_along(ma)) out[j * period + i] <- out[j * period + i] + ma[i] * sma[j]
  }
  out
}
# (1 - 0.97z)(1 - 0.5z)(1 + 0.3z) = 1 - sum ar_j z^j: a root near the unit circle.
polymul <- function(a, b) {
  out <- rep(0, length(a) + length(b) - 1)
  for (i in seq_along(a)) out[i:(i + length(b) - 1)] <- out[i:(i + length(b) - 1)] + a[i] * b
  out
}
near_unit <- -polymul(polymul(c(1, -0.97), c(1, -0.5)), c(1, 0.3))[-1]
cases <- list(
  list(id = "ar1", ar = 0.5, ma = numeric(0)),
  list(id = "arma11", ar = 0.8, ma = -0.4),
  list(id = "ar2-complex", ar = c(1.2, -0.8), ma = 0.3),
  list(id = "ar3-near-unit", ar = near_unit, ma = numeric(0)),
  list(id = "sarma-12", ar = seasonal(c(0.6, -0.2), 0.7, 12), ma = seasonal_ma(0.4, -0.6, 12)),
  list(id = "sar2-12", ar = seasonal(0.3, c(0.5, 0.3), 12), ma = numeric(0)),
  list(id = "sarma-4", ar = seasonal(c(-0.5, 0.3, 0.2), -0.8, 4), ma = seasonal_ma(c(0.5, 0.2), 0.9, 4))
)
out <- lapply(cases, function(c) {
  stopifnot(all(Mod(polyroot(c(1, -c$ar))) > 1))
  lag <- max(length(c$ar), length(c$ma) + 1) + 5
  list(id = c$id, ar = c$ar, ma = c$ma, acf = unname(ARMAacf(ar = c$ar, ma = c$ma, lag.max = lag)))
})
writeLines(
  toJSON(list(generator = paste("test/model/generate-acf.R with", R.version.string), cases = out), digits = NA, auto_unbox = FALSE, pretty = TRUE),
  "test/model/fixtures/arma-acf.json"
)
