// Rendering a figure to SVG (see render.hpp).
#include "render.hpp"

#include "contour.hpp"
#include "density.hpp"
#include "drawing.hpp"
#include "focal.hpp"
#include "grid.hpp"
#include "stats.hpp"
#include "stress.hpp"
#include "svg.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace striae {

namespace {

// ---- palette and symbols (striae's own design; colours from Okabe & Ito 2008) ----

const char *const kCycle[] = {"#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9"};
constexpr int kCycleSize = 6;
const char *const kSigmaFill[3] = {"#D55E00", "#F0E442", "#56B4E9"};
constexpr const char *kInk = "#000000";
constexpr const char *kGraticule = "#9a9a9a";

enum class Symbol { Disc, Triangle, Ring, Square, Star6, Star4, Star3, Cross };

// Sequential band colour, t in (0, 1]: white, sky blue, blue, dark blue.
std::string ramp(double t) {
  static const double stops[4][4] = {{0.0, 255, 255, 255}, {0.35, 0x56, 0xB4, 0xE9}, {0.7, 0x00, 0x72, 0xB2}, {1.0, 0x00, 0x2F, 0x4A}};
  t = std::clamp(t, 0.0, 1.0);
  int k = 0;
  while (k < 2 && t > stops[k + 1][0]) ++k;
  const double g = (t - stops[k][0]) / (stops[k + 1][0] - stops[k][0]);
  char buf[8];
  int c[3];
  for (int i = 0; i < 3; ++i) c[i] = static_cast<int>(std::lround(stops[k][i + 1] + g * (stops[k + 1][i + 1] - stops[k][i + 1])));
  std::snprintf(buf, sizeof buf, "#%02X%02X%02X", c[0], c[1], c[2]);
  return buf;
}

// ---- text helpers ------------------------------------------------------------------

std::string fmt(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  if (std::string(buf).find_first_not_of("-0.") == std::string::npos && buf[0] == '-') return buf + 1;  // no "-0"
  return buf;
}

std::string fmt_line(const Line &l) {
  long t = std::lround(l.trend), p = std::lround(l.plunge);
  if (t >= 360) t -= 360;
  char buf[32];
  std::snprintf(buf, sizeof buf, "%03ld/%02ld", t, p);
  return buf;
}

std::string fmt_slip(const FaultSlip &f) {
  long s = std::lround(f.strike), d = std::lround(f.dip), r = std::lround(f.rake);
  if (s >= 360) s -= 360;
  char buf[48];
  std::snprintf(buf, sizeof buf, "%03ld/%02ld/%ld", s, d, r);
  return buf;
}

const char *kSigma[3] = {"\xCF\x83\x31", "\xCF\x83\x32", "\xCF\x83\x33"};  // sigma1..3
constexpr const char *kPhi = "\xCE\xA6";
constexpr const char *kAlpha95 = "\xCE\xB1\x39\x35";
constexpr const char *kDegree = "\xC2\xB0";
constexpr const char *kGeq = "\xE2\x89\xA5";
constexpr const char *kDot = " \xC2\xB7 ";

// ---- legend entries ---------------------------------------------------------------------

enum class Swatch { None, Stroke, Symbol, Fill, Arrow, Wedge, Bar };

struct LegendEntry {
  Swatch swatch;
  std::string colour;
  Symbol symbol;
  std::string text;
  double opacity;
  std::vector<std::pair<std::string, std::string>> bar;  // Bar: (colour, level text)
};

// Statistics of axial data for a legend line: n, Fisher mean and alpha95
// (Fisher 1953), normalised eigenvalues of the orientation tensor.
std::string axial_stats(const std::vector<Vec3> &v, bool planes, bool girdle) {
  FisherState fs;
  TensorState ts;
  fisher_init(fs);
  tensor_init(ts);
  for (size_t i = 0; i < v.size(); ++i) {
    if ((i & 1023) == 0) poll_interrupts();
    fisher_add(fs, v[i]);
    tensor_add(ts, v[i]);
  }
  const FisherResult fr = fisher_result(fs);
  const FabricResult tr = tensor_result(ts);
  std::string s = "n = " + std::to_string(v.size());
  if (fr.mean_valid && v.size() >= 2) {
    s += kDot;
    s += planes ? "mean pole " : "mean ";
    s += fmt_line(fr.mean);
    if (fr.alpha95_valid) s += std::string(" (") + kAlpha95 + " " + fmt(fr.alpha95, 1) + kDegree + ")";
  }
  if (tr.axes_valid && v.size() >= 3) {
    s += kDot;
    s += "S1/S2/S3 " + fmt(tr.s1, 2) + "/" + fmt(tr.s2, 2) + "/" + fmt(tr.s3, 2);
  }
  if (girdle && tr.fold_axis_valid && v.size() >= 3) {
    s += kDot;
    s += "girdle axis " + fmt_line(tr.fold_axis);
  }
  return s;
}

std::string with_label(const Layer &l, const char *fallback, const std::string &stats) {
  return (l.label.empty() ? std::string(fallback) : l.label) + ": " + stats;
}

StressTensor stress_of(const Layer &l) {
  StressTensor t{};
  double *f = &t.nn;
  for (int k = 0; k < 13; ++k) f[k] = l.params[k];
  t.data_count = static_cast<int64_t>(l.params[13]);
  t.flags = static_cast<uint32_t>(l.params[14]);
  t.version = kStressTensorVersion;
  return t;
}

FaultSlip slip_at(const Layer &l, size_t i) { return FaultSlip{l.data[3 * i], l.data[3 * i + 1], l.data[3 * i + 2]}; }

std::vector<double> levels_of(const Layer &l) {
  if (l.params.size() > 4) return std::vector<double>(l.params.begin() + 4, l.params.end());
  return auto_levels(static_cast<GridKind>(static_cast<int>(l.params[0])), l.data.data(), l.data.size());
}

// The colour of each layer: data layers take the cycle in figure order.
std::vector<std::string> layer_colours(const Figure &f) {
  std::vector<std::string> out;
  // Over filled contour bands (blue) the data start at vermillion.
  int k = 0;
  for (const Layer &l : f.layers)
    if (l.kind == LayerKind::Contours && l.params[3] == 1) k = 1;
  for (const Layer &l : f.layers) {
    if (l.kind == LayerKind::Stress || l.kind == LayerKind::Contours) out.push_back(kInk);
    else if (l.kind == LayerKind::PDihedra) out.push_back(kCycle[1]);  // vermillion: apart from the blue bands
    else out.push_back(kCycle[k++ % kCycleSize]);
  }
  return out;
}

std::vector<LegendEntry> legend_entries(const Figure &f, const std::vector<std::string> &colour) {
  std::vector<LegendEntry> out;
  for (size_t li = 0; li < f.layers.size(); ++li) {
    const Layer &l = f.layers[li];
    const std::string &c = colour[li];
    const size_t n = l.items();
    switch (l.kind) {
      case LayerKind::GreatCircles:
      case LayerKind::Poles:
      case LayerKind::Lines: {
        std::vector<Vec3> v;
        for (size_t i = 0; i < n; ++i)
          v.push_back(l.kind == LayerKind::Lines ? line_vector(Line{l.data[2 * i], l.data[2 * i + 1]})
                                                 : pole_vector(Plane{l.data[2 * i], l.data[2 * i + 1]}));
        const bool planes = l.kind != LayerKind::Lines;
        const char *what = l.kind == LayerKind::GreatCircles ? "planes (great circles)"
                           : l.kind == LayerKind::Poles      ? "poles to planes"
                                                             : "lineations";
        out.push_back({l.kind == LayerKind::GreatCircles ? Swatch::Stroke : Swatch::Symbol, c,
                       l.kind == LayerKind::Lines ? Symbol::Triangle : Symbol::Disc,
                       with_label(l, what, axial_stats(v, planes, l.kind == LayerKind::GreatCircles)), 1, {}});
        break;
      }
      case LayerKind::SlipPlanes:
      case LayerKind::SlipPoles:
        out.push_back({Swatch::Arrow, c, Symbol::Disc,
                       with_label(l, l.kind == LayerKind::SlipPlanes ? "faults, arrow: hanging-wall slip"
                                                                     : "faults, poles with hanging-wall slip (Hoeppener)",
                                  "n = " + std::to_string(n)),
                       1, {}});
        break;
      case LayerKind::PTAxes:
        out.push_back({Swatch::Symbol, c, Symbol::Ring, (l.label.empty() ? std::string("P axes") : l.label + ", P") + ": n = " + std::to_string(n), 1, {}});
        out.push_back({Swatch::Symbol, c, Symbol::Square, (l.label.empty() ? std::string("T axes") : l.label + ", T") + ": n = " + std::to_string(n), 1, {}});
        break;
      case LayerKind::Mechanism: {
        const FaultSlip fs = slip_at(l, 0);
        out.push_back({Swatch::Fill, c, Symbol::Disc,
                       with_label(l, "mechanism", fmt_slip(fs) + ", auxiliary " + fmt_slip(auxiliary(fs)) + kDot + "P " +
                                                      fmt_line(p_axis(fs)) + ", T " + fmt_line(t_axis(fs))),
                       1, {}});
        break;
      }
      case LayerKind::PDihedra:
        out.push_back({Swatch::Fill, c, Symbol::Disc,
                       with_label(l, "P dihedra, overlaid", "n = " + std::to_string(n)), 0.35, {}});
        break;
      case LayerKind::Cones:
        for (size_t i = 0; i < n && i < 6; ++i)
          out.push_back({Swatch::Symbol, c, Symbol::Cross,
                         with_label(l, "cone", "axis " + fmt_line(Line{l.data[3 * i], l.data[3 * i + 1]}) + ", half-angle " +
                                                   fmt(l.data[3 * i + 2], 1) + kDegree),
                         1, {}});
        if (n > 6) out.push_back({Swatch::None, c, Symbol::Cross, "... " + std::to_string(n - 6) + " more cones", 1, {}});
        break;
      case LayerKind::Contours: {
        const bool rd = l.params[0] == 2;
        const Line top = grid_extreme(l.data.data(), l.data.size(), l.params[1], true);
        double vmax = l.data[0];
        for (double v : l.data) vmax = std::max(vmax, v);
        const std::string unit = rd ? " %" : "";
        out.push_back({Swatch::None, c, Symbol::Disc,
                       with_label(l, rd ? "right dihedra, % of data with a P dihedron there" : "density, multiples of uniform",
                                  "n = " + fmt(l.params[2], 0) + kDot + "max " + fmt(vmax, rd ? 0 : 1) + unit + " at " + fmt_line(top)),
                       1, {}});
        LegendEntry bar{Swatch::Bar, c, Symbol::Disc, "", 1, {}};
        const std::vector<double> lv = levels_of(l);
        for (size_t k = 0; k < lv.size(); ++k)
          bar.bar.push_back({ramp(0.15 + 0.85 * (k + 1) / lv.size()), std::string(kGeq) + fmt(lv[k], lv[k] == std::floor(lv[k]) ? 0 : 1)});
        if (!lv.empty()) out.push_back(bar);
        break;
      }
      case LayerKind::Stress: {
        const StressTensor t = stress_of(l);
        const PrincipalStress ps = principal_stresses(t);
        const bool cones = t.flags & kStressHasCones;
        const Symbol sym[3] = {Symbol::Star6, Symbol::Star4, Symbol::Star3};
        for (int k = 0; k < 3; ++k) {
          std::string s = std::string(kSigma[k]) + " " + fmt_line(vector_line(ps.axis[k]));
          if (cones) s += std::string(", 95 % cone ") + fmt(t.cone[k], 1) + kDegree;
          if (k == 0 && !l.label.empty()) s = l.label + ": " + s;
          out.push_back({Swatch::Symbol, kSigmaFill[k], sym[k], s, 1, {}});
        }
        // SHmax first: the entry's swatch is the wedge that marks it on the rim.
        const auto sh = shmax_azimuth(t);
        std::string s = sh ? "SHmax " + fmt(*sh, 0) + kDegree + kDot : std::string();
        s += std::string(kPhi) + " = " + fmt(shape_ratio(t), 2);
        if (t.flags & kStressHasPhiInterval) s += " [" + fmt(t.phi_lo, 2) + ", " + fmt(t.phi_hi, 2) + "]";
        if (t.data_count > 0) s += std::string(kDot) + "n = " + std::to_string(t.data_count);
        if (t.flags & kStressHasMisfit) s += std::string(kDot) + "mean misfit " + fmt(t.mean_misfit, 1) + kDegree;
        out.push_back({sh ? Swatch::Wedge : Swatch::None, kInk, Symbol::Disc, s, 1, {}});
        break;
      }
    }
  }
  return out;
}

// Code points of a UTF-8 string.
size_t text_length(const std::string &s) {
  size_t n = 0;
  for (unsigned char c : s) n += (c & 0xC0) != 0x80;
  return n;
}

// Lines longer than max_chars are broken after a " · " separator (or a blank)
// into continuation lines without a swatch.
std::vector<LegendEntry> wrap_legend(const std::vector<LegendEntry> &in, size_t max_chars) {
  std::vector<LegendEntry> out;
  for (const LegendEntry &e : in) {
    if (e.swatch == Swatch::Bar || text_length(e.text) <= max_chars) {
      out.push_back(e);
      continue;
    }
    std::string rest = e.text;
    bool first = true;
    while (!rest.empty()) {
      size_t cut;
      if (text_length(rest) > max_chars) {
        // byte offset of the max_chars-th code point
        size_t limit = 0, chars = 0;
        while (limit < rest.size() && chars < max_chars) {
          ++limit;
          while (limit < rest.size() && (static_cast<unsigned char>(rest[limit]) & 0xC0) == 0x80) ++limit;
          ++chars;
        }
        const std::string sep = kDot;
        size_t at = rest.rfind(sep, limit);
        size_t skip = sep.size();  // the separator is dropped at a break
        if (at == std::string::npos || at == 0) {
          at = rest.rfind(' ', limit);
          skip = 1;
          if (at == std::string::npos || at == 0) {
            at = limit;
            skip = 0;
          }
        }
        cut = at;
        LegendEntry x = e;
        if (!first) x.swatch = Swatch::None;
        x.text = (first ? "" : "   ") + rest.substr(0, cut);
        out.push_back(x);
        rest = rest.substr(cut + skip);
        first = false;
        continue;
      }
      LegendEntry x = e;
      if (!first) x.swatch = Swatch::None;
      x.text = (first ? "" : "   ") + rest;
      out.push_back(x);
      rest.clear();
    }
  }
  return out;
}

double legend_height(const std::vector<LegendEntry> &e, double lh) {
  double h = 0;
  for (const LegendEntry &x : e) h += x.swatch == Swatch::Bar ? 2.1 * lh : lh;
  return h;
}

// ---- symbols ------------------------------------------------------------------------------

// d of a symbol centred at pixel (x, y), size s (about the radius).
void symbol_d(SvgWriter &w, Symbol sym, double x, double y, double s) {
  std::vector<double> pts;
  auto star = [&](int points, double outer, double inner) {
    for (int k = 0; k < 2 * points; ++k) {
      const double a = kPi * k / points - kPi / 2, r = (k % 2 ? inner : outer) * s;
      pts.push_back(x + r * std::cos(a));
      pts.push_back(y + r * std::sin(a));
    }
  };
  switch (sym) {
    case Symbol::Disc:
    case Symbol::Ring:
      w.raw("M").num(x - s).raw(" ").num(y).raw("a").num(s).raw(" ").num(s).raw(" 0 1 0 ").num(2 * s).raw(" 0a").num(s).raw(" ").num(s).raw(" 0 1 0 ").num(-2 * s).raw(" 0z");
      return;
    case Symbol::Triangle:
      pts = {x, y - 1.35 * s, x + 1.2 * s, y + 0.75 * s, x - 1.2 * s, y + 0.75 * s};
      break;
    case Symbol::Square:
      pts = {x - 0.9 * s, y - 0.9 * s, x + 0.9 * s, y - 0.9 * s, x + 0.9 * s, y + 0.9 * s, x - 0.9 * s, y + 0.9 * s};
      break;
    case Symbol::Star6: star(6, 2.7, 1.25); break;
    case Symbol::Star4: star(4, 2.5, 0.95); break;
    case Symbol::Star3: star(3, 2.5, 0.8); break;
    case Symbol::Cross:
      w.raw("M").num(x - 1.4 * s).raw(" ").num(y).raw("h").num(2.8 * s).raw("M").num(x).raw(" ").num(y - 1.4 * s).raw("v").num(2.8 * s);
      return;
  }
  w.polyline_data(pts.data(), pts.size() / 2, true);
}

// An arrow of length len centred at pixel (x, y) pointing along the unit
// pixel direction (dx, dy), with an open head.
void arrow_d(SvgWriter &w, double x, double y, double dx, double dy, double len) {
  const double h = 0.38 * len, ca = std::cos(rad(27)), sa = std::sin(rad(27));
  const double tx = x + dx * len / 2, ty = y + dy * len / 2;
  const double pts[4] = {x - dx * len / 2, y - dy * len / 2, tx, ty};
  w.polyline_data(pts, 2, false);
  const double hx1 = tx - h * (dx * ca - dy * sa), hy1 = ty - h * (dy * ca + dx * sa);
  const double hx2 = tx - h * (dx * ca + dy * sa), hy2 = ty - h * (dy * ca - dx * sa);
  const double head[6] = {hx1, hy1, tx, ty, hx2, hy2};
  w.polyline_data(head, 3, false);
}

// ---- the document ---------------------------------------------------------------------------

int kind_rank(LayerKind k) {
  switch (k) {
    case LayerKind::Contours: return 0;  // filled; contour lines go above the P dihedra (see below)
    case LayerKind::PDihedra: return 1;
    case LayerKind::Mechanism: return 2;
    case LayerKind::Cones: return 3;
    case LayerKind::GreatCircles: return 5;
    case LayerKind::SlipPlanes: return 6;
    case LayerKind::Poles:
    case LayerKind::Lines:
    case LayerKind::SlipPoles:
    case LayerKind::PTAxes: return 8;
    case LayerKind::Stress: return 9;
  }
  return 9;
}

void check_options(const RenderOptions &o) {
  if (o.size < kMinFigureSize || o.size > kMaxFigureSize)
    throw Error(ErrorKind::InvalidParameter, "figure size out of range",
                "The size is the width in pixels, from " + std::to_string(kMinFigureSize) + " to " +
                    std::to_string(kMaxFigureSize) + ".");
  check_label(o.title);
}

NetFrame frame_for(const RenderOptions &o, double legend_lines_height) {
  NetFrame fr;
  fr.width = o.size;
  fr.font = std::clamp(std::round(o.size / 36.0), 9.0, 18.0);
  const double margin = std::max(2.2 * fr.font, 0.06 * o.size);
  const double title = o.title.empty() ? 0.0 : 2.0 * fr.font;
  fr.radius = (o.size - 2 * margin) / 2;
  fr.cx = o.size / 2.0;
  fr.cy = title + margin + fr.radius;
  const double below = fr.cy + fr.radius + 0.8 * margin;
  fr.height = std::ceil(legend_lines_height > 0 ? below + legend_lines_height + 0.6 * fr.font : fr.cy + fr.radius + margin);
  return fr;
}

// Characters that fit on a legend line: DejaVu Sans averages about 0.6 em a
// character in this text (common practice, no source); the legend is set at
// 0.92 of the figure's font size and starts 2.4 em from its left edge.
size_t legend_chars(const RenderOptions &o, double font) {
  const double x0 = std::max(2.2 * font, 0.06 * o.size) * 0.6;
  const double room = o.size - x0 - 2.4 * font - 0.5 * font;
  return static_cast<size_t>(std::max(12.0, room / (0.6 * 0.92 * font)));
}

}  // namespace

