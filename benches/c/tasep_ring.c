/* Plain C comparison loop (not part of the cargo build): multi-species TASEP on a ring of N sites,
 * random sequential update: each attempt picks a uniform bond (x, x+1 mod N) and, if the left
 * color is stronger (larger; 0 = hole), exchanges the two. Five species spread round the ring as in
 * the criterion bench. Generator: xoshiro256++ (Blackman and Vigna 2018); bond = (r >> 32) * N >> 32
 * (multiply-shift, common practice). Prints the median rate over the rounds in attempted moves per
 * second as "rate <value>". Build and run: benches/c/run.sh (gcc -O2). */
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

static void seed(uint64_t x) {
    for (int i = 0; i < 4; i++) {
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
    long n = argc > 1 ? atol(argv[1]) : 100000;
    long moves = argc > 2 ? atol(argv[2]) : 10000000;
    int rounds = argc > 3 ? atoi(argv[3]) : 15;
    uint32_t *site = malloc(sizeof(uint32_t) * n);
    double rates[256];
    uint64_t check = 0;
    if (rounds > 256) rounds = 256;
    seed(1);
    for (int r = 0; r < rounds; r++) {
        for (long i = 0; i < n; i++) site[i] = (uint32_t)((i * 7 + i / 13) % 5);
        double t0 = now();
        for (long m = 0; m < moves; m++) {
            uint64_t x = ((next() >> 32) * (uint64_t)n) >> 32;
            uint64_t y = x + 1 == (uint64_t)n ? 0 : x + 1;
            uint32_t a = site[x], b = site[y];
            if (a > b) { site[x] = b; site[y] = a; }
        }
        rates[r] = (double)moves / (now() - t0);
        check += site[0] + site[n / 2];
    }
    qsort(rates, rounds, sizeof(double), cmp);
    printf("check %llu\n", (unsigned long long)check);
    printf("rate %.4e\n", rates[rounds / 2]);
    free(site);
    return 0;
}
