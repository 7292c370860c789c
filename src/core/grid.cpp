// Lower-hemisphere node layout shared by all grids (see grid.hpp).
#include "grid.hpp"

#include <cmath>

namespace striae {

double grid_spacing(double s) {
  // The limits with the same relative slack as the divisor test, so that a
  // spacing that rounds to 45 or 0.5 is the grid of 45 or 0.5.
  if (!std::isfinite(s) || s < kMinGridSpacing * (1 - 1e-9) || s > kMaxGridSpacing * (1 + 1e-9))
    throw Error(ErrorKind::InvalidParameter, "grid spacing must be between 0.5 and 45 degrees",
                "", "Use a spacing that divides 90, e.g. 1, 2, 2.5, 5 or 10.");
  const double rings = 90.0 / s;
  const double k = std::round(rings);
  if (std::fabs(rings - k) > 1e-9)
    throw Error(ErrorKind::InvalidParameter, "grid spacing must divide 90 degrees into whole rings",
                "", "Use a spacing that divides 90, e.g. 1, 2, 2.5, 5 or 10.");
  return 90.0 / k;
}

void check_grid_spacing(double s) {
  if (grid_spacing(s) != s)
    throw Error(ErrorKind::InvalidParameter, "grid spacing is not exactly 90 divided by a whole number",
                "Grids store the spacing 90 / k; " + std::to_string(s) + " is near one but not equal.");
}

namespace {

// Nodes on the ring at plunge index i (plunge = i * s); the horizontal ring is halved.
int ring_size(int i, int rings, double s) {
  if (i == rings) return 1;
  const double p = i * s;
  int m = static_cast<int>(std::lround(360.0 * std::cos(rad(p)) / s));
  if (m < 1) m = 1;
  if (i == 0) m = (m + 1) / 2;  // trends [0,180) only
  return m;
}

template <class F>
void for_each_node(double s, F &&f) {
  s = grid_spacing(s);
  const int rings = static_cast<int>(std::lround(90.0 / s));
  for (int i = 0; i <= rings; ++i) {
    poll_interrupts();  // once a ring (at most 181 rings)
    const int m = ring_size(i, rings, s);
    const double plunge = i == rings ? 90.0 : i * s;
    const double step = (i == 0) ? 180.0 / m : 360.0 / m;
    for (int j = 0; j < m; ++j) f(Line{i == rings ? 0.0 : j * step, plunge});
  }
}

}  // namespace

int grid_node_count(double s) {
  int n = 0;
  for_each_node(s, [&](const Line &) { ++n; });
  return n;
}

std::vector<Line> grid_nodes(double s) {
  std::vector<Line> out;
  for_each_node(s, [&](const Line &l) { out.push_back(l); });
  return out;
}

std::vector<Vec3> grid_node_vectors(double s) {
  std::vector<Vec3> out;
  for_each_node(s, [&](const Line &l) { out.push_back(line_vector(l)); });
  return out;
}

}  // namespace striae

#include <charconv>
#include <cstring>
#include <string>

