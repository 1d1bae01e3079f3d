"""travertine: the carbonate system of natural waters, over numpy arrays.

Give any two measured carbonate parameters and the conditions of a water, as
numpy arrays or scalars that broadcast like numpy, and get the complete
carbonate state of every row as a dict of numpy arrays::

    import travertine
    r = travertine.solve(temperature_c=[12.0, 14.5], salinity=0.2,
                         alkalinity_mg_l_caco3=[118.0, 102.0], ph_nbs=[7.9, 8.1])
    r["pco2_uatm"], r["status"], r["message"]

The keyword names are the canonical column names of a travertine field
sheet, with the unit in the name (``help(travertine.solve)`` lists them);
the result keys are those of ``travertine solve --json``. A row that cannot
be solved has status "error", its message and NaN values, and the others go
on; ``errors="raise"`` raises :class:`TravertineError` instead.

The rows are solved in parallel in Rust with the GIL released.
"""

from __future__ import annotations

from typing import Any, Dict, Iterable, Mapping, Optional, Sequence, Tuple, Union

import numpy as np

from . import _native

__all__ = [
    "solve",
    "solve_frame",
    "dose",
    "blend",
    "TravertineError",
    "INPUTS",
    "OUTPUTS",
    "input_names",
    "output_keys",
]

__version__ = _native.__version__

#: Every input of the library's one list: ``(name, flag, help, accepted units, is_choice)``.
INPUTS: Tuple[Tuple[str, str, str, str, bool], ...] = tuple(_native.inputs())
#: Every output of the library's one list: ``(key, label, unit)``, in JSON order.
OUTPUTS: Tuple[Tuple[str, str, str], ...] = tuple(_native.outputs())

# Options that are inputs of the list read as names (water, ph_scale,
# carbonic, ...): accepted under their flag (with `_` for `-`) and column.
_CHOICES: Dict[str, str] = {}
for _name, _flag, _help, _accepted, _is_choice in INPUTS:
    if _is_choice:
        _CHOICES[_flag.replace("-", "_")] = _name
        _CHOICES[_name] = _name

# The precipitation potential costs about twenty solves per row: asked for by name only.
_COSTLY = ("precipitation_potential_mg_l_caco3",)
_ERRORS = ("coerce", "raise")


def input_names() -> Tuple[str, ...]:
    """The canonical input names (the sheet's column names), in list order."""
    return tuple(i[0] for i in INPUTS)


def output_keys() -> Tuple[str, ...]:
    """The output keys of ``travertine solve --json``, in order."""
    return tuple(o[0] for o in OUTPUTS)


class TravertineError(ValueError):
    """A row that cannot be solved, raised by ``errors="raise"``.

    Attributes: ``code`` (a stable snake_case code such as ``out_of_range``),
    ``field`` (the input it names, or None), ``row`` (flat row index) and
    ``message``.
    """

    def __init__(self, code: str, field: Optional[str], row: int, message: str):
        super().__init__(f"row {row}: {message} [{code}]")
        self.code = code
        self.field = field
        self.row = row
        self.message = message


def _is_text(a: np.ndarray) -> bool:
    return a.dtype.kind in "OUS"


def _missing(v) -> bool:
    """Whether a value of a text column means "not measured": None, NaN, pandas' NA or NaT."""
    return v is None or (isinstance(v, float) and v != v) or type(v).__name__ in ("NAType", "NaTType")


def _texts(values) -> list:
    return [None if _missing(v) else str(v) for v in values]


def _split(kwargs: Dict[str, Any]) -> Dict[str, Any]:
    """The inputs among keyword arguments, each under its input name."""
    inputs: Dict[str, Any] = {}
    for key, value in kwargs.items():
        name = _CHOICES.get(key, key)
        if name in _CHOICES.values() or _native.is_input(name):
            inputs[name] = value
        else:
            raise TypeError(
                f"`{key}` is not an input of travertine; inputs are named with their unit, "
                f"for example alkalinity_umol_kg, alkalinity_mg_l_caco3, ph_total, ph_nbs, "
                f"dic_umol_kg, pco2_uatm, temperature_c, salinity, specific_conductance_us_cm, "
                f"calcium_hardness_mg_l_caco3, ammonia_mg_l_n, wind_m_s; options: "
                f"{', '.join(sorted(k for k in _CHOICES if '_fit' not in k))}, errors, "
                f"columns, pair, root, profile, uncertainty (help(travertine.solve) lists all)"
            )
    return inputs


