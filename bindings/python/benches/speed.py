"""The binding beside the library's own loop, in one run (issue 15).

    python bindings/python/benches/speed.py [ROWS]

Times, on the same generated rows and the same rayon pool:
- the library's own loop over saline rows (alkalinity and pH, total scale):
  `travertine._native.library_loop`, Rust from end to end (Water::saline,
  solve), with and without the exchange with the air that `solve --json`
  and `travertine.solve` include;
- `travertine.solve` on the same rows, every output (the default) and with
  the exchange's keys left out;
- `travertine.solve` on fresh rows with calcium (alkalinity as CaCO3, pH NBS,
  specific conductance, calcium);
and prints the ratios the issue bounds: saline call / library loop (at most
1.5) and fresh call / saline call (at most 2), with the library's own fresh
loop beside its saline one (the fresh state itself costs more: the activity
fixed point, the saturation pH of the Langelier index, the equilibrium with
the air). Each time is the best of three runs; the six calls take turns, round
after round, so that a change in the machine's load falls on all of them. The
rows are generated (invented values in natural ranges).
"""

import sys
import time

import numpy as np

import travertine
from travertine import _native

N = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
rng = np.random.default_rng(15)
t = rng.uniform(10.0, 30.0, N)
s = rng.uniform(30.0, 35.0, N)
alk = rng.uniform(2100.0, 2400.0, N)
ph = rng.uniform(7.8, 8.2, N)
fresh_t = rng.uniform(5.0, 30.0, N)
spc = rng.uniform(150.0, 600.0, N)
alk_mg = rng.uniform(40.0, 160.0, N)
ph_nbs = rng.uniform(7.0, 8.6, N)
ca = rng.uniform(10.0, 80.0, N)

EXCHANGE = ("air_pco2_uatm", "co2_saturation_ratio", "equilibrium_ph", "equilibrium_ph_scale",
            "equilibrium_free_co2_mg_l", "schmidt_number", "gas_transfer", "k600_cm_h", "k_cm_h",
            "co2_flux_mmol_m2_d")
EVERY = [k for k in travertine.output_keys() if k != "precipitation_potential_mg_l_caco3"]
NO_EXCHANGE = [k for k in EVERY if k not in EXCHANGE]
TEXT = ("water", "ionic_strength_from", "carbonic_fit", "equilibrium_ph_scale", "gas_transfer")


def best(*calls, runs=3):
    """The best time of each call and its result. The calls take turns
    (runs rounds, each running every call once), so that a change in the
    machine's load during the benchmark weighs on all of them alike rather
    than on whichever ran then. The time is the call's: freeing the result of
    the round before falls outside it."""
    times = [[] for _ in calls]
    outs = [None] * len(calls)
    for _ in range(runs):
        for i, f in enumerate(calls):
            t0 = time.perf_counter()
            out = f()
            times[i].append(time.perf_counter() - t0)
            # The result of the round before is freed here, after the clock.
            outs[i] = out
    return [(min(t), o) for t, o in zip(times, outs)]


def numeric(keys):
    return [k for k in keys if k not in TEXT]


(lib_x, l_x), (saline, r), (lib, l_nx), (saline_nx, r_nx), (lib_fresh, lf), (fresh, rf) = best(
    lambda: _native.library_loop(t, s, alk, ph, numeric(EVERY), exchange=True),
    lambda: travertine.solve(temperature_c=t, salinity=s, alkalinity_umol_kg=alk, ph_total=ph),
    lambda: _native.library_loop(t, s, alk, ph, numeric(NO_EXCHANGE)),
    lambda: travertine.solve(temperature_c=t, salinity=s, alkalinity_umol_kg=alk, ph_total=ph,
                             columns=NO_EXCHANGE + ["flags"]),
    lambda: _native.library_loop_fresh(fresh_t, spc, alk_mg, ph_nbs, ca, numeric(EVERY)),
    lambda: travertine.solve(temperature_c=fresh_t, specific_conductance_us_cm=spc,
                             alkalinity_mg_l_caco3=alk_mg, ph_nbs=ph_nbs, calcium_mg_l=ca),
)
for k in numeric(EVERY):
    assert np.array_equal(r[k], l_x[k], equal_nan=True), f"{k}: the binding and the library loop disagree"
assert (r["status"] != "error").all() and (rf["status"] != "error").all()

print(f"rows: {N}; keys per row: {len(r)} (every output of solve --json but the precipitation potential, flags, status, message)")
print(f"library loop, saline, solve + exchange, every output    {lib_x:7.3f} s  {N / lib_x:10.0f} rows/s")
print(f"travertine.solve, saline, every output (the default)     {saline:7.3f} s  {N / saline:10.0f} rows/s")
print(f"library loop, saline, solve, outputs but the exchange's  {lib:7.3f} s  {N / lib:10.0f} rows/s")
print(f"travertine.solve, saline, outputs but the exchange's     {saline_nx:7.3f} s  {N / saline_nx:10.0f} rows/s")
print(f"travertine.solve, fresh with calcium, every output       {fresh:7.3f} s  {N / fresh:10.0f} rows/s")
print(f"library loop, fresh with calcium, every output          {lib_fresh:7.3f} s  {N / lib_fresh:10.0f} rows/s")
print(f"ratio saline call / library loop, every output           {saline / lib_x:5.2f}  (bound 1.5)")
print(f"ratio saline call / library loop, no exchange            {saline_nx / lib:5.2f}  (bound 1.5)")
print(f"ratio fresh call / saline call                           {fresh / saline:5.2f}  (bound 2)")
print(f"ratio fresh library loop / saline library loop           {lib_fresh / lib_x:5.2f}  (the library's own)")
print(f"ratio fresh call / fresh library loop                    {fresh / lib_fresh:5.2f}")
