/*
 * A x = b with MUMPS (complex, SYM = 2: general symmetric, no conjugation) on a system exported as
 * Matrix Market files (quietgrid export-system or bench/factor-case.ts). Built by bench/mumps.ts with
 * gcc against Debian's libmumps-seq-dev, or with mpicc and -DWITH_MPI against libmumps-dev (Open MPI).
 *
 *   mumps_solve A.mtx b.mtx ORDERING [PERM.txt] [X.mtx]
 *
 * ORDERING: amd, amf, scotch, pord, metis, qamd, auto, or given (ICNTL(7) = 1 with the 1-based
 * permutation read from PERM.txt, one entry a line: position k holds the pivot order of unknown k).
 * Prints one JSON line on rank 0: the ordering MUMPS used (INFOG(7)), analysis/factor/solve wall and
 * CPU seconds, entries in the factors (INFOG(29)), flops of the elimination (RINFOG(3), as MUMPS counts
 * them), the largest front (INFOG(11)), memory used by the factorisation (INFOG(22), MB), the relative
 * residual of its solution; and writes x as a Matrix Market "array complex general" column if asked.
 * With MUMPS_ANALYSIS_ONLY set, stops after the analysis and prints its estimates instead; with
 * MUMPS_WRITE_ORDER=FILE, writes the ordering it chose (SYM_PERM, 1-based positions) to FILE.
 * MUMPS Users' guide 5.5 (2022), §5 (ICNTL, INFOG, RINFOG).
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <math.h>
#include <time.h>
#include <mpi.h>
#include "zmumps_c.h"

#define USE_COMM_WORLD -987654
#define ICNTL(i) icntl[(i) - 1]
#define INFOG(i) infog[(i) - 1]
#define RINFOG(i) rinfog[(i) - 1]

static double wall(void) { struct timespec t; clock_gettime(CLOCK_MONOTONIC, &t); return t.tv_sec + 1e-9 * t.tv_nsec; }
static double cpu(void) { struct timespec t; clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t); return t.tv_sec + 1e-9 * t.tv_nsec; }

static void die(const char *what, const char *path) { fprintf(stderr, "mumps_solve: %s %s\n", what, path); exit(2); }

/* The sequential library's MPI stand-in has neither MPI_Abort nor MPI_Comm_size. */
static void fail(void) {
#ifdef WITH_MPI
  MPI_Abort(MPI_COMM_WORLD, 1);
#endif
  exit(1);
}

/* Skips the header and comment lines; returns the first size line. */
static FILE *open_mm(const char *path, char *header, char *line, size_t size) {
  FILE *f = fopen(path, "r");
  if (!f) die("cannot open", path);
  if (!fgets(header, (int)size, f)) die("empty file", path);
  do { if (!fgets(line, (int)size, f)) die("no size line in", path); } while (line[0] == '%');
  return f;
}

