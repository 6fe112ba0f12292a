# Reference fixtures for the ARIMA engine (src/model/), computed by R itself.
#
#   Rscript test/model/generate.R        (from the repository root)
#
# Writes test/model/fixtures/arima.json: for given orders, stats::arima(method = "ML") coefficients,
# log-likelihood, AIC, AICc (as forecast::Arima defines it), sigma^2 and predict() forecasts with standard
# errors. Each case is fitted twice: with R's default optimiser tolerance, and with reltol = 1e-12 so that the
# reported optimum is the likelihood's maximum to the digits compared. Every series is an open data set that
# ships with R (package datasets); `source` names it.

suppressPackageStartupMessages({
  library(jsonlite)
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

sources <- list(
  AirPassengers = "datasets::AirPassengers (log): monthly airline passengers 1949-1960; Box & Jenkins Series G",
  USAccDeaths = "datasets::USAccDeaths: monthly accidental deaths in the USA, 1973-1978; Brockwell & Davis (1991)",
  lh = "datasets::lh: luteinizing hormone in blood samples at 10-minute intervals; Diggle (1990)",
  LakeHuron = "datasets::LakeHuron: annual level of Lake Huron (ft), 1875-1972; Brockwell & Davis (1991)",
  Nile = "datasets::Nile: annual flow of the Nile at Aswan, 1871-1970; Cobb (1978)",
  presidents = "datasets::presidents: quarterly approval ratings of US presidents, 1945-1974, with missing values; Gallup",
  WWWusage = "datasets::WWWusage: users connected to a server each minute; Durbin & Koopman (2001)",
  mdeaths = "datasets::mdeaths: monthly UK male deaths from lung diseases, 1974-1979; Diggle (1990)",
  ldeaths = "datasets::ldeaths: monthly UK deaths from lung diseases, 1974-1979; Diggle (1990)",
  UKgas = "datasets::UKgas (log): quarterly UK gas consumption 1960-1986; Durbin & Koopman (2001)",
  lynx = "datasets::lynx (log): annual Canadian lynx trappings 1821-1934; Campbell & Walker (1977)",
  nottem = "datasets::nottem: monthly air temperature at Nottingham Castle, 1920-1939; Anderson (1976)",
  UKDriverDeaths = "datasets::UKDriverDeaths: monthly UK car drivers killed or seriously injured, 1969-1984; Harvey & Durbin (1986)",
  Seatbelts = "datasets::Seatbelts: monthly UK road casualties 1969-1984 with the seat-belt law (from February 1983) and the petrol price; Harvey & Durbin (1986)"
)

cases <- list()
add <- function(id, name, x, order, seasonal = c(0, 0, 0), mean = TRUE, xreg = NULL, newxreg = NULL, h = 12,
                note = "") {
  period <- frequency(x)
  fit_with <- function(control) {
    stats::arima(x, order = order, seasonal = list(order = seasonal, period = period), xreg = xreg,
                 include.mean = mean, method = "ML", optim.control = control)
  }
  f0 <- fit_with(list())
  f1 <- fit_with(list(reltol = 1e-12, maxit = 1000))
  npar <- length(f1$coef[f1$mask]) + 1
  nstar <- length(x) - order[2] - seasonal[2] * period
  aicc <- f1$aic + 2 * npar * (npar + 1) / (nstar - npar - 1)
  pr <- predict(f1, n.ahead = h, newxreg = newxreg)
  cases[[length(cases) + 1]] <<- list(
    id = unbox(id), dataset = unbox(name), source = unbox(sources[[name]]), note = unbox(note),
    values = num_array(as.numeric(x)), period = unbox(period),
    order = order, seasonal = seasonal, mean = unbox(mean),
    xreg = if (is.null(xreg)) list() else lapply(seq_len(ncol(as.matrix(xreg))), function(j) num_array(as.matrix(xreg)[, j])),
    newxreg = if (is.null(newxreg)) list() else lapply(seq_len(ncol(as.matrix(newxreg))), function(j) num_array(as.matrix(newxreg)[, j])),
    names = names(f1$coef),
    coef = num_array(f1$coef), se = num_array(sqrt(diag(f1$var.coef))),
    loglik = num_scalar(f1$loglik), aic = num_scalar(f1$aic), aicc = num_scalar(aicc),
    sigma2 = num_scalar(f1$sigma2), nobs = unbox(f1$nobs),
    loglikDefaultTol = num_scalar(f0$loglik), coefDefaultTol = num_array(f0$coef),
    horizon = unbox(h), forecast = num_array(pr$pred), forecastSe = num_array(pr$se)
  )
}

add("airpass-airline", "AirPassengers", log(AirPassengers), c(0, 1, 1), c(0, 1, 1))
add("usacc-airline", "USAccDeaths", USAccDeaths, c(0, 1, 1), c(0, 1, 1))
add("usacc-sar", "USAccDeaths", USAccDeaths, c(1, 1, 1), c(1, 1, 0))
add("lh-ar1", "lh", lh, c(1, 0, 0), h = 10)
add("lh-ar3", "lh", lh, c(3, 0, 0), h = 10)
add("lh-ma1", "lh", lh, c(1, 0, 1), h = 10)
add("huron-ar2-xreg", "LakeHuron", LakeHuron, c(2, 0, 0), xreg = time(LakeHuron) - 1920,
    newxreg = 1973:1982 - 1920, h = 10, note = "regressor: year - 1920")
add("nile-arima111", "Nile", Nile, c(1, 1, 1), h = 10)
add("presidents-ar1-gaps", "presidents", presidents, c(1, 0, 0), h = 8, note = "6 missing values")
add("presidents-ar3-gaps", "presidents", presidents, c(3, 0, 0), h = 8, note = "6 missing values")
add("www-arima310", "WWWusage", WWWusage, c(3, 1, 0), h = 10)
add("www-arima111", "WWWusage", WWWusage, c(1, 1, 1), h = 10)
add("ldeaths-sar", "ldeaths", ldeaths, c(1, 0, 0), c(1, 0, 0))
add("mdeaths-seasonal-diff", "mdeaths", mdeaths, c(0, 0, 1), c(0, 1, 1))
add("ukgas-seasonal", "UKgas", log(UKgas), c(1, 1, 0), c(0, 1, 1), h = 8)
add("lynx-ar2", "lynx", log(lynx), c(2, 0, 0), h = 10)
add("nottem-sar2", "nottem", nottem, c(1, 0, 0), c(2, 0, 0), h = 24)
add("driver-drift", "UKDriverDeaths", UKDriverDeaths, c(1, 1, 0), c(0, 1, 1), h = 12)
gappy <- USAccDeaths
gappy[c(5, 30, 31, 60)] <- NA
add("usacc-airline-gaps", "USAccDeaths", gappy, c(0, 1, 1), c(0, 1, 1), note = "values 5, 30, 31, 60 set missing")
nile <- Nile
add("nile-drift", "Nile", nile, c(1, 1, 0), xreg = 1:100, newxreg = 101:110, h = 10, note = "drift: regressor 1..n with d = 1")

# Regression with ARIMA errors: interventions and other regressors (stats::arima(xreg =)).
law <- as.numeric(Seatbelts[, "law"])
petrol <- as.numeric(Seatbelts[, "PetrolPrice"])
add("seatbelts-law-airline", "Seatbelts", log(Seatbelts[, "drivers"]), c(0, 1, 1), c(0, 1, 1), xreg = law,
    newxreg = rep(1, 12), note = "log(drivers); regressor: the seat-belt law (0 before February 1983, 1 from it)")
add("seatbelts-law-petrol-sar", "Seatbelts", log(Seatbelts[, "drivers"]), c(1, 0, 0), c(1, 0, 0),
    xreg = cbind(law = law, petrol = petrol), newxreg = cbind(rep(1, 12), rep(petrol[192], 12)),
    note = "log(drivers); regressors: the law and the petrol price")
nile_step <- as.numeric(time(Nile) >= 1899)
add("nile-step-ar1", "Nile", Nile, c(1, 0, 0), xreg = nile_step, newxreg = rep(1, 10), h = 10,
    note = "regressor: a level shift from 1899 (Cobb 1978)")
nile_ao <- as.numeric(time(Nile) == 1913)
add("nile-step-ao-arma", "Nile", Nile, c(1, 0, 1), xreg = cbind(step = nile_step, ao1913 = nile_ao),
    newxreg = cbind(rep(1, 10), rep(0, 10)), h = 10, note = "regressors: the 1899 step and a one-off in 1913")
add("usacc-ma-gaps-xreg", "USAccDeaths", gappy, c(0, 1, 1), c(0, 1, 1),
    xreg = as.numeric(seq_along(gappy) == 42), newxreg = rep(0, 12),
    note = "values 5, 30, 31, 60 missing; regressor: a one-off at value 42")

doc <- list(
  description = unbox("stats::arima(method = 'ML') fits and predict() forecasts for given orders"),
  generator = unbox(sprintf("test/model/generate.R with %s", R.version.string)),
  cases = cases
)
dir.create(file.path("test", "model", "fixtures"), showWarnings = FALSE)
writeLines(toJSON(doc, json_verbatim = TRUE, auto_unbox = FALSE, pretty = FALSE), file.path("test", "model", "fixtures", "arima.json"))
cat(length(cases), "cases\n")
