// density_grid's serialized state (density_deserialize -> read_density_header,
// then read_density_bins into arrays the size the header gives, as the glue
// does). Invariants on an accepted state: it serializes back to the same
// bytes; for small states the density grid is finite and not negative and its
// maximum axis canonical; and the state merged with itself (density_combine)
// is either rejected cleanly or a valid list.
#include "agg_state.hpp"
#include "density.hpp"
#include "state_checks.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  DensitySerial h;
  std::vector<uint32_t> ids;
  std::vector<uint64_t> counts;
  try {
    h = read_density_header(data, size, "density_deserialize");
    ids.resize(static_cast<size_t>(h.m));
    counts.resize(static_cast<size_t>(h.m));
    read_density_bins(data, size, h, ids.data(), counts.data(), "density_deserialize");
  } catch (const Error &) {
    return 0;
  }
  const size_t m = ids.size();
  std::vector<unsigned char> out(density_serial_size(m));
  write_density_state(h.spacing, ids.data(), counts.data(), m, out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  // density_final (bounded cost: few bins, a coarse grid).
  if (m > 0 && m <= 64 && h.spacing >= 5) {
    std::vector<double> values(static_cast<size_t>(grid_node_count(h.spacing)));
    try {
      density_values(ids.data(), counts.data(), m, h.spacing, values.data());
      for (double v : values) FUZZ_CHECK(std::isfinite(v) && v >= 0, "density value " + fuzz::num(v));
      const Line mx = grid_extreme(values.data(), values.size(), h.spacing, true);
      FUZZ_CHECK(is_canonical(mx), "grid maximum");
    } catch (const Error &) {
    }
  }
  std::vector<uint32_t> mi(2 * m);
  std::vector<uint64_t> mc(2 * m);
  size_t mm;
  try {
    mm = merge_bins(ids.data(), counts.data(), m, ids.data(), counts.data(), m, mi.data(), mc.data());
  } catch (const Error &) {
    return 0;
  }
  try {
    validate_bins(mi.data(), mc.data(), mm);
  } catch (const Error &e) {
    fuzz::fail("a valid state merged with itself is invalid", std::string(e.what()) + " | " + e.detail);
  }
  return 0;
}
