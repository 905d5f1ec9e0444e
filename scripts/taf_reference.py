#!/usr/bin/env python3
"""Decode fixtures/taf/corpus.txt with the PyPI package `metar-taf-parser-mivek` into
fixtures/taf/reference.json, the reference the Rust test tests/taf_reference.rs
compares against field by field.

    python3 -m pip install -r scripts/requirements-taf.txt
    python3 scripts/taf_reference.py

The package is imported, not re-implemented: every value below is read from its parsed
TAF object and only converted to plain numbers and strings (kt, ft, degC; visibility
kept as the package's own text, e.g. "P6", ">10000", "1 1/2"). A TAF the package
rejects is recorded with its error message. TAFs are split as our decoder splits them:
a new one at a line starting with TAF, after a line ending in '=' or a blank line.
"""

import json
import pathlib

from importlib.metadata import version

from metar_taf_parser.parser.parser import TAFParser

ROOT = pathlib.Path(__file__).resolve().parent.parent
CORPUS = ROOT / "fixtures" / "taf" / "corpus.txt"
OUT = ROOT / "fixtures" / "taf" / "reference.json"


def split(text):
    out, open_ = [], False
    for line in text.splitlines():
        s = line.strip()
        if not s or s.startswith("#"):
            open_ = False
            continue
        head = s[:3].upper() == "TAF" and (len(s) == 3 or s[3] in " \t")
        if out and open_ and not head:
            out[-1] += "\n" + s
        else:
            out.append(s)
        open_ = not s.endswith("=")
    return out


def wind(w):
    if w is None:
        return None
    conv = {"KT": 1.0, "MPS": 1.0 / 0.514444, "KM/H": 1.0 / 1.852, "KMH": 1.0 / 1.852}
    unit = str(w.unit).upper()
    f = conv.get(unit, 1.0)
    return {
        "direction_deg": None if w.direction == "VRB" else w.degrees,
        "variable": w.direction == "VRB",
        "speed_kt": None if w.speed is None else round(w.speed * f, 1),
        "gust_kt": None if w.gust is None else round(w.gust * f, 1),
        "unit": unit,
    }


def visibility(v):
    if v is None:
        return None
    return {"distance": v.distance, "unit": str(v.unit)}


def clouds(cs):
    out = []
    for c in cs:
        q = c.quantity
        out.append(
            {
                "cover": None if q is None else str(q.name),
                "base_ft": c.height,
                "convective": None if c.type is None else str(c.type.name),
            }
        )
    return out


def weather(ws):
    out = []
    for w in ws:
        s = ""
        if w.intensity is not None:
            s += str(w.intensity.value)
        if w.descriptive is not None:
            s += str(w.descriptive.value)
        for p in w.phenomenons:
            s += str(p.value)
        out.append(s)
    return out


def part(p):
    ws = getattr(p, "wind_shear", None)
    return {
        "wind": wind(p.wind),
        "visibility": visibility(p.visibility),
        "vertical_visibility_ft": p.vertical_visibility,
        "cavok": bool(p.cavok),
        "weather": weather(p.weather_conditions),
        "clouds": clouds(p.clouds),
        "wind_shear": None
        if ws is None
        else {
            "height_ft": ws.height,
            "direction_deg": ws.degrees,
            "speed_kt": ws.speed,
        },
    }


def validity(v):
    d = {k.lstrip("_"): val for k, val in vars(v).items()}
    return d


def temp(t):
    if t is None:
        return None
    return {"temperature_c": t.temperature, "day": t.day, "hour": t.hour}


def main():
    texts = split(CORPUS.read_text())
    out = []
    for text in texts:
        entry = {"text": text}
        try:
            t = TAFParser().parse(text.rstrip("="))
        except Exception as e:  # the package raises on what it cannot read
            entry["error"] = f"{type(e).__name__}: {e}"
            out.append(entry)
            continue
        entry.update(
            {
                "station": t.station,
                "day": t.day,
                "time": None if t.time is None else t.time.strftime("%H:%M"),
                "amended": "AMD" in [str(f.name) for f in t.flags],
                "validity": None if t.validity is None else validity(t.validity),
                "base": part(t),
                "max_temperature": temp(t.max_temperature),
                "min_temperature": temp(t.min_temperature),
                "changes": [
                    dict(
                        part(tr),
                        kind=str(tr.type.name),
                        probability=tr.probability,
                        validity=validity(tr.validity),
                    )
                    for tr in t.trends
                ],
            }
        )
        out.append(entry)
    doc = {
        "source": f"metar-taf-parser-mivek {version('metar-taf-parser-mivek')}",
        "corpus": "fixtures/taf/corpus.txt",
        "tafs": out,
    }
    OUT.write_text(json.dumps(doc, indent=1, sort_keys=True) + "\n")
    print(f"wrote {OUT.relative_to(ROOT)}: {len(out)} TAFs")


if __name__ == "__main__":
    main()
