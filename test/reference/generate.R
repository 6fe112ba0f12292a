# Reference fixtures for the decomposition methods, computed by R itself.
#
#   Rscript test/reference/generate.R        (from the repository root)
#
# Writes test/reference/fixtures/{classical,stl,mstl,distributions}.json. Every series is an open data set
# that ships with R (package datasets) or with the forecast package; each case names its data set and
# origin in `source`. Numbers are written with the fewest digits that read back to the identical double
# (jsonlite's digits = NA stops at 15 significant digits, which is not always exact); NA/NaN are null.
#
# Made with R 4.2 and forecast 8.20; the versions used are recorded in each file's `generator` field.

suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
})

out_dir <- file.path("test", "reference", "fixtures")
dir.create(out_dir, recursive = TRUE, showWarnings = FALSE)

# Shortest decimal that round-trips: %.15g, else %.16g, else %.17g.
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
# A numeric vector as a verbatim JSON array (always an array, even of length 1).
num_array <- function(x) structure(paste0("[", paste(num_text(x), collapse = ","), "]"), class = "json")
num_scalar <- function(x) structure(num_text(x), class = "json")

write_fixture <- function(name, description, cases, extra = list()) {
  doc <- c(list(
    description = unbox(description),
    generator = unbox(sprintf(
      "test/reference/generate.R with %s, forecast %s, jsonlite %s",
      R.version.string, packageVersion("forecast"), packageVersion("jsonlite")
    ))
  ), extra, list(cases = cases))
  path <- file.path(out_dir, paste0(name, ".json"))
  writeLines(toJSON(doc, json_verbatim = TRUE, auto_unbox = FALSE, pretty = FALSE), path)
  cat(sprintf("%s: %d cases, %.0f kB\n", path, length(cases), file.size(path) / 1024))
}

# Origins of the series used (R help pages of datasets and forecast).
sources <- list(
  AirPassengers = "datasets::AirPassengers: monthly international airline passengers (thousands), 1949-1960; Box, Jenkins & Reinsel, Time Series Analysis, Series G",
  USAccDeaths = "datasets::USAccDeaths: monthly accidental deaths in the USA, 1973-1978; Brockwell & Davis (1991), Time Series: Theory and Methods",
  nottem = "datasets::nottem: average monthly air temperature at Nottingham Castle (deg F), 1920-1939; Anderson (1976), Time Series Analysis and Forecasting",
  UKgas = "datasets::UKgas: quarterly UK gas consumption (million therms), 1960Q1-1986Q4; Durbin & Koopman (2001), Time Series Analysis by State Space Methods",
  JohnsonJohnson = "datasets::JohnsonJohnson: quarterly earnings (dollars) per Johnson & Johnson share, 1960-1980; Shumway & Stoffer (2000), Time Series Analysis and Its Applications",
  ldeaths = "datasets::ldeaths: monthly deaths from bronchitis, emphysema and asthma in the UK, both sexes, 1974-1979; Diggle (1990), Time Series: A Biostatistical Introduction",
  UKDriverDeaths = "datasets::UKDriverDeaths: monthly UK car drivers killed or seriously injured, 1969-1984; Harvey & Durbin (1986), JRSS A 149, 187-227",
  sunspot.year = "datasets::sunspot.year: yearly mean relative sunspot numbers, 1700-1988 (WDC-SILSO, Royal Observatory of Belgium); treated here as period 11, the solar cycle",
  gas = "forecast::gas: Australian monthly gas production, 1956-1995; Australian Bureau of Statistics",
  wineind = "forecast::wineind: Australian total wine sales by wine makers in bottles <= 1 litre, monthly, Jan 1980 - Aug 1994; Australian Bureau of Statistics",
  woolyrnq = "forecast::woolyrnq: quarterly woollen yarn production in Australia (tonnes), Mar 1965 - Sep 1994; Australian Bureau of Statistics",
  taylor = "forecast::taylor: half-hourly electricity demand (MW) in England and Wales, 5 June - 27 August 2000; Taylor (2003), Journal of the Operational Research Society 54, 799-805"
)

