// right_dihedra's serialized state (right_dihedra_deserialize ->
// read_dihedra_header, then read_dihedra_counts into an array of the header's
// node count, as the glue does). Invariants on an accepted state: it
// serializes back to the same bytes; the final percentages lie in [0, 100] and
// form a valid right_dihedra sphere_grid; and the state combined with itself
// is either rejected cleanly or valid. Rows added to it through the block of
// the transition function (dihedra_push, then the flush that serialize does)
// count exactly as dihedra_add counts them one by one, and the flushed state
// serializes and reads back.
#include "agg_state.hpp"
#include "kernels.hpp"
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
  {
    // Up to 150 rows (two full blocks and a part) from the input's bytes as
    // whole-degree-ish angles, many of them on nodal planes through nodes.
    const std::vector<double> nodes = dihedra_node_table(h.spacing);
    DihedraHeader hb = h, ha = h;
    std::vector<int64_t> cb = counts, ca = counts;
    DihedraBlock block;
    std::memset(&block, 0, sizeof block);
    for (size_t i = 0; i + 2 < size && i < 450; i += 3) {
      const SlipDatum d = slip_datum(FaultSlip{data[i] * 360.0 / 256, 1 + data[i + 1] * 89.0 / 256,
                                               data[i + 2] * 360.0 / 256 - 180});
      dihedra_push(hb, cb.data(), nodes.data(), block, d.n, d.u);
      dihedra_add(ha, ca.data(), nodes.data(), d.n, d.u);
    }
    dihedra_flush(hb, cb.data(), nodes.data(), block);
    FUZZ_CHECK(hb.data_count == ha.data_count && cb == ca, "blocked counts differ from row-by-row counts");
    // Rows past the 2^53 limit (a fuzzed count just below it; no server gets
    // there) make a state that serialize rightly refuses; otherwise it must
    // serialize and read back.
    if (hb.data_count <= kMaxDihedraData) {
      std::vector<unsigned char> bytes(dihedra_serial_size(hb));
      try {
        write_dihedra_state(hb, cb.data(), bytes.data());
        const DihedraHeader rh = read_dihedra_header(bytes.data(), bytes.size(), "right_dihedra_deserialize");
        std::vector<int64_t> rc(static_cast<size_t>(rh.node_count));
        read_dihedra_counts(bytes.data(), bytes.size(), rh, rc.data(), "right_dihedra_deserialize");
        FUZZ_CHECK(rc == cb, "flushed state reads back different counts");
      } catch (const Error &e) {
        fuzz::fail("flushed state does not serialize and read back", std::string(e.what()) + " | " + e.detail);
      }
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
