"""Reference for profileSegments: standardised differences, medoids, median / IQR and category
shares computed with NumPy and SciPy on data of our own making (fixed seed, stored in the fixture)."""
import json, os, sys
import numpy as np
import scipy
from scipy.spatial.distance import cdist

rng = np.random.default_rng(20261202)
n = 90
assignment = rng.integers(0, 3, size=n)
features = rng.normal(size=(n, 3)) + assignment[:, None] * 1.5
trips = np.round(rng.gamma(3.0, 2.0, size=n) + assignment * 2, 2)
peak = np.round(rng.uniform(size=n), 3)
fare = rng.choice(["standard", "student", "senior"], size=n, p=[0.6, 0.25, 0.15])
tenure = np.round(rng.exponential(30, size=n), 1)
zone = rng.choice(["north", "south"], size=n)
# a few missing values in a used and a kept column
trips_list = [float(v) for v in trips]
tenure_list = [float(v) for v in tenure]
for i in (3, 17, 40):
    trips_list[i] = None
for i in (5, 6):
    tenure_list[i] = None

def std_diff(values, mask_seg):
    v = np.array([np.nan if x is None else x for x in values], dtype=float)
    ok = ~np.isnan(v)
    mean = v[ok].mean(); sd = v[ok].std(ddof=1)
    seg = v[ok & mask_seg].mean()
    return dict(segmentMean=seg, overallMean=mean, overallSd=sd, difference=(seg - mean) / sd)

expected = []
for s in range(3):
    m = assignment == s
    diffs = {
        "trips": std_diff(trips_list, m),
        "peak": std_diff([float(v) for v in peak], m),
    }
    for level in sorted(set(fare)):
        diffs["fare=" + level] = std_diff([1.0 if f == level else 0.0 for f in fare], m)
    members = np.where(m)[0]
    D = cdist(features[members], features[members])
    medoid = int(members[np.argmin(D.sum(axis=1))])
    t = np.array([x for x, keep in zip(tenure_list, m) if keep and x is not None])
    zones = [z for z, keep in zip(zone, m) if keep]
    expected.append(dict(
        size=int(m.sum()), differences=diffs, medoid=medoid,
        tenure=dict(median=float(np.percentile(t, 50)), q1=float(np.percentile(t, 25)), q3=float(np.percentile(t, 75)),
                    missing=int(sum(1 for x, keep in zip(tenure_list, m) if keep and x is None))),
        zone={z: zones.count(z) / len(zones) for z in sorted(set(zones))},
    ))

out = dict(
    producedBy=f"NumPy {np.__version__}, SciPy {scipy.__version__} (Python {sys.version.split()[0]})",
    source="data of our own making (numpy default_rng seed 20261202)",
    inputs=dict(assignment=assignment.tolist(), features=features.tolist(), trips=trips_list, peak=peak.tolist(),
                fare=fare.tolist(), tenure=tenure_list, zone=zone.tolist()),
    expected=expected,
)
here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, "fixtures", "segment-profile.json"), "w") as f:
    json.dump(out, f, indent=1)
