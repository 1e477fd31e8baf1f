#!/usr/bin/python3
"""Demo chip layouts for the seed: Brookmere Biofluidics (an invented startup) and
its three invented chips, each in two revisions, written with ezdxf as real DXF
files (µm, $INSUNITS = 13), with a conditions.json per chip.

Run by hand:  /usr/bin/python3 db/demo-layouts/generate.py
The seed reads the committed files; it never runs this script.
"""
import json
import math
import os

import ezdxf
import ezdxf.bbox

HERE = os.path.dirname(os.path.abspath(__file__))
PORT_R = 750.0  # µm: a 1.5 mm punched inlet


def new_doc(title):
    doc = ezdxf.new("R2018")
    doc.header["$INSUNITS"] = 13  # micrometres
    doc.layers.add("FLOW", color=5)
    doc.layers.add("PORTS", color=1)
    doc.layers.add("DIE", color=7)
    doc.layers.add("TEXT", color=3)
    msp = doc.modelspace()
    return doc, msp


def port(msp, x, y, name):
    msp.add_circle((x, y), PORT_R, dxfattribs={"layer": "PORTS"})
    msp.add_text(name, dxfattribs={"layer": "TEXT", "height": 180, "insert": (x - 500, y - 90)})


def die(msp, label, margin=3500.0):
    """Die outline around everything drawn so far, `margin` µm clear of every channel and port rim."""
    box = ezdxf.bbox.extents(e for e in msp if e.dxf.layer in ("FLOW", "PORTS"))
    x0, y0 = box.extmin.x - margin, box.extmin.y - margin
    x1, y1 = box.extmax.x + margin, box.extmax.y + margin
    x0, y0, x1, y1 = (math.floor(x0 / 500) * 500, math.floor(y0 / 500) * 500, math.ceil(x1 / 500) * 500, math.ceil(y1 / 500) * 500)
    msp.add_lwpolyline([(x0, y0), (x1, y0), (x1, y1), (x0, y1)], close=True, dxfattribs={"layer": "DIE"})
    msp.add_text(label, dxfattribs={"layer": "TEXT", "height": 300, "insert": (x0 + 600, y0 + 500)})


def serpentine_points(x, y, run, turns, pitch, direction=1):
    """Horizontal runs joined by semicircular turns (bulge ±1), starting at (x, y) going +x (direction=1)
    and stepping down by `pitch` at each turn. Returns LWPOLYLINE points (x, y, bulge) and the end point."""
    pts = []
    cx, cy = x, y
    d = direction
    for k in range(turns):
        nx = cx + d * run
        # Going +x and turning down is clockwise (bulge −1); going −x and turning down is counter-clockwise (+1).
        pts.append((cx, cy, 0.0))
        pts.append((nx, cy, -1.0 if d > 0 else 1.0))
        cx, cy = nx, cy - pitch
        d = -d
    pts.append((cx, cy, 0.0))
    return pts, (cx, cy)


def write(doc, name):
    doc.saveas(os.path.join(HERE, name))


def write_conditions(name, doc):
    with open(os.path.join(HERE, name), "w") as f:
        json.dump(doc, f, indent=2)
        f.write("\n")


