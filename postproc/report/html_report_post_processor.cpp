#include "postproc/report/html_report_post_processor.hpp"

#include <algorithm>
#include <nlohmann/json.hpp>
#include <sstream>
#include <variant>

#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "planner/program/motion_path.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/report/report_charts.hpp"
#include "postproc/report/report_style.hpp"
#include "postproc/report/report_timeline.hpp"
#include "postproc/report/report_views.hpp"
#include "postproc/report/svg_plot.hpp"
#include "postproc/review_warnings.hpp"
#include "postproc/safety_caution.hpp"
#include "postproc/tables/summary_post_processor.hpp"

namespace tw::postproc {
namespace {

using nlohmann::json;
using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;

/// Refuses a cell that cannot be drawn, naming what is wrong.
void checkReportCell(const ReportCell& cell, const std::string& source) {
  auto fail = [&](const std::string& what) {
    throw InputError(source, 0, "report cell: " + what + " is not finite");
  };
  for (const auto& [frame, X_CR] : cell.X_CR) {
    if (!X_CR.matrix().allFinite()) fail("the pose of frame '" + frame + "'");
  }
  if (cell.X_CB && !cell.X_CB->matrix().allFinite()) fail("the pose of the arm base");
  for (const ReportBody& body : cell.bodies) {
    for (std::size_t t = 0; t < body.triangles_C.size(); ++t) {
      for (const Eigen::Vector3d& corner : body.triangles_C[t]) {
        if (!corner.allFinite()) {
          fail("a corner of triangle " + std::to_string(t + 1) + " of body '" + body.name + "'");
        }
      }
    }
  }
}

std::string element(const std::string& tag, const std::string& text,
                    const std::string& attributes = "") {
  return '<' + tag + (attributes.empty() ? "" : ' ' + attributes) + '>' + escapeXml(text) + "</" +
         tag + '>';
}

/// A figure of the summary JSON ({"value", "record"} or null) as table text.
std::string locatedFigure(const json& figure, const std::string& unit, int decimals) {
  if (figure.is_null()) return "not measured";
  return formatFixed(figure.at("value").get<double>(), decimals) + ' ' + unit + " (record " +
         std::to_string(figure.at("record").get<std::size_t>()) + ')';
}

class PageWriter {
 public:
  PageWriter(const Program& program, const WriteOptions& options)
      : program_(program),
        options_(options),
        quantities_(fileQuantities(program.metadata.units)),
        timeline_(reportTimeline(program, options.report_cell)),
        warnings_(reviewWarnings(program, options)),
        charts_(program, options, timeline_, warnings_) {
    std::ostringstream summary_text;
    SummaryPostProcessor().write(program, options, summary_text);
    summary_ = json::parse(summary_text.str());
  }

  std::string page() const {
    std::string out = "<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" lang=\"en\">\n";
    out += "<head><meta charset=\"utf-8\"/><meta name=\"viewport\" content=\"width=device-width\"/>";
    out += element("title", "Review report: " + program_.metadata.job);
    out += "<style>" + reportStyleSheet() + "</style></head>\n<body>\n";
    out += masthead() + "<main>\n" + caution() + figuresAndWarnings() + views();
    out += scopeSection(reportScope(timeline_, ""), "Whole program", "all");
    const std::vector<std::string> seams = seamNames(timeline_);
    for (std::size_t s = 0; s < seams.size(); ++s) {
      out += scopeSection(reportScope(timeline_, seams[s]), "Seam " + seams[s],
                          "seam" + std::to_string(s + 1));
    }
    out += recordTable() + inputs() + "</main>\n";
    out += element("footer", "Written by " + program_.metadata.generator + "; " +
                                 summary_.at("cycle_time_note").get<std::string>() + '.');
    return out + "\n</body>\n</html>\n";
  }

 private:
  using ProgramMetadataText = std::vector<std::pair<std::string, std::string>>;

