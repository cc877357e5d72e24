"""Python side of the kinsort bench: SciPy and scikit-learn timed on the bench's data files.

Reads one JSON command per line on stdin and answers one JSON line on stdout, so one long-lived
process serves a whole run and start-up / imports are never timed. Data are read with
np.fromfile before the clock starts; only the library call is inside the timed region.

  {"op": "info"}                         -> versions, BLAS kernel, thread pools
  {"op": "time", "case": ..., "data": path, "labels": path, "n": n, "d": d,
   "params": {...}, "repeats": r, "budgetMs": b}   -> {"times": [ms, ...]}
  {"op": "quit"}

With --once '<command>' it runs one "time" command and also reports its peak resident memory,
for the memory case (a fresh process, so earlier cases do not inflate the peak).
"""
import gc
import json
import resource
import sys
import time
import warnings

import numpy as np

warnings.simplefilter("ignore")  # keep stdout/stderr clean; the bench reads stdout as JSON


def library_versions():
    import platform
    import scipy
    import sklearn
    info = {
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "sklearn": sklearn.__version__,
    }
    try:
        import threadpoolctl
        # Importing these loads their BLAS / OpenMP libraries, so the thread pools are visible.
        import scipy.linalg  # noqa: F401
        import sklearn.cluster  # noqa: F401
        pools = threadpoolctl.threadpool_info()
        info["threadpools"] = [
            {k: p.get(k) for k in ("user_api", "internal_api", "version", "architecture", "num_threads")}
            for p in pools
        ]
        blas = [p for p in pools if p.get("user_api") == "blas"]
        info["blasKernel"] = (
            f"{blas[0].get('internal_api')} {blas[0].get('version')} {blas[0].get('architecture')}"
            if blas else "no BLAS pool reported"
        )
    except ImportError:
        info["blasKernel"] = "unknown (threadpoolctl not installed)"
    return info


def load(cmd):
    X = np.fromfile(cmd["data"], dtype="<f8").reshape(cmd["n"], cmd["d"])
    labels = np.fromfile(cmd["labels"], dtype="<i4") if cmd.get("labels") else None
    return X, labels


def computation(case, X, labels, params):
    """The library call for one case, as a zero-argument function (imports done here, untimed)."""
    if case == "dissimilarity":
        from scipy.spatial.distance import pdist
        return lambda: pdist(X, params.get("metric", "euclidean"))
    if case == "kmeans":
        from sklearn.cluster import KMeans
        model = lambda: KMeans(n_clusters=params["k"], n_init=params["restarts"], algorithm="lloyd",
                               random_state=params.get("seed", 0))
        return lambda: model().fit(X)
    if case == "k-sweep":
        from sklearn.cluster import KMeans
        from sklearn.metrics import calinski_harabasz_score, davies_bouldin_score, silhouette_score

        def sweep():
            out = []
            for k in range(params["kFrom"], params["kTo"] + 1):
                fit = KMeans(n_clusters=k, n_init=params["restarts"], random_state=params["seed"]).fit(X)
                sample = min(params["silhouetteRows"], X.shape[0])
                out.append((fit.inertia_,
                            silhouette_score(X, fit.labels_, sample_size=sample, random_state=params["seed"]),
                            calinski_harabasz_score(X, fit.labels_),
                            davies_bouldin_score(X, fit.labels_)))
            return out
        return sweep
    if case == "silhouette":
        from sklearn.metrics import silhouette_score
        return lambda: silhouette_score(X, labels)
    if case in ("ward", "average"):
        from scipy.cluster.hierarchy import linkage
        return lambda: linkage(X, method=case, metric="euclidean")
    if case == "mixture":
        from sklearn.mixture import GaussianMixture
        model = lambda: GaussianMixture(n_components=params["k"], covariance_type="full", n_init=params["restarts"],
                                        init_params="k-means++", tol=params["tolerance"], random_state=params["seed"])
        return lambda: model().fit(X)
    if case == "pca":
        from sklearn.decomposition import PCA
        return lambda: PCA(n_components=params["components"], svd_solver="full").fit_transform(X)
    raise ValueError(f"unknown case {case!r}")


def time_case(cmd):
    X, labels = load(cmd)
    work = computation(cmd["case"], X, labels, cmd.get("params", {}))
    times, spent = [], 0.0
    for _ in range(cmd.get("repeats", 3)):
        gc.collect()
        start = time.perf_counter()
        out = work()
        ms = (time.perf_counter() - start) * 1000.0
        del out
        times.append(ms)
        spent += ms
        if spent >= cmd.get("budgetMs", 30000):
            break
    return {"times": times}


def peak_mb():
    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0  # ru_maxrss is KiB on Linux


def answer(obj):
    sys.stdout.write(json.dumps(obj) + "\n")
    sys.stdout.flush()


def serve():
    for line in sys.stdin:
        if not line.strip():
            continue
        try:
            cmd = json.loads(line)
            if cmd["op"] == "quit":
                break
            if cmd["op"] == "info":
                answer(library_versions())
            elif cmd["op"] == "time":
                answer(time_case(cmd))
            else:
                answer({"error": f"unknown op {cmd['op']!r}"})
        except Exception as exc:  # report and keep serving: one failed case must not end the run
            answer({"error": f"{type(exc).__name__}: {exc}"})


if __name__ == "__main__":
    if len(sys.argv) == 3 and sys.argv[1] == "--once":
        result = time_case(json.loads(sys.argv[2]))
        result["peakMB"] = peak_mb()  # whole process: interpreter, libraries, data and the call
        answer(result)
    else:
        serve()
