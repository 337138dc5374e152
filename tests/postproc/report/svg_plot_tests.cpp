#include <catch2/catch.hpp>
#include <cmath>
#include <random>
#include <set>
#include <string>
#include <tinyxml2.h>
#include <vector>

#include "postproc/report/svg_plot.hpp"

using namespace tw::postproc;

namespace {

/// The step's leading digits: 1, 2, 2.5 or 5 (times a power of ten).
double mantissa(double step) {
  return step / std::pow(10.0, std::floor(std::log10(step) + 1e-12));
}

void checkBracketing(const AxisTicks& ticks, double low, double high) {
  REQUIRE(ticks.values.size() >= 2);
  CHECK(ticks.first() <= low);
  CHECK(ticks.last() >= high);
  // No tick wasted beyond the data: the outer ticks lie within one step.
  CHECK(ticks.first() > low - ticks.step);
  CHECK(ticks.last() < high + ticks.step);
}

}  // namespace

TEST_CASE("Nice ticks of hand-picked ranges", "[svg-plot]") {
  // Expected values by hand from the 1-2-2.5-5 rule (common practice for
  // chart axes, no source).
  SECTION("0 to 10 in about six ticks is a step of 2") {
    const AxisTicks ticks = niceTicks(0.0, 10.0, 6);
    CHECK(ticks.step == 2.0);
    CHECK(ticks.values == std::vector<double>{0.0, 2.0, 4.0, 6.0, 8.0, 10.0});
    CHECK(ticks.decimals == 0);
    CHECK(ticks.label(4.0) == "4");
  }
  SECTION("a joint from -15.92 to 15.93 deg gets ticks at tens") {
    const AxisTicks ticks = niceTicks(-15.9211, 15.9293, 6);
    CHECK(ticks.step == 10.0);
    CHECK(ticks.values == std::vector<double>{-20.0, -10.0, 0.0, 10.0, 20.0});
  }
  SECTION("a step of 2.5 times a power of ten needs one decimal more") {
    const AxisTicks ticks = niceTicks(0.0, 1.0, 5);
    CHECK(ticks.step == 0.25);
    CHECK(ticks.decimals == 2);
    CHECK(ticks.label(0.75) == "0.75");
  }
  SECTION("small steps get their decimals") {
    const AxisTicks ticks = niceTicks(0.1, 0.35, 6);
    CHECK(ticks.step == Approx(0.05).epsilon(1e-12));  // 1e-12: pow(10, -2) rounding
    CHECK(ticks.decimals == 2);
    CHECK(ticks.label(ticks.first()) == "0.10");
    CHECK(ticks.label(ticks.last()) == "0.35");
  }
  SECTION("zero is labelled without a sign") {
    const AxisTicks ticks = niceTicks(-1.0, 1.0, 5);
    CHECK(ticks.label(ticks.values[2]) == "0.0");
    for (const double value : ticks.values) CHECK(ticks.label(value) != "-0.0");
  }
  SECTION("an empty range is widened around its value") {
    // 5 % of 1000 on each side, then nice steps of 10.
    const AxisTicks ticks = niceTicks(1000.0, 1000.0, 6);
    checkBracketing(ticks, 975.0, 1025.0);
    CHECK(ticks.step == 10.0);
    const AxisTicks at_zero = niceTicks(0.0, 0.0, 6);
    checkBracketing(at_zero, -0.5, 0.5);
  }
}

TEST_CASE("Nice ticks bracket any range with a nice step and distinct labels", "[svg-plot]") {
  std::mt19937 random(20260);  // fixed seed
  std::uniform_real_distribution<double> exponent(-4.0, 5.0);
  std::uniform_real_distribution<double> unit(-1.0, 1.0);
  std::uniform_int_distribution<int> count(2, 10);
  for (int trial = 0; trial < 2000; ++trial) {
    const double scale = std::pow(10.0, exponent(random));
    const double a = unit(random) * scale;
    const double b = a + std::abs(unit(random)) * scale;
    const int target = count(random);
    CAPTURE(a, b, target);
    const AxisTicks ticks = niceTicks(a, b, target);
    checkBracketing(ticks, a, b);
    const double leading = mantissa(ticks.step);
    const bool nice = std::abs(leading - 1.0) < 1e-9 || std::abs(leading - 2.0) < 1e-9 ||
                      std::abs(leading - 2.5) < 1e-9 || std::abs(leading - 5.0) < 1e-9;
    CHECK(nice);  // 1e-9: the mantissa goes through log10 and pow
    // Not far more ticks than asked for: the step is the first nice value
    // at or above range / (target - 1), so at most 2.5× as many (1 → 2.5).
    CHECK(ticks.values.size() <= static_cast<std::size_t>(2.5 * (target - 1)) + 3);
    std::set<std::string> labels;
    for (const double value : ticks.values) {
      // Each tick is a whole multiple of the step; 1e-6: the products are exact
      // to a few ulps of k.
      CHECK(std::abs(value / ticks.step - std::round(value / ticks.step)) < 1e-6);
      labels.insert(ticks.label(value));
    }
    CHECK(labels.size() == ticks.values.size());
  }
}

