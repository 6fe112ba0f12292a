# Reads the test workbooks (written by make.py with LibreOffice) with R's readxl, as the reference our
# reader is held to: readback.json holds, for each case, the columns readxl finds and every cell's value.
# Date cells come back from readxl as instants (it applies the workbook's 1900 or 1904 date system); they
# are written as ISO text in UTC. Columns of plain serial numbers are turned into dates here with R's
# as.Date and the origin of the date system the workbook was written with (1899-12-30 or 1904-01-01),
# independently of our code.
#
#   Rscript test/sources/workbooks/readback.R   (Debian: r-base-core r-cran-readxl r-cran-jsonlite)
suppressPackageStartupMessages({ library(readxl); library(jsonlite) })
here <- dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)))

iso <- function(x) {
  if (inherits(x, "POSIXct")) {
    hm <- format(x, "%H:%M", tz = "UTC")
    if (all(is.na(x) | hm == "00:00")) return(format(x, "%Y-%m-%d", tz = "UTC"))
    return(format(x, "%Y-%m-%dT%H:%M", tz = "UTC"))
  }
  x
}

read_case <- function(name, file, sheet, range = NULL, skip = 0, serial_origin = NULL, serial_column = NULL,
                      col_types = NULL, instant_column = NULL) {
  t <- read_excel(file.path(here, file), sheet = sheet, range = range, skip = skip, .name_repair = "minimal",
                  col_types = col_types)
  cols <- lapply(t, iso)
  if (!is.null(serial_column)) {
    cols[[serial_column]] <- format(as.Date(t[[serial_column]], origin = serial_origin), "%Y-%m-%d")
  }
  if (!is.null(instant_column)) {
    secs <- round(t[[instant_column]] * 86400)
    cols[[instant_column]] <- format(as.POSIXct(secs, origin = serial_origin, tz = "UTC"), "%Y-%m-%dT%H:%M", tz = "UTC")
  }
  list(name = name, file = file, columns = names(t), rows = nrow(t), cells = unname(cols))
}

cases <- list(
  read_case("monthly, sheet by name, header under a title", "monthly.xlsx", "Monthly", skip = 2),
  read_case("monthly, sheet by position, a range", "monthly.xlsx", 2, range = "A3:C20"),
  read_case("serials in the 1900 system", "serial-1900.xlsx", "Serials", skip = 1,
            serial_origin = "1899-12-30", serial_column = "day serial"),
  read_case("serials in the 1904 system", "serial-1904.xlsx", "Serials", skip = 1,
            serial_origin = "1904-01-01", serial_column = "day serial"),
  # LibreOffice writes the 1904 system as date1904="true", which the schema's xsd:boolean allows; readxl
  # 1.4.2 read those formatted dates in the 1900 system here (1462 days early), so the date-times are read
  # as their serial numbers and turned into instants with the 1904 origin.
  read_case("date-times in the 1904 system", "hourly-1904.xlsx", "Hours", col_types = c("numeric", "numeric"),
            serial_origin = "1904-01-01", instant_column = "hour")
)
writeLines(toJSON(cases, auto_unbox = TRUE, digits = NA, na = "null", null = "null", pretty = TRUE),
           file.path(here, "readback.json"))
cat("wrote", file.path(here, "readback.json"), "\n")
