#!/usr/bin/python3
# Reference values for the preparation layer's scaling, one-hot encoding and imputation, from numpy
# and scikit-learn (Debian python3-numpy, python3-sklearn). Data of our own making, seeded.
# Writes fixtures/scaling.json. Run: /usr/bin/python3 test/reference/scaling.py
import json, os, platform
import numpy as np
import sklearn
from sklearn.preprocessing import StandardScaler, RobustScaler, MinMaxScaler, OneHotEncoder
from sklearn.impute import SimpleImputer

rng = np.random.default_rng(20261202)
n = 41
trips = rng.normal(10.0, 3.0, n).round(3)                 # roughly normal
spend = rng.lognormal(2.0, 0.8, n).round(2)               # skewed, >= 0: for log1p
tenure = rng.integers(0, 12, n).astype(float)             # many ties: quantile interpolation
mode = rng.choice(['tram', 'bus', 'rail', 'ferry'], n)    # categorical
X = np.column_stack([trips, spend, tenure])
names = ['trips', 'spend', 'tenure']

def cols(m):
    return {name: m[:, j].tolist() for j, name in enumerate(names)}

standard = StandardScaler().fit(X)
robust = RobustScaler(quantile_range=(25.0, 75.0)).fit(X)
minmax = MinMaxScaler().fit(X)
logged = np.log1p(X)

enc = OneHotEncoder(sparse_output=False).fit(mode.reshape(-1, 1))

# Imputation: a copy with holes, median for numeric and most frequent for the categorical.
holes = [3, 17, 29]
X_missing = X.copy()
X_missing[holes, 0] = np.nan
X_missing[[5, 6], 2] = np.nan
mode_missing = mode.astype(object)
mode_missing[[8, 30]] = np.nan
# A deliberate tie between two levels: scikit-learn keeps the smallest (first in sorted order).
tie = np.array(['walk', 'cycle', 'walk', 'cycle', np.nan, 'scooter'], dtype=object)
tie_imp = SimpleImputer(strategy='most_frequent', missing_values=np.nan).fit(tie.reshape(-1, 1))
median_imp = SimpleImputer(strategy='median').fit(X_missing)
frequent_imp = SimpleImputer(strategy='most_frequent').fit(mode_missing.reshape(-1, 1))

out = {
    'producedBy': f'scikit-learn {sklearn.__version__}, numpy {np.__version__}, Python {platform.python_version()} (Debian /usr/bin/python3)',
    'source': 'data of our own making: numpy default_rng(20261202), see test/reference/scaling.py',
    'inputs': {
        'columns': {**cols(X), 'mode': mode.tolist()},
        'withMissing': {
            'trips': [None if np.isnan(v) else v for v in X_missing[:, 0]],
            'tenure': [None if np.isnan(v) else v for v in X_missing[:, 2]],
            'tie': [None if isinstance(v, float) else v for v in tie],
            'mode': [None if v is np.nan or (isinstance(v, float) and np.isnan(v)) else v for v in mode_missing],
        },
    },
    'expected': {
        'numpyMean': dict(zip(names, X.mean(axis=0).tolist())),
        'numpySdSample': dict(zip(names, X.std(axis=0, ddof=1).tolist())),
        'numpyPercentiles': {name: np.percentile(X[:, j], [25, 50, 75]).tolist() for j, name in enumerate(names)},
        'zscoreSample': cols((X - X.mean(axis=0)) / X.std(axis=0, ddof=1)),
        'standardScalerPopulation': cols(standard.transform(X)),
        'robustScaler': cols(robust.transform(X)),
        'robustCenter': dict(zip(names, robust.center_.tolist())),
        'robustScale': dict(zip(names, robust.scale_.tolist())),
        'minMaxScaler': cols(minmax.transform(X)),
        'log1pZscoreSample': cols((logged - logged.mean(axis=0)) / logged.std(axis=0, ddof=1)),
        'oneHotCategories': enc.categories_[0].tolist(),
        'oneHot': enc.transform(mode.reshape(-1, 1)).tolist(),
        'medianImputed': {'trips': float(median_imp.statistics_[0]), 'tenure': float(median_imp.statistics_[2])},
        'mostFrequentImputed': {'mode': str(frequent_imp.statistics_[0]), 'tie': str(tie_imp.statistics_[0])},
    },
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'fixtures', 'scaling.json')
with open(path, 'w') as f:
    json.dump(out, f, indent=1)
print('wrote', path)
