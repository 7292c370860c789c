// The exception guard every SQL entry point uses (STYLE.md, "Meeting
// PostgreSQL from C++"). The body runs inside try; whatever it throws is copied
// into a plain buffer, the catch block is left, and only then is ereport called,
// so no longjmp ever crosses a C++ frame that owns something. Bodies call only
// pure C++ (src/core) and must not call PostgreSQL routines that can error;
// do detoasting and palloc outside the guard.
#pragma once

#include "pg.hpp"

namespace striae_pg {

// Failure::sqlstate of a computation stopped by the cancellation hook.
constexpr int kCancelledState = -1;

// The cancellation hook the glue gives src/core (core.hpp): true when a
// cancel, statement timeout or terminate request is pending and may be
// processed. Reads flags only; never raises.
bool interrupt_pending();

struct Failure {
  int sqlstate = 0;
  char message[1024];
  char detail[1024];
  char hint[512];
};

// Copy a caught exception into f. Never throws.
void capture_current(Failure &f) noexcept;

// Raise f as a PostgreSQL ERROR. Does not return.
[[noreturn]] void raise(const Failure &f);

template <class F>
STRIAE_HOT auto guarded(F &&body) -> decltype(body()) {
  Failure failure;
  failure.sqlstate = 0;
  {
    try {
      return body();
    } catch (...) {
      capture_current(failure);
    }
  }
  raise(failure);
}

}  // namespace striae_pg
