"""Simple-span statics: closed forms, an FE package, ponding closed form and properties."""

from __future__ import annotations

import math
import warnings
from itertools import pairwise

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from engine.mechanics.statics import (
    PointLoad,
    PondingInstabilityError,
    UniformLoad,
    deflection,
    deflection_from_curvature,
    max_abs_shear,
    ponded_deflection,
    reactions,
    shear_moment,
    stations,
)

L = 480.0  # 40 ft span, in
EI = 29000.0 * 1500.0  # E = 29,000 ksi times I = 1500 in^4, kip-in^2
H = L / 400.0  # station spacing of stations(L), in


def at(x: np.ndarray, xp: float) -> int:
    """Index of the station at xp (the test picks xp on a station)."""
    i = int(np.argmin(np.abs(x - xp)))
    assert abs(x[i] - xp) < 1e-9
    return i


# ---------------------------------------------------------------- grid


def test_stations_grid() -> None:
    x = stations(L)
    assert x.size == 401 and x[0] == 0.0 and x[-1] == L
    assert np.allclose(np.diff(x), H)  # equal spacing L/(n-1)
    assert stations(L, 3).tolist() == [0.0, L / 2, L]
    with pytest.raises(ValueError):
        stations(L, 2)
    with pytest.raises(ValueError):
        stations(0.0)


# ------------------------------------------- AISC Manual Table 3-23 (closed forms recomputed here)


def test_uniform_load_table_3_23() -> None:
    # Table 3-23 "Simple beam - uniformly distributed load": R = wl/2, Vx = w(l/2 - x),
    # Mx = wx(l - x)/2, Mmax = wl^2/8
    w = 0.12
    x = stations(L)
    assert reactions(L, [UniformLoad(w)]) == pytest.approx((w * L / 2, w * L / 2))
    v, m = shear_moment(x, L, [UniformLoad(w)])
    assert np.allclose(v, w * (L / 2 - x))
    assert np.allclose(m, w * x * (L - x) / 2)
    assert m.max() == pytest.approx(w * L**2 / 8)
    assert max_abs_shear(L, [UniformLoad(w)]) == pytest.approx(w * L / 2)


def test_partial_uniform_load_table_3_23() -> None:
    # Table 3-23 "Simple beam - load partially distributed" (a from left, b loaded, c to right):
    # R1 = wb(2c + b)/(2l), R2 = wb(2a + b)/(2l); Mx = R1 x (x < a),
    # R1 x - w(x - a)^2/2 (a < x < a + b), R2 (l - x) (x > a + b); Mmax = R1 (a + R1/(2w))
    w, a, b = 0.2, 96.0, 180.0
    c = L - a - b
    r1, r2 = w * b * (2 * c + b) / (2 * L), w * b * (2 * a + b) / (2 * L)
    load = [UniformLoad(w, a, a + b)]
    assert reactions(L, load) == pytest.approx((r1, r2))
    x = stations(L)
    v, m = shear_moment(x, L, load)
    m_hand = np.where(x < a, r1 * x, np.where(x <= a + b, r1 * x - w * (x - a) ** 2 / 2, r2 * (L - x)))
    v_hand = np.where(x < a, r1, np.where(x <= a + b, r1 - w * (x - a), -r2))
    assert np.allclose(m, m_hand) and np.allclose(v, v_hand)
    xm = a + r1 / w  # location of Mmax (zero shear)
    _, m_at = shear_moment(np.array([xm]), L, load)
    assert m_at[0] == pytest.approx(r1 * (a + r1 / (2 * w)))
    assert max_abs_shear(L, load) == pytest.approx(max(r1, r2))


def test_point_load_any_point_table_3_23() -> None:
    # Table 3-23 "Simple beam - concentrated load at any point": R1 = Pb/l, R2 = Pa/l,
    # Mmax = Pab/l at the load, Mx = Pbx/l (x < a)
    p, a = 15.0, 156.0
    b = L - a
    load = [PointLoad(p, a)]
    assert reactions(L, load) == pytest.approx((p * b / L, p * a / L))
    x = stations(L)
    v, m = shear_moment(x, L, load)
    assert np.allclose(m, np.where(x < a, p * b * x / L, p * a * (L - x) / L))
    ia = at(x, a)
    assert m[ia] == pytest.approx(p * a * b / L)
    # V just right of the load (station at the load): R1 - P = -R2 (sign convention of shear_moment)
    assert v[ia] == pytest.approx(-p * a / L) and v[ia - 1] == pytest.approx(p * b / L)
    assert max_abs_shear(L, load) == pytest.approx(p * b / L)  # R1 governs since b > a


