// right_dihedra's serialized state (right_dihedra_deserialize ->
// read_dihedra_header, then read_dihedra_counts into an array of the header's
// node count, as the glue does). Invariants on an accepted state: it
// serializes back to the same bytes; the final percentages lie in [0, 100] and
// form a valid right_dihedra sphere_grid; and the state combined with itself
// is either rejected cleanly or valid.
#include "agg_state.hpp"
#include "state_checks.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  DihedraHeader h;
  std::vector<int64_t> counts;
  try {
    h = read_dihedra_header(data, size, "right_dihedra_deserialize");
    counts.resize(static_cast<size_t>(h.node_count));
    read_dihedra_counts(data, size, h, counts.data(), "right_dihedra_deserialize");
  } catch (const Error &) {
    return 0;
  }
  std::vector<unsigned char> out(dihedra_serial_size(h));
  write_dihedra_state(h, counts.data(), out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  std::vector<double> percent(counts.size());
  if (dihedra_finalise(h, counts.data(), percent.data())) {
    for (double v : percent) FUZZ_CHECK(v >= 0 && v <= 100, "percent " + fuzz::num(v));
    try {
      check_grid(GridKind::RightDihedra, h.spacing, h.data_count, percent.data(), percent.size());
    } catch (const Error &e) {
      fuzz::fail("right_dihedra_final would return an invalid sphere_grid", e.what());
    }
  }
  DihedraHeader ch = h;
  std::vector<int64_t> cc = counts;
  try {
    dihedra_combine(ch, cc.data(), h, counts.data());
  } catch (const Error &) {
    return 0;
  }
  try {
    dihedra_validate(ch, cc.data());
  } catch (const Error &e) {
    fuzz::fail("a valid state combined with itself is invalid", std::string(e.what()) + " | " + e.detail);
  }
  return 0;
}