def _prepare(inputs: Mapping[str, Any]):
    """Broadcast the inputs: names, values for the native layer, shape."""
    arrays = {}
    for name, value in inputs.items():
        if value is None:
            continue
        if isinstance(value, str):
            arrays[name] = value
            continue
        a = np.asarray(value)
        if not _is_text(a) and a.dtype.kind not in "biuf":
            a = a.astype(np.float64)
        arrays[name] = a
    shapes = [a.shape for a in arrays.values() if isinstance(a, np.ndarray)]
    shape = np.broadcast_shapes(*shapes) if shapes else ()
    n = int(np.prod(shape, dtype=np.int64)) if shape else 1
    names, values = [], []
    for name, a in arrays.items():
        names.append(name)
        if isinstance(a, str):
            values.append(a)
        elif _is_text(a):
            flat = np.broadcast_to(a, shape).ravel()
            values.append(_texts(flat))
        elif a.size == 1 and n != 1 or a.ndim == 0:
            values.append(float(a.reshape(-1)[0]) if a.size else float("nan"))
        else:
            values.append(np.ascontiguousarray(np.broadcast_to(a, shape), dtype=np.float64).ravel())
    return names, values, n, shape


def _columns_spec(columns) -> str:
    if columns is None:
        return ",".join([k for k in output_keys() if k not in _COSTLY] + ["flags"])
    if isinstance(columns, str):
        return columns
    return ",".join(columns)


def _uncertainty(u: Optional[Mapping[str, Union[float, str]]]):
    if u is None:
        return None
    out = []
    for name, size in u.items():
        if isinstance(size, str):
            text = size.strip()
            if text.endswith("%"):
                out.append((name, float(text[:-1]), True))
                continue
            out.append((name, float(text), False))
        else:
            out.append((name, float(size), False))
    return out


def _decoded(codes: np.ndarray, texts: list) -> np.ndarray:
    """An object array of texts from their codes (0: None). A column of one
    text (the medium, status "ok", the message every row shares) is filled
    rather than indexed: several times faster on a million rows."""
    if len(texts) == 1 or len(codes) == 0:
        return np.empty(len(codes), dtype=object)  # every element None
    first = codes[0]
    if codes.min() == first == codes.max():
        a = np.empty(len(codes), dtype=object)
        if first:
            a.fill(texts[first])
        return a
    table = np.empty(len(texts), dtype=object)
    table[:] = texts
    return table[codes]


def _shape_result(result: Dict[str, Any], shape) -> Dict[str, np.ndarray]:
    out = {}
    for key, value in result.items():
        if isinstance(value, tuple):
            codes, texts = value
            a = _decoded(codes, texts)
        elif isinstance(value, list):
            a = np.empty(len(value), dtype=object)
            a[:] = value
        else:
            a = value
        out[key] = a.reshape(shape)
    return out


def _raise_first(first) -> None:
    if first is not None:
        row, code, field, message = first
        raise TravertineError(code, field, row, message)


def solve(
    *,
    errors: str = "coerce",
    columns: Union[None, str, Sequence[str]] = None,
    pair: Union[None, str, Sequence[str]] = None,
    root: Optional[str] = None,
    profile: Optional[str] = None,
    uncertainty: Optional[Mapping[str, Union[float, str]]] = None,
    uncertainty_constants: bool = True,
    **inputs: Any,
) -> Dict[str, np.ndarray]:
    # The docstring is made from the library's list of inputs below.
    return _solve(inputs, errors, columns, pair, root, profile, uncertainty, uncertainty_constants, None)