int main(int argc, char **argv) {
  int rank = 0;
  MPI_Init(&argc, &argv);
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  if (argc < 4) { if (rank == 0) fprintf(stderr, "usage: mumps_solve A.mtx b.mtx ORDERING [PERM.txt] [X.mtx]\n"); MPI_Finalize(); return 2; }
  const char *ordering = argv[3];
  const char *names[] = {"amd", "given", "amf", "scotch", "pord", "metis", "qamd", "auto"};
  int code = -1;
  for (int k = 0; k < 8; k++) if (strcmp(ordering, names[k]) == 0) code = k;
  if (code < 0) die("unknown ordering", ordering);
  const char *permPath = code == 1 ? (argc > 4 ? argv[4] : NULL) : NULL;
  if (code == 1 && !permPath) die("the ordering 'given' needs", "PERM.txt");
  const char *outPath = argc > (code == 1 ? 5 : 4) ? argv[code == 1 ? 5 : 4] : NULL;

  ZMUMPS_STRUC_C id;
  memset(&id, 0, sizeof id);
  id.comm_fortran = USE_COMM_WORLD;
#ifdef WITH_MPI
  id.comm_fortran = (MUMPS_INT)MPI_Comm_c2f(MPI_COMM_WORLD);
#endif
  id.par = 1;
  id.sym = 2;
  id.job = -1;
  zmumps_c(&id);

  int n = 0;
  long long nz = 0;
  MUMPS_INT *irn = NULL, *jcn = NULL, *perm = NULL;
  ZMUMPS_COMPLEX *a = NULL, *rhs = NULL, *b = NULL;
  if (rank == 0) {
    char header[512], line[512];
    FILE *f = open_mm(argv[1], header, line, sizeof line);
    int ncols;
    if (sscanf(line, "%d %d %lld", &n, &ncols, &nz) != 3) die("bad size line in", argv[1]);
    if (!strstr(header, "complex") || !strstr(header, "symmetric")) die("expected a coordinate complex symmetric matrix:", argv[1]);
    irn = malloc(sizeof *irn * nz); jcn = malloc(sizeof *jcn * nz); a = malloc(sizeof *a * nz);
    for (long long k = 0; k < nz; k++) {
      int i, j; double re, im;
      if (fscanf(f, "%d %d %lf %lf", &i, &j, &re, &im) != 4) die("short matrix file", argv[1]);
      irn[k] = i; jcn[k] = j; a[k].r = re; a[k].i = im;
    }
    fclose(f);
    int m, one;
    f = open_mm(argv[2], header, line, sizeof line);
    if (sscanf(line, "%d %d", &m, &one) != 2 || m != n) die("right-hand side does not match the matrix:", argv[2]);
    rhs = malloc(sizeof *rhs * n); b = malloc(sizeof *b * n);
    for (int k = 0; k < n; k++) {
      if (fscanf(f, "%lf %lf", &b[k].r, &b[k].i) != 2) die("short vector file", argv[2]);
      rhs[k] = b[k];
    }
    fclose(f);
    if (permPath) {
      f = fopen(permPath, "r");
      if (!f) die("cannot open", permPath);
      perm = malloc(sizeof *perm * n);
      for (int k = 0; k < n; k++) if (fscanf(f, "%d", &perm[k]) != 1) die("short permutation file", permPath);
      fclose(f);
    }
    id.n = n; id.nnz = nz; id.irn = irn; id.jcn = jcn; id.a = a;
    id.rhs = rhs; id.nrhs = 1; id.lrhs = n;
    id.perm_in = perm;
  }
  id.ICNTL(1) = -1; id.ICNTL(2) = -1; id.ICNTL(3) = -1; id.ICNTL(4) = 0; /* silent */
  id.ICNTL(7) = code;      /* sequential ordering */
  id.ICNTL(28) = 1;        /* sequential analysis */
  id.ICNTL(14) = 40;       /* workspace headroom, per cent */

  double t0 = wall(), c0 = cpu();
  id.job = 1; zmumps_c(&id);
  double t1 = wall(), c1 = cpu();
  if (id.INFOG(1) < 0) { if (rank == 0) fprintf(stderr, "mumps_solve: analysis failed, INFOG(1) = %d, INFOG(2) = %d\n", id.INFOG(1), id.INFOG(2)); fail(); }
  const char *permOut = getenv("MUMPS_WRITE_ORDER"); /* the ordering MUMPS chose (SYM_PERM: position of each unknown, 1-based), for analysing it with ours */
  if (permOut && rank == 0 && id.sym_perm) {
    FILE *f = fopen(permOut, "w");
    if (!f) die("cannot write", permOut);
    for (int k = 0; k < n; k++) fprintf(f, "%d\n", id.sym_perm[k]);
    fclose(f);
  }
  if (getenv("MUMPS_ANALYSIS_ONLY")) { /* the ordering's estimates only: INFOG(20) entries, RINFOG(1) flops, INFOG(5) largest front */
    if (rank == 0) printf("{\"ordering\":\"%s\",\"orderingUsed\":\"%s\",\"analysisSeconds\":%.6f,\"estimatedEntries\":%lld,\"estimatedFlops\":%.6e,\"maxFront\":%d}\n",
                          ordering, id.INFOG(7) >= 0 && id.INFOG(7) < 8 ? names[id.INFOG(7)] : "?", t1 - t0,
                          id.INFOG(20) < 0 ? -1000000LL * id.INFOG(20) : id.INFOG(20), id.RINFOG(1), id.INFOG(5));
    id.job = -2; zmumps_c(&id); MPI_Finalize(); return 0;
  }
  id.job = 2; zmumps_c(&id);
  double t2 = wall(), c2 = cpu();
  if (id.INFOG(1) < 0) { if (rank == 0) fprintf(stderr, "mumps_solve: factorisation failed, INFOG(1) = %d, INFOG(2) = %d\n", id.INFOG(1), id.INFOG(2)); fail(); }
  id.job = 3; zmumps_c(&id);
  double t3 = wall(), c3 = cpu();
  if (id.INFOG(1) < 0) { if (rank == 0) fprintf(stderr, "mumps_solve: solve failed, INFOG(1) = %d\n", id.INFOG(1)); fail(); }

  if (rank == 0) {
    /* relative residual ‖b − A x‖ / ‖b‖ with the symmetric lower triangle counted twice off the diagonal */
    double *rr = calloc(2 * (size_t)n, sizeof *rr), nb = 0, nr = 0;
    for (long long k = 0; k < nz; k++) {
      int i = irn[k] - 1, j = jcn[k] - 1;
      ZMUMPS_COMPLEX v = a[k], xi = rhs[i], xj = rhs[j];
      rr[2 * i] += v.r * xj.r - v.i * xj.i; rr[2 * i + 1] += v.r * xj.i + v.i * xj.r;
      if (i != j) { rr[2 * j] += v.r * xi.r - v.i * xi.i; rr[2 * j + 1] += v.r * xi.i + v.i * xi.r; }
    }
    for (int k = 0; k < n; k++) {
      double dr = b[k].r - rr[2 * k], di = b[k].i - rr[2 * k + 1];
      nr += dr * dr + di * di; nb += b[k].r * b[k].r + b[k].i * b[k].i;
    }
    long long entries = id.INFOG(29) < 0 ? -1000000LL * id.INFOG(29) : id.INFOG(29);
    int ranks = 1;
#ifdef WITH_MPI
    MPI_Comm_size(MPI_COMM_WORLD, &ranks);
#endif
    printf("{\"ordering\":\"%s\",\"orderingUsed\":\"%s\",\"ranks\":%d,\"n\":%d,\"nnz\":%lld,"
           "\"analysisSeconds\":%.6f,\"factorSeconds\":%.6f,\"solveSeconds\":%.6f,"
           "\"analysisCpuSeconds\":%.6f,\"factorCpuSeconds\":%.6f,\"solveCpuSeconds\":%.6f,"
           "\"factorEntries\":%lld,\"flops\":%.6e,\"estimatedFlops\":%.6e,\"maxFront\":%d,\"memoryMB\":%d,\"residual\":%.3e}\n",
           ordering, id.INFOG(7) >= 0 && id.INFOG(7) < 8 ? names[id.INFOG(7)] : "?", ranks, n, nz,
           t1 - t0, t2 - t1, t3 - t2, c1 - c0, c2 - c1, c3 - c2,
           entries, id.RINFOG(3), id.RINFOG(1), id.INFOG(11), id.INFOG(22), sqrt(nr / (nb > 0 ? nb : 1)));
    if (outPath) {
      FILE *f = fopen(outPath, "w");
      if (!f) die("cannot write", outPath);
      fprintf(f, "%%%%MatrixMarket matrix array complex general\n%%%% solution by MUMPS (%s ordering)\n%d 1\n", names[id.INFOG(7)], n);
      for (int k = 0; k < n; k++) fprintf(f, "%.17g %.17g\n", rhs[k].r, rhs[k].i);
      fclose(f);
    }
    free(rr);
  }
  id.job = -2;
  zmumps_c(&id);
  free(irn); free(jcn); free(a); free(rhs); free(b); free(perm);
  MPI_Finalize();
  return 0;
}
