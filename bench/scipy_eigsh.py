"""Reference run for the eigenframe benchmark: the lowest modes of K x = lambda M x by SciPy's
ARPACK in shift-invert mode (eigsh with sigma = 0 factorizes K with SuperLU).

Usage: python3 scipy_eigsh.py K.mtx M.mtx COUNT
Prints one JSON object: seconds (eigsh only, wall), cpu_seconds (eigsh, process CPU), read_seconds, maxrss_mib (whole process),
solve_peak_mib (peak resident memory during eigsh, K and M loaded; null when the high-water mark
cannot be reset), rss_before_solve_mib (resident memory just before eigsh), n, nnz_lower, eigenvalues (ascending).
"""
import json
import resource
import sys
import time


def high_water_mib():
    try:
        with open("/proc/self/status") as f:
            for line in f:
                if line.startswith("VmHWM:"):
                    return int(line.split()[1]) / 1024.0
    except OSError:
        pass
    return None


def current_rss_mib():
    try:
        with open("/proc/self/status") as f:
            for line in f:
                if line.startswith("VmRSS:"):
                    return int(line.split()[1]) / 1024.0
    except OSError:
        pass
    return None


def reset_peak():
    # Linux >= 4.0: writing 5 resets the peak RSS to the current RSS (proc(5)).
    try:
        with open("/proc/self/clear_refs", "w") as f:
            f.write("5")
        return True
    except OSError:
        return False


def main():
    import numpy as np
    from scipy.io import mmread
    from scipy.sparse.linalg import eigsh

    k_path, m_path, count = sys.argv[1], sys.argv[2], int(sys.argv[3])
    t0 = time.perf_counter()
    K = mmread(k_path).tocsc()
    M = mmread(m_path).tocsc()
    read_seconds = time.perf_counter() - t0

    can_reset = reset_peak()
    rss_before = current_rss_mib()
    t0 = time.perf_counter()
    c0 = time.process_time()
    vals = eigsh(K, count, M, sigma=0, return_eigenvectors=True)[0]
    seconds = time.perf_counter() - t0
    cpu_seconds = time.process_time() - c0
    solve_peak = high_water_mib() if can_reset else None

    print(json.dumps({
        "seconds": seconds,
        "cpu_seconds": cpu_seconds,
        "read_seconds": read_seconds,
        "maxrss_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0,
        "solve_peak_mib": solve_peak,
        "rss_before_solve_mib": rss_before,
        "n": int(K.shape[0]),
        "nnz_lower": int((K.nnz + K.shape[0]) // 2),
        "eigenvalues": sorted(float(v) for v in np.real(vals)),
    }))


if __name__ == "__main__":
    main()
