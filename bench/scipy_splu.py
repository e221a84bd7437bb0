"""SuperLU (scipy.sparse.linalg.splu) on a Matrix Market system written by bench/factor-case.ts.

usage: /usr/bin/python3 bench/scipy_splu.py A.mtx b.mtx ORDERING...  (bench/run.ts gives one ordering per process)   (MMD_AT_PLUS_A, COLAMD, ...)
Prints one JSON line per ordering: factor and solve seconds (timed here, reading excluded),
nnz(L) + nnz(U) of SuperLU (L stores its unit diagonal), and the relative residual.
"""
import json, sys, time
import numpy as np
import scipy
import scipy.sparse as sp
import scipy.sparse.linalg as sla


def body(path):
    """Header fields and the numbers after the size line; np.fromfile parses in C."""
    with open(path, 'r') as f:
        header = f.readline().lower().split()
        line = f.readline()
        while line.startswith('%'):
            line = f.readline()
        size = [int(v) for v in line.split()]
        return header, size, np.fromfile(f, sep=' ')


def read_matrix(path):
    header, (n, _, nnz), v = body(path)
    v = v.reshape(nnz, 4)
    i = v[:, 0].astype(np.int64) - 1
    j = v[:, 1].astype(np.int64) - 1
    a = v[:, 2] + 1j * v[:, 3]
    if header[4] == 'symmetric':
        off = i != j
        i, j, a = np.concatenate([i, j[off]]), np.concatenate([j, i[off]]), np.concatenate([a, a[off]])
    return sp.csc_matrix((a, (i, j)), shape=(n, n))


def read_vector(path):
    _, (n, _), v = body(path)
    v = v.reshape(n, 2)
    return v[:, 0] + 1j * v[:, 1]


A = read_matrix(sys.argv[1])
b = read_vector(sys.argv[2])
for ordering in sys.argv[3:]:
    t0, c0 = time.perf_counter(), time.process_time()
    lu = sla.splu(A, permc_spec=ordering)
    t1, c1 = time.perf_counter(), time.process_time()
    x = lu.solve(b)
    t2 = time.perf_counter()
    r = np.linalg.norm(A @ x - b) / np.linalg.norm(b)
    print(json.dumps({'ordering': ordering, 'scipy': scipy.__version__, 'n': A.shape[0], 'factorSeconds': t1 - t0, 'factorCpuSeconds': c1 - c0, 'solveSeconds': t2 - t1,
                      'nnzL': int(lu.L.nnz), 'nnzU': int(lu.U.nnz), 'residual': float(r)}), flush=True)
    del lu
