"""The pandas side of the datalog benchmark: read the CSV, keep warm closed-loop part-throttle samples (the filter of
packages/domain/src/datalog/fuel-trim.ts with the default settings) and average the combined fuel trim on a
500 rpm x 10 kPa grid. Prints one JSON line: wall seconds, peak RSS and the grid's size, for scripts/bench/datalog.ts.

Run: python3 scripts/bench/datalog_pandas.py FILE.csv
"""
import json
import resource
import sys
import time

start = time.perf_counter()
import pandas as pd  # noqa: E402  (the import is part of the time a user waits, as Node's start-up is on the other side)

frame = pd.read_csv(sys.argv[1])
col = {name.split(" (")[0]: name for name in frame.columns}
rpm = frame[col["Engine RPM"]]
load = frame[col["Intake manifold absolute pressure"]]
pedal = frame[col["Accelerator pedal position D"]]
keep = (
    (rpm >= 400)
    & (frame[col["Engine coolant temperature"]] >= 80)
    & ((frame[col["Commanded equivalence ratio"]] - 1).abs() <= 0.03)
    & (frame[col["O2 sensor 1 equivalence ratio"]] <= 1.3)
    & (pedal < 95)
    & ~((pedal <= 1) & (rpm > 1500))
)
bank1 = frame[col["Short term fuel trim\u2014Bank 1"]] + frame[col["Long term fuel trim\u2014Bank 1"]]
bank2 = frame[col["Short term fuel trim\u2014Bank 2"]] + frame[col["Long term fuel trim\u2014Bank 2"]]
trims = pd.DataFrame(
    {
        "rpm": (rpm[keep] // 500) * 500,
        "map": (load[keep] // 10) * 10,
        "trim": ((bank1 + bank2) / 2)[keep],
    }
)
grid = trims.groupby(["rpm", "map"])["trim"].agg(["mean", "count"])
grid = grid[grid["count"] >= 20]
elapsed = time.perf_counter() - start
print(
    json.dumps(
        {
            "rows": len(frame),
            "cells": len(grid),
            "seconds": elapsed,
            # ru_maxrss is in kilobytes on Linux.
            "maxRssMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        }
    )
)
