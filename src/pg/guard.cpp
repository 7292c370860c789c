// Exception guard: maps src/core errors onto SQLSTATEs (DESIGN.md, "Errors").
#include "guard.hpp"

#include <exception>

namespace striae_pg {

namespace {

void copy(char *dst, size_t cap, const char *src) noexcept {
  size_t n = std::strlen(src);
  if (n >= cap) n = cap - 1;
  std::memcpy(dst, src, n);
  dst[n] = '\0';
}

int sqlstate_of(striae::ErrorKind k) noexcept {
  switch (k) {
    case striae::ErrorKind::InvalidText: return ERRCODE_INVALID_TEXT_REPRESENTATION;
    case striae::ErrorKind::OutOfRange: return ERRCODE_NUMERIC_VALUE_OUT_OF_RANGE;
    case striae::ErrorKind::InvalidParameter: return ERRCODE_INVALID_PARAMETER_VALUE;
    case striae::ErrorKind::DataError: return ERRCODE_DATA_EXCEPTION;
    case striae::ErrorKind::BadState: return ERRCODE_DATA_EXCEPTION;
    case striae::ErrorKind::InvalidBinary: return ERRCODE_INVALID_BINARY_REPRESENTATION;
  }
  return ERRCODE_DATA_EXCEPTION;
}

// Make s valid in the database encoding, in place: the core quotes whole
// UTF-8 characters and copy() above cuts at a byte count, so a message may end
// in part of a character, or (in a database of another multi-byte encoding)
// hold a byte sequence that is not a character there. Each byte that does not
// start a valid character becomes '?', and a character cut at the end goes.
// Without this a client in another encoding gets 22021 (character not in
// repertoire) instead of the error. pg_encoding_verifymbchar never raises.
void make_valid(char *s) {
  const int enc = GetDatabaseEncoding();
  size_t len = std::strlen(s);
  for (size_t i = 0; i < len;) {
    const int n = pg_encoding_verifymbchar(enc, s + i, static_cast<int>(len - i));
    if (n > 0) {
      i += static_cast<size_t>(n);
      continue;
    }
    // Not a whole character here: an incomplete one at the very end is cut,
    // anything else is replaced byte by byte.
    const int want = pg_encoding_mblen_bounded(enc, s + i);
    if (want > 1 && i + static_cast<size_t>(want) > len) {
      s[i] = '\0';
      len = i;
      break;
    }
    s[i++] = '?';
  }
}

}  // namespace

void capture_current(Failure &f) noexcept {
  f.detail[0] = f.hint[0] = '\0';
  try {
    throw;
  } catch (const striae::Cancelled &) {
    f.sqlstate = kCancelledState;
    copy(f.message, sizeof f.message, "canceling statement due to user request");
  } catch (const striae::Error &e) {
    f.sqlstate = sqlstate_of(e.kind);
    copy(f.message, sizeof f.message, e.what());
    copy(f.detail, sizeof f.detail, e.detail.c_str());
    copy(f.hint, sizeof f.hint, e.hint.c_str());
  } catch (const std::bad_alloc &) {
    f.sqlstate = ERRCODE_OUT_OF_MEMORY;
    copy(f.message, sizeof f.message, "out of memory");
  } catch (const std::exception &e) {
    f.sqlstate = ERRCODE_INTERNAL_ERROR;
    copy(f.message, sizeof f.message, "striae internal error: ");
    size_t n = std::strlen(f.message);
    copy(f.message + n, sizeof f.message - n, e.what());
  } catch (...) {
    f.sqlstate = ERRCODE_INTERNAL_ERROR;
    copy(f.message, sizeof f.message, "striae internal error: unknown exception");
  }
}

bool interrupt_pending() {
  // Only the interrupts that end the statement (cancel, statement_timeout,
  // terminate), and only where the server would act on them now.
  return InterruptPending && (QueryCancelPending || ProcDiePending) && INTERRUPTS_CAN_BE_PROCESSED();
}

void raise(const Failure &f0) {
  Failure f = f0;
  make_valid(f.message);
  make_valid(f.detail);
  make_valid(f.hint);
  if (f.sqlstate == kCancelledState) {
    // The core stopped because the hook saw a pending cancel or terminate:
    // let the server report it as it always does (statement timeout, user
    // request, termination). Should it not raise, the statement still ends.
    CHECK_FOR_INTERRUPTS();
    ereport(ERROR, (errcode(ERRCODE_QUERY_CANCELED), errmsg("%s", f.message)));
  }
  ereport(ERROR, (errcode(f.sqlstate), errmsg("%s", f.message),
                  f.detail[0] ? errdetail("%s", f.detail) : 0,
                  f.hint[0] ? errhint("%s", f.hint) : 0));
  pg_unreachable();
}

}  // namespace striae_pg
