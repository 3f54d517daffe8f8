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

#include "xoshiro.h"

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
