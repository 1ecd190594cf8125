"""The plain script an analyst would write for the benchmark's field, run beside the engine by
`npm run bench -- --compare` so both are timed in one run on the same files.

pandas reads both CSVs, pyproj projects the as-planted lat/lon to the survey's UTM zone, a scipy k-d tree
finds each survey point's nearest record, and pairs are taken greedily, closest first, one to one, within
the maximum pairing distance. Then the usual figures: bias, RMSE, CEP (median radial error), 95 % radius
and the share within tolerance. Prints one JSON line: stage wall times in ms, peak memory and the figures.

Usage: python3 analyst_audit.py PLANTED.csv SURVEY.csv EPSG:32632 MAX_DISTANCE_M TOLERANCE_M
"""

import json
import resource
import sys
import time

start = time.perf_counter()
import numpy as np  # noqa: E402
import pandas as pd  # noqa: E402
from pyproj import Transformer  # noqa: E402
from scipy.spatial import cKDTree  # noqa: E402

planted_path, survey_path, survey_crs, max_distance, tolerance = sys.argv[1:6]
max_distance, tolerance = float(max_distance), float(tolerance)
t = {"start": (time.perf_counter() - start) * 1000}


def lap(name, since):
    now = time.perf_counter()
    t[name] = (now - since) * 1000
    return now


mark = time.perf_counter()
planted = pd.read_csv(planted_path, dtype={"plant_id": str, "crop": str, "bed": str, "row": str, "arm": str})
survey = pd.read_csv(survey_path)
mark = lap("read", mark)

to_grid = Transformer.from_crs("EPSG:4326", survey_crs, always_xy=True)
pe, pn = to_grid.transform(planted["lon"].to_numpy(), planted["lat"].to_numpy())
se, sn = survey["easting"].to_numpy(), survey["northing"].to_numpy()
mark = lap("project", mark)

tree = cKDTree(np.column_stack([pe, pn]))
dist, nearest = tree.query(np.column_stack([se, sn]), k=1, distance_upper_bound=max_distance)
candidates = np.flatnonzero(np.isfinite(dist))
order = candidates[np.argsort(dist[candidates], kind="stable")]
taken = np.zeros(len(pe), dtype=bool)
survey_idx, planted_idx = [], []
for s in order:
    p = nearest[s]
    if not taken[p]:
        taken[p] = True
        survey_idx.append(s)
        planted_idx.append(p)
survey_idx = np.asarray(survey_idx)
planted_idx = np.asarray(planted_idx)
mark = lap("pair", mark)

de = pe[planted_idx] - se[survey_idx]
dn = pn[planted_idx] - sn[survey_idx]
radial = np.hypot(de, dn)
figures = {
    "pairs": int(len(radial)),
    "meanDE": float(de.mean()),
    "meanDN": float(dn.mean()),
    "rmseR": float(np.sqrt(np.mean(de**2 + dn**2))),
    "cep": float(np.median(radial)),
    "r95": float(np.quantile(radial, 0.95)),
    "withinShare": float(np.mean(radial <= tolerance)),
}
lap("statistics", mark)
t["total"] = (time.perf_counter() - start) * 1000
peak_mb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
print(json.dumps({"timingsMs": {k: round(v) for k, v in t.items()}, "maxRssMB": round(peak_mb), **figures}))
