#pragma once

#include <functional>
#include <string>

namespace tw::planner {

/// Told once per finished unit of a long computation (a seam solved, a
/// transit planned) with a few words on what finished, for a progress
/// display. Calls never overlap, even when workers run in parallel; the
/// order of calls may depend on the thread count, the results never do.
using StepCallback = std::function<void(const std::string& finished)>;

}  // namespace tw::planner
