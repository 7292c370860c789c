// Invariants shared by the aggregate-state harnesses: what the final
// functions make of an accepted state must be a value the SQL types accept.
#pragma once

#include "fuzz.hpp"
#include "stress.hpp"

namespace fuzz {

// A tensor a final function returns must pass the check every function that
// takes a stress_tensor applies (else the server would store a value that its
// own input functions reject).
inline void check_result_tensor(const striae::StressTensor &t, const char *where) {
  try {
    striae::check_stress_tensor(t);
  } catch (const striae::Error &e) {
    fail(where, std::string("returned an invalid stress_tensor: ") + e.what());
  }
}

}  // namespace fuzz