# ---------------------------------------------------------------- stats::decompose
classical_case <- function(id, x, type, source) {
  d <- stats::decompose(x, type = type)
  list(
    id = unbox(id), source = unbox(source), call = unbox(sprintf("stats::decompose(x, type = \"%s\")", type)),
    model = unbox(type), period = unbox(frequency(x)), start = num_array(start(x)),
    values = num_array(x), trend = num_array(d$trend), seasonal = num_array(d$seasonal),
    random = num_array(d$random), figure = num_array(d$figure)
  )
}
classical <- list()
add_classical <- function(id, x, source) {
  for (type in c("additive", "multiplicative")) {
    classical[[length(classical) + 1]] <<- classical_case(paste0(id, "-", type), x, type, source)
  }
}
add_classical("AirPassengers", AirPassengers, sources$AirPassengers)
add_classical("USAccDeaths", USAccDeaths, sources$USAccDeaths)
add_classical("nottem", nottem, sources$nottem)
add_classical("UKgas", UKgas, sources$UKgas)
add_classical("JohnsonJohnson", JohnsonJohnson, sources$JohnsonJohnson)
add_classical("ldeaths", ldeaths, sources$ldeaths)
# Starts mid-cycle and ends with a partial cycle: the figure is indexed from the first observation.
add_classical("AirPassengers-Apr1949-Aug1960", window(AirPassengers, start = c(1949, 4), end = c(1960, 8)),
  paste(sources$AirPassengers, "(window April 1949 - August 1960)"))
# (decompose refuses a series with internal NAs — na.omit.ts stops — so presidents is not used here.)
# Odd period: a plain (not 2x) moving average of 11 terms.
add_classical("sunspot.year-period11", ts(as.numeric(sunspot.year) + 1, frequency = 11),
  paste(sources$sunspot.year, "(plus 1, so that the multiplicative model has no zero)"))
write_fixture("classical", "stats::decompose: classical additive and multiplicative decomposition", classical)

