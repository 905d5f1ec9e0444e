#!/usr/bin/env python3
"""Make fixtures/reference/atmosphere.json: air data for (elevation, altimeter setting,
temperature, dew point) cases, computed with general-purpose reference libraries.

    pip install -r scripts/requirements-atmosphere.txt
    python3 scripts/atmosphere_reference.py > fixtures/reference/atmosphere.json

Libraries (pinned in scripts/requirements-atmosphere.txt):
  * ambiance 1.3.1 — the ICAO Standard Atmosphere 1993 (Doc 7488/3): pressure and
    density at a geopotential altitude, and its own exact inversions `from_pressure`
    and `from_density`.
  * metpy 1.7.1 — saturation vapour pressure (metpy's own formulation), mixing ratio
    and moist-air density; and `altimeter_to_station_pressure` (the Smithsonian
    Meteorological Tables relation, which adds 0.3 hPa) as a cross-check only.

The only relation written here is the definition of the altimeter setting: an altimeter
set to QNH reads field elevation, so pressure altitude = elevation + the ISA pressure
altitude of the QNH level. Everything else is the libraries' arithmetic.
"""
import json
import sys

import ambiance
import metpy
import metpy.calc as mc
import numpy as np
from ambiance import Atmosphere
from metpy.units import units

FT = 0.3048
HPA_PER_INHG = 33.8638866667

# (elevation_ft, altimeter, altimeter unit, temperature_c, dewpoint_c or None)
CASES = [
    (0, 1013.25, "hPa", 15.0, None),
    (0, 1013.25, "hPa", 15.0, 10.0),
    (0, 29.92, "inHg", 30.0, 24.0),
    (0, 1030.0, "hPa", -10.0, -15.0),
    (0, 990.0, "hPa", 35.0, 28.0),
    (-1000, 1020.0, "hPa", 45.0, 10.0),
    (-200, 1008.0, "hPa", 38.0, 22.0),
    (150, 1018.0, "hPa", 22.0, 14.0),
    (500, 30.12, "inHg", 25.0, 18.0),
    (820, 1002.0, "hPa", 28.0, None),
    (1000, 29.50, "inHg", 10.0, 5.0),
    (1250, 1025.0, "hPa", -5.0, -9.0),
    (1640, 1011.0, "hPa", 31.0, 12.0),
    (2000, 30.40, "inHg", 0.0, -3.0),
    (2350, 995.0, "hPa", 33.0, 20.0),
    (2800, 1016.0, "hPa", 18.0, 18.0),
    (3000, 29.80, "inHg", 27.0, 9.0),
    (3300, 1021.0, "hPa", 12.0, 2.0),
    (3900, 1006.0, "hPa", 36.0, 4.0),
    (4200, 30.05, "inHg", 20.0, None),
    (4500, 1013.0, "hPa", 29.0, 15.0),
    (5000, 29.65, "inHg", 32.0, 6.0),
    (5280, 1019.0, "hPa", 24.0, -2.0),
    (5500, 30.20, "inHg", 15.0, 10.0),
    (5900, 30.12, "inHg", 31.0, 8.0),
    (6100, 1009.0, "hPa", 27.0, 11.0),
    (6500, 29.95, "inHg", 34.0, 0.0),
    (6800, 1015.0, "hPa", -12.0, -20.0),
    (7000, 1023.0, "hPa", 30.0, None),
    (7300, 29.70, "inHg", 25.0, 13.0),
    (8000, 1012.0, "hPa", 20.0, -5.0),
    (8500, 30.00, "inHg", 22.0, 3.0),
    (9000, 1004.0, "hPa", 16.0, 1.0),
    (9500, 29.85, "inHg", 18.0, -8.0),
    (10000, 1020.0, "hPa", 10.0, -10.0),
    (11000, 1000.0, "hPa", 5.0, -2.0),
    (12000, 30.30, "inHg", 0.0, -15.0),
    (13500, 1017.0, "hPa", -8.0, -25.0),
    (15000, 29.60, "inHg", -10.0, -30.0),
    (18000, 1013.25, "hPa", -20.7, None),
    (20000, 1040.0, "hPa", -40.0, -50.0),
    (3100, 960.0, "hPa", 20.0, 15.0),
    (400, 1050.0, "hPa", -30.0, -34.0),
    (2500, 870.0, "hPa", 10.0, 0.0),
]


def geopotential_to_atmosphere(h_geopotential_m):
    return Atmosphere(Atmosphere.geop2geom_height(h_geopotential_m))


def case(elev_ft, alt, unit, t_c, td_c):
    qnh_hpa = alt * HPA_PER_INHG if unit == "inHg" else alt
    qnh_level = Atmosphere.from_pressure(qnh_hpa * 100.0)
    pa_ft = elev_ft + float(qnh_level.H[0]) / FT
    station = geopotential_to_atmosphere(pa_ft * FT)
    p_hpa = float(station.pressure[0]) / 100.0
    isa_t_c = float(station.temperature_in_celsius[0])

    p = p_hpa * units.hPa
    t = t_c * units.degC
    dry = mc.density(p, t, 0 * units("g/kg")).to("kg/m^3").magnitude
    if td_c is None:
        moist = dry
        e_hpa = None
    else:
        e = mc.saturation_vapor_pressure(td_c * units.degC)
        w = mc.mixing_ratio(e, p)
        moist = mc.density(p, t, w).to("kg/m^3").magnitude
        e_hpa = float(e.to("hPa").magnitude)
    da_ft = float(Atmosphere.from_density(float(moist)).H[0]) / FT
    da_dry_ft = float(Atmosphere.from_density(float(dry)).H[0]) / FT
    smithsonian = mc.altimeter_to_station_pressure(
        qnh_hpa * units.hPa, elev_ft * units.ft
    ).to("hPa").magnitude
    return {
        "elevation_ft": elev_ft,
        "altimeter": f"{alt}{unit}",
        "qnh_hpa": qnh_hpa,
        "temperature_c": t_c,
        "dewpoint_c": td_c,
        "pressure_altitude_ft": pa_ft,
        "station_pressure_hpa": p_hpa,
        "isa_temperature_c": isa_t_c,
        "vapour_pressure_hpa": e_hpa,
        "air_density_kg_m3": float(moist),
        "air_density_dry_kg_m3": float(dry),
        "density_altitude_ft": da_ft,
        "density_altitude_dry_ft": da_dry_ft,
        "metpy_smithsonian_station_pressure_hpa": float(smithsonian),
    }


def main():
    out = {
        "source": "scripts/atmosphere_reference.py",
        "libraries": {
            "ambiance": ambiance.__version__ if hasattr(ambiance, "__version__") else "1.3.1",
            "metpy": metpy.__version__,
            "numpy": np.__version__,
        },
        "cases": [case(*c) for c in CASES],
    }
    json.dump(out, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
