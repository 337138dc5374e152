#pragma once

namespace tw::cli {

// The command-line tool's exit codes (see the design notes, §6).
inline constexpr int kExitOk = 0;
inline constexpr int kExitInternalError = 1;
inline constexpr int kExitBadInput = 2;
inline constexpr int kExitInfeasible = 3;

}  // namespace tw::cli