NetFrame net_frame(const Figure &f, const RenderOptions &o) {
  check_options(o);
  const NetFrame probe = frame_for(o, 0);
  const double lh = 1.5 * probe.font;
  return frame_for(o, o.legend ? legend_height(wrap_legend(legend_entries(f, layer_colours(f)), legend_chars(o, probe.font)), lh) : 0);
}

std::string render_svg(const Figure &f, const RenderOptions &o) {
  check_options(o);
  check_figure(f);
  const std::vector<std::string> colour = layer_colours(f);
  const std::vector<LegendEntry> legend =
      o.legend ? wrap_legend(legend_entries(f, colour), legend_chars(o, frame_for(o, 0).font)) : std::vector<LegendEntry>{};
  const double lh = 1.5 * frame_for(o, 0).font;
  const NetFrame fr = frame_for(o, legend_height(legend, lh));
  const Projection proj = o.projection;
  const double tol = 0.1 / fr.radius;  // 0.1 px
  const double s = std::max(2.5, o.size / 160.0);  // symbol size
  const double stroke = std::max(0.6, o.size / 600.0);

  SvgWriter w;
  w.cx = fr.cx;
  w.cy = fr.cy;
  w.r = fr.radius;
  w.out.reserve(4096 + figure_items(f) * 160);
  w.raw("<?xml version=\"1.0\" encoding=\"UTF-8\" standalone=\"no\"?>\n");
  w.raw("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"").num(fr.width).raw("\" height=\"").num(fr.height);
  w.raw("\" viewBox=\"0 0 ").num(fr.width).raw(" ").num(fr.height).raw("\" font-family=\"DejaVu Sans, Verdana, Arial, sans-serif\" font-size=\"").num(fr.font).raw("\">\n");
  const std::string pname = proj == Projection::EqualArea ? "equal-area" : "equal-angle";
  w.raw("<title>").text(o.title.empty() ? "Lower-hemisphere " + pname + " net" : o.title).raw("</title>\n");
  w.raw("<desc>").text("Lower-hemisphere " + pname + " projection, north up, " + std::to_string(f.layers.size()) +
                       " layer(s), " + std::to_string(figure_items(f)) + " drawn data. Drawn by striae.");
  w.raw("</desc>\n<defs><clipPath id=\"net-clip\"><circle cx=\"").num(fr.cx).raw("\" cy=\"").num(fr.cy).raw("\" r=\"").num(fr.radius).raw("\"/></clipPath></defs>\n");
  w.raw("<rect width=\"").num(fr.width).raw("\" height=\"").num(fr.height).raw("\" fill=\"#ffffff\"/>\n");

  // Layer order: by kind rank, stable.
  std::vector<size_t> order(f.layers.size());
  for (size_t i = 0; i < order.size(); ++i) order[i] = i;
  auto rank_of = [&](size_t i) {
    const Layer &l = f.layers[i];
    return l.kind == LayerKind::Contours && l.params[3] == 0 ? 2 * kind_rank(LayerKind::PDihedra) + 1 : 2 * kind_rank(l.kind);
  };
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) { return rank_of(a) < rank_of(b); });

  bool frame_done = false, graticule_done = false;
  auto draw_graticule = [&]() {
    graticule_done = true;
    if (!o.graticule) return;
    w.raw("<path id=\"graticule\" fill=\"none\" stroke=\"").raw(kGraticule).raw("\" stroke-width=\"").num(stroke * 0.7).raw("\" d=\"");
    for (int p = 10; p <= 80; p += 10) {
      const double r = project(line_vector(Line{90, static_cast<double>(p)}), proj).x * fr.radius;
      w.raw("M").num(fr.cx - r).raw(" ").num(fr.cy).raw("a").num(r).raw(" ").num(r).raw(" 0 1 0 ").num(2 * r).raw(" 0a").num(r).raw(" ").num(r).raw(" 0 1 0 ").num(-2 * r).raw(" 0");
    }
    const double r80 = project(line_vector(Line{0, 80}), proj).y;
    for (int t = 0; t < 360; t += 10) {
      const double a = rad(t);
      const double pts[4] = {fr.cx + fr.radius * r80 * std::sin(a), fr.cy - fr.radius * r80 * std::cos(a),
                             fr.cx + fr.radius * std::sin(a), fr.cy - fr.radius * std::cos(a)};
      w.polyline_data(pts, 2, false);
    }
    w.raw("\"/>\n");
  };
  auto draw_frame = [&]() {
    frame_done = true;
    w.raw("<g id=\"frame\" fill=\"none\" stroke=\"").raw(kInk).raw("\" stroke-width=\"").num(stroke * 1.4).raw("\">");
    w.raw("<circle id=\"primitive\" cx=\"").num(fr.cx).raw("\" cy=\"").num(fr.cy).raw("\" r=\"").num(fr.radius).raw("\"/>");
    const double tick = 0.45 * fr.font;
    w.raw("<path d=\"");
    w.raw("M").num(fr.cx).raw(" ").num(fr.cy - fr.radius).raw("v").num(-tick);
    w.raw("M").num(fr.cx + fr.radius).raw(" ").num(fr.cy).raw("h").num(tick * 0.6);
    w.raw("M").num(fr.cx).raw(" ").num(fr.cy + fr.radius).raw("v").num(tick * 0.6);
    w.raw("M").num(fr.cx - fr.radius).raw(" ").num(fr.cy).raw("h").num(-tick * 0.6);
    w.raw("M").num(fr.cx - 0.4 * tick).raw(" ").num(fr.cy).raw("h").num(0.8 * tick).raw("M").num(fr.cx).raw(" ").num(fr.cy - 0.4 * tick).raw("v").num(0.8 * tick);
    w.raw("\"/></g>\n<text id=\"north\" x=\"").num(fr.cx).raw("\" y=\"").num(fr.cy - fr.radius - tick - 0.3 * fr.font);
    w.raw("\" text-anchor=\"middle\" font-weight=\"bold\">N</text>\n");
  };

  size_t polled = 0;
  auto poll = [&]() {
    if ((++polled & 255) == 0) poll_interrupts();
  };

  for (size_t oi : order) {
    const Layer &l = f.layers[oi];
    const int rank = kind_rank(l.kind);
    if (!graticule_done && rank >= 5) draw_graticule();
    if (!frame_done && rank >= 8) draw_frame();
    const std::string &c = colour[oi];
    const std::string id = "layer-" + std::to_string(oi + 1);
    const size_t n = l.items();
    switch (l.kind) {
      case LayerKind::GreatCircles:
      case LayerKind::SlipPlanes: {
        w.raw("<g id=\"").raw(id).raw("\" class=\"").raw(layer_kind_name(l.kind)).raw("\" fill=\"none\" stroke=\"").raw(c);
        w.raw("\" stroke-width=\"").num(stroke).raw("\" stroke-linejoin=\"round\">\n");
        const bool slip = l.kind == LayerKind::SlipPlanes;
        for (size_t i = 0; i < n; ++i) {
          poll();
          DiscPath path;
          Vec3 nv, u;
          Plane pl{l.data[2 * i], l.data[2 * i + 1]};
          if (slip) {
            const FaultSlip fs = slip_at(l, i);
            fault_vectors(fs, nv, u);
            pl = Plane{fs.strike, fs.dip};
          }
          append_arc(path, plane_arc(pl), proj, tol, true);
          w.raw("<path d=\"").path_data(path);
          if (slip) {
            // Arrow at the striation (drawn where the slip line meets the
            // lower hemisphere), pointing the way the hanging wall moves in map
            // view: outward for normal slip, inward for reverse slip.
            const XY at = project_axis(u, proj);
            const double hx = u.y(), hy = -u.x(), hl = std::hypot(hx, hy);
            if (hl > 1e-9) arrow_d(w, w.px(at), w.py(at), hx / hl, hy / hl, 5.5 * s);
            else symbol_d(w, Symbol::Ring, w.px(at), w.py(at), 0.8 * s);  // vertical slip: a ring at the centre
          }
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::Poles:
      case LayerKind::Lines: {
        w.raw("<g id=\"").raw(id).raw("\" class=\"").raw(layer_kind_name(l.kind)).raw("\" fill=\"").raw(c);
        w.raw("\" stroke=\"#ffffff\" stroke-width=\"").num(stroke * 0.6).raw("\">\n");
        for (size_t i = 0; i < n; ++i) {
          poll();
          const Vec3 v = l.kind == LayerKind::Poles ? pole_vector(Plane{l.data[2 * i], l.data[2 * i + 1]})
                                                    : line_vector(Line{l.data[2 * i], l.data[2 * i + 1]});
          const XY p = project_axis(v, proj);
          w.raw("<path d=\"");
          symbol_d(w, l.kind == LayerKind::Poles ? Symbol::Disc : Symbol::Triangle, w.px(p), w.py(p), s);
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::SlipPoles: {
        w.raw("<g id=\"").raw(id).raw("\" class=\"slip_poles\" fill=\"none\" stroke=\"").raw(c);
        w.raw("\" stroke-width=\"").num(stroke * 1.3).raw("\" stroke-linecap=\"round\" stroke-linejoin=\"round\">\n");
        for (size_t i = 0; i < n; ++i) {
          poll();
          Vec3 nv, u;
          fault_vectors(slip_at(l, i), nv, u);
          // Hoeppener (1955): the hanging-wall slip u, a tangent of the sphere
          // at the pole -n, drawn there as its image under the projection.
          const Vec3 pole = -nv;
          const XY at = project(pole, proj), d = project_derivative(pole, u, proj);
          const double dl = std::hypot(d.x, d.y);
          w.raw("<path d=\"");
          arrow_d(w, w.px(at), w.py(at), d.x / dl, -d.y / dl, 5.5 * s);
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::PTAxes: {
        for (int pt = 0; pt < 2; ++pt) {
          w.raw("<g id=\"").raw(id).raw(pt == 0 ? "-p\" class=\"p_axes\" fill=\"#ffffff\" stroke=\"" : "-t\" class=\"t_axes\" fill=\"");
          w.raw(c).raw(pt == 0 ? "\" stroke-width=\"" : "\" stroke=\"#ffffff\" stroke-width=\"").num(pt == 0 ? stroke * 1.5 : stroke * 0.6).raw("\">\n");
          for (size_t i = 0; i < n; ++i) {
            poll();
            const FaultSlip fs = slip_at(l, i);
            const XY p = project_axis(line_vector(pt == 0 ? p_axis(fs) : t_axis(fs)), proj);
            w.raw("<path d=\"");
            symbol_d(w, pt == 0 ? Symbol::Ring : Symbol::Square, w.px(p), w.py(p), s);
            w.raw("\"/>\n");
          }
          w.raw("</g>\n");
        }
        break;
      }
      case LayerKind::Mechanism: {
        const FaultSlip fs = slip_at(l, 0);
        Vec3 nv, u;
        fault_vectors(fs, nv, u);
        w.raw("<g id=\"").raw(id).raw("\" class=\"mechanism\">\n");
        w.raw("<circle cx=\"").num(fr.cx).raw("\" cy=\"").num(fr.cy).raw("\" r=\"").num(fr.radius).raw("\" fill=\"#ffffff\"/>\n");
        DiscPath q;
        for (const Ring &r : double_couple_regions(nv, u, true)) append_ring(q, r, proj, tol);
        w.raw("<path class=\"compressional\" fill=\"").raw(c).raw("\" stroke=\"none\" d=\"").path_data(q).raw("\"/>\n");
        DiscPath np;
        append_arc(np, normal_plane_arc(nv), proj, tol, true);
        append_arc(np, normal_plane_arc(u), proj, tol, true);
        w.raw("<path class=\"nodal_planes\" fill=\"none\" stroke=\"").raw(kInk).raw("\" stroke-width=\"").num(stroke * 1.6).raw("\" d=\"").path_data(np).raw("\"/>\n");
        // Letters at the axes, pulled in from the rim so that they stay on
        // their own quadrant's colour.
        auto inward = [](XY p) {
          const double r = std::hypot(p.x, p.y);
          return r > 0.8 ? XY{p.x * 0.8 / r, p.y * 0.8 / r} : p;
        };
        const XY tp = inward(project(line_vector(t_axis(fs)), proj)), pp = inward(project(line_vector(p_axis(fs)), proj));
        w.raw("<text class=\"axis-label\" x=\"").num(w.px(tp)).raw("\" y=\"").num(w.py(tp) + 0.4 * fr.font);
        w.raw("\" text-anchor=\"middle\" font-weight=\"bold\" fill=\"#ffffff\">T</text>\n");
        w.raw("<text class=\"axis-label\" x=\"").num(w.px(pp)).raw("\" y=\"").num(w.py(pp) + 0.4 * fr.font);
        w.raw("\" text-anchor=\"middle\" font-weight=\"bold\" fill=\"").raw(kInk).raw("\">P</text>\n</g>\n");
        break;
      }
      case LayerKind::PDihedra: {
        const double alpha = std::clamp(1.5 / static_cast<double>(n), 0.04, 0.35);
        w.raw("<g id=\"").raw(id).raw("\" class=\"p_dihedra\" fill=\"").raw(c).raw("\" fill-opacity=\"");
        w.raw(fmt(alpha, 3)).raw("\" stroke=\"none\">\n");
        for (size_t i = 0; i < n; ++i) {
          poll();
          Vec3 nv, u;
          fault_vectors(slip_at(l, i), nv, u);
          DiscPath q;
          for (const Ring &r : double_couple_regions(nv, u, false)) append_ring(q, r, proj, tol);
          w.raw("<path d=\"").path_data(q).raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::Cones: {
        w.raw("<g id=\"").raw(id).raw("\" class=\"cones\" fill=\"").raw(c).raw("\" fill-opacity=\"0.18\" stroke=\"").raw(c);
        w.raw("\" stroke-width=\"").num(stroke).raw("\">\n");
        for (size_t i = 0; i < n; ++i) {
          poll();
          const Vec3 a = line_vector(Line{l.data[3 * i], l.data[3 * i + 1]});
          DiscPath q;
          for (const Ring &r : cone_regions(a, rad(l.data[3 * i + 2]))) append_ring(q, r, proj, tol);
          const XY p = project_axis(a, proj);
          w.raw("<path d=\"").path_data(q);
          symbol_d(w, Symbol::Cross, w.px(p), w.py(p), s);
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::Contours: {
        const std::vector<double> lv = levels_of(l);
        const int points = std::clamp(static_cast<int>(2 * fr.radius / 2.5), 80, 400) + 3;
        const std::vector<double> lat = contour_lattice(l.params[1], l.data.data(), l.data.size(), proj, points);
        const bool filled = l.params[3] == 1;
        w.raw("<g id=\"").raw(id).raw("\" class=\"contours\" clip-path=\"url(#net-clip)\" ");
        if (filled) w.raw("fill-rule=\"evenodd\" stroke=\"none\">\n");
        else w.raw("fill=\"none\" stroke-linejoin=\"round\">\n");
        for (size_t k = 0; k < lv.size(); ++k) {
          const std::string band = ramp(0.15 + 0.85 * (k + 1) / lv.size());
          if (filled) w.raw("<path class=\"band\" fill=\"").raw(band).raw("\" d=\"");
          else w.raw("<path class=\"level\" stroke=\"").raw(band).raw("\" stroke-width=\"").num(stroke * (1 + 1.5 * k / lv.size())).raw("\" d=\"");
          for (const std::vector<XY> &loop : contour_loops(lat, points, lv[k])) {
            std::vector<double> px;
            px.reserve(2 * loop.size());
            for (const XY &p : loop) {
              px.push_back(w.px(p));
              px.push_back(w.py(p));
            }
            w.polyline_data(px.data(), loop.size(), true);
          }
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
      case LayerKind::Stress: {
        const StressTensor t = stress_of(l);
        const PrincipalStress ps = principal_stresses(t);
        w.raw("<g id=\"").raw(id).raw("\" class=\"stress\" stroke=\"").raw(kInk).raw("\" stroke-width=\"").num(stroke).raw("\">\n");
        if (t.flags & kStressHasCones) {
          for (int k = 0; k < 3; ++k) {
            if (!(t.cone[k] > 0)) continue;
            DiscPath q;
            for (const Ring &r : cone_regions(ps.axis[k], rad(std::min(t.cone[k], 90.0)))) append_ring(q, r, proj, tol);
            w.raw("<path class=\"cone\" fill=\"").raw(kSigmaFill[k]).raw("\" fill-opacity=\"0.22\" stroke=\"").raw(kSigmaFill[k] == std::string("#F0E442") ? "#B8A800" : kSigmaFill[k]).raw("\" d=\"").path_data(q).raw("\"/>\n");
          }
        }
        const auto sh = shmax_azimuth(t);
        if (sh) {
          // Two wedges outside the primitive pointing at it, at SHmax and
          // SHmax + 180.
          w.raw("<path class=\"shmax\" fill=\"").raw(kInk).raw("\" d=\"");
          for (double az : {*sh, *sh + 180}) {
            const double a = rad(az), sx = std::sin(a), sy = -std::cos(a), ox = -sy, oy = sx;
            const double r0 = fr.radius + stroke, r1 = fr.radius + 4.2 * s;
            const double pts[6] = {fr.cx + r0 * sx, fr.cy + r0 * sy, fr.cx + r1 * sx + 1.3 * s * ox, fr.cy + r1 * sy + 1.3 * s * oy,
                                   fr.cx + r1 * sx - 1.3 * s * ox, fr.cy + r1 * sy - 1.3 * s * oy};
            w.polyline_data(pts, 3, true);
          }
          w.raw("\"/>\n");
        }
        const Symbol sym[3] = {Symbol::Star6, Symbol::Star4, Symbol::Star3};
        for (int k = 2; k >= 0; --k) {
          const XY p = project(line_vector(vector_line(ps.axis[k])), proj);  // a horizontal axis at its canonical trend
          w.raw("<path class=\"sigma").raw(std::to_string(k + 1)).raw("\" fill=\"").raw(kSigmaFill[k]).raw("\" d=\"");
          symbol_d(w, sym[k], w.px(p), w.py(p), s);
          w.raw("\"/>\n");
        }
        w.raw("</g>\n");
        break;
      }
    }
  }
  if (!graticule_done) draw_graticule();
  if (!frame_done) draw_frame();

  if (!o.title.empty()) {
    w.raw("<text id=\"title\" x=\"").num(fr.cx).raw("\" y=\"").num(1.4 * fr.font).raw("\" text-anchor=\"middle\" font-weight=\"bold\" font-size=\"");
    w.num(fr.font * 1.15).raw("\">").text(o.title).raw("</text>\n");
  }

  if (!legend.empty()) {
    const double x0 = std::max(2.2 * fr.font, 0.06 * o.size) * 0.6;
    double y = fr.cy + fr.radius + 0.8 * std::max(2.2 * fr.font, 0.06 * o.size);
    w.raw("<g id=\"legend\" font-size=\"").num(fr.font * 0.92).raw("\">\n");
    for (const LegendEntry &e : legend) {
      const double mid = y + 0.5 * lh, sx = x0 + fr.font;
      switch (e.swatch) {
        case Swatch::None: break;
        case Swatch::Stroke:
          w.raw("<path fill=\"none\" stroke=\"").raw(e.colour).raw("\" stroke-width=\"").num(stroke * 1.5).raw("\" d=\"M").num(sx - 0.8 * fr.font).raw(" ").num(mid).raw("h").num(1.6 * fr.font).raw("\"/>");
          break;
        case Swatch::Symbol:
          w.raw("<path fill=\"").raw(e.symbol == Symbol::Ring ? "#ffffff" : e.colour).raw("\" stroke=\"");
          w.raw(e.symbol == Symbol::Ring || e.symbol == Symbol::Cross ? e.colour : kInk).raw("\" stroke-width=\"").num(stroke).raw("\" d=\"");
          symbol_d(w, e.symbol, sx, mid, e.symbol >= Symbol::Star6 && e.symbol <= Symbol::Star3 ? 0.5 * s : s);
          w.raw("\"/>");
          break;
        case Swatch::Fill:
          w.raw("<rect x=\"").num(sx - 0.7 * fr.font).raw("\" y=\"").num(mid - 0.45 * fr.font).raw("\" width=\"").num(1.4 * fr.font);
          w.raw("\" height=\"").num(0.9 * fr.font).raw("\" fill=\"").raw(e.colour).raw("\" fill-opacity=\"").raw(fmt(e.opacity, 2)).raw("\" stroke=\"").raw(kInk).raw("\" stroke-width=\"").num(stroke * 0.5).raw("\"/>");
          break;
        case Swatch::Arrow:
          w.raw("<path fill=\"none\" stroke=\"").raw(e.colour).raw("\" stroke-width=\"").num(stroke * 1.3).raw("\" d=\"");
          arrow_d(w, sx, mid, 1, 0, 1.6 * fr.font);
          w.raw("\"/>");
          break;
        case Swatch::Wedge: {
          const double pts[6] = {sx, mid + 0.45 * fr.font, sx - 0.4 * fr.font, mid - 0.45 * fr.font, sx + 0.4 * fr.font, mid - 0.45 * fr.font};
          w.raw("<path fill=\"").raw(kInk).raw("\" d=\"");
          w.polyline_data(pts, 3, true);
          w.raw("\"/>");
          break;
        }
        case Swatch::Bar: {
          const double bw = std::min(3.6 * fr.font, (fr.width - 2 * x0) / e.bar.size());
          for (size_t k = 0; k < e.bar.size(); ++k) {
            const double bx = x0 + k * bw;
            w.raw("<rect x=\"").num(bx).raw("\" y=\"").num(y + 0.1 * lh).raw("\" width=\"").num(bw).raw("\" height=\"").num(0.8 * lh);
            w.raw("\" fill=\"").raw(e.bar[k].first).raw("\" stroke=\"").raw(kInk).raw("\" stroke-width=\"").num(stroke * 0.5).raw("\"/>");
            w.raw("<text x=\"").num(bx + 0.15 * fr.font).raw("\" y=\"").num(y + 1.75 * lh).raw("\">").text(e.bar[k].second).raw("</text>");
          }
          w.raw("\n");
          y += 2.1 * lh;
          continue;
        }
      }
      w.raw("<text x=\"").num(x0 + 2.4 * fr.font).raw("\" y=\"").num(mid + 0.35 * fr.font).raw("\">").text(e.text).raw("</text>\n");
      y += lh;
    }
    w.raw("</g>\n");
  }
  w.raw("</svg>\n");
  return std::move(w.out);
}

}  // namespace striae
