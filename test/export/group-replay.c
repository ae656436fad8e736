/*
 * Replays two exported tables of one phase-locked group on their shared sample clock and measures
 * each one's phase at its own frequency from the stream, then B's lead over A in degrees.
 *
 * Built by test/export/group-replay.test.ts with -DWAVEPLAN_HEADER='"<prefix>.h"',
 * -DA=<lower_a> -DAU=<UPPER_A>, -DB=<lower_b> -DBU=<UPPER_B> and -DB_START=<samples> (the DMA
 * start offset of B when it plays A's table, else 0); linked with the exported <prefix>.c.
 *
 * The divider model counts system clocks as replay.c does (a first-order accumulator: periods of
 * I or I + 1 clocks). Sample s of a channel is held from the start of period s; its phase at f is
 * read by correlating the stream with sin and cos of 2·pi·f·t over whole passes of the table:
 * x = c + a·sin(2·pi·f·t + phi) gives sum x·cos / sum x·sin = tan(phi).
 */
#include <math.h>
#include <stdio.h>
#include <stdint.h>
#include WAVEPLAN_HEADER

#define CAT2(a, b) a##b
#define CAT(a, b) CAT2(a, b)
#define PASSES 64UL

static double phase_deg(const double *x, unsigned long n, unsigned long start, double freq_hz,
                        unsigned long div_int, unsigned long div_frac, unsigned frac_bits, double clock_hz)
{
    unsigned long long acc = 0, modulus = 1ULL << frac_bits, t = 0;
    unsigned long s;
    double sum_sin = 0.0, sum_cos = 0.0, mean = 0.0;
    for (s = 0; s < n; s++) mean += x[s];
    mean /= (double)n;
    for (s = 0; s < PASSES * n; s++) {
        /* The held sample starts at t; both channels share the clock, so the hold delays them alike. */
        double w = 2.0 * M_PI * freq_hz * ((double)t / clock_hz);
        double v = x[(s + start) % n] - mean;
        sum_sin += v * sin(w);
        sum_cos += v * cos(w);
        acc += div_frac;
        if (acc >= modulus) {
            acc -= modulus;
            t += div_int + 1;
        } else {
            t += div_int;
        }
    }
    return atan2(sum_cos, sum_sin) * 180.0 / M_PI;
}

static double a_values[1UL << 16], b_values[1UL << 16];

int main(void)
{
    unsigned long i, na = CAT(AU, _TABLE_LENGTH), nb = CAT(BU, _TABLE_LENGTH);
    double pa, pb, lead;
    for (i = 0; i < na; i++) a_values[i] = (double)CAT(A, _table)[i];
    for (i = 0; i < nb; i++) b_values[i] = (double)CAT(B, _table)[i];
    pa = phase_deg(a_values, na, 0, CAT(AU, _FREQUENCY_HZ), CAT(AU, _DIVIDER_INT), CAT(AU, _DIVIDER_FRAC), CAT(AU, _DIVIDER_FRAC_BITS), WAVEPLAN_CLOCK_HZ);
    pb = phase_deg(b_values, nb, B_START, CAT(BU, _FREQUENCY_HZ), CAT(BU, _DIVIDER_INT), CAT(BU, _DIVIDER_FRAC), CAT(BU, _DIVIDER_FRAC_BITS), WAVEPLAN_CLOCK_HZ);
    /* B's lead over A, measured at B's frequency: A's phase scales by the frequency ratio. */
    lead = pb - pa * (CAT(BU, _FREQUENCY_HZ) / CAT(AU, _FREQUENCY_HZ));
    lead = fmod(fmod(lead, 360.0) + 360.0, 360.0);
    printf("lead=%.6f a=%.6f b=%.6f\n", lead, pa, pb);
    return 0;
}
