#include "postproc/atomic_file.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <fstream>
#include <system_error>

#include "kinematics/common/input_error.hpp"

namespace tw::postproc {
namespace {

std::filesystem::path temporaryPath(const std::filesystem::path& path) {
  std::filesystem::path temporary = path;
  temporary.replace_filename("." + path.filename().string() + ".partial-" +
                             std::to_string(::getpid()));
  return temporary;
}

// The rename is only as good as the data behind it: without fsync a crash
// shortly after could leave the new name pointing at an empty file.
bool syncToDisk(const std::filesystem::path& path) {
  const int fd = ::open(path.c_str(), O_RDONLY);
  if (fd < 0) return false;
  const bool synced = ::fsync(fd) == 0;
  return ::close(fd) == 0 && synced;
}

}  // namespace

void writeFileAtomically(const std::filesystem::path& path,
                         const std::function<void(std::ostream&)>& produce) {
  const std::filesystem::path temporary = temporaryPath(path);
  const auto discard = [&] {
    std::error_code ignored;
    std::filesystem::remove(temporary, ignored);
  };
  try {
    std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
    if (!out) {
      throw InputError(path.string(), 0,
                       "cannot create the temporary file " + temporary.string() +
                           " to write this output (does the directory exist and is it writable?)");
    }
    produce(out);
    out.flush();
    out.close();
    if (!out || !syncToDisk(temporary)) {
      throw InputError(path.string(), 0, "writing the output failed (disk full?); the earlier "
                                         "file, if any, is unchanged");
    }
    std::error_code error;
    std::filesystem::rename(temporary, path, error);
    if (error) {
      throw InputError(path.string(), 0, "cannot replace the output file: " + error.message() +
                                             "; the earlier file, if any, is unchanged");
    }
  } catch (...) {
    discard();
    throw;
  }
}

void writeProgramFile(const PostProcessor& post_processor, const planner::Program& program,
                      WriteOptions options, const std::filesystem::path& path) {
  if (options.output_name.empty()) options.output_name = path.string();
  writeFileAtomically(path, [&](std::ostream& out) { post_processor.write(program, options, out); });
}

}  // namespace tw::postproc