  std::string masthead() const {
    const ProgramMetadataText text = metadataText();
    std::string out = "<header class=\"masthead\"><h1>Review report · <span class=\"job\">" +
                      escapeXml(program_.metadata.job) + "</span></h1><dl>";
    for (const auto& [term, value] : text) {
      out += "<div>" + element("dt", term) + element("dd", value) + "</div>";
    }
    return out + "</dl></header>\n";
  }

  ProgramMetadataText metadataText() const {
    const planner::ProgramMetadata& meta = program_.metadata;
    return {{"arm", meta.arm},
            {"generator", meta.generator},
            {"seed", std::to_string(meta.seed)},
            {"cycle time (estimate)", quantities_.time.format(planner::cycleTime(program_)) + " s"},
            {"records", std::to_string(program_.records.size())},
            {"seams", std::to_string(seamNames(timeline_).size())},
            {"units", quantities_.length.unit + ", " + quantities_.angle.unit + ", s"}};
  }

  std::string caution() const {
    const std::vector<std::string> lines = safetyCaution(program_);
    std::string rest;
    for (std::size_t i = 1; i < lines.size(); ++i) rest += (rest.empty() ? "" : " ") + lines[i];
    return "<section class=\"caution\" id=\"caution\">" + element("strong", lines.front()) +
           element("p", rest) + "</section>\n";
  }

  std::string figuresAndWarnings() const {
    std::string out = "<section class=\"card\" id=\"figures\">" + element("h2", "Figures");
    const std::string& length = quantities_.length.unit;
    const std::string& angle = quantities_.angle.unit;
    out += "<table class=\"figures\"><tr><th class=\"text\">scope</th><th>motions</th>"
           "<th>time [s]</th><th>process [s]</th><th>air [s]</th><th>min clearance</th>"
           "<th>min singularity margin</th><th class=\"text\">tightest joint-limit margin</th></tr>";
    auto row = [&](const std::string& scope, const json& figures, const char* time_key) {
      std::string limit = "—";
      const json& tightest = figures.at("tightest_joint_limit_margin");
      if (!tightest.is_null()) {
        const std::string unit = tightest.at("unit").get<std::string>();
        const int decimals = unit == quantities_.angle.unit ? quantities_.angle.decimals
                                                            : quantities_.length.decimals;
        limit = tightest.at("joint").get<std::string>() + ": " +
                locatedFigure(tightest, unit, decimals);
      }
      return "<tr>" + element("td", scope, "class=\"text\"") +
             element("td", std::to_string(figures.at("waypoints").get<std::size_t>())) +
             element("td", formatFixed(figures.at(time_key).get<double>(), 4)) +
             element("td", formatFixed(figures.at("process_time").get<double>(), 4)) +
             element("td", formatFixed(figures.at("air_time").get<double>(), 4)) +
             element("td", locatedFigure(figures.at("min_clearance"), length,
                                         quantities_.length.decimals)) +
             element("td", locatedFigure(figures.at("min_singularity_margin"), angle,
                                         quantities_.angle.decimals)) +
             element("td", limit, "class=\"text\"") + "</tr>";
    };
    out += row("whole program", summary_.at("total"), "cycle_time");
    for (const json& seam : summary_.at("seams")) {
      out += row(seam.at("seam").get<std::string>(), seam, "time");
    }
    out += "</table>";
    out += element("h2", "Warnings (" + std::to_string(warnings_.size()) + ")");
    if (warnings_.empty()) {
      out += element("p", "No warnings at the thresholds of this report.", "class=\"ok\"");
    } else {
      out += "<ul class=\"warnings\">";
      for (std::size_t w = 0; w < warnings_.size(); ++w) {
        const ReviewWarning& warning = warnings_[w];
        std::string item = element("span", 'W' + std::to_string(w + 1), "class=\"tag\"") +
                           escapeXml(warning.text);
        if (warning.record) {
          item += " <a href=\"#record-" + std::to_string(*warning.record + 1) + "\">table</a>";
        }
        out += "<li id=\"w" + std::to_string(w + 1) + "\">" + item + "</li>";
      }
      out += "</ul>";
    }
    out += element("p", "Thresholds: clearance " + quantities_.length.format(options_.clearance_warning) +
                            ' ' + length + ", singularity margin " +
                            quantities_.angle.format(options_.singularity_warning) + ' ' + angle +
                            ", joint limits " +
                            quantities_.angle.format(options_.revolute_limit_warning) + ' ' + angle +
                            " (prismatic " +
                            quantities_.length.format(options_.prismatic_limit_warning) + ' ' +
                            length + "), TCP speed " +
                            quantities_.speed.format(kReducedSpeedLimit) + ' ' +
                            quantities_.speed.unit + " (ISO 10218-1 reduced speed).",
                    "class=\"note\"");
    return out + "</section>\n";
  }

