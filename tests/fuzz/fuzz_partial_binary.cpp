// The binary input of partial_state (partial_state_recv -> check_partial_binary
// on the message's bytes). Invariants on an accepted value: the text form
// prints and reads back to the same bytes (binary and text input accept the
// same set of values); the header-level description the merges read
// (read_partial_info) agrees with the full check; and the value merges with
// itself under the merge rules.
#include "fuzz.hpp"
#include "partial.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  PartialInfo info;
  try {
    info = check_partial_binary(data, size);
  } catch (const Error &e) {
    FUZZ_CHECK(e.kind == ErrorKind::InvalidBinary, std::string("binary input error of another class: ") + e.what());
    return 0;
  }
  FUZZ_CHECK(partial_pair_valid(info.kind, info.input), "accepted an invalid kind and input");
  FUZZ_CHECK(info.count >= 0, "negative count");
  const PartialInfo head = read_partial_info(data, size, "partial_merge_accum");
  FUZZ_CHECK(head.kind == info.kind && head.count == info.count && head.spacing == info.spacing &&
                 head.seed == info.seed && head.threshold == info.threshold,
             "header-level description differs");
  std::string text(partial_text_size(data, size) + 1, '\0');
  write_partial_text(data, size, text.data());
  text.pop_back();
  std::vector<unsigned char> back;
  try {
    const PartialText t = scan_partial_text(text.c_str());
    back.resize(t.size);
    decode_partial_text(text.c_str(), t, back.data());
  } catch (const Error &e) {
    fuzz::fail("text input rejects a value binary input accepts", e.what() + std::string(" | ") + e.detail);
  }
  FUZZ_CHECK(back.size() == size && std::memcmp(back.data(), data, size) == 0, "text round trip changed the bytes");
  merge_partial_info(info, info, "merge_partial");
  return 0;
}
