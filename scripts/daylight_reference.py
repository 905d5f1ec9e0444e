#!/usr/bin/env python3
"""Make fixtures/reference/daylight.json: sunrise, sunset and civil twilight for named
places and dates, computed with PyEphem (the `ephem` package, pinned in
scripts/requirements-daylight.txt), a general-purpose astronomy library built on the
XEphem engine — independent of the NOAA method rhoboard implements.

    pip install -r scripts/requirements-daylight.txt
    python3 scripts/daylight_reference.py > fixtures/reference/daylight.json

Conventions (those of the U.S. Naval Observatory tables): no atmospheric model
(pressure 0), horizon -0:34 with the sun's upper limb for sunrise and sunset; horizon
-6 degrees with the sun's centre for civil twilight.
"""
import datetime as dt
import json
import sys

import ephem

PLACES = [
    ("Greenwich", 51.4769, -0.0005),
    ("Reykjavik", 64.1466, -21.9426),
    ("Quito", -0.1807, -78.4678),
    ("Cape Town", -33.9249, 18.4241),
    ("Denver", 39.7392, -104.9903),
    ("Singapore", 1.3521, 103.8198),
    ("Tromso", 69.6492, 18.9553),
    ("Hobart", -42.8821, 147.3272),
    ("Madrid", 40.4168, -3.7038),
    ("Anchorage", 61.2181, -149.9003),
]
DATES = ["2026-01-15", "2026-03-20", "2026-06-14", "2026-09-23", "2026-12-01"]


def event(obs, sun, method, horizon, use_center, start):
    obs.horizon = horizon
    obs.date = start
    try:
        t = getattr(obs, method)(sun, use_center=use_center)
    except ephem.AlwaysUpError:
        return "always_above"
    except ephem.NeverUpError:
        return "always_below"
    return ephem.Date(t).datetime().replace(tzinfo=dt.timezone.utc).isoformat(timespec="seconds")


def main():
    rows = []
    for name, lat, lon in PLACES:
        for d in DATES:
            date = dt.date.fromisoformat(d)
            obs = ephem.Observer()
            obs.lat, obs.lon = str(lat), str(lon)
            obs.elevation = 0
            obs.pressure = 0
            sun = ephem.Sun()
            # Search from local solar midnight so the events are the place's own day.
            start = ephem.Date(dt.datetime(date.year, date.month, date.day) - dt.timedelta(hours=lon / 15.0))
            rows.append({
                "place": name,
                "latitude_deg": lat,
                "longitude_deg": lon,
                "date": d,
                "civil_dawn": event(obs, sun, "next_rising", "-6", True, start),
                "sunrise": event(obs, sun, "next_rising", "-0:34", False, start),
                "sunset": event(obs, sun, "next_setting", "-0:34", False, start),
                "civil_dusk": event(obs, sun, "next_setting", "-6", True, start),
            })
    json.dump({"source": "scripts/daylight_reference.py", "library": {"ephem": ephem.__version__}, "cases": rows}, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
