"""SciPy pdist for every kinsort row metric, on data of our own making (seeded numpy).

Writes fixtures/pdist_metrics.json. Run with Debian's /usr/bin/python3 (python3-scipy)."""
import json
import os

import numpy as np
import scipy
from scipy.spatial.distance import pdist

rng = np.random.default_rng(20261202)
rows = rng.normal(loc=0.0, scale=3.0, size=(30, 6))  # negative and positive values
rows[:, 2] = rng.integers(-5, 5, size=30)  # a column with ties
rows[7] = rows[3]  # duplicate rows
rows[19] = rows[3]
rows[25] = rows[11]
rows = np.round(rows, 6)  # values exactly representable in JSON round trips
weights = np.round(rng.uniform(0.2, 2.0, size=6), 6)

cases = []
for metric, kwargs in [
    ("euclidean", {}),
    ("sqeuclidean", {}),
    ("cityblock", {}),
    ("chebyshev", {}),
    ("minkowski", {"p": 1.5}),
    ("minkowski", {"p": 3}),
    ("cosine", {}),
    ("correlation", {}),
]:
    ours = {"cityblock": "manhattan"}.get(metric, metric)
    cases.append({"metric": ours, **kwargs, "condensed": pdist(rows, metric, **kwargs).tolist()})
for metric, kwargs in [("euclidean", {}), ("cityblock", {}), ("minkowski", {"p": 3})]:
    ours = {"cityblock": "manhattan"}.get(metric, metric)
    cases.append(
        {"metric": ours, **kwargs, "weights": weights.tolist(), "condensed": pdist(rows, metric, w=weights, **kwargs).tolist()}
    )

out = {
    "producedBy": f"SciPy {scipy.__version__} scipy.spatial.distance.pdist, numpy {np.__version__}",
    "source": "data of our own making: numpy default_rng(20261202), normal(0, 3), one integer column, rows 8 and 20 repeat row 4, row 26 repeats row 12",
    "rows": rows.tolist(),
    "weights": weights.tolist(),
    "cases": cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "fixtures", "pdist_metrics.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
