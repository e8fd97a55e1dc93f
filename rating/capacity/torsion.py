"""Torsion and warping properties of a built-up section, by finite elements on its rectangles.

A built-up member's parts are axis-aligned rectangles (``rating.capacity.sections.Rect``).
The St Venant warping function omega of their union is found on a rectilinear grid of
bilinear elements that follows every rectangle's edges:

    Laplacian(omega) = 0 in the section, d(omega)/dn = y n_x - x n_y on its boundary

(Saint-Venant torsion; Pilkey, *Analysis and Design of Elastic Beams*, 2002, Ch. 6, the
displacement form of the warping problem [value from memory]). From omega:

* the torsional constant J = I_x + I_y - omega^T K omega (the same source);
* the shear centre, Trefftz's definition: the pole about which the warping function has no
  first moment about either centroidal axis;
* the warping constant C_w = integral of omega_s^2 dA, with omega_s the warping function about
  the shear centre, of zero mean.

The section must be one connected region: parts that only lacing or battens join are open
with respect to each other, and for a section like that the reason is returned instead of
properties. The riveted faces between parts are taken as continuous (common practice for a
riveted built-up member). Lacing and battens are not in the analysis: it is of the section
the rectangles make (``rating.capacity.compression`` decides what a laced section is rated
as); a closed cell (cover plates on both sides) is found as such.

Checked against thin-walled closed forms in ``tests/capacity/test_torsion.py`` and against an
independent finite-element library (sectionproperties) in
``tests/reference/test_sections_sectionproperties.py``.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from rating.capacity.sections import AreaProperties, Rect, rect_extent

CELL_MIN_IN = 0.1
"""Element side next to every rectangle edge, in (corners and junctions, where the warping
function departs from its thin-strip form); elements grow from there by ``GROWTH`` up to
``CELL_MAX_IN``. Checked for convergence against a fine reference in the tests."""

CELL_MAX_IN = 0.5
"""Largest element side, in, in the middle of a long plate (the warping function of a
straight wall varies linearly along it, which bilinear elements carry exactly)."""

GROWTH = 1.5
"""Ratio of neighbouring element sides in a graded interval."""

CELLS_ACROSS = 2
"""Elements across each rectangle's thickness at least: the warping function of a thin
strip is bilinear across it (omega ~ x y), which bilinear elements carry exactly."""

# 2 x 2 Gauss points on the reference square [-1, 1]^2 and the bilinear shape functions'
# values and derivatives there (nodes counter-clockwise from the lower left)
_G = 1.0 / math.sqrt(3.0)
_XI = np.array([-_G, _G, _G, -_G])
_ETA = np.array([-_G, -_G, _G, _G])
_NODE_XI = np.array([-1.0, 1.0, 1.0, -1.0])
_NODE_ETA = np.array([-1.0, -1.0, 1.0, 1.0])
_N = 0.25 * (1 + _NODE_XI[None, :] * _XI[:, None]) * (1 + _NODE_ETA[None, :] * _ETA[:, None])
_DN_DXI = 0.25 * _NODE_XI[None, :] * (1 + _NODE_ETA[None, :] * _ETA[:, None])
_DN_DETA = 0.25 * _NODE_ETA[None, :] * (1 + _NODE_XI[None, :] * _XI[:, None])
_K_XI = _DN_DXI.T @ _DN_DXI  # sum over the points of dN_i/dxi dN_j/dxi (weights 1)
_K_ETA = _DN_DETA.T @ _DN_DETA


@dataclass(frozen=True)
class TorsionProperties:
    """Torsion and warping properties of a section (in, in^4, in^6).

    ``area``: area, centroid and centroidal second moments of the meshed region (exact for
    rectangles); ``x_s_in``/``y_s_in`` the shear centre, in the section's coordinates;
    ``J_in4`` the St Venant torsional constant; ``C_w_in6`` the warping constant;
    ``elements`` the number of finite elements used.
    """

    area: AreaProperties
    J_in4: float
    x_s_in: float
    y_s_in: float
    C_w_in6: float
    elements: int

    @property
    def x_o_in(self) -> float:
        """Shear centre from the centroid along x (LRFD 6.9.4.1.3's x_o)."""
        return self.x_s_in - self.area.x_c_in

    @property
    def y_o_in(self) -> float:
        """Shear centre from the centroid along y (LRFD 6.9.4.1.3's y_o)."""
        return self.y_s_in - self.area.y_c_in

    @property
    def r_o_in(self) -> float:
        """Polar radius of gyration about the shear centre, r_o^2 = x_o^2 + y_o^2 +
        (I_x + I_y)/A_g (AASHTO LRFD 6.9.4.1.3 [value from memory])."""
        return math.sqrt(self.x_o_in ** 2 + self.y_o_in ** 2
                         + (self.area.I_x_in4 + self.area.I_y_in4) / self.area.A_in2)


def _graded(a: float, b: float, h_min: float) -> np.ndarray:
    """Grid lines in (a, b]: elements of ``h_min`` at both ends growing by ``GROWTH`` to at
    most ``CELL_MAX_IN``, and equal ones in the middle, none thinner than about ``h_min``/2
    (a sliver of an element would spoil the solution)."""
    length = b - a
    left: list[float] = []  # offsets of the graded lines from each end
    h, total = h_min, 0.0
    while 2.0 * (total + h) <= length - h_min:
        total += h
        left.append(total)
        h = min(h * GROWTH, CELL_MAX_IN)
    n = max(1, math.ceil((length - 2.0 * total) / h - 1e-9))
    middle = np.linspace(a + total, b - total, n + 1)[1:]
    if not left:
        return middle
    offsets = np.array(left)
    return np.concatenate([a + offsets, middle, (b - offsets[:-1])[::-1], [b]])


def _breaks(lo: np.ndarray, hi: np.ndarray, thick: np.ndarray) -> np.ndarray:
    """Grid lines along one axis: every rectangle edge, each interval between them graded
    from ``CELL_MIN_IN`` at its ends (at most 1/``CELLS_ACROSS`` of the thinnest rectangle
    whose thickness lies along this axis and spans the interval)."""
    edges = np.unique(np.concatenate([lo, hi]))  # (snapped: see ``_snapped``)
    lines = [edges[:1]]
    for a, b in zip(edges[:-1], edges[1:], strict=True):
        mid = 0.5 * (a + b)
        spans = (lo < mid) & (hi > mid)
        if not spans.any():  # a gap between parts: its cells are empty
            lines.append(np.array([b]))
            continue
        h = CELL_MIN_IN
        if np.any(spans & np.isfinite(thick)):
            h = min(h, float(np.min(thick[spans])) / CELLS_ACROSS)
        lines.append(_graded(float(a), float(b), h))
    return np.concatenate(lines)


def _snapped(lo: np.ndarray, hi: np.ndarray, tol: float = 1e-6
             ) -> tuple[np.ndarray, np.ndarray]:
    """The rectangles' edges along one axis with those within ``tol`` of each other made one
    (the first of each run), so that parts ``_one_region`` joins share a grid line."""
    v = np.concatenate([lo, hi])
    order = np.argsort(v, kind="stable")
    sv = v[order]
    run = np.concatenate([[0], np.cumsum(np.diff(sv) > tol)])
    first = np.concatenate([[True], np.diff(run) > 0])
    out = np.empty_like(v)
    out[order] = sv[first][run]
    return out[:len(lo)], out[len(lo):]


def _one_region(x0: np.ndarray, x1: np.ndarray, y0: np.ndarray, y1: np.ndarray) -> bool:
    """Whether the rectangles make one region, two of them joined where they share a stretch
    of edge (a shared corner alone joins nothing)."""
    tol = 1e-6
    over_y = np.minimum(y1[:, None], y1[None, :]) - np.maximum(y0[:, None], y0[None, :]) > tol
    over_x = np.minimum(x1[:, None], x1[None, :]) - np.maximum(x0[:, None], x0[None, :]) > tol
    side = (np.abs(x1[:, None] - x0[None, :]) <= tol) | (np.abs(x0[:, None] - x1[None, :]) <= tol)
    end = (np.abs(y1[:, None] - y0[None, :]) <= tol) | (np.abs(y0[:, None] - y1[None, :]) <= tol)
    joined = (side & over_y) | (end & over_x) | (over_x & over_y)  # (overlaps: said later)
    reached = np.zeros(len(x0), dtype=bool)
    reached[0] = True
    while True:
        grown = reached | joined[reached].any(axis=0)
        if grown.sum() == reached.sum():
            return bool(reached.all())
        reached = grown


def torsion_properties(rects: Sequence[Rect]) -> TorsionProperties | str:
    """Torsion and warping properties of the union of ``rects`` (see the module doc).

    Pilkey 2002, Ch. 6 (warping function, J, Trefftz's shear centre, C_w) [value from
    memory]. Returns the reason instead where the rectangles overlap or do not make one
    connected region.
    """
    r = [x for x in rects if x.bx_in > 0 and x.by_in > 0]
    if not r:
        return "no material left"
    x0, x1, y0, y1 = np.array([rect_extent(x) for x in r]).T
    if not _one_region(x0, x1, y0, y1):
        return ("the parts do not make one connected section (a part touches no other, or the "
                "parts are joined by lacing or battens only)")
    x0, x1 = _snapped(x0, x1)
    y0, y1 = _snapped(y0, y1)
    # a rectangle's thickness limits the elements along the axis it lies on
    t_along_x = np.array([x.bx_in if x.thick_along_x else np.inf for x in r])
    t_along_y = np.array([np.inf if x.thick_along_x else x.by_in for x in r])
    xs = _breaks(x0, x1, t_along_x)
    ys = _breaks(y0, y1, t_along_y)
    xm = 0.5 * (xs[:-1] + xs[1:])
    ym = 0.5 * (ys[:-1] + ys[1:])
    # cells whose centres lie in each rectangle (the grid follows every edge)
    inside_x = (xm[None, :] > x0[:, None]) & (xm[None, :] < x1[:, None])  # (R, nx)
    inside_y = (ym[None, :] > y0[:, None]) & (ym[None, :] < y1[:, None])  # (R, ny)
    count = np.einsum("ri,rj->ij", inside_x.astype(np.int32), inside_y.astype(np.int32))
    if np.any(count > 1):
        return "parts overlap"
    # imported here: scipy costs a one-workbook run about 0.2 s of start-up, and only a
    # built-up compression member needs it
    import scipy.sparse as sp
    from scipy.sparse.linalg import spsolve

    ix, iy = np.nonzero(count)
    nx1 = len(xs)
    # element nodes, counter-clockwise from the lower left, numbered on the full grid
    corners = np.stack([iy * nx1 + ix, iy * nx1 + ix + 1, (iy + 1) * nx1 + ix + 1,
                        (iy + 1) * nx1 + ix], axis=1)
    used, conn = np.unique(corners, return_inverse=True)
    conn = conn.reshape(corners.shape)
    n = len(used)
    ne = len(ix)
    rows = np.repeat(conn, 4, axis=1).ravel()
    cols = np.tile(conn, (1, 4)).ravel()

    hx = (xs[ix + 1] - xs[ix])
    hy = (ys[iy + 1] - ys[iy])
    area_e = hx * hy
    A = float(area_e.sum())
    # centroid and second moments of the cells, exact for rectangles
    cx_e = 0.5 * (xs[ix] + xs[ix + 1])
    cy_e = 0.5 * (ys[iy] + ys[iy + 1])
    xc = float(np.dot(area_e, cx_e) / A)
    yc = float(np.dot(area_e, cy_e) / A)
    dx, dy = cx_e - xc, cy_e - yc
    I_x = float(np.sum(hx * hy ** 3 / 12.0 + area_e * dy ** 2))
    I_y = float(np.sum(hy * hx ** 3 / 12.0 + area_e * dx ** 2))
    I_xy = float(np.sum(area_e * dx * dy))

    # Gauss points of every element, centroidal coordinates: (E, 4)
    gx = dx[:, None] + 0.5 * hx[:, None] * _XI[None, :]
    gy = dy[:, None] + 0.5 * hy[:, None] * _ETA[None, :]
    w = (0.25 * area_e)[:, None]  # weight of each point: the Jacobian, the Gauss weight 1
    dN_dx = _DN_DXI[None, :, :] * (2.0 / hx)[:, None, None]  # (E, point, node)
    dN_dy = _DN_DETA[None, :, :] * (2.0 / hy)[:, None, None]
    # the element Laplacian of a bilinear rectangle: (hy/hx) K_xi + (hx/hy) K_eta
    k_e = (hy / hx)[:, None, None] * _K_XI[None] + (hx / hy)[:, None, None] * _K_ETA[None]
    f_e = np.einsum("epi,ep->ei", dN_dx, gy * w) - np.einsum("epi,ep->ei", dN_dy, gx * w)
    K = sp.coo_matrix((k_e.ravel(), (rows, cols)), shape=(n, n)).tocsc()
    f = np.bincount(conn.ravel(), weights=f_e.ravel(), minlength=n)
    # omega is found up to a constant: hold the first node, then take the mean out
    omega = np.zeros(n)
    K_held = K[1:, 1:]
    omega[1:] = spsolve(K_held, f[1:])
    # a mesh in two pieces (which ``_one_region`` should have said) has no unique solution
    if not np.all(np.isfinite(omega)) or np.linalg.norm(K_held @ omega[1:] - f[1:]) > \
            1e-8 * max(float(np.linalg.norm(f)), 1e-300):
        return "the torsion analysis found no solution (the parts are not joined)"
    wq = omega[conn] @ _N.T  # omega at the Gauss points, (E, point)
    omega -= float(np.sum(wq * w)) / A
    wq -= float(np.sum(wq * w)) / A
    J = I_x + I_y - float(omega @ (K @ omega))
    I_xw = float(np.sum(gx * wq * w))
    I_yw = float(np.sum(gy * wq * w))
    det = I_x * I_y - I_xy ** 2
    # omega about (a, b) from the centroid: omega - b x + a y; Trefftz's pole makes its first
    # moments about both axes vanish
    a = (I_xy * I_xw - I_y * I_yw) / det
    b = (I_x * I_xw - I_xy * I_yw) / det
    ws = wq - b * gx + a * gy
    ws -= float(np.sum(ws * w)) / A
    C_w = float(np.sum(ws * ws * w))
    area = AreaProperties(A, xc, yc, I_x, I_y, I_xy, float(ys[iy + 1].max()),
                          float(ys[iy].min()), float(xs[ix].min()), float(xs[ix + 1].max()))
    return TorsionProperties(area, max(J, 0.0), xc + a, yc + b, max(C_w, 0.0), ne)
