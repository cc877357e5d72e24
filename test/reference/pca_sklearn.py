"""scikit-learn PCA on the wine data (Forina et al., as sklearn.datasets.load_wine ships it,
standardised) and on Fisher's iris (1936, sklearn.datasets.load_iris, raw).

Writes fixtures/pca_sklearn.json. Run with Debian's /usr/bin/python3 (python3-sklearn)."""
import json
import os

import numpy as np
import sklearn
from sklearn.datasets import load_iris, load_wine
from sklearn.decomposition import PCA
from sklearn.preprocessing import StandardScaler


def case(name, source, rows, feature_names, components):
    pca = PCA(svd_solver="full").fit(rows)  # all components, exact LAPACK SVD
    kept = PCA(n_components=components, svd_solver="full").fit(rows)
    new_rows = rows[:5] * 0.9 + 0.1  # rows not seen in fitting
    return {
        "name": name,
        "source": source,
        "featureNames": list(feature_names),
        "rows": rows.tolist(),
        "components": components,
        "mean": pca.mean_.tolist(),
        "explainedVariance": pca.explained_variance_.tolist(),
        "explainedVarianceRatio": pca.explained_variance_ratio_.tolist(),
        # sklearn's components_ is c x d; we store loadings d x c (transposed).
        "loadings": kept.components_.T.tolist(),
        "scores": kept.transform(rows).tolist(),
        "newRows": new_rows.tolist(),
        "newScores": kept.transform(new_rows).tolist(),
    }


wine = load_wine()
wine_std = StandardScaler().fit_transform(wine.data)  # population standard deviation (ddof = 0)
iris = load_iris()
out = {
    "producedBy": f"scikit-learn {sklearn.__version__} sklearn.decomposition.PCA(svd_solver='full'), numpy {np.__version__}",
    "source": "wine recognition data (Forina et al.) and Fisher's iris (1936), both as scikit-learn ships them",
    "cases": [
        case("wine", "wine recognition data (Forina et al.), sklearn.datasets.load_wine, standardised by StandardScaler", wine_std, wine.feature_names, 3),
        case("iris", "Fisher's iris data (1936), sklearn.datasets.load_iris, raw measurements", iris.data, iris.feature_names, 2),
    ],
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "fixtures", "pca_sklearn.json")
with open(path, "w") as f:
    json.dump(out, f)
print("wrote", path)