# --- Droplet generator (flow focusing) -------------------------------------------------
def droplet(rev):
    nozzle_w = 40 if rev == 1 else 55  # rev 2 widens the orifice for larger droplets
    doc, msp = new_doc("droplet")
    jx, jy = 6000.0, 5000.0
    # Oil inlet on the left; its two arms wrap round the aqueous inlet and reach the cross from above and below.
    ox = 1500.0
    port(msp, ox, jy, "IN_OIL")
    msp.add_lwpolyline([(ox, jy), (ox, jy + 2500), (jx, jy + 2500), (jx, jy)], dxfattribs={"layer": "FLOW"})
    msp.add_lwpolyline([(ox, jy), (ox, jy - 2500), (jx, jy - 2500), (jx, jy)], dxfattribs={"layer": "FLOW"})
    # Aqueous inlet between the arms, straight into the cross.
    port(msp, 3500, jy, "IN_AQ")
    msp.add_line((3500, jy), (jx, jy), dxfattribs={"layer": "FLOW"})
    # Nozzle (orifice), then a straight expansion lead and a serpentine delay line, drawn with their own widths.
    msp.add_lwpolyline([(jx, jy), (jx + 150, jy)], dxfattribs={"layer": "FLOW", "const_width": nozzle_w})
    msp.add_lwpolyline([(jx + 150, jy), (jx + 1500, jy)], dxfattribs={"layer": "FLOW", "const_width": 200})
    turns = 3 if rev == 1 else 4
    pts, end = serpentine_points(jx + 1500, jy, 4000, turns, 700)
    msp.add_lwpolyline(pts, format="xyb", dxfattribs={"layer": "FLOW", "const_width": 200})
    out = (end[0] + (1500 if turns % 2 == 0 else -1500), end[1])
    msp.add_lwpolyline([end, out], dxfattribs={"layer": "FLOW", "const_width": 200})
    port(msp, out[0], out[1], "OUT")
    die(msp, f"BRK-DG1 rev {rev}")
    write(doc, f"droplet-generator-rev{rev}.dxf")


# --- Gradient generator (tree of serpentines) -------------------------------------------
def gradient(rev):
    doc, msp = new_doc("gradient")
    pitch_x = 1800.0
    stage_drop = 3200.0 if rev == 1 else 4200.0
    turns = 4 if rev == 1 else 6  # rev 2: longer serpentines for complete mixing at higher flow
    run = 800.0
    top = 20000.0 + (0 if rev == 1 else 4000)
    # Inlets feed the first distribution line.
    xs0 = [-pitch_x / 2, pitch_x / 2]
    port(msp, xs0[0] - 1500, top + 3000, "IN_MEDIUM")
    port(msp, xs0[1] + 1500, top + 3000, "IN_DRUG")
    msp.add_lwpolyline([(xs0[0] - 1500, top + 3000), (xs0[0] - 1500, top + 1500), (xs0[0], top + 1500), (xs0[0], top)], dxfattribs={"layer": "FLOW"})
    msp.add_lwpolyline([(xs0[1] + 1500, top + 3000), (xs0[1] + 1500, top + 1500), (xs0[1], top + 1500), (xs0[1], top)], dxfattribs={"layer": "FLOW"})
    msp.add_line((xs0[0], top), (xs0[1], top), dxfattribs={"layer": "FLOW"})
    y = top
    n_prev = 2
    for stage in range(3):
        n = n_prev + 1
        xs = [(i - (n - 1) / 2) * pitch_x for i in range(n)]
        line_y = y
        # Widen the distribution line to span this stage's serpentines.
        if xs[0] < -((n_prev - 1) / 2) * pitch_x:
            msp.add_line((xs[0], line_y), (-((n_prev - 1) / 2) * pitch_x, line_y), dxfattribs={"layer": "FLOW"})
            msp.add_line((((n_prev - 1) / 2) * pitch_x, line_y), (xs[-1], line_y), dxfattribs={"layer": "FLOW"})
        next_y = y - stage_drop
        for x in xs:
            # Down from the line, a serpentine of `turns` half-turns (amplitude run/2 about x), then down to the next line.
            # Down from the line, a serpentine of `turns` (even) half-turns to the right of x, then down to the next line.
            msp.add_line((x, line_y), (x, line_y - 400), dxfattribs={"layer": "FLOW"})
            step = (stage_drop - 800) / turns
            pts, end = serpentine_points(x, line_y - 400, run, turns, step)
            msp.add_lwpolyline(pts, format="xyb", dxfattribs={"layer": "FLOW"})
            msp.add_line(end, (x, next_y), dxfattribs={"layer": "FLOW"})
        # Next distribution line: spans the serpentines just drawn (and the next stage widens it).
        msp.add_line((xs[0], next_y), (xs[-1], next_y), dxfattribs={"layer": "FLOW"})
        y = next_y
        n_prev = n
    # Five outputs into the culture channel (wide) and the outlet.
    xs = [(i - (n_prev - 1) / 2) * pitch_x for i in range(n_prev)]
    for x in xs:
        msp.add_lwpolyline([(x, y), (x, y - 3000)], dxfattribs={"layer": "FLOW"})
    msp.add_lwpolyline([(xs[0], y - 3000), (xs[-1], y - 3000)], dxfattribs={"layer": "FLOW", "const_width": 400})
    msp.add_lwpolyline([(xs[-1], y - 3000), (xs[-1] + 2500, y - 3000)], dxfattribs={"layer": "FLOW", "const_width": 400})
    port(msp, xs[-1] + 2500, y - 3000, "OUT")
    die(msp, f"BRK-GG5 rev {rev}")
    write(doc, f"gradient-generator-rev{rev}.dxf")


