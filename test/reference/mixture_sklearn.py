#!/usr/bin/python3
"""Reference values for Gaussian mixtures (src/methods/mixture, src/assess/compare-mixtures) from
scikit-learn's GaussianMixture (Debian python3-sklearn).

Writes fixtures/mixture_sklearn.json:
- Old Faithful eruptions (R datasets::faithful, Azzalini & Bowman 1990; read through Rscript) and
  six columns of the Wisconsin breast cancer data (Street, Wolberg & Mangasarian 1993, as
  scikit-learn ships it), z-scored with the population standard deviation; for each of the four
  covariance types and a few k: scikit-learn's best total log-likelihood over 10 initialisations
  (n_init=10, tolerance 1e-8), its BIC and its parameter count.
- Rows drawn from three Gaussians of unequal shape (numpy default_rng, seed stored): scikit-learn's
  BIC for k = 1..6, full covariance, and the k it prefers.
Every fit uses reg_covar = 1e-6, kinsort's default varianceFloor.
Run with /usr/bin/python3 (the Debian interpreter), not a virtualenv python.
"""
import io
import json
import os
import subprocess
import numpy as np
import sklearn
from sklearn.datasets import load_breast_cancer
from sklearn.mixture import GaussianMixture

HERE = os.path.dirname(os.path.abspath(__file__))


def zscore(x):
    return (x - x.mean(axis=0)) / x.std(axis=0)


def faithful():
    text = subprocess.run(
        ["Rscript", "-e", "write.csv(datasets::faithful, row.names = FALSE)"], capture_output=True, text=True, check=True
    ).stdout
    return np.loadtxt(io.StringIO(text), delimiter=",", skiprows=1)


def fits(x, ks):
    out = []
    for k in ks:
        for shape in ["full", "diag", "spherical", "tied"]:
            gm = GaussianMixture(
                n_components=k, covariance_type=shape, n_init=10, tol=1e-8, max_iter=5000, reg_covar=1e-6, random_state=0
            ).fit(x)
            out.append(
                {
                    "k": k,
                    "covariance": {"diag": "diagonal"}.get(shape, shape),
                    "logLikelihood": float(gm.score(x) * x.shape[0]),
                    "bic": float(gm.bic(x)),
                    "parameterCount": int(gm._n_parameters()),
                    "converged": bool(gm.converged_),
                }
            )
    return out


cancer = load_breast_cancer()
cancer_columns = [0, 1, 4, 5, 8, 9]
x_cancer = zscore(cancer.data[:, cancer_columns])
x_faithful = zscore(faithful())

# Three Gaussians of unequal shape and size in 2 dimensions (our own).
seed = 20261203
rng = np.random.default_rng(seed)
parts = [
    rng.multivariate_normal([0, 0], [[1.0, 0.0], [0.0, 1.0]], size=250),
    rng.multivariate_normal([6, 1], [[3.0, 2.4], [2.4, 2.5]], size=150),
    rng.multivariate_normal([1, 7], [[0.3, 0.0], [0.0, 2.0]], size=100),
]
x_three = np.vstack(parts)
bic_three = []
for k in range(1, 7):
    gm = GaussianMixture(n_components=k, covariance_type="full", n_init=10, tol=1e-8, max_iter=5000, random_state=0).fit(x_three)
    bic_three.append(float(gm.bic(x_three)))

fixture = {
    "producedBy": f"scikit-learn {sklearn.__version__} GaussianMixture (numpy {np.__version__}), test/reference/mixture_sklearn.py",
    "note": "logLikelihood = score(X) * n (total); bic = -2 logLikelihood + parameterCount ln n; lower BIC is better.",
    "datasets": {
        "faithful": {
            "source": "R datasets::faithful (Azzalini & Bowman 1990), z-scored (population sd)",
            "rows": x_faithful.tolist(),
            "fits": fits(x_faithful, [2, 3]),
        },
        "breastCancer": {
            "source": "scikit-learn load_breast_cancer (Street, Wolberg & Mangasarian 1993), columns "
            + ", ".join(cancer.feature_names[cancer_columns])
            + ", z-scored (population sd)",
            "rows": x_cancer.tolist(),
            "fits": fits(x_cancer, [2, 4]),
        },
    },
    "threeShapes": {
        "source": f"numpy default_rng({seed}): 250 rows N((0,0), I), 150 rows N((6,1), [[3,2.4],[2.4,2.5]]), 100 rows N((1,7), diag(0.3, 2))",
        "rows": x_three.tolist(),
        "bicByK": bic_three,
        "preferredK": int(np.argmin(bic_three)) + 1,
    },
}
with open(os.path.join(HERE, "fixtures", "mixture_sklearn.json"), "w") as f:
    json.dump(fixture, f, indent=1)
    f.write("\n")
print("wrote fixtures/mixture_sklearn.json")
