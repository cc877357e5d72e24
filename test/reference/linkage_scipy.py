# Reference for agglomerate(): SciPy's linkage / fcluster / cophenet / leaves_list on data of our
# own making (seeded numpy). Run with Debian's Python: /usr/bin/python3 test/reference/linkage_scipy.py
import json
import os

import numpy as np
import scipy
from scipy.cluster.hierarchy import cophenet, fcluster, leaves_list, linkage
from scipy.spatial.distance import pdist

rng = np.random.default_rng(20261202)

def blobs():
    # Three well separated groups plus spread: n = 60, d = 3, no tied distances (continuous values).
    centres = np.array([[0.0, 0.0, 0.0], [5.0, 5.0, 0.0], [0.0, 6.0, 4.0]])
    parts = [c + rng.normal(scale=1.2, size=(20, 3)) for c in centres]
    return np.vstack(parts)

def grid():
    # Integer grid points 4 x 4 with two points repeated elsewhere: many tied distances.
    xs = [[float(i), float(j)] for i in range(4) for j in range(4)]
    xs += [[7.0, 0.0], [7.0, 1.0]]
    return np.array(xs)

def small():
    # n = 12, d = 4 standard normal: small enough to store the whole cophenetic matrix.
    return rng.normal(size=(12, 4))

METHODS = ["single", "complete", "average", "weighted", "centroid", "median", "ward"]
VECTOR_METHODS = ["centroid", "median", "ward"]

def describe(Z, n, d):
    coph_corr, coph = cophenet(Z, d)
    cuts = {}
    for k in range(1, min(n, 8) + 1):
        cuts[str(k)] = fcluster(Z, k, criterion="maxclust").tolist()
    # Height cuts at midpoints between distinct merge heights (never on a tie), and at 0.
    distinct = np.unique(Z[:, 2])
    picks = [0.0] + [float((distinct[i] + distinct[i + 1]) / 2) for i in np.linspace(0, len(distinct) - 2, 6).astype(int)]
    height_cuts = [{"height": t, "labels": fcluster(Z, t, criterion="distance").tolist()} for t in picks]
    return {
        "heightCuts": height_cuts,
        "merges": Z[:, :2].astype(int).tolist(),
        "heights": Z[:, 2].tolist(),
        "sizes": Z[:, 3].astype(int).tolist(),
        "order": leaves_list(Z).tolist(),
        "cutsMaxclust": cuts,
        "copheneticCorrelation": float(coph_corr),
        "cophenetic": coph.tolist() if n <= 20 else None,
    }

sets = []
for name, X in [("blobs", blobs()), ("grid", grid()), ("small", small())]:
    n = X.shape[0]
    d = pdist(X)
    entry = {"name": name, "rows": X.tolist(), "fromPdist": {}, "fromRows": {}}
    for m in METHODS:
        entry["fromPdist"][m] = describe(linkage(d, method=m), n, d)
    for m in VECTOR_METHODS:
        entry["fromRows"][m] = describe(linkage(X, method=m, metric="euclidean"), n, d)
    sets.append(entry)

out = {
    "producedBy": f"SciPy {scipy.__version__} (scipy.cluster.hierarchy.linkage, fcluster maxclust and distance, cophenet, leaves_list), numpy {np.__version__}",
    "source": "data of our own making: numpy default_rng(20261202) normal blobs and small set; integer grid points for ties",
    "note": "Z merges use SciPy's numbering (leaves 0..n-1, merge i makes n+i); fcluster labels are 1-based and arbitrary.",
    "sets": sets,
}
here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, "fixtures", "linkage_scipy.json"), "w") as f:
    json.dump(out, f)
