#include <catch2/catch.hpp>
#include <filesystem>
#include <stdexcept>

#include "kinematics/common/input_error.hpp"
#include "postproc/atomic_file.hpp"
#include "postproc/motion_text/motion_text_post_processor.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;
namespace fs = std::filesystem;

namespace {

fs::path freshDirectory(const std::string& name) {
  const fs::path directory = fs::path(TW_TEST_OUTPUT_DIR) / name;
  fs::remove_all(directory);
  fs::create_directories(directory);
  return directory;
}

std::size_t fileCount(const fs::path& directory) {
  return static_cast<std::size_t>(
      std::distance(fs::directory_iterator(directory), fs::directory_iterator()));
}

}  // namespace

TEST_CASE("An atomic write replaces the file only when it succeeds", "[atomic]") {
  const fs::path directory = freshDirectory("atomic_write");
  const fs::path path = directory / "program.twm";
  test::writeWholeFile(path.string(), "earlier program\n");

  SECTION("a successful write replaces the content and leaves no temporary file") {
    writeFileAtomically(path, [](std::ostream& out) { out << "new program\n"; });
    CHECK(test::readWholeFile(path.string()) == "new program\n");
    CHECK(fileCount(directory) == 1);
  }
  SECTION("a writer failing half way leaves the earlier file untouched") {
    CHECK_THROWS_WITH(writeFileAtomically(path,
                                          [](std::ostream& out) {
                                            out << "half a progr";
                                            throw std::runtime_error("writer failed");
                                          }),
                      "writer failed");
    CHECK(test::readWholeFile(path.string()) == "earlier program\n");
    CHECK(fileCount(directory) == 1);
  }
  SECTION("a refused program leaves the earlier file untouched") {
    tw::planner::Program broken = test::sampleProgram();
    broken.records.pop_back();
    broken.records.erase(broken.records.begin() + 5);  // the arc stays on
    CHECK_THROWS_AS(writeProgramFile(MotionTextPostProcessor(), broken, WriteOptions{}, path),
                    tw::InputError);
    CHECK(test::readWholeFile(path.string()) == "earlier program\n");
    CHECK(fileCount(directory) == 1);
  }
  SECTION("a rename that fails leaves the directory in its place") {
    const fs::path occupied = directory / "occupied";
    fs::create_directories(occupied / "inside");
    CHECK_THROWS_AS(writeFileAtomically(occupied, [](std::ostream& out) { out << "x"; }),
                    tw::InputError);
    CHECK(fs::is_directory(occupied / "inside"));
    CHECK(fileCount(directory) == 2);
  }
}

TEST_CASE("An atomic write into a missing directory is a clear error", "[atomic]") {
  const fs::path directory = freshDirectory("atomic_missing");
  const fs::path path = directory / "no_such_folder" / "program.twm";
  CHECK_THROWS_WITH(writeFileAtomically(path, [](std::ostream& out) { out << "x"; }),
                    Catch::Contains("cannot create the temporary file"));
  CHECK_FALSE(fs::exists(path));
}

TEST_CASE("writeProgramFile writes what the post-processor writes", "[atomic]") {
  const fs::path path = freshDirectory("atomic_program") / "sample.twm";
  writeProgramFile(MotionTextPostProcessor(), test::sampleProgram(), WriteOptions{}, path);
  CHECK(test::readWholeFile(path.string()) == test::readDataFile("sample_program.twm"));
}