  std::string views() const {
    std::string out = "<section class=\"card\" id=\"views\">" + element("h2", "Views of the TCP path");
    out += "<div class=\"views\">" + orthographicViews(program_, timeline_, options_.report_cell) +
           "</div>";
    out += "<div class=\"legend\"><span><span class=\"swatch sw-process\"></span>process on</span>"
           "<span><span class=\"swatch sw-seam\"></span>approach / retract of a seam</span>"
           "<span><span class=\"swatch sw-air\"></span>moves outside seams</span>";
    // The arc wording only where there are arcs, so that pages of programs
    // without them stay as they were.
    const bool arcs = std::any_of(timeline_.begin(), timeline_.end(),
                                  [](const TimelineMotion& entry) { return !entry.arc_C.empty(); });
    out += arcs ? "<span>path drawn straight between targets, circular moves as their arcs; a "
                  "joint move's real TCP path differs</span>"
                : "<span>path drawn straight between targets; a joint move's real TCP path "
                  "differs</span>";
    const std::vector<ReportBody>& bodies = options_.report_cell.bodies;
    for (std::size_t b = 0; b < bodies.size(); ++b) {
      out += "<span><span class=\"swatch sw-body-" + std::to_string(b % 4) + "\"></span>" +
             escapeXml(bodies[b].name.empty() ? "body " + std::to_string(b + 1) : bodies[b].name) +
             "</span>";
    }
    out += "</div>";
    for (const std::string& note : viewNotes()) out += element("p", note, "class=\"note\"");
    return out + "</section>\n";
  }

  /// What the views cannot show, said rather than left out silently.
  std::vector<std::string> viewNotes() const {
    const ReportCell& cell = options_.report_cell;
    std::vector<std::string> frames;
    for (const TimelineMotion& entry : timeline_) {
      const std::string& frame = entry.motion->frame;
      if (!entry.frame_known && std::find(frames.begin(), frames.end(), frame) == frames.end()) {
        frames.push_back(frame);
      }
    }
    std::string frame_list;
    for (const std::string& frame : frames) frame_list += (frame_list.empty() ? "" : ", ") + frame;
    std::vector<std::string> notes;
    if (cell.empty()) {
      notes.push_back("No cell geometry was given to this report: the views show the TCP targets in "
                      "their reference frame (" + frame_list +
                      ") without the arm base or the cell's bodies.");
      return notes;
    }
    if (!frames.empty()) {
      notes.push_back("The pose of frame(s) " + frame_list +
                      " in the cell is not known: their targets are drawn as if given in the cell "
                      "frame.");
    }
    if (!cell.X_CB) notes.push_back("The arm base pose was not given; it is not drawn.");
    if (cell.bodies.empty()) notes.push_back("No cell bodies were given; obstacles are not drawn.");
    return notes;
  }

