// The text input of partial_state (partial_state_in -> scan_partial_text, then
// decode_partial_text into a value of the scanned size, as the glue does).
// Invariants on an accepted text: it is the one text of its value (printing
// the value gives the input back, byte for byte: strict base64, one label per
// kind and input); the binary input accepts the same value with the same
// description (text and binary accept the same set of values); and the value
// merges with itself under the merge rules, its count doubling.
#include "fuzz.hpp"
#include "partial.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string s = fuzz::as_text(data, size);
  std::vector<unsigned char> v;
  PartialInfo info;
  try {
    const PartialText t = scan_partial_text(s.c_str());
    FUZZ_CHECK(t.size > kPartialHeader, "scanned size without a state");  // short states fail in decode
    v.resize(t.size);
    info = decode_partial_text(s.c_str(), t, v.data());
  } catch (const Error &e) {
    FUZZ_CHECK(e.kind == ErrorKind::InvalidText, std::string("text input error of another class: ") + e.what());
    return 0;
  }
  std::string back(partial_text_size(v.data(), v.size()) + 1, '\0');
  write_partial_text(v.data(), v.size(), back.data());
  back.pop_back();
  FUZZ_CHECK(back == s, "accepted text does not print back the same: " + back.substr(0, 80));
  PartialInfo bin;
  try {
    bin = check_partial_binary(v.data(), v.size());
  } catch (const Error &e) {
    fuzz::fail("binary input rejects a value text input accepts", e.what() + std::string(" | ") + e.detail);
  }
  FUZZ_CHECK(bin.kind == info.kind && bin.input == info.input && bin.count == info.count, "descriptions differ");
  const PartialInfo twice = merge_partial_info(info, info, "merge_partial");
  FUZZ_CHECK(twice.count == 2 * info.count, "merged count");
  return 0;
}
