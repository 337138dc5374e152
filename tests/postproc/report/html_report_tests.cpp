#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <functional>
#include <limits>
#include <locale>
#include <map>
#include <sstream>
#include <tinyxml2.h>
#include <variant>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "postproc/atomic_file.hpp"
#include "postproc/report/html_report_post_processor.hpp"
#include "postproc/review_warnings.hpp"
#include "postproc/safety_caution.hpp"
#include "tests/postproc/demo_report_program.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;
using tw::planner::MotionRecord;
using tw::planner::Program;

namespace {

std::string reportText(const Program& program, const WriteOptions& options = {}) {
  std::ostringstream out;
  HtmlReportPostProcessor().write(program, options, out);
  return out.str();
}

WriteOptions demoOptions(const test::DemoReportJob& job) {
  WriteOptions options;
  options.report_cell = job.cell;
  return options;
}

std::string attribute(const tinyxml2::XMLElement& element, const char* name) {
  const char* value = element.Attribute(name);
  return value ? value : "";
}

bool hasClass(const tinyxml2::XMLElement& element, const std::string& css_class) {
  std::istringstream classes(attribute(element, "class"));
  std::string word;
  while (classes >> word) {
    if (word == css_class) return true;
  }
  return false;
}

/// Every element below `root` (depth first, document order).
void forEach(const tinyxml2::XMLElement& root,
             const std::function<void(const tinyxml2::XMLElement&)>& visit) {
  for (const tinyxml2::XMLElement* child = root.FirstChildElement(); child;
       child = child->NextSiblingElement()) {
    visit(*child);
    forEach(*child, visit);
  }
}

std::vector<const tinyxml2::XMLElement*> elementsWithClass(const tinyxml2::XMLElement& root,
                                                          const std::string& css_class) {
  std::vector<const tinyxml2::XMLElement*> found;
  forEach(root, [&](const tinyxml2::XMLElement& element) {
    if (hasClass(element, css_class)) found.push_back(&element);
  });
  return found;
}

/// All text inside an element, concatenated.
std::string allText(const tinyxml2::XMLNode& node) {
  std::string text;
  for (const tinyxml2::XMLNode* child = node.FirstChild(); child; child = child->NextSibling()) {
    if (const tinyxml2::XMLText* piece = child->ToText()) {
      text += piece->Value();
    } else {
      text += allText(*child);
    }
  }
  return text;
}

/// The parsed page; fails the test when the markup is not well-formed XML.
struct ParsedReport {
  explicit ParsedReport(const std::string& text) {
    const tinyxml2::XMLError error = document.Parse(text.c_str(), text.size());
    INFO(document.ErrorStr());
    REQUIRE(error == tinyxml2::XML_SUCCESS);
    root = document.RootElement();
    REQUIRE(root != nullptr);
  }
  tinyxml2::XMLDocument document;
  const tinyxml2::XMLElement* root = nullptr;
};

/// Joint `j` at the targets the plot of `seam` shows ("" for the whole
/// program: every motion; for a seam: the motion before its first, then its
/// own), in degrees — computed from the program, not from the report.
std::pair<double, double> jointExtremesDeg(const Program& program, const std::string& seam, int j) {
  std::vector<const MotionRecord*> motions;
  for (const auto& record : program.records) {
    if (const auto* motion = std::get_if<MotionRecord>(&record)) motions.push_back(motion);
  }
  double low = std::numeric_limits<double>::infinity();
  double high = -low;
  for (std::size_t i = 0; i < motions.size(); ++i) {
    const bool in_seam = seam.empty() || motions[i]->seam == seam;
    const bool lead_in = !seam.empty() && i + 1 < motions.size() && motions[i + 1]->seam == seam &&
                         motions[i]->seam != seam &&
                         std::none_of(motions.begin(), motions.begin() + i,
                                      [&](const MotionRecord* m) { return m->seam == seam; });
    if (!in_seam && !lead_in) continue;
    const double value = motions[i]->q[j] * 180.0 / tw::kPi;
    low = std::min(low, value);
    high = std::max(high, value);
  }
  return {low, high};
}

std::vector<double> tickValues(const tinyxml2::XMLElement& svg, const std::string& axis_class) {
  std::vector<double> values;
  for (const tinyxml2::XMLElement* text : elementsWithClass(svg, axis_class)) {
    values.push_back(std::stod(text->GetText()));
  }
  return values;
}

}  // namespace

