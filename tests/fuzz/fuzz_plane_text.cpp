// plane text input (plane_in -> parse_plane). Invariants on an accepted
// literal: the value is canonical, and its canonical text (strike/dip,
// shortest round-trip numbers, as plane_out prints) parses back to the same
// bits.
#include "fuzz.hpp"
#include "parse.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string text = fuzz::as_text(data, size);
  Plane p;
  try {
    p = parse_plane(text.c_str());
  } catch (const Error &) {
    return 0;
  }
  FUZZ_CHECK(is_canonical(p), text);
  const std::string out = fuzz::num(p.strike) + "/" + fuzz::num(p.dip);
  Plane q;
  try {
    q = parse_plane(out.c_str());
  } catch (const Error &e) {
    fuzz::fail("canonical text rejected", out + ": " + e.what());
  }
  FUZZ_CHECK(fuzz::same_bits(p.strike, q.strike) && fuzz::same_bits(p.dip, q.dip), text + " -> " + out);
  return 0;
}