namespace striae {

void grid_node_lines(double s, Line *out) {
  size_t i = 0;
  for_each_node(s, [&](const Line &l) { out[i++] = l; });
}

const char *grid_kind_name(GridKind k) {
  switch (k) {
    case GridKind::Density: return "density";
    case GridKind::RightDihedra: return "right_dihedra";
  }
  return "unknown";
}

namespace {

[[noreturn]] void grid_syntax(const char *text, const std::string &detail) {
  const std::string t = echo_text(text, 80);
  throw Error(ErrorKind::InvalidText, "invalid input syntax for type sphere_grid: \"" + t + "\"",
              detail,
              "Accepted: {\"kind\": \"density\" or \"right_dihedra\", \"spacing\": S, \"n\": N, "
              "\"values\": [...]}, with one value per grid node, as sphere_grid output prints it.");
}

[[noreturn]] void grid_range(const char *text, const std::string &detail) {
  throw Error(ErrorKind::OutOfRange, "value out of range for type sphere_grid: \"" + echo_text(text, 80) + "\"",
              detail);
}

struct Cursor {
  const char *text;
  size_t i;
  void blanks() {
    while (text[i] == ' ' || text[i] == '\t' || text[i] == '\n' || text[i] == '\r') ++i;
  }
  void expect(const char *tok) {
    blanks();
    const size_t n = std::strlen(tok);
    if (std::strncmp(text + i, tok, n) != 0) grid_syntax(text, std::string("expected ") + tok);
    i += n;
  }
  double number() {
    blanks();
    const char *b = text + i;
    const char *e = b;
    while (*e && std::strchr("+-.0123456789eE", *e)) ++e;
    double v;
    auto r = std::from_chars(*b == '+' ? b + 1 : b, e, v);
    if (e != b && r.ec == std::errc::result_out_of_range && r.ptr == e)
      grid_range(text, "the number " + echo_text(std::string(b, e), 40) + " is beyond the range of float8");
    if (e == b || r.ec != std::errc() || r.ptr != e || !std::isfinite(v))
      grid_syntax(text, "expected a finite number");
    i = static_cast<size_t>(e - text);
    return v;
  }
  // A whole number, read as an integer (no rounding through double).
  int64_t integer() {
    blanks();
    const char *b = text + i;
    const char *e = b;
    while (*e && std::strchr("+-.0123456789eE", *e)) ++e;
    int64_t v;
    auto r = std::from_chars(*b == '+' ? b + 1 : b, e, v);
    if (e != b && r.ec == std::errc::result_out_of_range && r.ptr == e)
      grid_range(text, "n " + echo_text(std::string(b, e), 40) + " is beyond the range of bigint");
    if (e == b || r.ec != std::errc() || r.ptr != e) grid_syntax(text, "n must be a whole number, written as an integer");
    i = static_cast<size_t>(e - text);
    return v;
  }
};

}  // namespace

GridHeader parse_grid_header(const char *text) {
  Cursor c{text, 0};
  GridHeader h{};
  c.expect("{");
  c.expect("\"kind\"");
  c.expect(":");
  c.blanks();
  if (std::strncmp(text + c.i, "\"density\"", 9) == 0) {
    h.kind = GridKind::Density;
    c.i += 9;
  } else if (std::strncmp(text + c.i, "\"right_dihedra\"", 15) == 0) {
    h.kind = GridKind::RightDihedra;
    c.i += 15;
  } else {
    grid_syntax(text, "unknown grid kind");
  }
  c.expect(",");
  c.expect("\"spacing\"");
  c.expect(":");
  h.spacing = c.number();
  c.expect(",");
  c.expect("\"n\"");
  c.expect(":");
  h.n = c.integer();  // range checked by check_grid, as for binary input
  c.expect(",");
  c.expect("\"values\"");
  c.expect(":");
  c.expect("[");
  h.values_at = c.i;
  h.spacing = grid_spacing(h.spacing);
  return h;
}

void parse_grid_values(const char *text, size_t at, double *out, size_t count) {
  Cursor c{text, at};
  for (size_t k = 0; k < count; ++k) {
    if ((k & 4095) == 4095) poll_interrupts();
    if (k) {
      c.blanks();
      if (text[c.i] == ']')
        grid_syntax(text, "only " + std::to_string(k) + " values for a grid of " +
                              std::to_string(count) + " nodes");
      c.expect(",");
    }
    out[k] = c.number();
  }
  c.blanks();
  if (text[c.i] == ',')
    grid_syntax(text, "more values than the " + std::to_string(count) + " nodes of the grid");
  c.expect("]");
  c.expect("}");
  c.blanks();
  if (text[c.i] != '\0') grid_syntax(text, "unexpected text after the grid");
}

void check_grid(GridKind kind, double spacing, int64_t n, const double *values, size_t count) {
  if (kind != GridKind::Density && kind != GridKind::RightDihedra)
    throw Error(ErrorKind::DataError, "unknown sphere_grid kind");
  check_grid_spacing(spacing);
  if (count != static_cast<size_t>(grid_node_count(spacing)))
    throw Error(ErrorKind::DataError, "sphere_grid has " + std::to_string(count) +
                                          " values, but its spacing needs " +
                                          std::to_string(grid_node_count(spacing)));
  // The bounds text input accepts (parse_grid_header): binary input must not
  // accept a value that a dump could not restore (found by fuzzing).
  if (n < 1 || n > (int64_t(1) << 53))
    throw Error(ErrorKind::OutOfRange, "sphere_grid data count " + std::to_string(n) + " is out of range",
                "Accepted: 1 to 2^53 (9007199254740992), the most data a grid aggregate counts.");
  for (size_t k = 0; k < count; ++k) {
    const double v = values[k];
    const bool ok = std::isfinite(v) && v >= 0 && (kind != GridKind::RightDihedra || v <= 100);
    if (!ok)
      throw Error(ErrorKind::OutOfRange, "sphere_grid value out of range",
                  kind == GridKind::RightDihedra ? "Right-dihedra values are percentages, 0 to 100."
                                                 : "Density values are finite and not negative.");
  }
}

}  // namespace striae
