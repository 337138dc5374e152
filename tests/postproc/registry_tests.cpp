#include <catch2/catch.hpp>
#include <memory>
#include <sstream>
#include <variant>

#include "kinematics/common/input_error.hpp"
#include "postproc/post_processor_registry.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;

namespace {

class NamedPostProcessor : public PostProcessor {
 public:
  explicit NamedPostProcessor(std::string name) : name_(std::move(name)) {}
  std::string name() const override { return name_; }
  std::string description() const override { return "test double"; }
  std::string fileExtension() const override { return "txt"; }
  void write(const tw::planner::Program&, const WriteOptions&, std::ostream& out) const override {
    out << name_;
  }

 private:
  std::string name_;
};

}  // namespace

TEST_CASE("The registry rejects duplicate names and names the known ones", "[registry]") {
  PostProcessorRegistry registry;
  registerBuiltInPostProcessors(registry);
  REQUIRE_FALSE(registry.empty());
  REQUIRE(registry.contains("motion-text"));

  SECTION("a duplicate name is an error") {
    CHECK_THROWS_WITH(registry.add(std::make_unique<NamedPostProcessor>("motion-text")),
                      Catch::Contains("'motion-text' is registered twice"));
  }
  SECTION("an unknown name is an error listing the known names") {
    CHECK_THROWS_WITH(registry.get("no-such-writer"),
                      Catch::Contains("unknown post-processor 'no-such-writer'") &&
                          Catch::Contains("motion-text"));
  }
  SECTION("a new post-processor is found by its name") {
    registry.add(std::make_unique<NamedPostProcessor>("plain-list"));
    std::ostringstream out;
    registry.get("plain-list").write(test::sampleProgram(), WriteOptions{}, out);
    CHECK(out.str() == "plain-list");
  }
}

TEST_CASE("Every built-in post-processor describes itself and refuses a broken program",
          "[registry]") {
  PostProcessorRegistry registry;
  registerBuiltInPostProcessors(registry);
  REQUIRE_FALSE(registry.empty());
  tw::planner::Program broken = test::sampleProgram();
  std::get<tw::planner::MotionRecord>(broken.records[0]).q.resize(3);
  for (const std::string& name : registry.names()) {
    CAPTURE(name);
    const PostProcessor& post_processor = registry.get(name);
    CHECK(post_processor.name() == name);
    CHECK_FALSE(post_processor.description().empty());
    CHECK_FALSE(post_processor.fileExtension().empty());
    std::ostringstream out;
    WriteOptions options;
    options.template_file = std::string(TW_SOURCE_DIR) + "/tests/postproc/data/tiny.twt";
    CHECK_THROWS_AS(post_processor.write(broken, options, out), tw::InputError);
    // Nothing reaches the stream when the program is refused.
    CHECK(out.str().empty());
  }
}

TEST_CASE("Circular moves and blends reach every built-in post-processor", "[registry]") {
  PostProcessorRegistry registry;
  registerBuiltInPostProcessors(registry);
  REQUIRE_FALSE(registry.empty());
  const tw::planner::Program arcs = test::arcProgram();
  // The same program with every circular move written as a linear move to
  // the same target: a writer that ignored the arcs would give equal output.
  tw::planner::Program straight = arcs;
  int turned = 0;
  for (tw::planner::ProgramRecord& record : straight.records) {
    auto* motion = std::get_if<tw::planner::MotionRecord>(&record);
    if (motion == nullptr || motion->kind != tw::planner::MotionKind::kCircularMove) continue;
    motion->kind = tw::planner::MotionKind::kLinearMove;
    motion->via.reset();
    ++turned;
  }
  REQUIRE(turned == 2);
  WriteOptions options;
  options.template_file = std::string(TW_SOURCE_DIR) + "/samples/templates/stepcard.twt";
  for (const std::string& name : registry.names()) {
    CAPTURE(name);
    const PostProcessor& post_processor = registry.get(name);
    std::ostringstream with_arcs;
    std::ostringstream without_arcs;
    REQUIRE_NOTHROW(post_processor.write(arcs, options, with_arcs));
    REQUIRE_NOTHROW(post_processor.write(straight, options, without_arcs));
    CHECK_FALSE(with_arcs.str().empty());
    CHECK(with_arcs.str() != without_arcs.str());
  }
}
