#!/usr/bin/python3
"""Reference values for the validity measures (src/assess) from scikit-learn (Debian python3-sklearn).

Writes fixtures/validity_sklearn.json: silhouette (per row and mean), Calinski-Harabasz and
Davies-Bouldin on Fisher's iris as scikit-learn ships it (with the labels of a seeded sklearn
KMeans, k = 3, stored) and on blobs of our own making; ARI and NMI (all four averages) on pairs
of label vectors of our own making (fixed numpy seed, stored).
Run with /usr/bin/python3 (the Debian interpreter), not a virtualenv python.
"""
import json
import os
import numpy as np
import sklearn
import scipy
from sklearn.datasets import load_iris
from sklearn.cluster import KMeans
from sklearn import metrics

HERE = os.path.dirname(os.path.abspath(__file__))


def measures(x, labels):
    return {
        "silhouetteValues": metrics.silhouette_samples(x, labels).tolist(),
        "silhouetteAverage": float(metrics.silhouette_score(x, labels)),
        "silhouetteManhattanAverage": float(metrics.silhouette_score(x, labels, metric="manhattan")),
        "calinskiHarabasz": float(metrics.calinski_harabasz_score(x, labels)),
        "daviesBouldin": float(metrics.davies_bouldin_score(x, labels)),
    }


iris = load_iris()
x_iris = iris.data
labels_iris = KMeans(n_clusters=3, n_init=10, random_state=0).fit(x_iris).labels_

# Our own data: four Gaussian blobs of different sizes and spreads in 3 dimensions, plus the
# same rows with labels drawn at random (a poor assignment: negative silhouettes occur).
rng = np.random.default_rng(20261202)
centres = np.array([[0, 0, 0], [4, 0, 1], [0, 5, -1], [3, 4, 4]], dtype=float)
sizes = [30, 20, 25, 15]
spreads = [0.6, 1.0, 0.8, 1.4]
x_own = np.vstack([rng.normal(c, s, size=(m, 3)) for c, s, m in zip(centres, spreads, sizes)])
labels_own = np.repeat(np.arange(4), sizes)
labels_random = rng.integers(0, 3, size=x_own.shape[0])
# A singleton segment: row 0 moved to its own label 9 (silhouette 0 by convention).
labels_singleton = labels_own.copy()
labels_singleton[0] = 9

pairs = []
for n, ka, kb in [(40, 3, 3), (60, 4, 6), (100, 2, 5), (25, 5, 5)]:
    a = rng.integers(0, ka, size=n)
    b = rng.integers(0, kb, size=n)
    # make the second vector agree with the first on about half the rows, so values are not all near 0
    agree = rng.random(n) < 0.5
    b = np.where(agree, a, b)
    pairs.append({
        "a": a.tolist(),
        "b": b.tolist(),
        "ari": float(metrics.adjusted_rand_score(a, b)),
        "nmi": {m: float(metrics.normalized_mutual_info_score(a, b, average_method=m))
                for m in ["arithmetic", "geometric", "min", "max"]},
        "contingency": metrics.cluster.contingency_matrix(a, b).tolist(),
    })

out = {
    "producedBy": f"scikit-learn {sklearn.__version__}, scipy {scipy.__version__}, numpy {np.__version__} (Debian python3-sklearn)",
    "script": "test/reference/validity_sklearn.py",
    "source": {"iris": "Fisher, R. A. (1936) The use of multiple measurements in taxonomic problems; as shipped by scikit-learn (sklearn.datasets.load_iris)",
               "own": "of our own making: numpy default_rng(20261202) Gaussian blobs and random label vectors, stored here"},
    "iris": {"rows": x_iris.tolist(), "assignment": labels_iris.tolist(), "assignmentBy": "sklearn KMeans(n_clusters=3, n_init=10, random_state=0)", **measures(x_iris, labels_iris)},
    "blobs": {"rows": x_own.tolist(), "assignment": labels_own.tolist(), **measures(x_own, labels_own)},
    "blobsRandomLabels": {"assignment": labels_random.tolist(), **measures(x_own, labels_random)},
    "blobsSingleton": {"assignment": labels_singleton.tolist(), **measures(x_own, labels_singleton)},
    "labelPairs": pairs,
}
with open(os.path.join(HERE, "fixtures", "validity_sklearn.json"), "w") as f:
    json.dump(out, f)
print("wrote fixtures/validity_sklearn.json")
