// Filled contours of a sphere_grid (see contour.hpp).
#include "contour.hpp"

#include <algorithm>
#include <cmath>

namespace striae {

namespace {

// Ring layout of grid.hpp, recomputed from the node list: first node index,
// node count and plunge of each ring.
struct Rings {
  std::vector<int> first, size;
  double spacing;
};

Rings rings_of(double spacing) {
  const std::vector<Line> nodes = grid_nodes(spacing);
  Rings r;
  r.spacing = spacing;
  for (size_t i = 0; i < nodes.size(); ++i) {
    if (i == 0 || nodes[i].plunge != nodes[i - 1].plunge) {
      r.first.push_back(static_cast<int>(i));
      r.size.push_back(0);
    }
    ++r.size.back();
  }
  return r;
}

double ring_value(const Rings &r, const double *values, int ring, double trend) {
  const int m = r.size[ring], f = r.first[ring];
  if (m == 1) return values[f];
  const double period = ring == 0 ? 180.0 : 360.0;  // the horizontal ring is axial
  double t = std::fmod(trend, period);
  if (t < 0) t += period;
  const double pos = t / (period / m);
  int j = static_cast<int>(std::floor(pos));
  const double g = pos - j;
  j %= m;
  return values[f + j] * (1 - g) + values[f + (j + 1) % m] * g;
}

double value_at(const Rings &r, const double *values, const Vec3 &v0) {
  const Vec3 v = v0.z() < 0 ? Vec3(-v0) : v0;
  const double plunge = deg(std::asin(std::clamp(v.z(), -1.0, 1.0)));
  const double trend = deg(std::atan2(v.y(), v.x()));
  const int last = static_cast<int>(r.size.size()) - 1;
  const double pos = plunge / r.spacing;
  int i = std::min(static_cast<int>(std::floor(pos)), last - 1);
  if (i < 0) i = 0;
  const double g = std::clamp(pos - i, 0.0, 1.0);
  return ring_value(r, values, i, trend) * (1 - g) + ring_value(r, values, i + 1, trend) * g;
}

}  // namespace

double grid_value_at(double spacing, const double *values, size_t count, const Vec3 &v) {
  const Rings r = rings_of(spacing);
  if (static_cast<size_t>(r.first.back() + r.size.back()) != count)
    throw Error(ErrorKind::DataError, "grid values do not match the spacing");
  return value_at(r, values, v);
}

std::vector<double> auto_levels(GridKind kind, const double *values, size_t count) {
  if (kind == GridKind::RightDihedra) return {20, 40, 60, 80, 100};
  double vmax = 0;
  for (size_t i = 0; i < count; ++i) vmax = std::max(vmax, values[i]);
  std::vector<double> out;
  if (!(vmax > 0)) return out;
  double step = 0.5;
  const double mult[3] = {2, 2.5, 2};  // 0.5, 1, 2, 5, 10, 20, 50, ...
  for (int k = 0; vmax / step > 6; ++k) step *= mult[k % 3];
  for (int k = 1; k * step <= vmax * (1 + 1e-12); ++k) out.push_back(k * step);
  return out;
}

std::vector<double> contour_lattice(double spacing, const double *values, size_t count, Projection proj, int points) {
  const Rings r = rings_of(spacing);
  if (static_cast<size_t>(r.first.back() + r.size.back()) != count)
    throw Error(ErrorKind::DataError, "grid values do not match the spacing");
  std::vector<double> lat(static_cast<size_t>(points) * points, -1e300);
  const double step = 2 * kContourExtent / (points - 3);
  for (int j = 1; j < points - 1; ++j) {
    poll_interrupts();
    for (int i = 1; i < points - 1; ++i) {
      double x = -kContourExtent + (i - 1) * step, y = -kContourExtent + (j - 1) * step;
      // Equal-area maps the whole sphere within radius sqrt 2; the lattice's
      // corners lie beyond it (and outside the drawn disc): pull them in.
      const double rr = std::hypot(x, y);
      if (rr > 1.3) {
        x *= 1.3 / rr;
        y *= 1.3 / rr;
      }
      lat[static_cast<size_t>(j) * points + i] = value_at(r, values, unproject(x, y, proj));
    }
  }
  return lat;
}

std::vector<std::vector<XY>> contour_loops(const std::vector<double> &lat, int points, double level) {
  const double step = 2 * kContourExtent / (points - 3);
  auto pos = [&](int i, int j) { return XY{-kContourExtent + (i - 1) * step, -kContourExtent + (j - 1) * step}; };
  auto val = [&](int i, int j) { return lat[static_cast<size_t>(j) * points + i]; };
  // Edge ids: horizontal edge (i,j)-(i+1,j) is 2 (j points + i), vertical (i,j)-(i,j+1) that + 1.
  const size_t nedges = 2 * static_cast<size_t>(points) * points;
  std::vector<int> link(2 * nedges, -1);  // two neighbours per crossed edge
  auto connect = [&](int a, int b) {
    int *la = &link[2 * static_cast<size_t>(a)], *lb = &link[2 * static_cast<size_t>(b)];
    (la[0] < 0 ? la[0] : la[1]) = b;
    (lb[0] < 0 ? lb[0] : lb[1]) = a;
  };
  for (int j = 0; j + 1 < points; ++j) {
    poll_interrupts();
    for (int i = 0; i + 1 < points; ++i) {
      const double a = val(i, j), b = val(i + 1, j), c = val(i + 1, j + 1), d = val(i, j + 1);
      const int code = (a >= level) | (b >= level) << 1 | (c >= level) << 2 | (d >= level) << 3;
      if (code == 0 || code == 15) continue;
      const int e0 = 2 * (j * points + i), e2 = 2 * ((j + 1) * points + i);  // bottom, top
      const int e3 = 2 * (j * points + i) + 1, e1 = 2 * (j * points + i + 1) + 1;  // left, right
      const bool centre = 0.25 * (a + b + c + d) >= level;
      switch (code) {
        case 1: case 14: connect(e3, e0); break;
        case 2: case 13: connect(e0, e1); break;
        case 3: case 12: connect(e3, e1); break;
        case 4: case 11: connect(e1, e2); break;
        case 6: case 9: connect(e0, e2); break;
        case 7: case 8: connect(e2, e3); break;
        case 5:
          if (centre) { connect(e0, e1); connect(e2, e3); } else { connect(e3, e0); connect(e1, e2); }
          break;
        case 10:
          if (centre) { connect(e3, e0); connect(e1, e2); } else { connect(e0, e1); connect(e2, e3); }
          break;
      }
    }
  }
  auto crossing = [&](int e) {
    const int cell = e / 2, i = cell % points, j = cell / points;
    const int i2 = (e & 1) ? i : i + 1, j2 = (e & 1) ? j + 1 : j;
    const double va = val(i, j), vb = val(i2, j2);
    double t = (level - va) / (vb - va);
    if (!(t >= 0)) t = 0;
    if (t > 1) t = 1;
    const XY pa = pos(i, j), pb = pos(i2, j2);
    return XY{pa.x + t * (pb.x - pa.x), pa.y + t * (pb.y - pa.y)};
  };
  std::vector<std::vector<XY>> loops;
  std::vector<char> used(nedges, 0);
  for (size_t e = 0; e < nedges; ++e) {
    if (used[e] || link[2 * e] < 0) continue;
    std::vector<XY> loop;
    int prev = -1, cur = static_cast<int>(e);
    while (!used[cur]) {
      used[cur] = 1;
      loop.push_back(crossing(cur));
      const int *l = &link[2 * static_cast<size_t>(cur)];
      const int next = l[0] != prev ? l[0] : l[1];
      prev = cur;
      if (next < 0) break;
      cur = next;
    }
    if (loop.size() >= 3) loops.push_back(std::move(loop));
  }
  return loops;
}

}  // namespace striae