def test_two_equal_loads_table_3_23() -> None:
    # Table 3-23 "Simple beam - two equal concentrated loads symmetrically placed":
    # R = P, Mmax = Pa between the loads, Mx = Px (x < a),
    # deflection at centre = Pa(3l^2 - 4a^2)/(24EI)
    p, a = 8.0, 144.0
    load = [PointLoad(p, a), PointLoad(p, L - a)]
    assert reactions(L, load) == pytest.approx((p, p))
    x = stations(L)
    v, m = shear_moment(x, L, load)
    assert np.allclose(m, np.minimum(p * np.minimum(x, L - x), p * a))
    assert np.allclose(v[(x > a) & (x < L - a)], 0.0)
    assert max_abs_shear(L, load) == pytest.approx(p)
    y = deflection(x, L, load, EI)
    assert y[200] == pytest.approx(p * a * (3 * L**2 - 4 * a**2) / (24 * EI), rel=5e-4)


def test_max_abs_shear_both_sides_of_point_load() -> None:
    # statics by hand: w = 0.1 over the span plus P = 30 at 0.25 L. R1 = wL/2 + 0.75 P = 46.5;
    # just left of P: 46.5 - 0.1*120 = 34.5, just right 4.5; R2 = 24 + 7.5 = 31.5
    load = [UniformLoad(0.1), PointLoad(30.0, 120.0)]
    assert reactions(L, load) == pytest.approx((46.5, 31.5))
    assert max_abs_shear(L, load) == pytest.approx(46.5)
    # upward w = -0.1: R1 = -24 + 22.5 = -1.5, R2 = -24 + 7.5 = -16.5; just left of P
    # -1.5 + 12 = 10.5, just right 10.5 - 30 = -19.5 (governs), far end +16.5
    load2 = [UniformLoad(-0.1), PointLoad(30.0, 120.0)]
    assert reactions(L, load2) == pytest.approx((-1.5, -16.5))
    assert max_abs_shear(L, load2) == pytest.approx(19.5)


# ------------------------------------------------------------ deflection vs closed forms


def test_uniform_deflection_5wl4() -> None:
    # 5wL^4/(384EI): Table 3-23 "uniformly distributed load"; 0.05 % required
    w = 0.1
    y = deflection(stations(L), L, [UniformLoad(w)], EI)
    assert y[200] == pytest.approx(5 * w * L**4 / (384 * EI), rel=5e-4)
    assert np.argmax(y) == 200


@pytest.mark.parametrize("n", [401, 400])  # 400 stations: the centre load sits between stations
def test_central_point_load_pl3_48(n: int) -> None:
    # PL^3/(48EI): Table 3-23 "concentrated load at center"; compare the largest station value
    p = 20.0
    y = deflection(stations(L, n), L, [PointLoad(p, L / 2)], EI)
    assert y.max() == pytest.approx(p * L**3 / (48 * EI), rel=5e-4)


@pytest.mark.parametrize("a", [300.0, 300.5, 355.3])  # on a station, then between stations
def test_off_centre_point_load(a: float) -> None:
    # Table 3-23 "concentrated load at any point", a > b: deflection at the load Pa^2b^2/(3EIl);
    # maximum Pab(a + 2b)sqrt(3a(a + 2b))/(27EIl) = Pb(l^2 - b^2)^1.5/(9 sqrt(3) l EI)
    # at x = sqrt(a(a + 2b)/3)
    p, b = 12.0, L - a
    x = stations(L)
    y = deflection(x, L, [PointLoad(p, a)], EI)
    y_max = p * a * b * (a + 2 * b) * math.sqrt(3 * a * (a + 2 * b)) / (27 * EI * L)
    assert y.max() == pytest.approx(y_max, rel=5e-4)
    assert x[np.argmax(y)] == pytest.approx(math.sqrt(a * (a + 2 * b) / 3), abs=H)
    assert np.interp(a, x, y) == pytest.approx(p * a**2 * b**2 / (3 * EI * L), rel=5e-4)


