# Reference fixture for the public holidays of src/calendar/holidays.ts (from the date-holidays library),
# computed by R's timeDate package (Debian: r-cran-timedate, r-cran-jsonlite), 1990-2040:
# - holidayLONDON: the days the London (England) calendar is closed, substitute days included;
# - the date of each holiday rule timeDate has for the United States, Germany, France, Italy and Canada (Ontario),
#   as the rule gives it (no substitute days, whatever year the holiday was first kept).
#
#   Rscript test/calendar/generate-holidays.R        (from the repository root)
#
# Writes test/calendar/fixtures/holidays-timedate.json.
suppressPackageStartupMessages({
  library(jsonlite)
  library(timeDate)
})
years <- 1990:2040
day <- function(x) format(as.Date(as.character(x)), "%Y-%m-%d")
rules <- c(
  "NewYearsDay", "GoodFriday", "EasterMonday", "LaborDay", "PentecostMonday", "ChristmasDay", "BoxingDay",
  "USNewYearsDay", "USMLKingsBirthday", "USPresidentsDay", "USMemorialDay", "USJuneteenthNationalIndependenceDay",
  "USIndependenceDay", "USLaborDay", "USColumbusDay", "USVeteransDay", "USThanksgivingDay", "USChristmasDay",
  "DEAscension", "DEGermanUnity",
  "FRFetDeLaVictoire1945", "FRAscension", "FRBastilleDay", "FRAssumptionVirginMary", "FRAllSaints", "FRArmisticeDay",
  "ITEpiphany", "ITLiberationDay", "ITAssumptionOfVirginMary", "ITAllSaints", "ITImmaculateConception",
  "CAFamilyDay", "CAVictoriaDay", "CACanadaDay", "CALabourDay", "CAThanksgivingDay"
)
doc <- list(
  generator = unbox(sprintf("test/calendar/generate-holidays.R with %s, timeDate %s", R.version.string,
                            packageVersion("timeDate"))),
  years = c(min(years), max(years)),
  london = day(holidayLONDON(years)),
  rules = setNames(lapply(rules, function(f) day(do.call(f, list(years)))), rules)
)
dir.create(file.path("test", "calendar", "fixtures"), showWarnings = FALSE)
writeLines(toJSON(doc, auto_unbox = FALSE), file.path("test", "calendar", "fixtures", "holidays-timedate.json"))
