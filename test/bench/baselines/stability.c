/* Baseline for `npm run bench -- stability`: overlapping ADEV, overlapping HDEV and MDEV of a phase record
 * (float64 little-endian file), as plain C loops: OADEV and OHDEV straight from their sums (NIST SP 1065
 * eqs. (11) and (19) [M]), MDEV with a prefix sum of the phase so each τ costs O(N). Usage:
 *   stability <file.f64> <statistic: oadev|ohdev|mdev> <m1> [m2 ...]
 * Prints the elapsed CPU seconds, then one deviation per m (tau0 = 1 s). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static double now(void) { struct timespec t; clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t); return t.tv_sec + 1e-9 * t.tv_nsec; }

int main(int argc, char **argv) {
  if (argc < 4) return 2;
  FILE *f = fopen(argv[1], "rb");
  if (!f) return 2;
  fseek(f, 0, SEEK_END); long bytes = ftell(f); fseek(f, 0, SEEK_SET);
  long N = bytes / 8;
  double *x = malloc(sizeof(double) * N), *S = malloc(sizeof(double) * (N + 1));
  if (fread(x, 8, N, f) != (size_t)N) return 2;
  fclose(f);
  int count = argc - 3;
  double *dev = malloc(sizeof(double) * count);
  double t0 = now();
  if (strcmp(argv[2], "mdev") == 0) {
    S[0] = 0;
    for (long i = 0; i < N; i++) S[i + 1] = S[i] + x[i];
  }
  for (int k = 0; k < count; k++) {
    long m = atol(argv[3 + k]);
    double sum = 0; long n = 0;
    if (strcmp(argv[2], "oadev") == 0) {
      for (long i = 0; i + 2 * m < N; i++) { double d = x[i + 2 * m] - 2 * x[i + m] + x[i]; sum += d * d; n++; }
      dev[k] = sqrt(sum / (2.0 * m * m * n));
    } else if (strcmp(argv[2], "ohdev") == 0) {
      for (long i = 0; i + 3 * m < N; i++) { double d = x[i + 3 * m] - 3 * x[i + 2 * m] + 3 * x[i + m] - x[i]; sum += d * d; n++; }
      dev[k] = sqrt(sum / (6.0 * m * m * n));
    } else {
      for (long j = 0; j + 3 * m <= N; j++) {
        double inner = (S[j + 3 * m] - S[j + 2 * m]) - 2 * (S[j + 2 * m] - S[j + m]) + (S[j + m] - S[j]);
        sum += inner * inner; n++;
      }
      dev[k] = sqrt(sum / (2.0 * (double)m * m * m * m * n));
    }
  }
  double t1 = now();
  printf("%.6f", t1 - t0);
  for (int k = 0; k < count; k++) printf(" %.17g", dev[k]);
  printf("\n");
  return 0;
}