def test_curvature_integration_exact_for_linear_curvature() -> None:
    # y'' = -(c0 + c1 x), y(0) = y(l) = 0 integrates to y = c0 x(l - x)/2 + c1 x(l^2 - x^2)/6
    # (hand integration); exact on any grid because the curvature is linear
    rng = np.random.default_rng(7)
    x = np.sort(np.concatenate([[0.0, L], rng.uniform(0, L, 60)]))
    c0, c1 = 2e-5, -3e-8
    y = deflection_from_curvature(x, c0 + c1 * x)
    assert np.allclose(y, c0 * x * (L - x) / 2 + c1 * x * (L**2 - x**2) / 6, rtol=1e-10, atol=1e-14)


# ------------------------------------------------------------ deflection vs FE (anastruct)


def fe_deflection(nodes, ei_of, w_of, points, k_of=None) -> np.ndarray:
    """Deflection (down +) at `nodes` from anastruct Euler-Bernoulli frame elements.

    The optional ponding load k*y is modelled as negative vertical springs k * tributary length.
    """
    from anastruct import SystemElements

    system = SystemElements(EA=1e9, EI=1.0)
    for a, b in pairwise(nodes):
        system.add_element([[a, 0.0], [b, 0.0]], EA=1e9, EI=ei_of(0.5 * (a + b)))
    system.add_support_hinged(1)
    system.add_support_roll(len(nodes))
    for i, (a, b) in enumerate(pairwise(nodes)):
        if w_of(0.5 * (a + b)):
            system.q_load(q=-w_of(0.5 * (a + b)), element_id=i + 1, direction="y")
    for p, xp in points:
        system.point_load(node_id=int(np.argmin(np.abs(nodes - xp))) + 1, Fy=-p)
    if k_of is not None:
        tributary = np.zeros(len(nodes))
        tributary[:-1] += np.diff(nodes) / 2
        tributary[1:] += np.diff(nodes) / 2
        for i in range(1, len(nodes) - 1):
            system.add_support_spring(i + 1, 2, -k_of(nodes[i]) * tributary[i])
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # anastruct's post-processing polyfit warnings
        system.solve()
    return -np.array(system.get_node_result_range("uy"))  # anastruct uy is up +


CHECK_POINTS = [60.0, 120.0, 240.0, 300.0, 420.0]  # all on stations of stations(L)


def compare_with_fe(y, nodes, y_fe, rel: float, x=None) -> None:
    x = stations(L) if x is None else x
    for xp in CHECK_POINTS:
        j = int(np.argmin(np.abs(nodes - xp)))
        assert nodes[j] == xp
        assert y[at(x, xp)] == pytest.approx(y_fe[j], rel=rel), xp


def test_partial_uniform_load_vs_fe() -> None:
    # anastruct, 120 elements; nodal displacements of Hermite beam elements are exact
    w, a, b = 0.15, 90.0, 330.0
    nodes = np.union1d(np.linspace(0, L, 121), [a, b])
    y_fe = fe_deflection(nodes, lambda _: EI, lambda s: w if a < s < b else 0.0, [])
    compare_with_fe(deflection(stations(L), L, [UniformLoad(w, a, b)], EI), nodes, y_fe, 1e-4)


def test_two_point_loads_vs_fe() -> None:
    # anastruct, 120 elements; the second load sits between stations of stations(L)
    loads = [(10.0, 100.0), (6.0, 351.7)]
    nodes = np.union1d(np.linspace(0, L, 121), [xp for _, xp in loads])
    y_fe = fe_deflection(nodes, lambda _: EI, lambda _: 0.0, loads)
    y = deflection(stations(L), L, [PointLoad(p, xp) for p, xp in loads], EI)
    compare_with_fe(y, nodes, y_fe, 1e-4)


def stepped_grid(steps, stiff):
    """stations(L) plus each step station twice; EI = 2 EI where stiff, the left value first."""
    x = np.sort(np.concatenate([np.union1d(stations(L), steps), steps]))
    first = np.diff(x, append=np.inf) == 0.0
    second = np.diff(x, prepend=-np.inf) == 0.0
    side = np.where(second, 1e-6, 0.0) - np.where(first, 1e-6, 0.0)
    return x, np.where(stiff(x + side), 2 * EI, EI)


