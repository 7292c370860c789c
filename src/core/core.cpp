// Definitions shared by the whole core (core.hpp).
#include "core.hpp"

#include <cstring>

namespace striae {

// Set by the glue when the library is loaded; null in unit tests.
InterruptHook interrupt_hook = nullptr;

size_t char_length(const char *p, const char *end) {
  const unsigned char c = static_cast<unsigned char>(*p);
  size_t n;
  unsigned lo = 0x80, hi = 0xBF;  // allowed range of the second byte (RFC 3629)
  if (c < 0x80) return 1;
  if (c >= 0xC2 && c <= 0xDF) n = 2;
  else if (c >= 0xE0 && c <= 0xEF) {
    n = 3;
    if (c == 0xE0) lo = 0xA0;
    if (c == 0xED) hi = 0x9F;  // no surrogates
  } else if (c >= 0xF0 && c <= 0xF4) {
    n = 4;
    if (c == 0xF0) lo = 0x90;
    if (c == 0xF4) hi = 0x8F;
  } else {
    return 1;
  }
  if (static_cast<size_t>(end - p) < n) return 1;
  for (size_t k = 1; k < n; ++k) {
    const unsigned char b = static_cast<unsigned char>(p[k]);
    if (k == 1 ? (b < lo || b > hi) : (b & 0xC0) != 0x80) return 1;
  }
  return n;
}

std::string echo_text(const char *s, size_t max_bytes) {
  const size_t len = std::strlen(s);
  if (len <= max_bytes) return std::string(s, len);
  const char *end = s + len;
  size_t k = 0;
  for (;;) {
    const size_t n = char_length(s + k, end);
    if (k + n > max_bytes) break;
    k += n;
  }
  return std::string(s, k) + "...";
}

}  // namespace striae