def _solve(inputs, errors, columns, pair, root, profile, uncertainty, constants, dose_request):
    if errors not in _ERRORS:
        raise ValueError(f"errors={errors!r}: accepted: 'coerce' (error rows in place) or 'raise'")
    named = _split(inputs)
    names, values, n, shape = _prepare(named)
    if not isinstance(pair, (str, type(None))):
        pair = ",".join(pair)
    result, first = _native.solve_columns(
        names,
        values,
        n,
        _columns_spec(columns),
        pair,
        root,
        profile,
        dose_request,
        _uncertainty(uncertainty),
        constants,
    )
    if errors == "raise":
        _raise_first(first)
    return _shape_result(result, shape)


def dose(
    *,
    chemical: str,
    target: Union[str, Tuple[str, Any]],
    purity_percent: Optional[float] = None,
    dissolved_fraction: Optional[float] = None,
    errors: str = "coerce",
    columns: Union[None, str, Sequence[str]] = None,
    pair: Union[None, str, Sequence[str]] = None,
    root: Optional[str] = None,
    profile: Optional[str] = None,
    **inputs: Any,
) -> Dict[str, np.ndarray]:
    """The dose of a chemical that brings each row's water to a target.

    ``chemical`` is a name as ``travertine dose --chemical`` takes it (for
    example ``sodium-bicarbonate``, ``agricultural-lime``); ``target`` is
    ``"NAME=VALUE"`` as ``--target`` takes it (``"ph=7.5"``,
    ``"alkalinity=50 mg/L CaCO3"``) or a pair ``("ph", 7.5)``. The inputs
    are those of :func:`solve`, with ``volume_m3`` (or ``area_m2`` and
    ``mean_depth_m``) for the totals. The result is that of :func:`solve`
    plus ``dose_g_m3``, ``dose_total_kg`` and ``dose_total_lb``; a row
    already beyond the target has no dose (NaN) and a note.

    Doses of lime, caustic soda and acids can harm people, fish and
    equipment: follow the product label, local rules and licensed advice;
    ``travertine dose`` prints the cautions of each chemical.
    """
    if not isinstance(target, str):
        target = f"{target[0]}={target[1]}"
    request = (chemical, target, purity_percent, dissolved_fraction)
    return _solve(inputs, errors, columns, pair, root, profile, None, True, request)


def _as_columns(result) -> Tuple[list, int]:
    """A result dict or frame as (key, array or list of str) pairs."""
    if hasattr(result, "to_dict") and hasattr(result, "columns"):
        result = {c: _frame_column(result, c) for c in result.columns}
    pairs, n = [], None
    for key, value in result.items():
        a = np.asarray(value).reshape(-1)
        n = a.size if n is None else n
        if _is_text(a):
            pairs.append((key, _texts(a)))
        elif a.dtype.kind in "biuf":
            pairs.append((key, np.ascontiguousarray(a, dtype=np.float64)))
    return pairs, n or 0


def blend(
    first: Mapping[str, Any],
    second: Mapping[str, Any],
    fraction_first: Any,
    *,
    by: str = "mass",
    errors: str = "coerce",
) -> Dict[str, np.ndarray]:
    """Two sets of solved waters mixed row by row and solved again.

    ``first`` and ``second`` are results of :func:`solve` (dicts or frames of
    the same rows, with at least the conditions, alkalinity, DIC, the
    totals and ``water``), ``fraction_first`` the share of the first (0 to
    1; an array or a scalar), ``by`` ``"mass"`` or ``"volume"``. Each
    conserved quantity mixes in proportion to mass, the temperature by heat
    content, as ``travertine blend`` does. The result has the keys of
    :func:`solve` (without residuals or flags), ``status`` and ``message``.
    """
    if by not in ("mass", "volume"):
        raise ValueError(f"by={by!r}: accepted: 'mass' or 'volume'")
    a, n = _as_columns(first)
    b, m = _as_columns(second)
    if n != m:
        raise ValueError(f"first has {n} rows, second {m}")
    f = np.ascontiguousarray(np.broadcast_to(np.asarray(fraction_first, dtype=np.float64), (n,)))
    result, first_error = _native.blend_columns(a, b, f, by == "volume")
    if errors == "raise":
        _raise_first(first_error)
    return _shape_result(result, (n,))