TEST_CASE("An SVG plot maps data to the data area and clips what lies outside", "[svg-plot]") {
  PlotLayout layout;  // 600 × 220 px, data area from (62, 28) to (586, 186)
  SvgPlot plot(layout, niceTicks(0.0, 10.0, 6), niceTicks(0.0, 100.0, 6), "p1",
               "class=\"plot\" data-test=\"a &amp; b\"");
  plot.title("axis <1>");
  plot.polyline({{0.0, 0.0}, {10.0, 100.0}}, "line");
  plot.band(120.0, 200.0, "hidden-band");  // entirely above the axis
  plot.band(50.0, 500.0, "upper-band");    // clipped at 100
  plot.verticalMark(5.0, "W1", "mark");
  plot.verticalMark(50.0, "W2", "mark");   // outside the time axis

  tinyxml2::XMLDocument document;
  REQUIRE(document.Parse(plot.svg().c_str()) == tinyxml2::XML_SUCCESS);
  const tinyxml2::XMLElement* svg = document.RootElement();
  REQUIRE(svg != nullptr);
  CHECK(std::string(svg->Attribute("data-test")) == "a & b");
  CHECK(std::string(svg->Attribute("id")) == "p1");

  std::vector<std::string> y_labels;
  std::vector<std::string> texts;
  int bands = 0;
  int marks = 0;
  std::string polyline;
  std::string band_y;
  std::string band_height;
  for (const tinyxml2::XMLElement* child = svg->FirstChildElement(); child;
       child = child->NextSiblingElement()) {
    const std::string name = child->Name();
    const char* css = child->Attribute("class");
    if (name == "text" && css && std::string(css) == "tick tick-y") y_labels.push_back(child->GetText());
    if (name == "text" && child->GetText()) texts.push_back(child->GetText());
    if (name == "g") {
      for (const tinyxml2::XMLElement* mark = child->FirstChildElement(); mark;
           mark = mark->NextSiblingElement()) {
        const std::string mark_class = mark->Attribute("class");
        if (mark_class == "line") polyline = mark->Attribute("points");
        if (mark_class == "hidden-band" || mark_class == "upper-band") {
          ++bands;
          band_y = mark->Attribute("y");
          band_height = mark->Attribute("height");
        }
        if (mark_class == "mark") ++marks;
      }
    }
  }
  CHECK(y_labels == std::vector<std::string>{"0", "20", "40", "60", "80", "100"});
  // (0, 0) is the bottom-left corner of the data area, (10, 100) the top-right.
  CHECK(polyline == "62.0,186.0 586.0,28.0");
  // Only the visible band, from y = 100 (top, 28 px) down to y = 50 (107 px).
  CHECK(bands == 1);
  CHECK(band_y == "28.0");
  CHECK(band_height == "79.0");
  CHECK(marks == 1);
  CHECK(std::find(texts.begin(), texts.end(), "axis <1>") != texts.end());
  CHECK(std::find(texts.begin(), texts.end(), "W2") == texts.end());
}

TEST_CASE("An equal-aspect plot has the same scale on both axes", "[svg-plot]") {
  PlotLayout layout;
  layout.width = 420.0;
  layout.height = 360.0;
  // A long thin extent: 2000 wide, 100 high; the y extent must grow.
  SvgPlot plot = SvgPlot::equalAspect(layout, 0.0, 2000.0, 0.0, 100.0, "v", "class=\"view\"");
  tinyxml2::XMLDocument document;
  REQUIRE(document.Parse(plot.svg().c_str()) == tinyxml2::XML_SUCCESS);
  std::vector<std::pair<double, double>> x_ticks;  // (value, pixel)
  std::vector<std::pair<double, double>> y_ticks;
  for (const tinyxml2::XMLElement* child = document.RootElement()->FirstChildElement("text"); child;
       child = child->NextSiblingElement("text")) {
    const std::string css = child->Attribute("class") ? child->Attribute("class") : "";
    if (css == "tick tick-x") x_ticks.emplace_back(std::stod(child->GetText()), child->DoubleAttribute("x"));
    if (css == "tick tick-y") y_ticks.emplace_back(std::stod(child->GetText()), child->DoubleAttribute("y"));
  }
  REQUIRE(x_ticks.size() >= 2);
  REQUIRE(y_ticks.size() >= 2);
  const double x_scale = (x_ticks.back().second - x_ticks.front().second) /
                         (x_ticks.back().first - x_ticks.front().first);
  const double y_scale = -(y_ticks.back().second - y_ticks.front().second) /
                         (y_ticks.back().first - y_ticks.front().first);
  // Pixel positions carry one decimal: 0.1 px over a few hundred px.
  CHECK(x_scale == Approx(y_scale).epsilon(2e-3));
  CHECK(plot.pixelsPerUnitX() == Approx(x_scale).epsilon(2e-3));
}

TEST_CASE("XML escaping covers markup characters", "[svg-plot]") {
  CHECK(escapeXml("a<b & \"c\">") == "a&lt;b &amp; &quot;c&quot;&gt;");
  CHECK(escapeXml("plain") == "plain");
}
