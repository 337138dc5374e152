#include <catch2/catch.hpp>
#include <locale>
#include <sstream>

#include "postproc/post_processor_registry.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;

namespace {

/// A decimal comma and thousands grouping, as several national locales use;
/// built in code because the test machines install only the C locales.
class CommaNumbers : public std::numpunct<char> {
 protected:
  char do_decimal_point() const override { return ','; }
  char do_thousands_sep() const override { return '.'; }
  std::string do_grouping() const override { return "\3"; }
};

std::string written(const PostProcessor& post_processor, const tw::planner::Program& program,
                    const std::locale& locale) {
  WriteOptions options;
  options.template_file = std::string(TW_SOURCE_DIR) + "/samples/templates/stepcard.twt";
  std::ostringstream out;
  out.imbue(locale);
  post_processor.write(program, options, out);
  return out.str();
}

}  // namespace

TEST_CASE("Every post-processor writes the same bytes whatever the stream and global locale",
          "[determinism]") {
  PostProcessorRegistry registry;
  registerBuiltInPostProcessors(registry);
  REQUIRE_FALSE(registry.empty());
  const std::locale comma(std::locale::classic(), new CommaNumbers);
  const bool arcs = GENERATE(false, true);  // the sample program, then the one with arcs
  CAPTURE(arcs);
  const tw::planner::Program program = arcs ? test::arcProgram() : test::sampleProgram();
  for (const std::string& name : registry.names()) {
    CAPTURE(name);
    const PostProcessor& post_processor = registry.get(name);
    const std::string plain = written(post_processor, program, std::locale::classic());
    REQUIRE_FALSE(plain.empty());
    const std::locale previous = std::locale::global(comma);
    const std::string with_comma = written(post_processor, program, comma);
    std::locale::global(previous);
    CHECK(with_comma == plain);
    // Writing twice gives the same bytes: no clock, no hidden state.
    CHECK(written(post_processor, program, std::locale::classic()) == plain);
  }
}
