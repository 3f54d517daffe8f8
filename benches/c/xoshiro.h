/* Shared by the plain C comparison loops: xoshiro256++ (Blackman and Vigna 2018) seeded by
 * splitmix64, doubles in [0, 1) from the top 53 bits (common practice), a monotonic clock and a
 * comparison for qsort. */
#ifndef MOTLEY_BENCH_XOSHIRO_H
#define MOTLEY_BENCH_XOSHIRO_H
#include <stdint.h>
#include <time.h>

static uint64_t s[4];

static inline uint64_t rotl(const uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }

static inline uint64_t next(void) {
    const uint64_t result = rotl(s[0] + s[3], 23) + s[0];
    const uint64_t t = s[1] << 17;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 45);
    return result;
}

static inline double uniform(void) { return (next() >> 11) * 0x1.0p-53; }

static void seed(uint64_t x) {
    for (int i = 0; i < 4; i++) { /* splitmix64 */
        x += 0x9E3779B97F4A7C15ULL;
        uint64_t z = x;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
        s[i] = z ^ (z >> 31);
    }
}

static double now(void) {
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return ts.tv_sec + 1e-9 * ts.tv_nsec;
}

static int cmp(const void *a, const void *b) {
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

#endif