# --- Serpentine mixer --------------------------------------------------------------------
def mixer(rev):
    doc, msp = new_doc("mixer")
    turns = 6 if rev == 1 else 12  # rev 2: six more turns, so the streams have time to mix
    port(msp, 1000, 9000 + (0 if rev == 1 else 2800), "IN_A")
    port(msp, 1000, 5000 + (0 if rev == 1 else 2800), "IN_B")
    top = 7000.0 + (0 if rev == 1 else 2800)
    msp.add_line((1000, 9000 + (0 if rev == 1 else 2800)), (3000, top), dxfattribs={"layer": "FLOW"})
    msp.add_line((1000, 5000 + (0 if rev == 1 else 2800)), (3000, top), dxfattribs={"layer": "FLOW"})
    msp.add_line((3000, top), (4000, top), dxfattribs={"layer": "FLOW"})
    pts, end = serpentine_points(4000, top, 9000, turns, 700)
    msp.add_lwpolyline(pts, format="xyb", dxfattribs={"layer": "FLOW"})
    out_x = end[0] + (1500 if turns % 2 == 0 else -1500)
    msp.add_line(end, (out_x, end[1]), dxfattribs={"layer": "FLOW"})
    port(msp, out_x, end[1], "OUT")
    die(msp, f"BRK-SM2 rev {rev}")
    write(doc, f"serpentine-mixer-rev{rev}.dxf")


common_layers = {
    "PORTS": {"role": "port"},
    "DIE": {"role": "outline"},
    "TEXT": {"role": "ignore"},
}

for rev in (1, 2):
    droplet(rev)
    gradient(rev)
    mixer(rev)

write_conditions("droplet-generator.conditions.json", {
    "units": "um",
    "snap": "0.5 um",
    "layers": {"FLOW": {"role": "channel", "depth": "50 um", "width": "100 um", "section": "rectangular"}, **common_layers},
    "fluid": {"preset": "fluorinated_oil"},
    "second_phase": {"preset": "aqueous_buffer"},
    "ports": {"IN_OIL": {"flow": "5 uL/min", "phase": "continuous"}, "IN_AQ": {"flow": "1 uL/min", "phase": "dispersed"}, "OUT": {"pressure": 0}},
    "process": "pdms_soft_lithography",
    "pump": {"max_pressure": "2 bar"},
})
write_conditions("gradient-generator.conditions.json", {
    "units": "um",
    "layers": {"FLOW": {"role": "channel", "depth": "60 um", "width": "100 um", "section": "rectangular"}, **common_layers},
    "fluid": {"preset": "aqueous_buffer"},
    "solute": {"preset": "fluorescein"},
    "ports": {"IN_MEDIUM": {"flow": "1 uL/min"}, "IN_DRUG": {"flow": "1 uL/min"}, "OUT": {"pressure": 0}},
    "process": "pdms_soft_lithography",
    "cells": True,
})
write_conditions("serpentine-mixer.conditions.json", {
    "units": "um",
    "layers": {"FLOW": {"role": "channel", "depth": "50 um", "width": "100 um", "section": "rectangular"}, **common_layers},
    "fluid": {"preset": "water"},
    "solute": {"preset": "small_molecule"},
    "ports": {"IN_A": {"flow": "0.5 uL/min"}, "IN_B": {"flow": "0.5 uL/min"}, "OUT": {"pressure": 0}},
    "process": "pdms_soft_lithography",
})
print("wrote demo layouts to", HERE)