# ---------------------------------------------------------------- stats::stl
stl_case <- function(id, x, source, ...) {
  args <- list(...)
  fit <- do.call(stats::stl, c(list(x = x), args))
  shown <- vapply(names(args), function(k) deparse1(args[[k]]), "")
  ts <- fit$time.series
  list(
    id = unbox(id), source = unbox(source),
    call = unbox(sprintf("stats::stl(x, %s)", paste(names(args), shown, sep = " = ", collapse = ", "))),
    period = unbox(frequency(x)),
    periodic = unbox(identical(args$s.window, "periodic")),
    robust = unbox(isTRUE(args$robust)),
    win = list(s = num_scalar(fit$win[["s"]]), t = num_scalar(fit$win[["t"]]), l = num_scalar(fit$win[["l"]])),
    deg = list(s = num_scalar(fit$deg[["s"]]), t = num_scalar(fit$deg[["t"]]), l = num_scalar(fit$deg[["l"]])),
    jump = list(s = num_scalar(fit$jump[["s"]]), t = num_scalar(fit$jump[["t"]]), l = num_scalar(fit$jump[["l"]])),
    inner = unbox(fit$inner), outer = unbox(fit$outer),
    values = num_array(x), trend = num_array(ts[, "trend"]), seasonal = num_array(ts[, "seasonal"]),
    remainder = num_array(ts[, "remainder"]), weights = num_array(fit$weights)
  )
}
logAP <- log(AirPassengers)
logAPsrc <- paste("log of", sources$AirPassengers)
stl_cases <- list(
  stl_case("logAirPassengers-periodic", logAP, logAPsrc, s.window = "periodic"),
  stl_case("logAirPassengers-s7", logAP, logAPsrc, s.window = 7),
  stl_case("logAirPassengers-s13-robust", logAP, logAPsrc, s.window = 13, robust = TRUE),
  stl_case("logAirPassengers-s35-t23", logAP, logAPsrc, s.window = 35, t.window = 23),
  stl_case("nottem-s7", nottem, sources$nottem, s.window = 7),
  stl_case("nottem-s11-sdeg1-robust", nottem, sources$nottem, s.window = 11, s.degree = 1, robust = TRUE),
  stl_case("nottem-s15-jumps", nottem, sources$nottem, s.window = 15, s.jump = 4, t.jump = 5, l.jump = 3),
  stl_case("UKgas-s9", UKgas, sources$UKgas, s.window = 9),
  stl_case("UKgas-periodic-robust", UKgas, sources$UKgas, s.window = "periodic", robust = TRUE),
  stl_case("UKgas-s5-t7-tdeg0", UKgas, sources$UKgas, s.window = 5, t.window = 7, t.degree = 0, l.degree = 1),
  stl_case("USAccDeaths-s11-t21-jumps1", USAccDeaths, sources$USAccDeaths,
    s.window = 11, t.window = 21, s.jump = 1, t.jump = 1, l.jump = 1),
  stl_case("USAccDeaths-s7-robust", USAccDeaths, sources$USAccDeaths, s.window = 7, robust = TRUE),
  stl_case("ldeaths-periodic", ldeaths, sources$ldeaths, s.window = "periodic"),
  stl_case("ldeaths-s9-robust-inner2-outer5", ldeaths, sources$ldeaths, s.window = 9, robust = TRUE, inner = 2, outer = 5),
  stl_case("ldeaths-s13-sdeg1-tdeg0-ldeg0", ldeaths, sources$ldeaths, s.window = 13, s.degree = 1, t.degree = 0, l.degree = 0),
  stl_case("UKDriverDeaths-s13-robust", UKDriverDeaths, sources$UKDriverDeaths, s.window = 13, robust = TRUE),
  stl_case("gas-s13", gas, sources$gas, s.window = 13),
  stl_case("gas-s21-robust", gas, sources$gas, s.window = 21, robust = TRUE),
  stl_case("gas-periodic-t61-l25", gas, sources$gas, s.window = "periodic", t.window = 61, l.window = 25),
  stl_case("wineind-s11-robust", wineind, sources$wineind, s.window = 11, robust = TRUE),
  stl_case("sunspot.year-period11-s15", ts(as.numeric(sunspot.year), frequency = 11), sources$sunspot.year, s.window = 15),
  stl_case("sunspot.year-period11-s7-robust", ts(as.numeric(sunspot.year), frequency = 11), sources$sunspot.year,
    s.window = 7, robust = TRUE)
)
# The robustness loop on one series for every count of outer passes, so each pass's weights (and with
# them the partial sort that picks the median absolute residual) are checked against R.
for (k in 1:15) {
  stl_cases[[length(stl_cases) + 1]] <- stl_case(sprintf("UKgas-s7-robust-outer%02d", k), UKgas, sources$UKgas,
    s.window = 7, robust = TRUE, outer = k)
}
for (k in c(1, 2, 3, 15)) {
  stl_cases[[length(stl_cases) + 1]] <- stl_case(sprintf("JohnsonJohnson-s9-robust-outer%02d", k), JohnsonJohnson,
    sources$JohnsonJohnson, s.window = 9, robust = TRUE, outer = k)
}
write_fixture("stl", "stats::stl: STL decomposition (Cleveland et al. 1990), with every argument R used", stl_cases)

