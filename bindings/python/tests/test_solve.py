"""travertine.solve against `travertine solve --json`, and its shapes and errors."""

import itertools
import math

import numpy as np
import pytest

import travertine

# One tolerance for a number computed twice by the same library through two
# front ends (the program and the binding): 1e-12 relative.
REL = 1e-12

GASES = {"pco2", "fco2", "xco2", "co2"}
PARAMETERS = ["alkalinity", "dic", "ph", "pco2", "fco2", "xco2", "co2", "hco3", "co3"]

# Invented waters (demo values, not data): a sea water of salinity 35 and a
# pond of salinity 0.2 with calcium.
MEDIA = {
    "saline": {
        "conditions": {"temperature_c": 18.5, "salinity": 35.0},
        "flags": ["--temperature", "18.5", "--salinity", "35", "--ph-scale", "total"],
        "base": {"alkalinity_umol_kg": 2300.0, "dic_umol_kg": 2050.0},
        "ph_key": "ph_total",
    },
    "fresh": {
        "conditions": {"temperature_c": 14.0, "salinity": 0.2, "calcium_mg_l": 40.0},
        "flags": ["--temperature", "14", "--salinity", "0.2", "--calcium", "40 mg/L Ca"],
        "base": {"alkalinity_umol_kg": 1800.0, "dic_umol_kg": 1850.0},
        "ph_key": "ph_nbs",
    },
}


def keyword_and_flag(p: str, state: dict, ph_key: str):
    """The binding's keyword, the value, and the program's flag for parameter p of a state."""
    if p == "ph":
        return ph_key, state[ph_key], ["--ph", repr(state[ph_key])]
    key = {"pco2": "pco2_uatm", "fco2": "fco2_uatm", "xco2": "xco2_ppm"}.get(p, f"{p}_umol_kg")
    unit = {"pco2_uatm": "uatm", "fco2_uatm": "uatm", "xco2_ppm": "ppm"}.get(key, "umol/kg")
    value = state[key]
    return key, value, [f"--{p}", f"{value!r} {unit}"]


def close(a, b) -> bool:
    if a is None or (isinstance(a, float) and math.isnan(a)):
        return b is None or (isinstance(b, float) and math.isnan(b))
    if b is None:
        return False
    return abs(a - b) <= REL * max(abs(a), abs(b)) or abs(a - b) < 1e-300


def pairs():
    for a, b in itertools.combinations(PARAMETERS, 2):
        if a in GASES and b in GASES:
            continue
        yield a, b


@pytest.mark.parametrize("medium", sorted(MEDIA))
def test_every_pair_equals_the_program(cli, medium):
    m = MEDIA[medium]
    base = cli("solve", *m["flags"], "--alkalinity", f"{m['base']['alkalinity_umol_kg']} umol/kg",
               "--dic", f"{m['base']['dic_umol_kg']} umol/kg", "--json")
    assert base["water"] == medium
    checked = 0
    for a, b in pairs():
        ka, va, fa = keyword_and_flag(a, base, m["ph_key"])
        kb, vb, fb = keyword_and_flag(b, base, m["ph_key"])
        expected = cli("solve", *m["flags"], *fa, *fb, "--json")
        got = travertine.solve(**m["conditions"], **{ka: va, kb: vb})
        assert got["status"][()] != "error", f"{a},{b}: {got['message'][()]}"
        for key, value in expected.items():
            if key not in got or key == "precipitation_potential_mg_l_caco3":
                continue
            g = got[key][()]
            if key == "flags":
                assert g == ";".join(f["code"] for f in value), f"{medium} {a},{b} flags"
            elif isinstance(value, (list, dict)):
                continue
            elif value is None:
                assert g is None or np.isnan(g), f"{medium} {a},{b} {key}: {g!r} != None"
            elif isinstance(value, str) or isinstance(g, str):
                assert g == value, f"{medium} {a},{b} {key}: {g!r} != {value!r}"
            else:
                assert close(value, float(g)), f"{medium} {a},{b} {key}: {g!r} != {value!r}"
                checked += 1
    assert checked > 500


