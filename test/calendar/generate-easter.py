"""Easter Sunday 1900-2099 from python-dateutil's easter() (Debian: python3-dateutil), an implementation
independent of ours and of R's: Tondering's algorithm, after Oudin (1940) as quoted in the Explanatory
Supplement to the Astronomical Almanac (Seidelmann, ed., 1992).

    python3 test/calendar/generate-easter.py        (from the repository root)
"""
import json
from dateutil import __version__, easter

doc = {
    "generator": f"test/calendar/generate-easter.py with python-dateutil {__version__}",
    "from": 1900,
    "dates": [easter.easter(y, easter.EASTER_WESTERN).isoformat() for y in range(1900, 2100)],
}
with open("test/calendar/fixtures/easter-dateutil.json", "w") as f:
    json.dump(doc, f)