  std::string scopeSection(const ReportScope& scope, const std::string& title,
                           const std::string& id) const {
    std::string out = "<section class=\"card scope\" id=\"" + id + "\" data-scope=\"" +
                      escapeXml(scope.seam.empty() ? "program" : scope.seam) + "\">";
    out += element("h2", title);
    if (scope.motions.empty()) {
      return out + element("p", "The program holds no motions.", "class=\"note\"") + "</section>\n";
    }
    if (scope.lead_in) {
      out += element("p", "Plots start where the arm comes from (record " +
                              std::to_string(timeline_[*scope.lead_in].record + 1) + ").",
                     "class=\"note\"");
    }
    out += element("h3", "Joint values at the motion targets");
    out += "<div class=\"chart-grid\">";
    for (int j = 0; j < static_cast<int>(program_.metadata.joints.size()); ++j) {
      out += charts_.jointChart(scope, j, id + "-joint" + std::to_string(j + 1));
    }
    out += "</div>";
    out += element("h3", "Speed and margins");
    out += "<div class=\"chart-grid\">" + charts_.speedChart(scope, id + "-speed") +
           charts_.clearanceChart(scope, id + "-clearance") +
           charts_.singularityChart(scope, id + "-singularity") + "</div>";
    out += "<div class=\"legend\"><span><span class=\"swatch sw-strip\"></span>process on (strip on the time axis)</span>"
           "<span><span class=\"swatch sw-limit\"></span>beyond a limit</span>"
           "<span><span class=\"swatch sw-near\"></span>within the warning margin of a limit or "
           "threshold</span><span><span class=\"swatch sw-warning\"></span>warning (see list)</span>"
           "<span>bar beside each chart: the joint's whole range, the used part dark</span></div>";
    return out + "</section>\n";
  }

  /// The row of a circular move's via point, before the move's own row: the
  /// time it passes the via at a uniform path speed, the via joints and
  /// position; the figures of a target stay empty.
  std::string viaRow(const std::string& number, const MotionRecord& previous,
                     const MotionRecord& motion, int columns) const {
    std::string out = "<tr class=\"via\">" + element("td", number) +
                      element("td", "via", "class=\"text\"") +
                      element("td", motion.seam, "class=\"text\"") +
                      element("td", quantities_.time.format(planner::viaPassingTime(
                                        previous.X_RT.translation(), motion))) +
                      element("td", "");
    for (int j = 0; j < motion.via->q_via.size(); ++j) {
      out += element("td", quantities_.joint(program_.metadata.joints[j].type)
                               .format(motion.via->q_via[j]));
    }
    const Eigen::Vector3d p_RV = motion.via->X_RV.translation();
    for (int k = 0; k < 3; ++k) out += element("td", quantities_.length.format(p_RV[k]));
    const int used = 5 + static_cast<int>(motion.via->q_via.size()) + 3;
    return out + element("td", "passed on the arc to record " + number,
                         "class=\"text\" colspan=\"" + std::to_string(columns - used) + '"') +
           "</tr>";
  }