@pytest.mark.parametrize("step", [160.0, 120.0])  # L/3 falls between stations; 120 on one
def test_stepped_ei_vs_fe(step: float) -> None:
    # anastruct with EI doubled over the middle; on the plain grid the step is smeared over one
    # station interval (0.5 % required); with the step station repeated it is exact
    loads = [UniformLoad(0.08), PointLoad(5.0, 200.0)]

    def stiff(s):
        return (s > step) & (s < L - step)

    nodes = np.union1d(np.linspace(0, L, 121), [step, L - step, 200.0])
    y_fe = fe_deflection(nodes, lambda s: 2 * EI if stiff(s) else EI, lambda _: 0.08, [(5.0, 200.0)])
    x = stations(L)
    compare_with_fe(deflection(x, L, loads, np.where(stiff(x), 2 * EI, EI)), nodes, y_fe, 5e-3)
    x2, ei2 = stepped_grid([step, L - step], stiff)
    compare_with_fe(deflection(x2, L, loads, ei2), nodes, y_fe, 1e-4, x2)


# ------------------------------------------------------------ ponding


def ponding_closed_form(x: np.ndarray, q0: float, k: float, ei: float) -> np.ndarray:
    """Exact deflection of a simple beam under q0 + k*y, constant EI and k.

    Derivation (hand): EI y'''' = q0 + k y with y = y'' = 0 at both supports. With
    beta^4 = k/EI the particular solution is -q0/k; the homogeneous ones are cosh, sinh, cos,
    sin of beta*xi, xi = x - L/2; symmetry keeps the even pair: y = -q0/k + A cosh + B cos.
    At xi = +-L/2 (u = beta L/2): y'' = 0 gives A cosh u = B cos u, y = 0 gives their sum q0/k, so
        y = (q0/k) [cosh(beta xi)/(2 cosh u) + cos(beta xi)/(2 cos u) - 1],
    finite and positive for u < pi/2, i.e. k L^4/(pi^4 EI) < 1. For k -> 0 the midspan value
    tends to 5 q0 L^4/(384 EI) (series 1/cosh u + 1/cos u = 2 + 5u^4/12 + ...).
    """
    beta = (k / ei) ** 0.25
    xi, u = x - L / 2, beta * L / 2
    return q0 / k * (np.cosh(beta * xi) / (2 * np.cosh(u)) + np.cos(beta * xi) / (2 * np.cos(u)) - 1)


def k_for(cc: float, ei: float = EI) -> float:
    """k giving Cc = k L^4/(pi^4 EI) (closed form after Ruddy, AISC Engineering Journal 1986, D)."""
    return cc * math.pi**4 * ei / L**4


def test_ponding_closed_form_reduces_to_5wl4() -> None:
    # derivation check of the test's own closed form: k -> 0 gives 5wL^4/(384EI)
    y = ponding_closed_form(np.array([L / 2]), 0.1, k_for(1e-4), EI)
    assert y[0] == pytest.approx(5 * 0.1 * L**4 / (384 * EI), rel=1e-3)


@pytest.mark.parametrize("cc", [0.1, 0.319, 0.6, 0.9])
def test_ponding_matches_closed_form(cc: float) -> None:
    # closed form derived in ponding_closed_form; 0.1 % required
    w, k = 0.1, k_for(cc)
    x = stations(L)
    y = ponded_deflection(x, L, [UniformLoad(w)], EI, k)
    exact = ponding_closed_form(x, w, k, EI)
    assert np.allclose(y[1:-1], exact[1:-1], rtol=1e-3, atol=0)
    # first-mode amplification 1/(1 - Cc) (closed form after Ruddy, AISC Engineering Journal 1986, D) within 0.5 %
    amplification = y[200] / deflection(x, L, [UniformLoad(w)], EI)[200]
    assert amplification == pytest.approx(1 / (1 - cc), rel=5e-3)


def test_ponding_example_i1_amplification() -> None:
    # Ruddy closed form (D): AISC Design Examples v16.0 Ex. I.1 Cc = 0.319 gives amplification 1.47
    x = stations(L)
    y = ponded_deflection(x, L, [UniformLoad(0.1)], EI, k_for(0.319))
    assert y[200] / deflection(x, L, [UniformLoad(0.1)], EI)[200] == pytest.approx(1.47, abs=0.005)


@pytest.mark.parametrize("cc", [1.01, 1.5, 4.0, 20.0, 100.0])
def test_ponding_instability_raised(cc: float) -> None:
    # Cc = k L^4/(pi^4 EI) > 1 is unstable (closed form after Ruddy, AISC Engineering Journal 1986: stable only if Cc < 1)
    with pytest.raises(PondingInstabilityError):
        ponded_deflection(stations(L), L, [UniformLoad(0.1)], EI, k_for(cc))


