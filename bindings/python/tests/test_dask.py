"""The package on an existing distributed engine: Dask (issue 15).

A 2,000,000-row generated field sheet is written to Parquet, read back with
dask.dataframe, solved with map_partitions(travertine.solve_frame) on a
dask.distributed LocalCluster of two workers, and compared row for row with
the same sheet solved in one process.
"""

import numpy as np
import pytest

import travertine

dd = pytest.importorskip("dask.dataframe")
distributed = pytest.importorskip("dask.distributed")
pd = pytest.importorskip("pandas")
pytest.importorskip("pyarrow")

ROWS = 2_000_000
COLUMNS = ["ph_total", "pco2_uatm", "dic_umol_kg", "omega_aragonite", "water"]


def sheet(rows: int) -> "pd.DataFrame":
    """An invented sheet: surface samples of a made-up coastal survey, a few bad rows among them."""
    rng = np.random.default_rng(2026)
    df = pd.DataFrame({
        "station": np.arange(rows) % 500,
        "temperature_c": rng.uniform(2.0, 28.0, rows),
        "salinity": rng.uniform(28.0, 36.0, rows),
        "alkalinity_umol_kg": rng.uniform(2000.0, 2400.0, rows),
        "ph_total": rng.uniform(7.7, 8.3, rows),
    })
    df.loc[::100_000, "ph_total"] = 15.0  # out of range: error rows, in place
    return df


def test_map_partitions_on_a_local_cluster_equals_one_process(tmp_path):
    path = tmp_path / "survey.parquet"
    sheet(ROWS).to_parquet(path, row_group_size=250_000)
    local = travertine.solve_frame(pd.read_parquet(path), columns=COLUMNS)

    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                                  dashboard_address=None) as cluster, distributed.Client(cluster):
        frame = dd.read_parquet(path, split_row_groups=True)
        assert frame.npartitions >= 2
        result = frame.map_partitions(travertine.solve_frame, columns=COLUMNS).compute()

    result = result.reset_index(drop=True)
    assert len(result) == ROWS
    assert list(result.columns) == list(local.columns)
    for c in local.columns:
        a, b = local[c].to_numpy(), result[c].to_numpy()
        if a.dtype.kind == "f":
            assert np.array_equal(a, b, equal_nan=True), c
        else:
            # Dask may hold texts as pyarrow strings (missing: <NA>), pandas as objects (None).
            def texts(series):
                return [None if pd.isna(v) else str(v) for v in series.astype(object)]
            assert texts(local[c]) == texts(result[c]), c
    assert (result["status"] == "error").sum() == ROWS // 100_000
