/*
 * Plain C reference of the spin-ice single-spin-flip Metropolis loop of packages/physics/src/montecarlo/
 * metropolisSweep.ts (dense pair matrix, local fields updated by one matrix row per accepted flip), for the speed
 * comparison in bench/spinice.bench.ts. Same generator as physics/random (xoshiro128**, Blackman & Vigna 2018),
 * started from the state the benchmark passes, so both programs make the same moves.
 *
 * Input file (little-endian): int32 N, int32 sweeps, double beta, uint32 state[4], int8 spins[N],
 * double fields[N], double J[N*N]. Output: one line "attempts seconds accepted energyChange".
 * Build: gcc -O2 -o spinice_metropolis spinice_metropolis.c -lm
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

static uint32_t s0, s1, s2, s3;
static inline uint32_t rotl(uint32_t x, int k) { return (x << k) | (x >> (32 - k)); }
static inline uint32_t next_u32(void) {
  uint32_t result = rotl(s1 * 5u, 7) * 9u;
  uint32_t t = s1 << 9;
  s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = rotl(s3, 11);
  return result;
}

int main(int argc, char **argv) {
  if (argc < 2) { fprintf(stderr, "usage: %s input.bin\n", argv[0]); return 2; }
  FILE *f = fopen(argv[1], "rb");
  if (!f) { perror("open"); return 2; }
  int32_t N, sweeps; double beta; uint32_t st[4];
  if (fread(&N, 4, 1, f) != 1 || fread(&sweeps, 4, 1, f) != 1 || fread(&beta, 8, 1, f) != 1 || fread(st, 4, 4, f) != 4) return 2;
  int8_t *s = malloc(N); double *F = malloc(sizeof(double) * N); double *J = malloc(sizeof(double) * (size_t)N * N);
  if (fread(s, 1, N, f) != (size_t)N || fread(F, 8, N, f) != (size_t)N || fread(J, 8, (size_t)N * N, f) != (size_t)N * N) return 2;
  fclose(f);
  s0 = st[0]; s1 = st[1]; s2 = st[2]; s3 = st[3];
  struct timespec a, b;
  clock_gettime(CLOCK_MONOTONIC, &a);
  long accepted = 0; double dEsum = 0;
  for (int sw = 0; sw < sweeps; sw++) {
    for (int n = 0; n < N; n++) {
      int i = (int)floor((next_u32() / 4294967296.0) * N);
      int si = s[i];
      double dE = -2.0 * si * F[i];
      if (dE <= 0 || next_u32() / 4294967296.0 < exp(-beta * dE)) {
        s[i] = (int8_t)-si;
        double twoS = -2.0 * si;
        const double *row = J + (size_t)i * N;
        for (int j = 0; j < N; j++) F[j] += twoS * row[j];
        dEsum += dE; accepted++;
      }
    }
  }
  clock_gettime(CLOCK_MONOTONIC, &b);
  double sec = (b.tv_sec - a.tv_sec) + 1e-9 * (b.tv_nsec - a.tv_nsec);
  printf("%ld %.6f %ld %.10g\n", (long)sweeps * N, sec, accepted, dEsum);
  return 0;
}
