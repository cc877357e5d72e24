"""Reference for k-means: scikit-learn KMeans within-SS (inertia_) on data of our own making.

Data: seeded numpy draws (blobs, stretched blobs, uniform square), rounded to 6 decimals and
stored in the fixture. Writes fixtures/kmeans_sklearn.json.
Run: /usr/bin/python3 test/reference/kmeans_sklearn.py
"""
import json
import os

import numpy as np
import sklearn
from sklearn.cluster import KMeans

here = os.path.dirname(os.path.abspath(__file__))
rng = np.random.default_rng(20261202)

def blobs(n, d, centres, spread):
    means = rng.uniform(-10, 10, size=(centres, d))
    labels = rng.integers(0, centres, size=n)
    return means[labels] + rng.normal(0, spread, size=(n, d))

cases = []
datasets = [
    ("blobs 500 x 5, 5 centres", blobs(500, 5, 5, 1.5), [3, 5, 8]),
    ("stretched blobs 400 x 3", blobs(400, 3, 4, 1.0) @ np.array([[2.0, 0.3, 0], [0, 0.5, 0.2], [0.1, 0, 3.0]]), [2, 4, 6]),
    ("uniform square 300 x 2", rng.uniform(0, 1, size=(300, 2)), [4, 6, 9]),
]
for name, x, ks in datasets:
    x = np.round(x, 6)
    results = []
    for k in ks:
        fit = KMeans(n_clusters=k, n_init=10, random_state=0, algorithm="lloyd").fit(x)
        singles = [KMeans(n_clusters=k, n_init=1, random_state=s, algorithm="lloyd").fit(x).inertia_ for s in range(200)]
        results.append({"k": k, "nInit": 10, "withinSS": float(fit.inertia_),
                        "singleStartMedianWithinSS": float(np.median(singles)), "singleStarts": 200})
    cases.append({"name": name, "rows": x.tolist(), "results": results})

fixture = {
    "producedBy": f"scikit-learn {sklearn.__version__} KMeans(algorithm='lloyd', n_init=10, random_state=0; and 200 single starts random_state=0..199), numpy {np.__version__}",
    "source": "data of our own making: numpy default_rng(20261202) draws, rounded to 6 decimals",
    "cases": cases,
}
with open(os.path.join(here, "fixtures", "kmeans_sklearn.json"), "w") as f:
    json.dump(fixture, f)