def test_every_json_key_is_a_result_key():
    r = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8.0)
    for key in travertine.output_keys():
        if key != "precipitation_potential_mg_l_caco3":
            assert key in r, key
    assert "precipitation_potential_mg_l_caco3" not in r
    assert {"flags", "status", "message"} <= set(r)
    # Asked for by name, the costly one is there.
    r = travertine.solve(temperature_c=20, salinity=0.2, calcium_mg_l=40, alkalinity_umol_kg=2000,
                         ph_nbs=8.3, columns=["precipitation_potential_mg_l_caco3"])
    assert np.isfinite(r["precipitation_potential_mg_l_caco3"])


def test_broadcasting_like_numpy():
    t = np.array([[5.0], [15.0], [25.0]])
    ph = np.array([7.9, 8.0, 8.1, 8.2])
    r = travertine.solve(temperature_c=t, salinity=35, alkalinity_umol_kg=2300.0, ph_total=ph)
    assert r["pco2_uatm"].shape == (3, 4)
    assert r["status"].shape == (3, 4)
    for i in range(3):
        for j in range(4):
            one = travertine.solve(temperature_c=t[i, 0], salinity=35, alkalinity_umol_kg=2300.0, ph_total=ph[j])
            assert r["pco2_uatm"][i, j] == one["pco2_uatm"][()]
    with pytest.raises(ValueError):
        travertine.solve(temperature_c=[1.0, 2.0], salinity=[30.0, 31.0, 32.0], alkalinity_umol_kg=2300, ph_total=8)


def test_names_broadcast_too():
    r = travertine.solve(temperature_c=15, salinity=[0.3, 3.0], water=["fresh", "saline"],
                         alkalinity_umol_kg=1500, dic_umol_kg=1450)
    assert list(r["water"]) == ["fresh", "saline"]
    r = travertine.solve(temperature_c=15, salinity=3.0, water="fresh", carbonic="lueker2000",
                         alkalinity_umol_kg=1500, dic_umol_kg=1450)
    assert r["status"][()] == "error" and "saline" in r["message"][()]


def test_error_rows_stay_in_place():
    ph = np.array([8.0, 15.0, np.nan, 8.1])
    r = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=ph)
    assert list(r["status"]) == ["ok", "error", "error", "ok"]
    assert "outside the accepted range" in r["message"][1]
    assert "only alkalinity" in r["message"][2]  # NaN: not measured, so no pair
    assert np.isnan(r["pco2_uatm"][1]) and np.isnan(r["pco2_uatm"][2])
    assert r["water"][1] is None
    for i in (0, 3):
        one = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=ph[i])
        assert r["pco2_uatm"][i] == one["pco2_uatm"][()]


def test_errors_raise_carries_code_and_field():
    with pytest.raises(travertine.TravertineError) as e:
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300,
                         ph_total=[8.0, 8.1, 15.0, 16.0], errors="raise")
    assert (e.value.code, e.value.field, e.value.row) == ("out_of_range", "ph", 2)
    with pytest.raises(travertine.TravertineError) as e:
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph=8.0, errors="raise")
    assert (e.value.code, e.value.field, e.value.row) == ("unstated_ph_scale", "ph_scale", 0)
    # A call that no row could pass is refused before any row is solved.
    with pytest.raises(ValueError, match="no pair"):
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300)
    # A row without its pair (a parameter not measured in that row).
    with pytest.raises(travertine.TravertineError) as e:
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=[8.0, np.nan],
                         errors="raise")
    assert (e.value.code, e.value.row) == ("wrong_count", 1)


def test_unknown_keywords_and_options_are_refused():
    with pytest.raises(TypeError, match="colour"):
        travertine.solve(temperature_c=20, colour=3)
    with pytest.raises(ValueError, match="errors"):
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8, errors="ignore")
    with pytest.raises(ValueError):
        travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8, columns=["colour"])


def test_residuals_of_a_third_parameter():
    base = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, dic_umol_kg=2000)
    r = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, dic_umol_kg=2000,
                         pco2_uatm=base["pco2_uatm"][()] + 10.0)
    assert abs(r["pco2_uatm_residual"][()] - 10.0) < 1e-6


