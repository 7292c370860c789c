// fault_slip text input (fault_slip_in -> parse_fault_slip), including the
// sense words and letters of the pitch forms. Invariants on an accepted
// literal: the value is canonical, its vectors are unit and orthogonal, and
// its canonical text (strike/dip/rake) parses back to the same bits.
#include "fuzz.hpp"
#include "parse.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string text = fuzz::as_text(data, size);
  FaultSlip f;
  try {
    f = parse_fault_slip(text.c_str());
  } catch (const Error &) {
    return 0;
  }
  FUZZ_CHECK(is_canonical(f), text);
  Vec3 n, u;
  fault_vectors(f, n, u);
  FUZZ_CHECK(std::fabs(n.norm() - 1) < 1e-12 && std::fabs(u.norm() - 1) < 1e-12 && std::fabs(n.dot(u)) < 1e-12,
             text);
  const std::string out = fuzz::num(f.strike) + "/" + fuzz::num(f.dip) + "/" + fuzz::num(f.rake);
  FaultSlip g;
  try {
    g = parse_fault_slip(out.c_str());
  } catch (const Error &e) {
    fuzz::fail("canonical text rejected", out + ": " + e.what());
  }
  FUZZ_CHECK(fuzz::same_bits(f.strike, g.strike) && fuzz::same_bits(f.dip, g.dip) && fuzz::same_bits(f.rake, g.rake),
             text + " -> " + out);
  return 0;
}
