/*
 * larkvane.c: travertine from C, on invented samples of the invented
 * Larkvane Fish Farm: Alder pond at dawn (fresh water, alkalinity in mg/L
 * as CaCO3, pH on the NBS scale) and the farm's sea-water holding tank
 * (saline, alkalinity in umol/kg, pH on the total scale), then the tank's
 * pH without its scale, which travertine refuses in saline water. The
 * tank's pH and alkalinity are given with their standard uncertainties
 * (as `travertine solve --uncertainty ph=0.01 --uncertainty
 * alkalinity=2umol/kg`), and the pCO2 is printed with its own.
 *
 * Build it against the static library (from the repository's root):
 *
 *   cargo build --release -p travertine-c
 *   cc -std=c99 -Ibindings/c bindings/c/examples/larkvane.c \
 *      target/release/libtravertine_c.a -lpthread -ldl -lm -o larkvane
 *   ./larkvane            (readable)
 *   ./larkvane --all-digits  (every digit, as bindings/c/tests/example.rs reads it)
 */
#include <stdio.h>
#include <string.h>
#include <math.h>

#include "travertine.h"

/* An input or an option of a sample, by the names of the sheet's columns. */
struct input {
    const char *name;
    double value;       /* for an input that takes a number */
    const char *choice; /* for an option: NULL for a number */
};

static int all_digits = 0;

static void show(const char *what, const char *name, double value)
{
    if (isnan(value))
        printf("  %-6s %-28s none\n", what, name);
    else if (all_digits)
        printf("  %-6s %-28s %.17g\n", what, name, value);
    else
        printf("  %-6s %-28s %.4g\n", what, name, value);
}

/* Fills a sample, asks for the standard uncertainties of `settings`
 * (NAME=VALUE texts, `m` of them), solves it and prints its inputs, some
 * outputs, the standard uncertainty of the pCO2 where uncertainties were
 * asked for, and its warnings, or its error. Returns 0 when it solved. */
static int run(const char *title, const struct input *inputs, size_t n,
               const char *const *settings, size_t m)
{
    static const char *outputs[] = {
        "ph_nbs", "ph_total", "alkalinity_umol_kg", "dic_umol_kg",
        "pco2_uatm", "free_co2_mg_l", "omega_calcite", "omega_aragonite",
        "langelier_index", "revelle_factor", "nh3_mg_l_n",
        "co2_flux_mmol_m2_d",
    };
    trv_sample *sample = trv_sample_new();
    trv_error *error = NULL;
    trv_state *state;
    size_t i;
    int status;

    printf("sample %s\n", title);
    if (sample == NULL)
        return 1;
    for (i = 0; i < n; i++) {
        if (inputs[i].choice != NULL) {
            status = trv_sample_option(sample, inputs[i].name, inputs[i].choice);
            printf("  option %-28s %s\n", inputs[i].name, inputs[i].choice);
        } else {
            status = trv_sample_set(sample, inputs[i].name, inputs[i].value);
            show("input", inputs[i].name, inputs[i].value);
        }
        if (status != TRV_OK) {
            printf("  input %s refused with code %d\n", inputs[i].name, status);
            trv_sample_free(sample);
            return 1;
        }
    }

    for (i = 0; i < m; i++) {
        status = trv_sample_uncertainty(sample, settings[i]);
        printf("  uncertainty %s\n", settings[i]);
        if (status != TRV_OK) {
            printf("  uncertainty %s refused with code %d\n", settings[i], status);
            trv_sample_free(sample);
            return 1;
        }
    }

    state = trv_solve(sample, &error);
    trv_sample_free(sample);
    if (state == NULL) {
        printf("  error  %d %s\n", trv_error_code(error), trv_error_message(error));
        trv_error_free(error);
        return 1;
    }
    for (i = 0; i < sizeof outputs / sizeof outputs[0]; i++)
        show("output", outputs[i], trv_state_get(state, outputs[i]));
    /* The standard uncertainty of the pCO2 (NaN without uncertainties). */
    if (m > 0)
        show("u", "pco2_uatm", trv_state_uncertainty(state, "pco2_uatm"));
    for (i = 0; i < trv_state_warning_count(state); i++)
        printf("  warning %s\n", trv_state_warning_code(state, i));
    trv_state_free(state);
    return 0;
}

int main(int argc, char **argv)
{
    /* Alder pond at dawn, from the farm's field sheet (invented). */
    static const struct input alder[] = {
        {"water", 0, "fresh"},
        {"temperature_c", 24.3, NULL},
        {"specific_conductance_us_cm", 415, NULL},
        {"ph_nbs", 7.52, NULL},
        {"alkalinity_mg_l_caco3", 117, NULL},
        {"calcium_hardness_mg_l_caco3", 83, NULL},
        {"ammonia_mg_l_n", 0.41, NULL},
        {"wind_m_s", 2.5, NULL},
    };
    /* The sea-water holding tank (invented). */
    static const struct input tank[] = {
        {"temperature_c", 14.2, NULL},
        {"salinity", 33.8, NULL},
        {"alkalinity_umol_kg", 2231, NULL},
        {"ph_total", 7.96, NULL},
        {"carbonic", 0, "lueker2000"},
    };
    /* The tank's pH meter and titration, to one standard uncertainty. */
    static const char *const tank_u[] = {"ph=0.01", "alkalinity=2umol/kg"};
    /* The same tank with a pH that names no scale. */
    static const struct input unscaled[] = {
        {"temperature_c", 14.2, NULL},
        {"salinity", 33.8, NULL},
        {"alkalinity_umol_kg", 2231, NULL},
        {"ph", 7.96, NULL},
    };
    int failed = 0;

    all_digits = argc > 1 && strcmp(argv[1], "--all-digits") == 0;
    failed += run("Alder pond, dawn", alder, sizeof alder / sizeof alder[0],
                  NULL, 0);
    failed += run("holding tank", tank, sizeof tank / sizeof tank[0],
                  tank_u, sizeof tank_u / sizeof tank_u[0]);
    /* This one is meant to fail: the error names the choice to make. */
    if (run("holding tank, pH without its scale", unscaled,
            sizeof unscaled / sizeof unscaled[0], NULL, 0) == 0)
        failed += 1;
    return failed == 0 ? 0 : 1;
}
