/* Plain C comparison loop (not part of the cargo build): the colored stochastic six-vertex model,
 * rainbow boundary (row y enters from the left with color y, nothing from below), W x H rectangle,
 * swept row by row with one double uniform per vertex, written the way a straightforward C program
 * would be (branches on the colors and on the uniform). Generator: xoshiro256++ (Blackman and
 * Vigna 2018) turned into a double in [0, 1) by the top 53 bits (common practice).
 * Prints the median rate over the rounds, in vertices per second, as "rate <value>".
 * Build and run: benches/c/run.sh (gcc -O2). */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
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

int main(int argc, char **argv) {
    int w = argc > 1 ? atoi(argv[1]) : 2000;
    int h = argc > 2 ? atoi(argv[2]) : 2000;
    int rounds = argc > 3 ? atoi(argv[3]) : 15;
    double b1 = 0.3, b2 = 0.6;
    uint32_t *vert = malloc(sizeof(uint32_t) * w);
    double rates[256];
    uint64_t check = 0;
    if (rounds > 256) rounds = 256;
    seed(1);
    for (int r = 0; r < rounds; r++) {
        double t0 = now();
        for (int x = 0; x < w; x++) vert[x] = 0;
        for (int y = 1; y <= h; y++) {
            uint32_t carry = (uint32_t)y;
            for (int x = 0; x < w; x++) {
                uint32_t i = vert[x], j = carry;
                if (i != j) {
                    double u = uniform();
                    if (i > j) {
                        if (u >= b1) { vert[x] = j; carry = i; }
                    } else {
                        if (u >= b2) { vert[x] = j; carry = i; }
                    }
                }
            }
            check += carry;
        }
        rates[r] = (double)w * h / (now() - t0);
    }
    qsort(rates, rounds, sizeof(double), cmp);
    printf("check %llu\n", (unsigned long long)check);
    printf("rate %.4e\n", rates[rounds / 2]);
    free(vert);
    return 0;
}
