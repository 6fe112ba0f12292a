# Reference fixtures for the calendar regressors (src/calendar/), computed by R's forecast and timeDate
# packages (Debian: r-cran-forecast, r-cran-timedate, r-cran-jsonlite).
#
#   Rscript test/calendar/generate.R        (from the repository root)
#
# Writes test/calendar/fixtures/calendar.json: for monthly and quarterly series 1990-2040,
# forecast::bizdays under the London and New York holiday calendars (with the holidays themselves, from
# timeDate::holidayLONDON and holidayNYSE), forecast::easter with and without Easter Monday, and
# timeDate::Easter for 1900-2099.
suppressPackageStartupMessages({
  library(jsonlite)
  library(forecast)
  library(timeDate)
})
years <- 1990:2040
monthly <- ts(numeric(length(years) * 12), start = c(1990, 1), frequency = 12)
quarterly <- ts(numeric(length(years) * 4), start = c(1990, 1), frequency = 4)
hol <- function(h) format(as.Date(as.character(h)), "%Y-%m-%d")
doc <- list(
  generator = unbox(sprintf("test/calendar/generate.R with %s, forecast %s, timeDate %s", R.version.string,
                            packageVersion("forecast"), packageVersion("timeDate"))),
  start = unbox("1990-01-01"), years = unbox(length(years)),
  holidays = list(London = hol(holidayLONDON(years)), NewYork = hol(holidayNYSE(years))),
  bizdays = list(
    monthly = list(London = as.numeric(bizdays(monthly, "London")), NewYork = as.numeric(bizdays(monthly, "New York"))),
    quarterly = list(London = as.numeric(bizdays(quarterly, "London")), NewYork = as.numeric(bizdays(quarterly, "New York")))
  ),
  easter = list(
    monthly = as.numeric(easter(monthly)), monthlyWithMonday = as.numeric(easter(monthly, easter.mon = TRUE)),
    quarterly = as.numeric(easter(quarterly)), quarterlyWithMonday = as.numeric(easter(quarterly, easter.mon = TRUE))
  ),
  easterSunday = list(from = unbox(1900), dates = format(as.Date(as.character(Easter(1900:2099))), "%Y-%m-%d"))
)
dir.create(file.path("test", "calendar", "fixtures"), showWarnings = FALSE)
writeLines(toJSON(doc, auto_unbox = FALSE), file.path("test", "calendar", "fixtures", "calendar.json"))
