"""Adds scikit-learn's figures to the k-means optimum-quality reference made by kmeans_optima.R.

For every case of fixtures/kmeans_optima_r.json (same data, same k): the within-SS (inertia_) that
scikit-learn KMeans (k-means++ starts, Lloyd) reaches with n_init = 10 and n_init = 200 for
random_state 1..3. The best known within-SS of a case is the lowest of every figure here (R's
best of 1000 starts included). Writes fixtures/kmeans_optima.json and removes the
intermediate R file.
Run: Rscript test/reference/kmeans_optima.R && /usr/bin/python3 test/reference/kmeans_optima.py
"""
import json
import os
import warnings

import numpy as np
import sklearn
from sklearn.cluster import KMeans

here = os.path.dirname(os.path.abspath(__file__))
source = os.path.join(here, "fixtures", "kmeans_optima_r.json")
with open(source) as f:
    fixture = json.load(f)

warnings.filterwarnings("ignore")
seeds = [1, 2, 3]


def inertia(x, k, starts, seed):
    return float(KMeans(n_clusters=k, n_init=starts, random_state=seed, max_iter=300, tol=1e-4, algorithm="lloyd").fit(x).inertia_)


for case in fixture["cases"]:
    x = np.array(fixture["data"][case["rowsRef"]], dtype=np.float64)
    k = case["k"]
    case["sklearn10"] = [inertia(x, k, 10, s) for s in seeds]
    case["sklearn200"] = [inertia(x, k, 200, s) for s in seeds]
    case["bestKnown"] = min(case["rBest1000"], *case["r10"], *case["r200"], *case["sklearn10"], *case["sklearn200"])

fixture["producedBy"] += f"; scikit-learn {sklearn.__version__} KMeans (k-means++, lloyd, tol 1e-4), numpy {np.__version__}"
fixture["source"] += "; scikit-learn random_state 1..3"
with open(os.path.join(here, "fixtures", "kmeans_optima.json"), "w") as f:
    json.dump(fixture, f, indent=None, separators=(",", ":"))
    f.write("\n")
os.remove(source)