  std::string recordTable() const {
    const std::string& length = quantities_.length.unit;
    std::string out = "<section class=\"card\" id=\"records\"><details><summary>Motion records (" +
                      std::to_string(program_.records.size()) +
                      ") — click to open</summary><div class=\"scroll\"><table class=\"records\"><tr>"
                      "<th>n</th><th class=\"text\">kind</th><th class=\"text\">seam</th>"
                      "<th>start [s]</th><th>duration [s]</th>";
    for (const planner::ProgramJoint& joint : program_.metadata.joints) {
      out += element("th", joint.name + " [" + quantities_.joint(joint.type).unit + ']');
    }
    out += "<th>x [" + length + "]</th><th>y [" + length + "]</th><th>z [" + length + "]</th>"
           "<th>speed</th><th>blend [" + length + "]</th><th>clearance [" + length + "]</th>"
           "<th>sing. margin [" + quantities_.angle.unit + "]</th><th class=\"text\">tool / frame</th>"
           "<th class=\"text\">branch</th></tr>";
    const int columns = 5 + static_cast<int>(program_.metadata.joints.size()) + 9;
    const MotionRecord* previous = nullptr;  // checkProgram(): a circular move has one
    for (std::size_t i = 0; i < program_.records.size(); ++i) {
      const std::string number = std::to_string(i + 1);
      const bool warned = std::any_of(warnings_.begin(), warnings_.end(), [&](const ReviewWarning& w) {
        return w.record && *w.record == i;
      });
      if (const auto* event = std::get_if<ProcessEvent>(&program_.records[i])) {
        out += "<tr class=\"event\" id=\"record-" + number + "\">" + element("td", number) +
               element("td", toString(event->kind), "class=\"text\"") +
               element("td", event->seam, "class=\"text\"") +
               element("td", quantities_.time.format(event->time)) +
               element("td", "process set " + event->parameter_set,
                       "class=\"text\" colspan=\"" + std::to_string(columns - 4) + '"') +
               "</tr>";
        continue;
      }
      const auto& motion = std::get<MotionRecord>(program_.records[i]);
      if (motion.via) out += viaRow(number, *previous, motion, columns);
      previous = &motion;
      out += "<tr id=\"record-" + number + '"' + (warned ? " class=\"warned\"" : "") + '>' +
             element("td", number) + element("td", toString(motion.kind), "class=\"text\"") +
             element("td", motion.seam, "class=\"text\"") +
             element("td", quantities_.time.format(motion.start_time)) +
             element("td", quantities_.time.format(motion.duration));
      for (int j = 0; j < motion.q.size(); ++j) {
        out += element("td", quantities_.joint(program_.metadata.joints[j].type).format(motion.q[j]));
      }
      const Eigen::Vector3d p_RT = motion.X_RT.translation();
      for (int k = 0; k < 3; ++k) out += element("td", quantities_.length.format(p_RT[k]));
      const std::string speed =
          motion.speed.kind == planner::SpeedKind::kTcpSpeed
              ? quantities_.speed.format(motion.speed.value) + ' ' + quantities_.speed.unit
              : quantities_.fraction.format(motion.speed.value) + " of max";
      out += element("td", speed) + element("td", quantities_.length.format(motion.blend_radius)) +
             element("td", motion.clearance ? quantities_.length.format(*motion.clearance) : "") +
             element("td", motion.singularity_margin
                               ? quantities_.angle.format(*motion.singularity_margin)
                               : "") +
             element("td", motion.tool + " / " + motion.frame, "class=\"text\"") +
             element("td", motion.branch, "class=\"text\"") + "</tr>";
    }
    return out + "</table></div></details></section>\n";
  }

  std::string inputs() const {
    std::string out = "<section class=\"card\" id=\"inputs\">" + element("h2", "Input files");
    if (program_.metadata.inputs.empty()) {
      return out + element("p", "The program names no input files.", "class=\"note\"") +
             "</section>\n";
    }
    out += "<table class=\"inputs\"><tr><th class=\"text\">file</th><th class=\"text\">SHA-256</th></tr>";
    for (const planner::InputFileHash& input : program_.metadata.inputs) {
      out += "<tr>" + element("td", input.path, "class=\"text\"") +
             element("td", input.sha256, "class=\"text hash\"") + "</tr>";
    }
    return out + "</table></section>\n";
  }

  const Program& program_;
  const WriteOptions& options_;
  FileQuantities quantities_;
  std::vector<TimelineMotion> timeline_;
  std::vector<ReviewWarning> warnings_;
  ReportCharts charts_;
  json summary_;
};

}  // namespace

void HtmlReportPostProcessor::write(const Program& program, const WriteOptions& options,
                                    std::ostream& out) const {
  planner::checkProgram(program, options.output_name);
  checkReportCell(options.report_cell, options.output_name);
  out << PageWriter(program, options).page();
}

}  // namespace tw::postproc