def test_ponding_stable_just_below_critical() -> None:
    # Cc = 0.98 < 1 is stable (closed form after Ruddy, AISC Engineering Journal 1986); amplification about 1/(1 - 0.98) = 50
    x = stations(L)
    y = ponded_deflection(x, L, [UniformLoad(0.1)], EI, k_for(0.98))
    assert 40 < y[200] / deflection(x, L, [UniformLoad(0.1)], EI)[200] < 60


def test_ponding_stiff_beam_and_zero_k_give_plain_deflection() -> None:
    # as EI grows (k fixed) the ponding term vanishes; k = 0 is the plain problem (same grid scheme)
    x = stations(L)
    loads = [UniformLoad(0.1, 40.0, 400.0), PointLoad(5.0, 301.3)]
    k = k_for(0.5)
    for factor in (1e3, 1e6):
        stiff_ei = EI * factor
        ratio = ponded_deflection(x, L, loads, stiff_ei, k)[1:-1] / deflection(x, L, loads, stiff_ei)[1:-1]
        assert np.all(np.abs(ratio - 1) < 2 / factor)  # first order: 1 + Cc/factor
    assert np.allclose(ponded_deflection(x, L, loads, EI, 0.0), deflection(x, L, loads, EI), rtol=1e-10)


def test_ponding_stepped_ei_varying_k_vs_fe() -> None:
    # anastruct with negative nodal springs k * tributary length standing in for k*y;
    # EI doubled over the middle third, k growing along the span (a tapering bay)
    k0 = k_for(0.5)

    def stiff(s):
        return (s > 160.0) & (s < 320.0)

    def k_of(s):
        return k0 * (0.5 + s / L)

    nodes = np.union1d(np.linspace(0, L, 241), [160.0, 320.0])
    y_fe = fe_deflection(nodes, lambda s: 2 * EI if stiff(s) else EI, lambda _: 0.1, [], k_of=k_of)
    x, ei = stepped_grid([160.0, 320.0], stiff)
    y = ponded_deflection(x, L, [UniformLoad(0.1)], ei, k_of(x))
    compare_with_fe(y, nodes, y_fe, 1e-4, x)  # FE lumps k*y at nodes: error O(h^2)


def grid_operator(x: np.ndarray, ei: np.ndarray) -> np.ndarray:
    """Dense deflection operator of a load linear between stations (columns = unit nodal loads).

    M'' = -q has the same form as y'' = -M/EI, so deflection_from_curvature gives both.
    """
    cols = [deflection_from_curvature(x, deflection_from_curvature(x, e) / ei) for e in np.eye(x.size)]
    return np.array(cols).T


@settings(max_examples=40, deadline=None)
@given(
    ei_factors=st.lists(st.floats(0.5, 3.0), min_size=4, max_size=4),
    k_factors=st.lists(st.floats(0.0, 1.0), min_size=4, max_size=4),
    target=st.floats(0.05, 3.0),
)
def test_ponding_equals_dense_solve_and_stability_rule(ei_factors, k_factors, target) -> None:
    # reference: dense (I - A K) y = y0 with numpy.linalg on a coarse grid; stable iff the
    # largest eigenvalue of A K is < 1 (the brief's rule)
    assume(max(k_factors) > 0.05)
    x = stations(L, 41)
    ei = EI * np.repeat(ei_factors, [10, 10, 10, 11])
    k_shape = np.repeat(k_factors, [10, 10, 10, 11])
    a = grid_operator(x, ei)
    rho0 = max(abs(np.linalg.eigvals(a * k_shape)))
    k = k_shape * target / rho0
    loads = [UniformLoad(0.1), PointLoad(3.0, 123.0)]
    y0 = deflection(x, L, loads, ei)
    if target < 1 - 1e-6:
        y = ponded_deflection(x, L, loads, ei, k)
        dense = np.linalg.solve(np.eye(x.size) - a * k, y0)
        assert np.allclose(y, dense, rtol=1e-8, atol=1e-10 * np.abs(dense).max())
        assert np.all(y >= y0 - 1e-12)
    elif target > 1 + 1e-6:
        with pytest.raises(PondingInstabilityError):
            ponded_deflection(x, L, loads, ei, k)


# ------------------------------------------------------------ properties (hypothesis)

uniform_loads = st.builds(
    lambda w, a, length: UniformLoad(w, a, min(L, a + length)),
    st.floats(0.0, 0.5),
    st.floats(0.0, L - 10.0),
    st.floats(5.0, L),
)
point_loads = st.builds(PointLoad, st.floats(0.0, 50.0), st.floats(0.0, L))
load_lists = st.lists(st.one_of(uniform_loads, point_loads), min_size=1, max_size=4)
ei_profiles = st.lists(st.floats(0.5, 4.0), min_size=5, max_size=5).map(
    lambda f: EI * np.repeat(f, [80, 80, 81, 80, 80])
)