TEST_CASE("The review report is well-formed and self-contained", "[html-report]") {
  const test::DemoReportJob job = test::demoReportJob();
  const std::string text = reportText(job.program, demoOptions(job));
  const ParsedReport report(text);
  CHECK(std::string(report.root->Name()) == "html");
  CHECK(attribute(*report.root, "xmlns") == "http://www.w3.org/1999/xhtml");
  REQUIRE(report.root->FirstChildElement("head") != nullptr);
  REQUIRE(report.root->FirstChildElement("body") != nullptr);
  CHECK(text.rfind("<!DOCTYPE html>\n", 0) == 0);

  // Nothing to fetch: no script, no linked style, image or font, and the only
  // URLs are the XML namespace names and the page's own anchors.
  int external = 0;
  forEach(*report.root, [&](const tinyxml2::XMLElement& element) {
    const std::string name = element.Name();
    if (name == "script" || name == "link" || name == "img" || name == "iframe" ||
        name == "object" || name == "image" || name == "use") {
      ++external;
    }
    for (const char* key : {"src", "href", "xlink:href"}) {
      const std::string value = attribute(element, key);
      if (!value.empty() && value.front() != '#') ++external;
    }
  });
  CHECK(external == 0);
  std::string without_namespaces = text;
  for (const std::string& uri : {std::string("http://www.w3.org/1999/xhtml"),
                                 std::string("http://www.w3.org/2000/svg")}) {
    for (std::size_t at; (at = without_namespaces.find(uri)) != std::string::npos;) {
      without_namespaces.erase(at, uri.size());
    }
  }
  CHECK(without_namespaces.find("http") == std::string::npos);
  CHECK(without_namespaces.find("@import") == std::string::npos);
  CHECK(without_namespaces.find("@font-face") == std::string::npos);
  auto count = [&](const std::string& what) {
    std::size_t n = 0;
    for (std::size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
    return n;
  };
  CHECK(count("url(") > 0);
  CHECK(count("url(") == count("url(#"));  // only references to the page's own clip paths
}

TEST_CASE("The review report holds one plot per joint per seam and the three views",
          "[html-report]") {
  const test::DemoReportJob job = test::demoReportJob();
  const ParsedReport report(reportText(job.program, demoOptions(job)));
  std::map<std::string, std::vector<std::string>> joints_by_scope;
  for (const tinyxml2::XMLElement* svg : elementsWithClass(*report.root, "joint-plot")) {
    joints_by_scope[attribute(*svg, "data-scope")].push_back(attribute(*svg, "data-joint"));
  }
  std::vector<std::string> joint_names;
  for (const auto& joint : job.program.metadata.joints) joint_names.push_back(joint.name);
  REQUIRE(joint_names.size() == 6);
  // The demo job's two seams plus the whole program.
  REQUIRE(joints_by_scope.size() == 3);
  for (const std::string scope : {"program", "seam_1", "seam_2"}) {
    CAPTURE(scope);
    CHECK(joints_by_scope[scope] == joint_names);
  }
  for (const std::string kind : {"speed-plot", "clearance-plot", "singularity-plot"}) {
    CAPTURE(kind);
    CHECK(elementsWithClass(*report.root, kind).size() == 3);
  }
  std::vector<std::string> views;
  for (const tinyxml2::XMLElement* svg : elementsWithClass(*report.root, "view")) {
    views.push_back(attribute(*svg, "data-view"));
  }
  CHECK(views == std::vector<std::string>{"top", "front", "side"});
}

TEST_CASE("The joint axes of the review report bracket the program's extremes", "[html-report]") {
  const test::DemoReportJob demo = test::demoReportJob();
  for (const Program& program : {test::sampleProgram(), demo.program}) {
    const ParsedReport report(reportText(program));
    const double cycle_time = tw::planner::cycleTime(program);
    const auto plots = elementsWithClass(*report.root, "joint-plot");
    REQUIRE_FALSE(plots.empty());
    for (const tinyxml2::XMLElement* svg : plots) {
      const std::string scope = attribute(*svg, "data-scope");
      const std::string joint_name = attribute(*svg, "data-joint");
      CAPTURE(scope, joint_name);
      int j = 0;
      while (program.metadata.joints[j].name != joint_name) ++j;
      const auto [low, high] = jointExtremesDeg(program, scope == "program" ? "" : scope, j);
      const std::vector<double> ticks = tickValues(*svg, "tick-y");
      REQUIRE(ticks.size() >= 2);
      const double step = ticks[1] - ticks[0];
      // The printed labels round to the tick decimals; 1e-9 deg absorbs only
      // the decimal-to-binary conversion of the labels.
      CHECK(ticks.front() <= low + 1e-9);
      CHECK(ticks.back() >= high - 1e-9);
      CHECK(ticks.front() > low - step);
      CHECK(ticks.back() < high + step);
      // The caption below the plot prints the extremes in the file decimals.
      const tinyxml2::XMLElement* figure = svg->Parent()->Parent()->ToElement();
      const std::string caption = allText(*figure->FirstChildElement("figcaption"));
      CHECK_THAT(caption, Catch::StartsWith("min " + tw::formatFixed(low, 4) + " · max " +
                                            tw::formatFixed(high, 4) + " deg"));
      if (scope == "program") {
        const std::vector<double> time_ticks = tickValues(*svg, "tick-x");
        CHECK(time_ticks.front() == 0.0);
        CHECK(time_ticks.back() >= cycle_time - 1e-9);  // 1e-9 s: label conversion only
      }
    }
  }
}

TEST_CASE("The review report carries the caution, the hashes, the warnings and every record",
          "[html-report]") {
  Program program = test::sampleProgram();
  std::get<MotionRecord>(program.records[6]).speed.value = 0.300;  // above 250 mm/s
  WriteOptions options;
  options.clearance_warning = 0.009;                          // record 4 has 8 mm
  options.singularity_warning = 43.0 * WriteOptions::kDegree;  // record 5 has 42.75°
  const ParsedReport report(reportText(program, options));
  const std::string page_text = allText(*report.root);

  // ISO 10218-1 reduced speed and the rest of the caution, every line.
  for (const std::string& line : safetyCaution(program)) {
    CAPTURE(line);
    CHECK(page_text.find(line) != std::string::npos);
  }
  CHECK(page_text.find(program.metadata.inputs[0].sha256) != std::string::npos);
  CHECK(page_text.find(program.metadata.inputs[0].path) != std::string::npos);

  const std::vector<ReviewWarning> warnings = reviewWarnings(program, options);
  REQUIRE(warnings.size() == 4);  // the planner's, clearance, singularity, speed
  const tinyxml2::XMLElement* list = elementsWithClass(*report.root, "warnings").at(0);
  int items = 0;
  for (const tinyxml2::XMLElement* item = list->FirstChildElement("li"); item;
       item = item->NextSiblingElement("li")) {
    CHECK_THAT(allText(*item), Catch::Contains(warnings[items].text));
    ++items;
  }
  CHECK(items == 4);

  // Each record-bound warning is marked on the plot of its kind, in the
  // whole-program and in the seam plots (all three records lie in seam_1).
  auto marks = [&](const std::string& kind, const std::string& label) {
    int count = 0;
    for (const tinyxml2::XMLElement* svg : elementsWithClass(*report.root, kind)) {
      for (const tinyxml2::XMLElement* text : elementsWithClass(*svg, "warning-mark-label")) {
        if (text->GetText() == label) ++count;
      }
    }
    return count;
  };
  CHECK(marks("clearance-plot", "W2") == 2);
  CHECK(marks("singularity-plot", "W3") == 2);
  CHECK(marks("speed-plot", "W4") == 2);
  CHECK(marks("joint-plot", "W2") == 0);

  // The record table: collapsed, one row per record with an anchor.
  const tinyxml2::XMLElement* table = elementsWithClass(*report.root, "records").at(0);
  CHECK(std::string(table->Parent()->Parent()->ToElement()->Name()) == "details");
  int rows = 0;
  for (const tinyxml2::XMLElement* row = table->FirstChildElement("tr"); row;
       row = row->NextSiblingElement("tr")) {
    if (row->Attribute("id")) {
      ++rows;
      CHECK(attribute(*row, "id") == "record-" + std::to_string(rows));
    }
  }
  CHECK(rows == static_cast<int>(program.records.size()));
}

TEST_CASE("A joint near its limit shows the warning band and its warning marks", "[html-report]") {
  // axis_5 ends at 60° of its ±125° (sample_program.cpp): 65° from the
  // limit, so a 70° margin puts the home move (outside the seam) within it;
  // no other joint and no seam motion comes within 70° of a limit.
  WriteOptions options;
  options.revolute_limit_warning = 70.0 * WriteOptions::kDegree;
  const Program program = test::sampleProgram();
  const ParsedReport report(reportText(program, options));
  for (const tinyxml2::XMLElement* svg : elementsWithClass(*report.root, "joint-plot")) {
    const std::string joint = attribute(*svg, "data-joint");
    CAPTURE(joint, attribute(*svg, "data-scope"));
    const bool near_limit = joint == "axis_5" && attribute(*svg, "data-scope") == "program";
    CHECK(elementsWithClass(*svg, "band-near").empty() != near_limit);
    CHECK(elementsWithClass(*svg, "warning-mark").empty() != near_limit);
  }
}

TEST_CASE("The views of the demo job draw its cell, arm base, TCP path and seams",
          "[html-report]") {
  const test::DemoReportJob job = test::demoReportJob();
  const ParsedReport report(reportText(job.program, demoOptions(job)));
  std::size_t motions = 0;
  for (const auto& record : job.program.records) {
    if (std::holds_alternative<MotionRecord>(record)) ++motions;
  }
  // 8 + 6 weld steps with the arc on (demo_report_program.cpp).
  const std::size_t process_moves = 14;
  for (const tinyxml2::XMLElement* view : elementsWithClass(*report.root, "view")) {
    CAPTURE(attribute(*view, "data-view"));
    const std::size_t segments = elementsWithClass(*view, "path-process").size() +
                                 elementsWithClass(*view, "path-seam").size() +
                                 elementsWithClass(*view, "path-air").size();
    CHECK(segments == motions - 1);
    CHECK(elementsWithClass(*view, "path-process").size() == process_moves);
    CHECK(elementsWithClass(*view, "base-mark").size() == 1);
    std::vector<std::string> seams;
    for (const tinyxml2::XMLElement* label : elementsWithClass(*view, "seam-label")) {
      seams.push_back(label->GetText());
    }
    CHECK(seams == std::vector<std::string>{"seam_1", "seam_2"});
    // Four axis-aligned boxes of 12 triangles; along a coordinate axis a view
    // sees four faces edge-on, so the 4 triangles of the two faces facing it
    // and facing away remain per box.
    CHECK(elementsWithClass(*view, "body").size() == 4 * 4);
  }
  CHECK(allText(*report.root).find("not known") == std::string::npos);
}

TEST_CASE("Without cell geometry the views say what they cannot show", "[html-report]") {
  const std::string text = reportText(test::sampleProgram());
  // Kept for a look in a browser: the page as the command line will first write it.
  test::writeWholeFile(std::string(TW_TEST_OUTPUT_DIR) + "/sample_program_report.html", text);
  const ParsedReport report(text);
  const std::string page_text = allText(*report.root);
  CHECK_THAT(page_text, Catch::Contains("No cell geometry was given") &&
                            Catch::Contains("(fixture_a)"));
  CHECK(elementsWithClass(*report.root, "base-mark").empty());
  CHECK(elementsWithClass(*report.root, "view").size() == 3);

  WriteOptions options;
  options.report_cell.X_CB = Eigen::Isometry3d::Identity();
  const ParsedReport with_base(reportText(test::sampleProgram(), options));
  CHECK_THAT(allText(*with_base.root), Catch::Contains("frame(s) fixture_a in the cell is not known"));
  CHECK(elementsWithClass(*with_base.root, "base-mark").size() == 3);
}

TEST_CASE("A program without records still gives a well-formed page", "[html-report]") {
  Program program = test::sampleProgram();
  program.records.clear();
  const ParsedReport report(reportText(program));
  CHECK(elementsWithClass(*report.root, "joint-plot").empty());
  CHECK(elementsWithClass(*report.root, "view").size() == 3);
  CHECK_THAT(allText(*report.root), Catch::Contains("The program holds no motions."));
}

TEST_CASE("The review report refuses a cell it cannot draw and writes nothing", "[html-report]") {
  const test::DemoReportJob job = test::demoReportJob();
  WriteOptions options = demoOptions(job);
  options.output_name = "report.html";
  options.report_cell.bodies[2].triangles_C[5][1].y() = std::nan("");
  std::ostringstream out;
  CHECK_THROWS_WITH(HtmlReportPostProcessor().write(job.program, options, out),
                    Catch::Contains("report.html") &&
                        Catch::Contains("triangle 6 of body 'clamp'") &&
                        Catch::Contains("not finite"));
  CHECK(out.str().empty());

  // Through the atomic writer an earlier report stays as it was.
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/refused_report.html";
  test::writeWholeFile(path, "earlier report\n");
  CHECK_THROWS_AS(writeProgramFile(HtmlReportPostProcessor(), job.program, options, path),
                  tw::InputError);
  CHECK(test::readWholeFile(path) == "earlier report\n");
}

namespace {

class DecimalComma : public std::numpunct<char> {
 protected:
  char do_decimal_point() const override { return ','; }
  char do_thousands_sep() const override { return '.'; }
  std::string do_grouping() const override { return "\3"; }
};

}  // namespace

TEST_CASE("The demo report is byte-identical on repeat and under a decimal-comma locale",
          "[html-report]") {
  const test::DemoReportJob job = test::demoReportJob();
  const std::string plain = reportText(job.program, demoOptions(job));
  CHECK(reportText(job.program, demoOptions(job)) == plain);
  const std::locale comma(std::locale::classic(), new DecimalComma);
  const std::locale previous = std::locale::global(comma);
  std::ostringstream out;
  out.imbue(comma);
  HtmlReportPostProcessor().write(job.program, demoOptions(job), out);
  std::locale::global(previous);
  CHECK(out.str() == plain);
  // Keep the sample page for a look in a browser (DEVELOPERS.md).
  test::writeWholeFile(std::string(TW_TEST_OUTPUT_DIR) + "/sample_report.html", plain);
}

TEST_CASE("The review report draws circular moves as arcs and lists their via points",
          "[html-report]") {
  const Program program = test::arcProgram();
  const std::string text = reportText(program);
  // Kept for a look in a browser.
  test::writeWholeFile(std::string(TW_TEST_OUTPUT_DIR) + "/arc_program_report.html", text);
  const ParsedReport report(text);

  const auto views = elementsWithClass(*report.root, "view");
  REQUIRE(views.size() == 3);
  const tinyxml2::XMLElement* top = views.front();
  REQUIRE(attribute(*top, "data-view") == "top");
  std::vector<std::vector<std::pair<double, double>>> paths;
  forEach(*top, [&](const tinyxml2::XMLElement& element) {
    if (std::string(element.Name()) != "polyline") return;
    if (!hasClass(element, "path-process") && !hasClass(element, "path-seam") &&
        !hasClass(element, "path-air")) {
      return;
    }
    std::vector<std::pair<double, double>> points;
    std::istringstream pairs(attribute(element, "points"));
    std::string pair;
    while (pairs >> pair) {
      const std::size_t comma = pair.find(',');
      points.emplace_back(std::stod(pair.substr(0, comma)), std::stod(pair.substr(comma + 1)));
    }
    paths.push_back(points);
  });
  // One path per motion after the first (eight motions, arcProgram()).
  REQUIRE(paths.size() == 7);
  // The half circle (record 5, the third path) sweeps 180° in steps of at
  // most 5°: 36 segments; the three-quarter circle (record 9, the sixth)
  // 270°: 54 segments; every other motion is one straight segment.
  CHECK(paths[2].size() == 37);
  CHECK(paths[5].size() == 55);
  for (const std::size_t straight : {0, 1, 3, 4, 6}) CHECK(paths[straight].size() == 2);
  // Seen from +z the half circle is a true half circle whose first and last
  // points are a diameter apart: every point is half that distance from
  // their midpoint. Pixel coordinates have one decimal (±0.05 px each), so
  // distances agree to 0.15 px.
  const auto& half = paths[2];
  const double cx = (half.front().first + half.back().first) / 2.0;
  const double cy = (half.front().second + half.back().second) / 2.0;
  const double radius = std::hypot(half.front().first - cx, half.front().second - cy);
  REQUIRE(radius > 10.0);  // large enough on the page for the check to mean something
  for (const auto& point : half) {
    CHECK(std::hypot(point.first - cx, point.second - cy) == Approx(radius).margin(0.15));
  }

  // The record table: a via row before each circular move's row.
  const auto via_rows = elementsWithClass(*report.root, "via");
  REQUIRE(via_rows.size() == 2);
  const tinyxml2::XMLElement* after = via_rows[0]->NextSiblingElement("tr");
  REQUIRE(after != nullptr);
  CHECK(attribute(*after, "id") == "record-5");
  const std::string via_text = allText(*via_rows[0]);
  // The half circle's via (sample data): passed at 7.4 + 7.854 / 2 s, at
  // (975, 25, 410) mm.
  CHECK_THAT(via_text, Catch::Contains("11.3270") && Catch::Contains("975.000") &&
                           Catch::Contains("via"));
  CHECK_THAT(allText(*after), Catch::Contains("circular-move"));
  // The legend says arcs are drawn as arcs, and the speed chart compares
  // them against their arc length and says so.
  CHECK_THAT(allText(*report.root), Catch::Contains("circular moves as their arcs"));
  CHECK_THAT(allText(*report.root), Catch::Contains("path length (chord or arc) ÷ duration"));
}
