"""Reference for settling k-means to a fixed point: scikit-learn KMeans(algorithm='lloyd', tol=0)
started from given centres runs Lloyd steps until no label changes (strict convergence); kinsort's
settleKmeans, started from the assignment to the same centres, must end on the same labels.

Data: the rows stored in fixtures/kmeans_sklearn.json (our own seeded draws). Initial centres: the
first k rows. Writes fixtures/settle_sklearn.json.
Run: /usr/bin/python3 test/reference/settle_sklearn.py
"""
import json
import os

import numpy as np
import sklearn
from sklearn.cluster import KMeans

here = os.path.dirname(os.path.abspath(__file__))
source = json.load(open(os.path.join(here, "fixtures", "kmeans_sklearn.json")))
cases = []
for case in source["cases"]:
    x = np.array(case["rows"], dtype=float)
    for k in (3, 6):
        init = x[:k].copy()
        fit = KMeans(n_clusters=k, init=init, n_init=1, algorithm="lloyd", tol=0.0, max_iter=10000).fit(x)
        cases.append({"name": case["name"], "k": k, "labels": fit.labels_.tolist(), "iterations": int(fit.n_iter_),
                      "inertia": float(fit.inertia_)})
fixture = {
    "producedBy": f"scikit-learn {sklearn.__version__} KMeans(init=first k rows, n_init=1, algorithm='lloyd', tol=0, max_iter=10000), numpy {np.__version__}",
    "source": "rows of fixtures/kmeans_sklearn.json (data of our own making)",
    "cases": cases,
}
with open(os.path.join(here, "fixtures", "settle_sklearn.json"), "w") as f:
    json.dump(fixture, f)