def _frame_kind(df) -> str:
    module = type(df).__module__
    if module.startswith("polars"):
        return "polars"
    if module.startswith("pandas"):
        return "pandas"
    raise TypeError(f"solve_frame takes a pandas or polars DataFrame, not {type(df).__name__}")


def _frame_column(df, name):
    kind = _frame_kind(df)
    if kind == "polars":
        return df.get_column(name).to_numpy()
    col = df[name]
    if col.dtype.kind in "biuf":
        return col.to_numpy(dtype=np.float64, na_value=np.nan)
    return col.to_numpy(dtype=object)


def solve_frame(df, **options: Any):
    """:func:`solve` over a pandas or polars DataFrame, returning one of the same kind.

    Every column whose name is an input (``temperature_c``, ``ph_nbs``,
    ``alkalinity_mg_l_caco3``, ...) is read; the others pass through. The
    result has the frame's columns, in order and unchanged, then the
    computed columns, ``status`` and ``message``; a computed column whose
    name an input column already has is written ``NAME_calculated``. Other
    keywords are options or inputs for every row, as in :func:`solve`
    (``water="fresh"``, ``columns=[...]``). Missing values (NaN, None) are
    "not measured". Works as a ``dask.dataframe.map_partitions`` function.
    """
    kind = _frame_kind(df)
    inputs = {c: _frame_column(df, c) for c in df.columns if _native.is_input(str(c)) or c in _CHOICES}
    result = solve(**inputs, **options)
    taken = set(df.columns)
    renamed = {}
    for key, value in result.items():
        name = key
        while name in taken:
            name = f"{name}_calculated" if name == key else name + "_"
        taken.add(name)
        renamed[name] = value
    if kind == "polars":
        import polars as pl

        return pl.concat([df, pl.DataFrame({k: list(v) if v.dtype == object else v for k, v in renamed.items()})], how="horizontal")
    import pandas as pd

    added = pd.DataFrame(renamed, index=df.index)
    return pd.concat([df, added], axis=1)


def _solve_doc() -> str:
    lines = [
        "Solve every row: two measured carbonate parameters and the conditions give the complete state.",
        "",
        "Inputs are keyword arguments named as the canonical columns of a travertine field sheet,",
        "each a number, a numpy array (or anything numpy reads) or, for names, a str or array of",
        "str; they broadcast like numpy. Any column name a sheet reads with its unit in it is",
        "accepted too (alkalinity_umol_kg, alkalinity_meq_l, ph_total, ph_free, temperature_f,",
        "calcium_hardness_mg_l_caco3, conductivity_us_cm, ...). NaN or None means not measured.",
        "",
        "Inputs (canonical names, from the library's list):",
    ]
    for name, flag, help_, accepted, is_choice in INPUTS:
        alias = f" (or {flag.replace('-', '_')}=)" if is_choice and flag.replace("-", "_") != name else ""
        lines.append(f"  {name}{alias}")
        lines.append(f"      {help_}")
        lines.append(f"      accepted: {accepted}")
    lines += [
        "",
        "Options:",
        "  errors='coerce'  a row that cannot be solved gets status 'error', its message and NaN",
        "                   values; 'raise' raises TravertineError (code, field, row, message).",
        "  columns=None     the output keys to compute (list or comma-separated str), 'default',",
        "                   'all' or 'flags'; None: every key of solve --json except",
        "                   precipitation_potential_mg_l_caco3 (about twenty solves a row), plus flags.",
        "  pair=None        force the pair of every row, e.g. 'alkalinity,ph'; otherwise the first",
        "                   usable pair in the order alkalinity, dic, ph, pco2, fco2, xco2, co2, hco3,",
        "                   co3, and every other carbonate input gets a <key>_residual column.",
        "  root=None        'natural', 'higher-ph' or 'lower-ph' where two waters fit.",
        "  profile=None     the profile of the quality flags (general, cold-water-fish, ...).",
        "  uncertainty=None standard uncertainties {input name or constant: size}; a number is",
        "                   absolute in the unit of the name (alkalinity_mg_l_caco3: mg/L as CaCO3;",
        "                   ph_total: pH units; temperature_f: degF as a difference; pk1: pK units),",
        "                   a str 'N%' relative. Adds <key>_u for every numeric output (linear",
        "                   propagation with the constants' default uncertainties unless",
        "                   uncertainty_constants=False).",
        "",
        "Returns a dict of numpy arrays of the broadcast shape, keyed by the output keys of",
        "`travertine solve --json` (numbers as float64 with NaN where absent, names as object",
        "arrays), then residuals, flags, status ('ok', 'warning', 'error') and message.",
        "",
        "Outputs:",
    ]
    for key, label, unit in OUTPUTS:
        lines.append(f"  {key}: {label}" + (f" [{unit}]" if unit else ""))
    return "\n".join(lines)


