/* Plain C comparison loop (not part of the cargo build): multi-species TASEP on a ring of N sites,
 * random sequential update, written the way a straightforward C program would be (the same style as
 * rainbow_sweep.c): each attempt draws one double uniform u, takes the bond x = (long)(u * N),
 * y = (x + 1) % N, and if the left color is stronger (larger; 0 = hole) exchanges the two with a
 * branch. Five species spread round the ring as in the criterion bench. Generator as in xoshiro.h.
 * Prints the median rate over the rounds in attempted moves per second as "rate <value>".
 * Build and run: benches/c/run.sh (gcc -O2). Built with -DTUNED it is the tuned loop instead: the
 * bond by multiply-shift on the top 32 bits, (r >> 32) * N >> 32 (common practice), and the wrap
 * by a compare instead of a division. */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

#include "xoshiro.h"

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
#ifdef TUNED
            long x = (long)(((next() >> 32) * (uint64_t)n) >> 32);
            long y = x + 1 == n ? 0 : x + 1;
#else
            long x = (long)(uniform() * n);
            long y = (x + 1) % n;
#endif
            if (site[x] > site[y]) {
                uint32_t a = site[x];
                site[x] = site[y];
                site[y] = a;
            }
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
