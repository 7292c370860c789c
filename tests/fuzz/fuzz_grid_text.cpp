// sphere_grid text input (sphere_grid_in -> parse_grid_header,
// grid_node_count, parse_grid_values, check_grid, in that order, as the glue
// calls them). Invariant on an accepted literal: the text sphere_grid_out
// prints for it is accepted and gives the same grid, bit for bit.
#include "fuzz.hpp"
#include "grid.hpp"

using namespace striae;

namespace {

struct Grid {
  GridHeader h;
  std::vector<double> values;
};

Grid read(const char *s) {
  Grid g;
  g.h = parse_grid_header(s);
  const int count = grid_node_count(g.h.spacing);
  g.values.resize(static_cast<size_t>(count));
  parse_grid_values(s, g.h.values_at, g.values.data(), g.values.size());
  check_grid(g.h.kind, g.h.spacing, g.h.n, g.values.data(), g.values.size());
  return g;
}

// As sphere_grid_out (src/pg/grid.cpp) prints it.
std::string print(const Grid &g) {
  std::string s = std::string("{\"kind\": \"") + grid_kind_name(g.h.kind) + "\", \"spacing\": " +
                  fuzz::num(g.h.spacing) + ", \"n\": " + std::to_string(g.h.n) + ", \"values\": [";
  for (size_t k = 0; k < g.values.size(); ++k) s += (k ? ", " : "") + fuzz::num(g.values[k]);
  return s + "]}";
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string text = fuzz::as_text(data, size);
  Grid g;
  try {
    g = read(text.c_str());
  } catch (const Error &) {
    return 0;
  }
  const std::string out = print(g);
  Grid r;
  try {
    r = read(out.c_str());
  } catch (const Error &e) {
    fuzz::fail("printed text rejected", out.substr(0, 200) + ": " + e.what());
  }
  FUZZ_CHECK(r.h.kind == g.h.kind && fuzz::same_bits(r.h.spacing, g.h.spacing) && r.h.n == g.h.n &&
                 r.values.size() == g.values.size() &&
                 std::memcmp(r.values.data(), g.values.data(), sizeof(double) * g.values.size()) == 0,
             text.substr(0, 200));
  return 0;
}
