/*
 * Replays every exported table through a model of the sample clock and measures what comes out.
 *
 * Built by test/export/replay.test.ts with
 *   -DWAVEPLAN_HEADER='"<prefix>.h"' -DWAVEPLAN_OUTPUTS=<PREFIX>_OUTPUTS -DWAVEPLAN_CLOCK_HZ=<PREFIX>_SYSTEM_CLOCK_HZ
 * and linked with the exported <prefix>.c. It uses only what the header declares.
 *
 * The divider model counts system clocks: a first-order accumulator adds F every sample period
 * and, when it reaches 2^k, wraps and makes that period I + 1 clocks instead of I (docs/DESIGN.md,
 * "Divider jitter"). The stream plays table[s mod N] from the start of period s (zero-order hold).
 *
 * The frequency is measured from the stream: rising crossings of the table's mid level, counted
 * from the first one to the crossing at the same table index a whole number of passes later,
 * divided by the system clocks between them. One line per output:
 *   name=<lower> hz=<measured> crossings=<count> passes=<P> wrap=<table[0]-table[N-1]> sum=<sum of codes> n=<N>
 * With -DWAVEPLAN_RING (DMA ring tables) a second line per output: name=<lower> misalign=<address mod size>.
 */
#include <stdio.h>
#include <stdint.h>
#include WAVEPLAN_HEADER

#define MAX_TABLE 65536UL
/* Samples streamed per output, at least: long enough that one system clock is ~1e-9 of the run. */
#define MIN_STREAM (1UL << 21)

static double values[MAX_TABLE];

static unsigned long long gcd_ull(unsigned long long a, unsigned long long b)
{
    while (b != 0) {
        unsigned long long r = a % b;
        a = b;
        b = r;
    }
    return a;
}

static int replay(const char *name, unsigned long n, unsigned long div_int, unsigned long div_frac, unsigned frac_bits)
{
    unsigned long i, s, passes, step, total, crossings = 0, first_index = 0, first_pass = 0;
    unsigned long long pattern;
    unsigned long long acc = 0, modulus = 1ULL << frac_bits, t = 0, first_t = 0, end_t = 0;
    double lo = values[0], hi = values[0], mid, sum = 0.0;
    int started = 0, ended = 0;

    if (n == 0 || n > MAX_TABLE) {
        printf("name=%s error=table-length\n", name);
        return 1;
    }
    for (i = 0; i < n; i++) {
        if (values[i] < lo) lo = values[i];
        if (values[i] > hi) hi = values[i];
        sum += values[i];
    }
    mid = (lo + hi) / 2.0;
    /* The divider's period pattern repeats every 2^k / gcd(F, 2^k) periods; measuring over a
       whole number of patterns makes the elapsed clocks exactly passes * N * D. */
    pattern = div_frac == 0 ? 1 : modulus / gcd_ull(div_frac, modulus);
    step = (unsigned long)(pattern / gcd_ull(pattern, n));
    passes = ((MIN_STREAM + n - 1) / n + step - 1) / step * step;
    total = (passes + 2 * step) * n;
    for (s = 0; s < total && !ended; s++) {
        unsigned long idx = s % n;
        unsigned long prev = (idx + n - 1) % n;
        int rising = s > 0 && values[prev] < mid && values[idx] >= mid;
        if (rising) {
            if (!started) {
                started = 1;
                first_index = idx;
                first_pass = s / n;
                first_t = t;
            } else if (idx == first_index && s / n - first_pass == passes) {
                end_t = t;
                ended = 1;
                break;
            }
            crossings++;
        }
        acc += div_frac;
        if (acc >= modulus) {
            acc -= modulus;
            t += div_int + 1;
        } else {
            t += div_int;
        }
    }
    if (!ended || end_t == first_t) {
        printf("name=%s error=no-crossings\n", name);
        return 1;
    }
    printf("name=%s hz=%.12e crossings=%lu passes=%lu wrap=%ld sum=%.0f n=%lu\n", name,
           (double)crossings * (double)WAVEPLAN_CLOCK_HZ / (double)(end_t - first_t), crossings,
           passes, (long)values[0] - (long)values[n - 1], sum, n);
    return 0;
}

#ifdef WAVEPLAN_RING
#define RING_CHECK(lower, UPPER) \
    printf("name=%s misalign=%lu\n", #lower, (unsigned long)((uintptr_t)lower##_table % (uintptr_t)(UPPER##_TABLE_ALIGN)));
#else
#define RING_CHECK(lower, UPPER)
#endif

/* The divider the hardware divides by; a build for counter stages passes one computed from the
   stage registers the way the clock file says each register holds its value. */
#ifndef WAVEPLAN_DIVIDER
#define WAVEPLAN_DIVIDER(UPPER) (UPPER##_DIVIDER_INT)
#endif

#define REPLAY(lower, UPPER)                                                                  \
    for (i = 0; i < (unsigned long)(UPPER##_TABLE_LENGTH) && i < MAX_TABLE; i++)              \
        values[i] = (double)lower##_table[i];                                                 \
    failures += replay(#lower, (unsigned long)(UPPER##_TABLE_LENGTH),                         \
                       (unsigned long)WAVEPLAN_DIVIDER(UPPER), (unsigned long)(UPPER##_DIVIDER_FRAC), \
                       (unsigned)(UPPER##_DIVIDER_FRAC_BITS));                             \
    RING_CHECK(lower, UPPER)

int main(void)
{
    unsigned long i;
    int failures = 0;
    WAVEPLAN_OUTPUTS(REPLAY)
    return failures == 0 ? 0 : 1;
}
