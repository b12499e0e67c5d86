"""Print, as JSON, every pipe the fluids package tabulates for the schedules Spoolwright carries.

Output: {"version": "<fluids version>", "entries": [{"nps": 1.5, "schedule": "40",
"do_mm": 48.3, "t_mm": 3.68}, ...]}. Values are millimetres, as fluids stores them
internally (its public lookup returns metres). Fluids' schedule "5" is skipped: it is not
an ASME B36.10M schedule (the stainless 5S is).

Run by tests/engine/fluids-crosscheck.test.ts; exits 3 when fluids cannot be imported.
"""
import json
import sys

SCHEDULES = ["10", "20", "30", "40", "60", "80", "100", "120", "140", "160",
             "STD", "XS", "XXS", "5S", "10S", "40S", "80S"]

try:
    import fluids
    from fluids.piping import schedule_lookup, nearest_pipe
except ImportError as exc:  # pragma: no cover - reported by the test
    print(json.dumps({"error": "cannot import fluids: %s" % exc}))
    sys.exit(3)

entries = []
for schedule in SCHEDULES:
    npses, _dis, dos, ts = schedule_lookup[schedule]
    for nps, do, t in zip(npses, dos, ts):
        # Go through the public API too, so a change in how it reports sizes shows up here.
        _nps, _di, do_m, t_m = nearest_pipe(NPS=nps, schedule=schedule)
        if abs(do_m * 1e3 - do) > 1e-6 or abs(t_m * 1e3 - t) > 1e-6:
            raise SystemExit("nearest_pipe disagrees with schedule_lookup at %s %s" % (nps, schedule))
        entries.append({"nps": float(nps), "schedule": schedule, "do_mm": float(do), "t_mm": float(t)})

json.dump({"version": getattr(fluids, "__version__", "unknown"), "entries": entries}, sys.stdout)
sys.stdout.write("\n")
