// Shared helpers of the libFuzzer harnesses (tests/fuzz/README in DEVELOPERS.md).
// Each harness feeds its input to exactly the src/core functions the SQL
// glue calls, catches striae::Error (the clean rejection the server turns into
// a class-22 error), and checks invariants on what is accepted. Anything else
// (a sanitizer report, an uncaught exception, a failed invariant) aborts, and
// libFuzzer saves the input.
#pragma once

#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <vector>

#include "core.hpp"

namespace fuzz {

// Fail the run with a message (libFuzzer saves the input as a crash).
[[noreturn]] inline void fail(const char *what, const std::string &detail = {}) {
  std::fprintf(stderr, "INVARIANT VIOLATED: %s %s\n", what, detail.c_str());
  std::abort();
}
#define FUZZ_CHECK(cond, detail)                 \
  do {                                           \
    if (!(cond)) ::fuzz::fail(#cond, (detail));  \
  } while (0)

// The input as a NUL-terminated string (the glue hands the parsers a cstring;
// an embedded NUL ends it there, as it would in the server).
inline std::string as_text(const uint8_t *data, size_t size) {
  return std::string(reinterpret_cast<const char *>(data), strnlen(reinterpret_cast<const char *>(data), size));
}

// Shortest round-trip decimal of v, as float8out prints it by default.
inline std::string num(double v) {
  char buf[64];
  auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

inline bool same_bits(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

// Reads fixed-size fields from the input, zeros past its end.
struct Bytes {
  const uint8_t *p;
  size_t n;
  size_t at = 0;
  template <class T>
  T get() {
    T v{};
    unsigned char buf[sizeof(T)] = {0};
    for (size_t i = 0; i < sizeof(T) && at < n; ++i) buf[i] = p[at++];
    std::memcpy(&v, buf, sizeof(T));
    return v;
  }
  // Network byte order, as pq_getmsgint / pq_getmsgfloat8 read it.
  template <class T>
  T get_be() {
    unsigned char buf[sizeof(T)] = {0};
    for (size_t i = 0; i < sizeof(T) && at < n; ++i) buf[sizeof(T) - 1 - i] = p[at++];
    T v;
    std::memcpy(&v, buf, sizeof(T));
    return v;
  }
  bool done() const { return at >= n; }
  size_t left() const { return at < n ? n - at : 0; }
};

}  // namespace fuzz
