// striae core: shared definitions for the pure C++17 + Eigen layer.
// Nothing under src/core may include a PostgreSQL header; the guard below makes
// that a compile-time error (postgres.h defines PG_VERSION_NUM via pg_config.h).
#pragma once

#ifdef PG_VERSION_NUM
#error "src/core must not include PostgreSQL headers"
#endif

#include <Eigen/Dense>
#include <stdexcept>
#include <string>

namespace striae {

using Vec3 = Eigen::Vector3d;
using Mat3 = Eigen::Matrix3d;

// Error classes the glue maps onto SQLSTATEs (DESIGN.md: class 22 for bad data).
enum class ErrorKind {
  InvalidText,       // 22P02 invalid_text_representation
  OutOfRange,        // 22003 numeric_value_out_of_range
  InvalidParameter,  // 22023 invalid_parameter_value
  DataError,         // 22000 data_exception
  BadState,          // 22000 too, for a malformed aggregate state handed in from SQL
  InvalidBinary,     // 22P03 invalid_binary_representation (binary input of a value)
};

// The one exception type src/core throws on purpose. message is the primary
// line; detail and hint may be empty.
struct Error : std::runtime_error {
  ErrorKind kind;
  std::string detail;
  std::string hint;
  Error(ErrorKind k, const std::string &msg, std::string det = {}, std::string hnt = {})
      : std::runtime_error(msg), kind(k), detail(std::move(det)), hint(std::move(hnt)) {}
};

// Cancellation (DESIGN.md, "Interrupts"). Every loop whose length depends on
// the data or the parameters calls poll_interrupts() about every 10 ms of work
// or more often. The glue sets interrupt_hook to a function that reads the
// server's pending-interrupt flags (it never raises an error itself); when it
// says stop, poll_interrupts throws Cancelled, which unwinds the C++ frames
// normally and which the glue's guard turns into the server's own cancel or
// timeout error after leaving its catch block. Cancelled is deliberately not a
// std::exception, so no catch (const std::exception &) in src/core swallows it.
// Outside the server (unit tests) the hook is null unless a test sets it.
struct Cancelled {};
using InterruptHook = bool (*)();
extern InterruptHook interrupt_hook;
inline void poll_interrupts() {
  if (interrupt_hook != nullptr && interrupt_hook()) throw Cancelled{};
}
// In a loop over the data whose iterations each take well under a
// microsecond: polls on every 65,536th iteration (i counting from 0), a few
// milliseconds of work at most.
constexpr size_t kPollMask = 0xffff;
inline void poll_every(size_t i) {
  if ((i & kPollMask) == kPollMask) poll_interrupts();
}

// Echoing user text in error messages (DEVELOPERS.md, "Errors"). A message
// quotes at most kEchoBytes of any argument, cut before a character that would
// not fit whole and marked "..." when cut; a single offending character is
// quoted whole. Text is taken as UTF-8 where its bytes form valid UTF-8
// sequences and byte by byte elsewhere (a single-byte server encoding); the
// glue's guard makes the final message valid in the database encoding.
constexpr size_t kEchoBytes = 200;
// s cut to at most max_bytes at a character boundary, "..." appended when cut.
std::string echo_text(const char *s, size_t max_bytes = kEchoBytes);
inline std::string echo_text(const std::string &s, size_t max_bytes = kEchoBytes) {
  return echo_text(s.c_str(), max_bytes);
}
// Length of the character at p (p < end): its UTF-8 sequence when valid, else 1.
size_t char_length(const char *p, const char *end);
// The character at p, whole.
inline std::string char_at(const char *p, const char *end) { return std::string(p, char_length(p, end)); }

constexpr double kPi = 3.14159265358979323846;
constexpr double kDeg = kPi / 180.0;  // degrees -> radians

// Per-row code that must be inlined into the transition functions: measured
// in the server, a row's cost there is its latency, and calls (with vectors
// passed through memory) add to it.
#define STRIAE_HOT inline __attribute__((always_inline))

inline double rad(double deg) { return deg * kDeg; }
inline double deg(double r) { return r / kDeg; }

}  // namespace striae
