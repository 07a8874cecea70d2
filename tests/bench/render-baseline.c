/* Optimised C reference for the render kernel the benchmark compares against:
 * the same per-mode complex recursion, blocked the same way, compiled with -O3 -march=native.
 * G, the modes per group, is set at compile time (-DG=16); the benchmark builds 4, 8 and 16 and keeps the fastest.
 * Usage: render-baseline MODES SAMPLES  -> prints seconds and a checksum. */
#ifndef G
#define G 8
#endif
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#define BLOCK 1024

int main(int argc, char **argv) {
  int modes = argc > 1 ? atoi(argv[1]) : 1000;
  long samples = argc > 2 ? atol(argv[2]) : 1920000;
  double *re = malloc(sizeof(double) * modes), *im = malloc(sizeof(double) * modes);
  double *sr = malloc(sizeof(double) * modes), *si = malloc(sizeof(double) * modes);
  double *out = calloc(samples, sizeof(double));
  for (int m = 0; m < modes; m++) {
    double w = 2 * M_PI * 10.0 * (m + 1) / 96000.0, d = exp(-0.1 / 96000.0);
    re[m] = 1.0 / ((m + 1) * (m + 1)); im[m] = 0;
    sr[m] = d * cos(w); si[m] = d * sin(w);
  }
  struct timespec t0, t1;
  clock_gettime(CLOCK_MONOTONIC, &t0);
  for (long b = 0; b < samples; b += BLOCK) {
    long e = b + BLOCK < samples ? b + BLOCK : samples;
    for (int g = 0; g + G <= modes; g += G) {
      double r[G], i[G], a[G], c[G];
      for (int j = 0; j < G; j++) { r[j] = re[g + j]; i[j] = im[g + j]; a[j] = sr[g + j]; c[j] = si[g + j]; }
      for (long s = b; s < e; s++) {
        { double acc = 0; for (int j = 0; j < G; j++) acc += r[j]; out[s] += acc; }
        for (int j = 0; j < G; j++) {
          double t = r[j] * a[j] - i[j] * c[j];
          i[j] = r[j] * c[j] + i[j] * a[j];
          r[j] = t;
        }
      }
      for (int j = 0; j < G; j++) { re[g + j] = r[j]; im[g + j] = i[j]; }
    }
  }
  clock_gettime(CLOCK_MONOTONIC, &t1);
  double sum = 0;
  for (long s = 0; s < samples; s++) sum += out[s];
  printf("{\"seconds\": %.6f, \"checksum\": %.12g}\n", (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec), sum);
  return 0;
}
