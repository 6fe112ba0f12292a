# Writes the verifier's corpus: open datasets that ship with R and with R packages, as CSV files, and
# corpus.json describing each (source, frequency, unit, how values combine). The files are committed, so
# the tests need no R. To regenerate (Debian):
#   apt-get install -y r-base-core r-cran-forecast r-cran-tseries r-cran-modeldata r-cran-jsonlite
#   Rscript test/verify/corpus/generate.R
# Sources (each dataset's R documentation, ?name):
#   datasets (R): AirPassengers, UKDriverDeaths, USAccDeaths, nottem, UKgas, austres, sunspot.month
#   forecast: wineind, woolyrnq, taylor
#   tseries: tcm (tcm1y), ice.river (flow.jok, temp)
#   modeldata: Chicago (daily L-train ridership at Clark/Lake)
suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
})
here <- dirname(normalizePath(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))
setwd(here)

monthly <- function(x) {
  t <- time(x)
  y <- floor(t + 1e-9)
  m <- round((t - y) * 12) + 1
  sprintf("%04d-%02d", y, m)
}
quarterly <- function(x) {
  t <- time(x)
  y <- floor(t + 1e-9)
  q <- round((t - y) * 4) + 1
  sprintf("%04d-Q%d", y, q)
}
# Shortest decimal that reads back to the same double.
num <- function(v) {
  vapply(v, function(z) {
    if (is.na(z)) return("")
    for (d in 1:17) {
      s <- formatC(z, digits = d, format = "g")
      if (as.numeric(s) == z) return(trimws(s))
    }
    formatC(z, digits = 17, format = "g")
  }, "")
}
corpus <- list()
put <- function(id, dates, values, frequency, unit, combine, source, note) {
  write.csv(data.frame(date = dates, value = num(values)), paste0(id, ".csv"), row.names = FALSE, quote = FALSE)
  corpus[[length(corpus) + 1]] <<- list(
    id = id, file = paste0(id, ".csv"), frequency = frequency, unit = unit, combine = combine,
    source = source, note = note, n = length(values)
  )
}

put("air-passengers", monthly(AirPassengers), as.numeric(AirPassengers), "monthly", "thousand passengers", "sum",
    "R datasets: AirPassengers (Box & Jenkins 1976, monthly airline passengers 1949-1960)", "multiplicative seasonality")
short <- window(AirPassengers, end = c(1951, 1))
put("air-passengers-short", monthly(short), as.numeric(short), "monthly", "thousand passengers", "sum",
    "R datasets: AirPassengers, first 25 months", "the shortest series a brief accepts (two years and one month)")
put("uk-driver-deaths", monthly(UKDriverDeaths), as.numeric(UKDriverDeaths), "monthly", "deaths", "sum",
    "R datasets: UKDriverDeaths (Harvey & Durbin 1986)", "a level shift in 1983 (seat-belt law)")
put("us-accidental-deaths", monthly(USAccDeaths), as.numeric(USAccDeaths), "monthly", "deaths", "sum",
    "R datasets: USAccDeaths (Brockwell & Davis 1991)", "six years")
put("nottingham-f", monthly(nottem), as.numeric(nottem), "monthly", "°F", "mean",
    "R datasets: nottem (Anderson 1976, Nottingham Castle mean air temperature 1920-1939)", "a temperature level")
put("nottingham-c", monthly(nottem), (as.numeric(nottem) - 32) * 5 / 9, "monthly", "°C", "mean",
    "R datasets: nottem, converted to degrees Celsius", "crosses zero in some winters")
data(tcm, package = "tseries")
put("treasury-1y", monthly(tcm[, "tcm1y"]), as.numeric(tcm[, "tcm1y"]), "monthly", "%", "mean",
    "R package tseries: tcm (US Treasury constant maturity 1-year yield, Federal Reserve)", "a percentage rate with little seasonality")
ss <- window(sunspot.month, start = c(1975, 1))
put("sunspots", monthly(ss), as.numeric(ss), "monthly", "sunspot number", "mean",
    "R datasets: sunspot.month (WDC-SILSO, Royal Observatory of Belgium)", "holds zeros; an eleven-year cycle, no yearly seasonality")
put("wine-sales", monthly(wineind), as.numeric(wineind), "monthly", "litres", "sum",
    "R package forecast: wineind (Australian wine sales by winemakers, ABS)", "strong yearly seasonality")
put("uk-gas", quarterly(UKgas), as.numeric(UKgas), "quarterly", "million therms", "sum",
    "R datasets: UKgas (Harvey 1989)", "multiplicative seasonality")
put("australian-residents", quarterly(austres), as.numeric(austres), "quarterly", "thousand people", "mean",
    "R datasets: austres (Brockwell & Davis 1996)", "no seasonality")
put("wool-production", quarterly(woolyrnq), as.numeric(woolyrnq), "quarterly", "tonnes", "sum",
    "R package forecast: woolyrnq (Australian woollen yarn production, ABS)", "quarterly, irregular")

data(Chicago, package = "modeldata")
ch <- Chicago[Chicago$date >= as.Date("2012-08-29"), c("date", "ridership")]
put("chicago-daily", format(ch$date), ch$ridership, "daily", "thousand rides", "sum",
    "R package modeldata: Chicago (CTA L-train entries at Clark/Lake, City of Chicago data portal), last four years",
    "weekly and yearly seasonality")
all <- Chicago[, c("date", "ridership")]
wk <- format(all$date, "%G-W%V")
weeks <- aggregate(all$ridership, list(week = wk), sum)
counts <- aggregate(all$ridership, list(week = wk), length)
weeks <- weeks[counts$x == 7, ]
put("chicago-weekly", weeks$week, weeks$x, "weekly", "thousand rides", "sum",
    "R package modeldata: Chicago, summed over complete ISO weeks", "yearly seasonality of weeks")

data(ice.river, package = "tseries")
days <- format(as.Date("1972-01-01") + seq_len(nrow(ice.river)) - 1)
put("river-flow", days, as.numeric(ice.river[, "flow.jok"]), "daily", "m³/s", "mean",
    "R package tseries: ice.river (Jokulsa Eystri river flow, Tong 1990); dates assigned from 1 January 1972, one a day",
    "daily with a yearly pattern; the source counts 365 days a year")
put("river-temperature", days, as.numeric(ice.river[, "temp"]), "daily", "°C", "mean",
    "R package tseries: ice.river (temperature at Hveravellir, Tong 1990); dates as river-flow",
    "crosses zero every year")

h <- as.numeric(taylor)
hourly <- (h[seq(1, length(h), 2)] + h[seq(2, length(h), 2)]) / 2
hours <- format(as.POSIXct("2000-06-05 00:00", tz = "UTC") + 3600 * (seq_along(hourly) - 1), "%Y-%m-%dT%H:%M", tz = "UTC")
put("electricity-hourly", hours, hourly, "hourly", "MW", "mean",
    "R package forecast: taylor (half-hourly electricity demand, England and Wales, 5 June to 27 August 2000; Taylor 2003), averaged to hours",
    "twelve weeks: daily and weekly patterns")

writeLines(toJSON(corpus, auto_unbox = TRUE, pretty = TRUE, digits = NA), "corpus.json")
