# The peer of `npm run bench:export` (scripts/bench-export.ts): Debian's matplotlib drawing the
# reference figure's numbers — the same two synthetic datasets (markers, total and statistical
# error bars with caps, bin widths), the same three 1000-point prediction curves, the same ratio
# strip, the legend with the χ²/ndf lines, the axis titles — at the same size, and saving it to
# SVG, PDF and PNG (at the same dpi) in memory. Reads the numbers from the JSON file named on the
# command line before any timing. Then, for each line "svg", "pdf" or "png" on stdin, builds the
# figure from scratch and saves it in that format, and answers one JSON line with the time of the
# build and save only (the interpreter's start and the imports are not timed) and the byte count.
# Text is matplotlib's default: its own mathtext typesetting of the same TeX, DejaVu fonts; SVG
# text as paths (svg.fonttype "path", the default), PDF with embedded Type 3 fonts (pdf.fonttype
# 3, the default). With BENCH_EXPORT_OUT=dir set, the last file of each format is also written
# there (matplotlib.svg, .pdf, .png), to look at beside ours.
import io
import json
import os
import sys
import time

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402

with open(sys.argv[1], encoding="utf-8") as f:
    spec = json.load(f)

MARKERS = {"disc": ("o", True), "open-disc": ("o", False), "square": ("s", True), "open-square": ("s", False), "triangle": ("^", True), "open-triangle": ("^", False), "diamond": ("D", True), "open-diamond": ("D", False)}
DASHES = {"solid": "-", "dashed": (0, (4, 2.5)), "dotted": (0, (1, 1.8)), "dashdot": (0, (4, 1.8, 1, 1.8))}
datasets = [
    {k: (np.asarray(v, dtype=float) if isinstance(v, list) and k not in ("label",) else v) for k, v in d.items()}
    for d in spec["datasets"]
]
predictions = [{**p, "x": np.asarray(p["x"], dtype=float), "y": np.asarray(p["y"], dtype=float)} for p in spec["predictions"]]


def tex(s):
    return f"${s}$"


def build():
    f = spec["fontSizePt"]
    lw = spec["lineWidthPt"]
    plt.rcParams.update({"font.size": f, "axes.linewidth": lw, "xtick.major.width": lw, "ytick.major.width": lw, "lines.linewidth": lw})
    fig = plt.figure(figsize=(spec["widthPt"] / 72, spec["heightPt"] / 72), dpi=spec["dpi"])
    grid = fig.add_gridspec(2, 1, height_ratios=[spec["mainHeightPt"], spec["stripHeightPt"]], hspace=0)
    main = fig.add_subplot(grid[0])
    strip = fig.add_subplot(grid[1], sharex=main)
    for p in predictions:
        main.plot(p["x"], p["y"], color=p["colour"], linestyle=DASHES.get(p["dash"], "-"), linewidth=1.2 * lw, label=tex(p["label"]))
    for d in datasets:
        marker, filled = MARKERS.get(d["marker"], ("o", True))
        face = d["colour"] if filled else "white"
        label = tex(d["label"]) + ("\n" + tex(d["stats"]) if d["stats"] else "")
        main.errorbar(d["x"], d["y"], yerr=[d["totalDown"], d["totalUp"]], fmt="none", ecolor=d["colour"], elinewidth=0.6 * lw)
        main.errorbar(d["x"], d["y"], yerr=[d["statDown"], d["statUp"]], xerr=[d["x"] - d["binLow"], d["binHigh"] - d["x"]], fmt=marker, color=d["colour"], mfc=face, mec=d["colour"], ms=2.2, elinewidth=lw, capsize=1.8, capthick=lw, label=label)
        strip.errorbar(d["x"], d["ratio"], yerr=[d["ratioDown"], d["ratioUp"]], xerr=[d["x"] - d["binLow"], d["binHigh"] - d["x"]], fmt=marker, color=d["colour"], mfc=face, mec=d["colour"], ms=2.2, elinewidth=0.6 * lw)
    strip.axhline(1, color="#1b1a17", linewidth=lw)
    main.set_yscale(spec["yScale"])
    main.set_xlim(*spec["xDomain"])
    main.set_ylim(*spec["yDomain"])
    strip.set_ylim(*spec["stripDomain"])
    main.set_ylabel(tex(spec["yLabel"]))
    strip.set_ylabel(tex(spec["stripLabel"]))
    strip.set_xlabel(tex(spec["xLabel"]))
    main.tick_params(labelbottom=False, direction="in", top=True, right=True)
    strip.tick_params(direction="in", top=True, right=True)
    main.legend(loc="upper right", frameon=False, fontsize=f)
    fig.subplots_adjust(left=spec["leftFraction"], right=spec["rightFraction"], top=spec["topFraction"], bottom=spec["bottomFraction"])
    return fig


def save(fmt):
    fig = build()
    out = io.BytesIO()
    fig.savefig(out, format=fmt, dpi=spec["dpi"])
    plt.close(fig)
    if os.environ.get("BENCH_EXPORT_OUT"):
        with open(os.path.join(os.environ["BENCH_EXPORT_OUT"], f"matplotlib.{fmt}"), "wb") as f:
            f.write(out.getbuffer())
    return out.getbuffer().nbytes


print(json.dumps({"ready": True, "matplotlib": matplotlib.__version__}), flush=True)
for line in sys.stdin:
    fmt = line.strip()
    if fmt not in ("svg", "pdf", "png"):
        break
    t = time.perf_counter()
    size = save(fmt)
    ms = (time.perf_counter() - t) * 1000
    print(json.dumps({"format": fmt, "ms": ms, "bytes": size}), flush=True)
