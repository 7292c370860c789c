// lineation text input (lineation_in -> parse_line). Invariants on an
// accepted literal: the value is canonical, and its canonical text
// (trend/plunge, shortest round-trip numbers) parses back to the same bits.
#include "fuzz.hpp"
#include "parse.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string text = fuzz::as_text(data, size);
  Line l;
  try {
    l = parse_line(text.c_str());
  } catch (const Error &) {
    return 0;
  }
  FUZZ_CHECK(is_canonical(l), text);
  const std::string out = fuzz::num(l.trend) + "/" + fuzz::num(l.plunge);
  Line m;
  try {
    m = parse_line(out.c_str());
  } catch (const Error &e) {
    fuzz::fail("canonical text rejected", out + ": " + e.what());
  }
  FUZZ_CHECK(fuzz::same_bits(l.trend, m.trend) && fuzz::same_bits(l.plunge, m.plunge), text + " -> " + out);
  return 0;
}