def test_uncertainty_keys():
    r = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=[8.0, 8.1],
                         uncertainty={"ph_total": 0.01, "alkalinity_umol_kg": "0.1%"},
                         uncertainty_constants=False, columns=["ph_total", "pco2_uatm", "water"])
    assert set(r) == {"ph_total", "pco2_uatm", "water", "ph_total_u", "pco2_uatm_u", "status", "message"}
    # pH is measured: its uncertainty is the one given.
    assert np.allclose(r["ph_total_u"], 0.01, rtol=1e-6)
    # pCO2 moves by about 2.3 % per 0.01 pH: more than 2 % of it.
    assert (r["pco2_uatm_u"] > 0.02 * r["pco2_uatm"]).all()
    with_constants = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8.0,
                                      uncertainty={"ph_total": 0.01}, columns=["pco2_uatm"])
    assert with_constants["pco2_uatm_u"][()] > r["pco2_uatm_u"][0]
    # An absolute size is in the unit of its name: 2 mg/L as CaCO3 is the
    # alkalinity's own uncertainty when it is measured in mg/L as CaCO3,
    # and 2 % of 100 mg/L the same.
    for size in (2.0, "2%"):
        r = travertine.solve(temperature_c=20, salinity=0.2, alkalinity_mg_l_caco3=100, ph_nbs=8,
                             uncertainty={"alkalinity_mg_l_caco3": size}, uncertainty_constants=False,
                             columns=["alkalinity_mg_l_caco3"])
        assert abs(r["alkalinity_mg_l_caco3_u"][()] - 2.0) < 1e-6, size
    # A constant by the name of its pK or of K; an unknown name is refused
    # with the nearest name.
    a = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8.0,
                         uncertainty={"pk1": 0.01}, uncertainty_constants=False, columns=["pco2_uatm"])
    b = travertine.solve(temperature_c=20, salinity=35, alkalinity_umol_kg=2300, ph_total=8.0,
                         uncertainty={"K1": 0.01}, uncertainty_constants=False, columns=["pco2_uatm"])
    assert a["pco2_uatm_u"][()] > 0 and a["pco2_uatm_u"][()] == b["pco2_uatm_u"][()]
    with pytest.raises(ValueError, match="alkalinity"):
        travertine.solve(temperature_c=20, salinity=0.2, alkalinity_mg_l_caco3=100, ph_nbs=8,
                         uncertainty={"alkalinty": 2.0})


def test_help_lists_every_input_and_stubs_are_current():
    import pathlib

    doc = travertine.solve.__doc__
    for name in travertine.input_names():
        assert name in doc, name
    stub = pathlib.Path(travertine.__file__).with_name("__init__.pyi")
    assert stub.read_text() == travertine._stub_text(), "run: python -c 'import travertine; print(travertine._stub_text(), end=\"\")' > bindings/python/python/travertine/__init__.pyi"


def test_stubs_pass_mypy(tmp_path):
    """The type stubs are valid to mypy --strict, and calls as the README
    writes them check against them (scripts/test-all installs mypy)."""
    import pathlib
    import sys

    api = pytest.importorskip("mypy.api")
    stub = pathlib.Path(travertine.__file__).with_name("__init__.pyi")
    use = tmp_path / "use.py"
    use.write_text(
        "import numpy as np\n"
        "import travertine\n"
        "r = travertine.solve(temperature_c=np.array([20.0, 21.0]), salinity=35,\n"
        "                     alkalinity_umol_kg=2300, ph_total=8.0, columns=['ph_total'])\n"
        "ph: np.ndarray = r['ph_total']\n"
        "d = travertine.dose(chemical='sodium-bicarbonate', target='alkalinity=80 mg/L CaCO3',\n"
        "                    temperature_c=20, alkalinity_mg_l_caco3=50, ph_nbs=7.2, volume_m3=1500)\n"
        "b = travertine.blend(r, r, fraction_first=0.5)\n"
        "keys: tuple[str, ...] = travertine.output_keys()\n"
    )
    # The stub checked as a file of its own (site-packages is no source root).
    copy = tmp_path / "stub" / "travertine" / "__init__.pyi"
    copy.parent.mkdir(parents=True)
    copy.write_text(stub.read_text())
    for target in (str(copy), str(use)):
        out, err, status = api.run(["--strict", "--python-executable", sys.executable,
                                    "--cache-dir", str(tmp_path / "cache"), target])
        assert status == 0, f"mypy {target}:\n{out}{err}"
