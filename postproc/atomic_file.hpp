#pragma once

#include <filesystem>
#include <functional>
#include <ostream>

#include "planner/program/program.hpp"
#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// Writes the file at `path` whole or not at all: `produce` writes into a
/// temporary file beside `path` (same directory, so the rename cannot cross
/// file systems), which is flushed to disk and then renamed over `path`.
/// When `produce` throws, or writing, flushing or renaming fails, the
/// temporary file is removed and any earlier file at `path` is left as it
/// was; the error is rethrown, write failures as tw::InputError naming
/// `path`. The temporary name holds the process id, so two processes writing
/// the same path do not share a temporary file (the last rename wins).
void writeFileAtomically(const std::filesystem::path& path,
                         const std::function<void(std::ostream&)>& produce);

/// writeFileAtomically() with `post_processor.write(program, options, ·)`;
/// options.output_name is set to `path` for messages when it is empty.
void writeProgramFile(const PostProcessor& post_processor, const planner::Program& program,
                      WriteOptions options, const std::filesystem::path& path);

}  // namespace tw::postproc
