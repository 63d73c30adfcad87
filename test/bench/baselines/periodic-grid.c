/* Baseline for `npm run bench -- relativity`: the periodic correction on a uniform grid, the plain way
 * (Newton's method from M per epoch, sin/cos from libm). Usage: periodic-grid a e M0 h count
 * Prints the elapsed seconds and a checksum so the loop is not optimised away. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

int main(int argc, char **argv) {
  if (argc != 6) return 2;
  double a = atof(argv[1]), e = atof(argv[2]), M0 = atof(argv[3]), h = atof(argv[4]);
  long count = atol(argv[5]);
  const double gm = 3.986004418e14, c = 299792458.0;
  double F = -2.0 * sqrt(gm) / (c * c), n = sqrt(gm / (a * a * a)), amp = F * e * sqrt(a);
  double *out = malloc(sizeof(double) * (size_t)count);
  for (long k = 0; k < count; k++) out[k] = 0; /* touch the pages before timing, as the JS side reuses its array */
  struct timespec t0, t1;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t0);
  for (long k = 0; k < count; k++) {
    double M = fmod(M0 + n * (double)k * h, 2.0 * M_PI);
    double E = M + e * sin(M);
    for (int it = 0; it < 50; it++) {
      double d = (E - e * sin(E) - M) / (1.0 - e * cos(E));
      E -= d;
      if (fabs(d) < 1e-15) break;
    }
    out[k] = amp * sin(E);
  }
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t1);
  double sum = 0;
  for (long k = 0; k < count; k++) sum += out[k];
  printf("%.6f %.17g\n", (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec), sum);
  free(out);
  return 0;
}