# ---------------------------------------------------------------- forecast::mstl
default_s_window <- eval(formals(forecast::mstl)$s.window)
mstl_case <- function(id, x, source, passes_used, ...) {
  args <- list(...)
  fit <- do.call(forecast::mstl, c(list(x = x), args))
  shown <- vapply(names(args), function(k) deparse1(args[[k]]), "")
  periods <- if (inherits(x, "msts")) sort(attr(x, "msts")) else frequency(x)
  sw <- if (is.null(args$s.window)) default_s_window else args$s.window
  if (length(sw) == 1) sw <- rep(sw, length(periods))
  sw <- sw[seq_along(periods)]
  seasonals <- lapply(seq_along(periods), function(i) num_array(fit[, 2 + i]))
  names(seasonals) <- as.character(periods)
  stl_args <- args[setdiff(names(args), c("s.window", "iterate", "lambda"))]
  list(
    id = unbox(id), source = unbox(source),
    call = unbox(if (length(args)) sprintf("forecast::mstl(x, %s)", paste(names(args), shown, sep = " = ", collapse = ", ")) else "forecast::mstl(x)"),
    periods = num_array(periods), s_window = num_array(sw),
    # mstl sets iterate to 1 for a plain ts; an msts keeps it (default 2).
    iterate = unbox(passes_used),
    robust = unbox(isTRUE(stl_args$robust)),
    values = num_array(x), trend = num_array(fit[, "Trend"]), seasonals = seasonals,
    remainder = num_array(fit[, "Remainder"])
  )
}
taylor4w <- msts(as.numeric(taylor)[1:(336 * 4)], seasonal.periods = c(48, 336))
taylor4wsrc <- paste(sources$taylor, "(first 4 weeks, periods 48 and 336)")
# Hourly means of the first 6 weeks: an hourly series with daily (24) and weekly (168) periods.
hourly <- colMeans(matrix(as.numeric(taylor)[1:(336 * 6)], nrow = 2))
hourly6w <- msts(hourly, seasonal.periods = c(168, 24))
hourlysrc <- paste(sources$taylor, "(hourly means of the first 6 weeks, periods 24 and 168)")
mstl_cases <- list(
  mstl_case("taylor-4weeks-default", taylor4w, taylor4wsrc, 2),
  mstl_case("taylor-4weeks-s9-s21-iterate3", taylor4w, taylor4wsrc, 3, s.window = c(9, 21), iterate = 3),
  mstl_case("taylor-hourly-6weeks-default", hourly6w, hourlysrc, 2),
  mstl_case("taylor-hourly-6weeks-robust", hourly6w, hourlysrc, 2, robust = TRUE),
  mstl_case("woolyrnq-ts-default", woolyrnq, sources$woolyrnq, 1),
  mstl_case("USAccDeaths-ts-s7", USAccDeaths, sources$USAccDeaths, 1, s.window = 7),
  mstl_case("nottem-msts12-default", msts(as.numeric(nottem), seasonal.periods = 12),
    paste(sources$nottem, "(as an msts with the single period 12)"), 2)
)
mstl_doc <- "forecast::mstl: multiple seasonal decomposition (Bandara, Hyndman & Bergmeir 2021)"
mstl_doc <- paste0(mstl_doc, "; default s.window in this forecast version: ", deparse1(formals(forecast::mstl)$s.window),
  " = ", paste(default_s_window, collapse = ", "))
write_fixture("mstl", mstl_doc, mstl_cases, list(default_s_window = num_array(default_s_window)))

# ---------------------------------------------------------------- stats::pf, median, mad
grid <- expand.grid(q = c(0.05, 0.25, 0.5, 1, 1.5, 2, 2.5, 3, 4, 6, 10, 25),
  df1 = c(1, 2, 3, 4, 6, 11), df2 = c(3, 8, 20, 45, 120, 1000))
pf_case <- list(
  id = unbox("pf-grid"), source = unbox("stats::pf on a grid of (F, df1, df2)"),
  q = num_array(grid$q), df1 = num_array(grid$df1), df2 = num_array(grid$df2),
  lower = num_array(stats::pf(grid$q, grid$df1, grid$df2)),
  upper = num_array(stats::pf(grid$q, grid$df1, grid$df2, lower.tail = FALSE))
)
set.seed(20240611)
vectors <- list(
  c(3, 1, 2), c(4, 1, 3, 2), c(5, 5, 5, 1, 9), c(2, 2, 2, 2), c(7),
  as.numeric(AirPassengers[1:13]), as.numeric(UKgas[1:20]),
  round(rnorm(31), 1), rexp(50), round(runif(200) * 10)
)
robust_case <- list(
  id = unbox("median-mad"), source = unbox("stats::median and stats::mad (constant 1.4826, and constant 1) of fixed and random vectors"),
  vectors = lapply(vectors, num_array),
  median = num_array(vapply(vectors, stats::median, 0)),
  mad = num_array(vapply(vectors, stats::mad, 0)),
  mad_raw = num_array(vapply(vectors, function(v) stats::mad(v, constant = 1), 0))
)
write_fixture("distributions", "stats::pf (F distribution) and stats::median / stats::mad", list(pf_case, robust_case))