def rough_size(loads, ei) -> float:
    """Order of magnitude of the deflection: total load * L^3 / least EI (round-off scale)."""
    total = sum(abs(ld.w) * L if isinstance(ld, UniformLoad) else abs(ld.p) for ld in loads)
    return total * L**3 / np.min(ei) + 1e-30


@settings(max_examples=60, deadline=None)
@given(first=load_lists, second=load_lists, ei=ei_profiles, scale=st.floats(-3.0, 3.0))
def test_superposition(first, second, ei, scale) -> None:
    # linear elasticity: y(P1 + s*P2) = y(P1) + s*y(P2)
    x = stations(L)
    scaled = [UniformLoad(ld.w * scale, ld.start, ld.end) if isinstance(ld, UniformLoad)
              else PointLoad(ld.p * scale, ld.x) for ld in second]
    y = deflection(x, L, first + scaled, ei)
    expected = deflection(x, L, first, ei) + scale * deflection(x, L, second, ei)
    assert np.allclose(y, expected, rtol=1e-9, atol=1e-12 * rough_size(first + second, ei))


@settings(max_examples=60, deadline=None)
@given(loads=load_lists, ei=ei_profiles, seed=st.integers(0, 2**32 - 1))
def test_more_ei_less_deflection(loads, ei, seed) -> None:
    # downward loads give M >= 0 and a positive Green's function, so raising EI anywhere
    # cannot raise the deflection anywhere (virtual work)
    x = stations(L)
    stiffer = ei * (1.0 + np.random.default_rng(seed).uniform(0.0, 2.0, x.size))
    y, y_stiff = deflection(x, L, loads, ei), deflection(x, L, loads, stiffer)
    noise = 1e-12 * rough_size(loads, ei)
    assert np.all(y_stiff <= y + noise)
    assert np.all(y >= -noise)


@settings(max_examples=60, deadline=None)
@given(loads=load_lists, half=st.lists(st.floats(0.5, 4.0), min_size=3, max_size=3), cc=st.floats(0.0, 0.8))
def test_symmetric_loads_symmetric_deflection(loads, half, cc) -> None:
    # mirror symmetry: loads and EI mirrored about midspan give y(x) = y(L - x)
    mirrored = [UniformLoad(ld.w, L - (L if ld.end is None else ld.end), L - ld.start)
                if isinstance(ld, UniformLoad) else PointLoad(ld.p, L - ld.x) for ld in loads]
    x = stations(L)
    f = np.repeat(half, [70, 70, 60])
    ei = EI * np.concatenate([f, [half[-1]], f[::-1]])
    y = deflection(x, L, loads + mirrored, ei)
    noise = 1e-12 * rough_size(loads + mirrored, ei)
    assert np.allclose(y, y[::-1], rtol=1e-9, atol=noise)
    yp = ponded_deflection(x, L, loads + mirrored, ei, k_for(cc, ei.min()))
    assert np.allclose(yp, yp[::-1], rtol=1e-8, atol=noise)
    assert np.all(yp >= y - noise)  # ponding only adds downward load


# ------------------------------------------------------------ bad input


def test_bad_input_is_rejected() -> None:
    x = stations(L)
    with pytest.raises(ValueError):
        UniformLoad(0.1, 100.0, 50.0)
    with pytest.raises(ValueError):
        PointLoad(1.0, -1.0)
    with pytest.raises(ValueError):
        reactions(L, [PointLoad(1.0, L + 1.0)])
    with pytest.raises(ValueError):
        deflection(x, L, [UniformLoad(0.1, 0.0, L + 5.0)], EI)
    with pytest.raises(ValueError):
        deflection(x, L + 1.0, [UniformLoad(0.1)], EI)  # stations do not reach the support
    with pytest.raises(ValueError):
        deflection(x, L, [UniformLoad(0.1)], 0.0)
    with pytest.raises(ValueError):
        ponded_deflection(x, L, [UniformLoad(0.1)], EI, -1.0)
    with pytest.raises(ValueError):
        deflection_from_curvature(x[::-1], np.ones_like(x))  # stations must not decrease
    with pytest.raises(TypeError):
        reactions(L, [("w", 0.1)])
