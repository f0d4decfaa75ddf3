#!/usr/bin/python3
"""Sweep the superheater outlet of the solvent-recovery sample and plot the
low-pressure steam it takes and the exergy destroyed against the outlet
temperature.

    /usr/bin/python3 python/examples/superheat_sweep.py [PROJECT] [-o sweep.png]
"""
import argparse
import os

import matplotlib

matplotlib.use("Agg")  # draws to a file; no display needed
import matplotlib.pyplot as plt  # noqa: E402

import heatchain  # noqa: E402

here = os.path.dirname(os.path.abspath(__file__))
parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
parser.add_argument("project", nargs="?",
                    default=os.path.join(here, "..", "..", "sample-projects", "solvent-recovery.hchain"))
parser.add_argument("-o", "--output", default="superheat-sweep.png")
args = parser.parse_args()

project = heatchain.Project(args.project)
# Up to 140 degC: the steam header (about 144 degC) must stay hotter than the vapour.
sweep = project.sweep("superheat", "to.T", "120 degC", "140 degC", points=11,
                      outputs=["utility:lp-steam.mass", "total.exergyDestroyed"])
t_c = sweep["x"] - 273.15

fig, steam = plt.subplots(figsize=(6.4, 4.0))
steam.plot(t_c, sweep["values"]["utility:lp-steam.mass"] * 3600, marker="o", color="#d85028",
           label="low-pressure steam")
steam.set_xlabel("superheater outlet temperature [degC]")
steam.set_ylabel("low-pressure steam [kg/h]")
destroyed = steam.twinx()
destroyed.plot(t_c, sweep["values"]["total.exergyDestroyed"] / 1e3, marker="s", color="#4c9bd6",
               label="exergy destroyed")
destroyed.set_ylabel("exergy destroyed [kW]")
steam.set_title("Solvent recovery: superheater outlet sweep")
fig.tight_layout()
fig.savefig(args.output, dpi=100)
print("%s: %d of %d points computed" % (args.output, sweep["computed"], len(sweep["points"])))
