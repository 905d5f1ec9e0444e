#!/usr/bin/env python3
"""Decode fixtures/metar/corpus.txt with the PyPI `metar` package into
fixtures/metar/reference.json, the reference the Rust test tests/metar_reference.rs
compares against field by field.

    python3 -m pip install -r scripts/requirements-metar.txt
    python3 scripts/metar_reference.py

The package is imported, not re-implemented: every value below is read from its
decoded `Metar` object and only converted to the units our decoder uses (kt, m, ft,
degC, hPa). The corpus is dated 14 June 2026, so month and year are passed explicitly.
"""

import json
import pathlib
import sys

from importlib.metadata import version

from metar import Metar

ROOT = pathlib.Path(__file__).resolve().parent.parent
CORPUS = ROOT / "fixtures" / "metar" / "corpus.txt"
OUT = ROOT / "fixtures" / "metar" / "reference.json"
MONTH, YEAR = 6, 2026


def val(x, unit):
    return None if x is None else round(x.value(unit), 3)


def bound(x):
    # Datatypes.distance keeps ">" / "<" for P / M values.
    g = getattr(x, "_gtlt", None)
    return {">": "at_least", "<": "less_than"}.get(g, "exact")


def decode(line):
    m = Metar.Metar(line, month=MONTH, year=YEAR, strict=False)
    weather = [
        "".join(part or "" for part in group) for group in m.weather
    ]
    recent = ["RE" + "".join(part or "" for part in group) for group in m.recent]
    sky = [
        {
            "cover": cover,
            "base_ft": val(height, "FT"),
            "cloud": cloud,
        }
        for cover, height, cloud in m.sky
    ]
    runway = [
        {
            "name": name,
            "low_m": val(low, "M"),
            "low_bound": bound(low),
            "high_m": val(high, "M"),
            "unit": unit,
        }
        for name, low, high, unit in m.runway
    ]
    return {
        "text": line,
        "type": m.type,
        "station": m.station_id,
        "time": m.time.isoformat() if m.time else None,
        "mod": m.mod,
        "correction": m.correction,
        "wind_dir_deg": m.wind_dir.value() if m.wind_dir else None,
        "wind_speed_kt": val(m.wind_speed, "KT"),
        "wind_speed_bound": bound(m.wind_speed) if m.wind_speed else None,
        "wind_gust_kt": val(m.wind_gust, "KT"),
        "wind_dir_from_deg": m.wind_dir_from.value() if m.wind_dir_from else None,
        "wind_dir_to_deg": m.wind_dir_to.value() if m.wind_dir_to else None,
        "vis_m": val(m.vis, "M"),
        "vis_bound": bound(m.vis) if m.vis else None,
        # The package calls the second (directional) visibility group max_vis.
        "dir_vis_m": val(m.max_vis, "M"),
        "dir_vis_dir": m.max_vis_dir.compass() if m.max_vis_dir else None,
        "runway": runway,
        "weather": weather,
        "recent": recent,
        "sky": sky,
        "temp_c": val(m.temp, "C"),
        "dewpt_c": val(m.dewpt, "C"),
        "press_hpa": val(m.press, "HPA"),
        "windshear": list(m.windshear),
        "trend": " ".join(m._trend_groups) or None,
        "unparsed": list(m._unparsed_groups),
    }


def main():
    lines = [
        ln.strip()
        for ln in CORPUS.read_text().splitlines()
        if ln.strip() and not ln.lstrip().startswith("#")
    ]
    reports = [decode(ln) for ln in lines]
    doc = {
        "source": f"PyPI metar=={version('metar')} (python-metar), decoding {CORPUS.relative_to(ROOT)}",
        "generator": "scripts/metar_reference.py",
        "month": MONTH,
        "year": YEAR,
        "reports": reports,
    }
    OUT.write_text(json.dumps(doc, indent=1, sort_keys=True) + "\n")
    print(f"wrote {len(reports)} reports to {OUT.relative_to(ROOT)}", file=sys.stderr)


if __name__ == "__main__":
    main()
