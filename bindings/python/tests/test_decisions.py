"""Doses, blends and frames."""

import json
import subprocess

import numpy as np
import pytest

import travertine
from conftest import program

REL = 1e-12


def test_dose_equals_the_program(cli):
    expected = cli("dose", "--temperature", "16", "--salinity", "0.2", "--alkalinity", "40 mg/L CaCO3",
                   "--ph", "6.8", "--calcium", "20 mg/L Ca", "--chemical", "sodium-bicarbonate",
                   "--target", "alkalinity=80 mg/L CaCO3", "--volume", "1500 m3", "--json")
    got = travertine.dose(temperature_c=16, salinity=0.2, alkalinity_mg_l_caco3=[40.0, 90.0], ph_nbs=6.8,
                          calcium_mg_l=20, volume_m3=1500, chemical="sodium-bicarbonate",
                          target="alkalinity=80 mg/L CaCO3")
    assert abs(got["dose_g_m3"][0] - expected["dose_g_m3"]) <= REL * expected["dose_g_m3"]
    assert abs(got["dose_total_kg"][0] - expected["dose_total_kg"]) <= REL * expected["dose_total_kg"]
    # Already beyond the target: no dose, a note, and the row is still solved.
    assert np.isnan(got["dose_g_m3"][1]) and "already 90.0 mg/L as CaCO3, above the target" in got["message"][1]
    assert got["status"][1] != "error"
    same = travertine.dose(temperature_c=16, salinity=0.2, alkalinity_mg_l_caco3=40.0, ph_nbs=6.8,
                           calcium_mg_l=20, chemical="sodium-bicarbonate", target=("alkalinity", "80 mg/L CaCO3"))
    assert same["dose_g_m3"][()] == got["dose_g_m3"][0]


def test_blend_equals_the_program(tmp_path, cli):
    river = ["--temperature", "12", "--salinity", "0.2", "--alkalinity", "1500 umol/kg", "--dic", "1600 umol/kg"]
    sea = ["--temperature", "18", "--salinity", "34", "--alkalinity", "2300 umol/kg", "--dic", "2050 umol/kg"]
    paths = []
    for name, flags in (("river", river), ("sea", sea)):
        p = tmp_path / f"{name}.json"
        p.write_text(json.dumps(cli("solve", *flags, "--json")))
        paths.append(str(p))
    expected = cli("blend", *paths, "--fraction-first", "0.3", "--json")
    first = travertine.solve(temperature_c=[12.0, 12.0], salinity=0.2, alkalinity_umol_kg=1500, dic_umol_kg=1600)
    second = travertine.solve(temperature_c=[18.0, 18.0], salinity=34, alkalinity_umol_kg=2300, dic_umol_kg=2050)
    got = travertine.blend(first, second, [0.3, 1.5])
    assert got["status"][0] != "error" and got["status"][1] == "error"
    for key in ("alkalinity_umol_kg", "dic_umol_kg", "salinity", "temperature_c", "ph_total", "pco2_uatm"):
        e, g = expected[key], got[key][0]
        assert abs(g - e) <= 1e-9 * abs(e), f"{key}: {g} != {e}"
    assert got["water"][0] == expected["water"]
    with pytest.raises(travertine.TravertineError):
        travertine.blend(first, second, [0.3, 1.5], errors="raise")


def test_solve_frame_pandas():
    pd = pytest.importorskip("pandas")
    df = pd.DataFrame({
        "pond": ["north", "south", "east"],
        "temperature_c": [24.5, 25.1, 23.0],
        "specific_conductance_us_cm": [410.0, 395.0, 380.0],
        "ph_nbs": [7.9, np.nan, 15.0],
        "alkalinity_mg_l_caco3": [118.0, 102.0, 100.0],
    }, index=[10, 11, 12])
    # A text column with pandas' own missing value: not given in that row.
    df["water"] = pd.array(["fresh", None, "fresh"], dtype="string")
    out = travertine.solve_frame(df, columns=["ph_nbs", "pco2_uatm"])
    assert list(out.columns[:6]) == list(df.columns)
    assert list(out.index) == [10, 11, 12]
    assert "ph_nbs_calculated" in out.columns and "pco2_uatm" in out.columns
    assert list(out["status"]) == ["ok", "error", "error"]
    one = travertine.solve(temperature_c=24.5, specific_conductance_us_cm=410.0, ph_nbs=7.9,
                           alkalinity_mg_l_caco3=118.0, columns=["pco2_uatm"])
    assert out["pco2_uatm"].iloc[0] == one["pco2_uatm"][()]
    # The result dict makes a DataFrame as it is.
    assert len(pd.DataFrame(travertine.solve(temperature_c=df["temperature_c"].to_numpy(),
                                             specific_conductance_us_cm=400.0, ph_nbs=7.9,
                                             alkalinity_mg_l_caco3=110.0))) == 3


def test_solve_frame_polars():
    pl = pytest.importorskip("polars")
    df = pl.DataFrame({"site": ["a", "b"], "temperature_c": [20.0, 21.0], "salinity": [35.0, 34.0],
                       "alkalinity_umol_kg": [2300.0, 2250.0], "ph_total": [8.05, 8.0]})
    out = travertine.solve_frame(df, columns=["pco2_uatm", "water"])
    assert isinstance(out, pl.DataFrame)
    assert out.columns[:5] == df.columns
    assert out["water"].to_list() == ["saline", "saline"]
    one = travertine.solve(temperature_c=21.0, salinity=34.0, alkalinity_umol_kg=2250.0, ph_total=8.0,
                           columns=["pco2_uatm"])
    assert out["pco2_uatm"][1] == one["pco2_uatm"][()]
    assert len(pl.DataFrame(travertine.solve(temperature_c=[20.0, 21.0], salinity=35, alkalinity_umol_kg=2300,
                                             ph_total=8.0, columns=["pco2_uatm"]))) == 2
