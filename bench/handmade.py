#!/usr/bin/python3
"""The hand-made route a practitioner takes without trendbrief, as the yardstick of bench/ratios.js.

For each series column of a monthly CSV: STL (statsmodels, period 12, robust), then one PDF page with the
observed series and its trend, the seasonal component, the remainder, and the trend's year-over-year
percent change, drawn with matplotlib into one PDF. No words, no comparisons, no firmness study: the
least a practitioner would hand over, so the ratio flatters the hand-made route rather than trendbrief.

    /usr/bin/python3 bench/handmade.py bench/data/brief-12.csv out.pdf            every column
    /usr/bin/python3 bench/handmade.py bench/data/brief-12.csv out.pdf s01        the named columns only

Needs Debian's python3-statsmodels and python3-matplotlib (pandas comes with statsmodels).
"""

import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import pandas as pd  # noqa: E402
from matplotlib.backends.backend_pdf import PdfPages  # noqa: E402
from statsmodels.tsa.seasonal import STL  # noqa: E402


def main(argv):
    source, target, *columns = argv
    frame = pd.read_csv(source)
    dates = pd.PeriodIndex(frame.iloc[:, 0], freq="M").to_timestamp()
    columns = columns or list(frame.columns[1:])
    # Fixed metadata so that two runs write the same bytes, as trendbrief does with SOURCE_DATE_EPOCH.
    with PdfPages(target, metadata={"CreationDate": None, "ModDate": None}) as pdf:
        for column in columns:
            series = pd.Series(frame[column].to_numpy(dtype=float), index=dates)
            fit = STL(series, period=12, robust=True).fit()
            yoy = 100 * (fit.trend / fit.trend.shift(12) - 1)
            fig, axes = plt.subplots(4, 1, figsize=(8.27, 11.69), sharex=True)
            axes[0].plot(series.index, series, color="0.6", label="observed")
            axes[0].plot(series.index, fit.trend, color="C0", label="trend")
            axes[0].legend(loc="upper left")
            axes[0].set_title(column)
            axes[1].plot(series.index, fit.seasonal, color="C1")
            axes[1].set_ylabel("seasonal")
            axes[2].scatter(series.index, fit.resid, s=6, color="C2")
            axes[2].set_ylabel("remainder")
            axes[3].bar(series.index, yoy, width=25, color="C3")
            axes[3].set_ylabel("trend, % on a year ago")
            fig.tight_layout()
            pdf.savefig(fig)
            plt.close(fig)


if __name__ == "__main__":
    main(sys.argv[1:])
