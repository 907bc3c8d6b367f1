/*
 * Hopper scale (invented scenario, see scenario.ts): convert converter codes to net weight with the
 * constants generated into hopper_scale.h by examples/hopper-scale.ts.
 *
 * Usage: hopper-scale CODE...   (without arguments: a few demonstration codes)
 * Prints one line per code: the code, the fixed-point net weight in 0.01 kg and in kg, and the
 * float32 result, or "out of range" (the evaluators are defined only inside the converter's range).
 */
#include <stdio.h>
#include <stdlib.h>
#include "hopper_scale.h"

static void show(long code)
{
    if (code < HOPPER_NET_WEIGHT_CODE_MIN || code > HOPPER_NET_WEIGHT_CODE_MAX) {
        printf("%ld out of range\n", code);
        return;
    }
    {
        const int32_t c = (int32_t)code;
        const int32_t centi = hopper_net_weight_fixed(c);
        const long whole = (long)(centi / 100);
        const long hundredths = labs((long)(centi % 100));
        printf("%ld %ld %s%ld.%02ld kg %.9g kg\n", code, (long)centi, (centi < 0 && whole == 0) ? "-" : "",
               whole, hundredths, (double)hopper_net_weight_f32(c));
    }
}

int main(int argc, char **argv)
{
    static const long demo[] = { 8421L, 8422L, 1082645L, 2157301L, -8388608L, 8388607L };
    int i;
    if (argc < 2) {
        for (i = 0; i < (int)(sizeof demo / sizeof demo[0]); i++) show(demo[i]);
        return 0;
    }
    for (i = 1; i < argc; i++) show(strtol(argv[i], NULL, 10));
    return 0;
}