solve.__doc__ = _solve_doc()


def _stub_text() -> str:
    """The type stubs of this package, made from the library's lists (the
    committed ``__init__.pyi`` is checked against it by the tests)."""
    choice = [i for i in INPUTS if i[4]]
    numeric = [i for i in INPUTS if not i[4]]
    kw = []
    for name, *_ in numeric:
        kw.append(f"    {name}: _Numbers | None = ...,")
    seen = set()
    for name, flag, *_ in choice:
        for n in (name, flag.replace("-", "_")):
            if n not in seen:
                seen.add(n)
                kw.append(f"    {n}: _Names | None = ...,")
    kw_text = "\n".join(kw)
    return f'''# Generated by travertine._stub_text() from the library's lists: do not edit.
from typing import Any, Dict, Literal, Mapping, Optional, Sequence, Tuple, Union

import numpy as np
import numpy.typing as npt

_Numbers = Union[float, npt.ArrayLike]
_Names = Union[str, Sequence[Optional[str]], npt.ArrayLike]
_Columns = Union[None, str, Sequence[str]]

__version__: str
INPUTS: Tuple[Tuple[str, str, str, str, bool], ...]
OUTPUTS: Tuple[Tuple[str, str, str], ...]

class TravertineError(ValueError):
    code: str
    field: Optional[str]
    row: int
    message: str
    def __init__(self, code: str, field: Optional[str], row: int, message: str) -> None: ...

def input_names() -> Tuple[str, ...]: ...
def output_keys() -> Tuple[str, ...]: ...
def solve(
    *,
    errors: Literal["coerce", "raise"] = ...,
    columns: _Columns = ...,
    pair: Union[None, str, Sequence[str]] = ...,
    root: Optional[str] = ...,
    profile: Optional[str] = ...,
    uncertainty: Optional[Mapping[str, Union[float, str]]] = ...,
    uncertainty_constants: bool = ...,
{kw_text}
    **inputs: Any,
) -> Dict[str, np.ndarray]: ...
def dose(
    *,
    chemical: str,
    target: Union[str, Tuple[str, Any]],
    purity_percent: Optional[float] = ...,
    dissolved_fraction: Optional[float] = ...,
    errors: Literal["coerce", "raise"] = ...,
    columns: _Columns = ...,
    pair: Union[None, str, Sequence[str]] = ...,
    root: Optional[str] = ...,
    profile: Optional[str] = ...,
{kw_text}
    **inputs: Any,
) -> Dict[str, np.ndarray]: ...
def blend(
    first: Mapping[str, Any],
    second: Mapping[str, Any],
    fraction_first: _Numbers,
    *,
    by: Literal["mass", "volume"] = ...,
    errors: Literal["coerce", "raise"] = ...,
) -> Dict[str, np.ndarray]: ...
def solve_frame(df: Any, **options: Any) -> Any: ...
'''
