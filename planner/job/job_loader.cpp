#include "planner/job/job_loader.hpp"

#include <algorithm>
#include <set>

#include "kinematics/common/xml_file.hpp"
#include "kinematics/xml_values.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/job/seam_points_csv.hpp"

namespace tw::planner {
namespace {

// The shared XML readers and unit constants (kinematics/xml_values.hpp).
using namespace kinematics;
using tinyxml2::XMLElement;

// Turnaround acceleration for the default lead [m/s²]: the worked example of
// domain-facts §2 (from memory, a typical gun-carrying arm).
constexpr double kDefaultTurnaroundAcceleration = 5.0;

/// Reads one job file; keeps it open for located errors.
class JobFileReader {
 public:
  explicit JobFileReader(const std::string& path) : file_(path) {}

  Job read() {
    const XMLElement& root = file_.root("job");
    file_.allowOnly(root, {"format-version", "name", "length-unit", "angle-unit", "time-unit"},
                    {"cell", "seam", "patch", "transit", "outputs"});
    checkFormatHeader(file_, root, true);
    const XMLElement& cell_element = file_.child(root, "cell");
    file_.allowOnly(cell_element, {"file"});

    Job job{file_.text(root, "name"),
            file_.path(),
            loadCell(resolvePath(file_, file_.text(cell_element, "file"))),
            {},
            {},
            file_.directory(),
            {}};
    std::set<std::string> names;
    for (const XMLElement* element = root.FirstChildElement(); element != nullptr;
         element = element->NextSiblingElement()) {
      const std::string kind = element->Name();
      if (kind != "seam" && kind != "patch") continue;
      if (!names.insert(file_.text(*element, "name")).second) {
        file_.fail(*element, "the name '" + file_.text(*element, "name") +
                                 "' is already used by another seam or patch of this job");
      }
      if (kind == "seam") {
        job.tasks.emplace_back(readSeam(*element, job.cell));
      } else {
        job.tasks.emplace_back(readPatch(*element, job.cell));
      }
    }
    if (job.tasks.empty()) file_.fail(root, "expected at least one <seam> or <patch>");
    if (const XMLElement* transit = file_.optionalChild(root, "transit")) {
      job.transit = readTransit(*transit);
    }
    if (const XMLElement* outputs = file_.optionalChild(root, "outputs")) {
      readOutputs(*outputs, job);
    }
    return job;
  }

 private:
  /// What seams and patches share: line, name, frame and tool (checked
  /// against the cell), speed, approach and retract.
  template <typename Spec>
  void readCommon(const XMLElement& element, const Cell& cell, Spec& spec) const {
    spec.line = element.GetLineNum();
    spec.name = file_.text(element, "name");
    spec.frame = file_.text(element, "frame");
    spec.tool = file_.text(element, "tool");
    if (!cell.frames.contains(spec.frame)) {
      file_.fail(element, "unknown frame '" + spec.frame + "'; expected a frame of cell '" +
                              cell.name + "' (" + cell.source + ")");
    }
    if (cell.findTool(spec.tool) == nullptr) {
      file_.fail(element, "unknown tool '" + spec.tool + "'; expected a tool of cell '" +
                              cell.name + "' (" + cell.source + ")");
    }
    spec.speed = kMmToM * positive(element, "speed");
    spec.approach = readLengthOr(file_, element, "approach", spec.approach, true);
    spec.retract = readLengthOr(file_, element, "retract", spec.retract, true);
    if (const std::optional<std::string> set = file_.optionalText(element, "parameter-set")) {
      if (set->empty()) file_.fail(element, "parameter-set must not be empty (leave it out for the default)");
      spec.parameter_set = *set;
    }
  }

  double positive(const XMLElement& element, const char* attribute) const {
    const double value = file_.number(element, attribute);
    if (value <= 0.0) file_.fail(element, std::string(attribute) + " must be greater than 0");
    return value;
  }

  /// An angle in degrees within [low, high], returned in radians.
  double angle(const XMLElement& element, const char* attribute, double low, double high,
               const char* expected) const {
    const double value = file_.number(element, attribute);
    if (value < low || value > high) {
      file_.fail(element, std::string(attribute) + " must be " + expected);
    }
    return kDegToRad * value;
  }

  SeamSpec readSeam(const XMLElement& element, const Cell& cell) const {
    file_.allowOnly(element,
                    {"name", "points", "frame", "tool", "speed", "approach", "retract", "step",
                     "corner-angle", "direction", "parameter-set"},
                    {"weld", "paint", "dispense"});
    SeamSpec seam;
    readCommon(element, cell, seam);
    seam.sampling.step = readLengthOr(file_, element, "step", seam.sampling.step);
    if (element.Attribute("corner-angle") != nullptr) {
      seam.sampling.corner_angle =
          angle(element, "corner-angle", 1e-9, 170.0, "above 0 and at most 170 degrees");
    }

    const XMLElement* process = element.FirstChildElement();
    if (process == nullptr) {
      file_.fail(element, "expected exactly one process element: <weld>, <paint> or <dispense>");
    }
    if (process->NextSiblingElement() != nullptr) {
      file_.fail(*process->NextSiblingElement(),
                 "a seam has exactly one process element: <weld>, <paint> or <dispense>");
    }
    seam.process = readProcess(*process);
    seam.points = loadSeamPointsCsv(resolvePath(file_, file_.text(element, "points")));
    if (element.Attribute("direction") != nullptr) {
      seam.reversed = file_.choice(element, "direction", {"as-listed", "reversed"}) == 1;
    }
    if (seam.reversed) std::reverse(seam.points.points.begin(), seam.points.points.end());
    return seam;
  }

  ProcessParameters readProcess(const XMLElement& element) const {
    const std::string kind = element.Name();
    if (kind == "weld") {
      file_.allowOnly(element, {"work-angle", "travel-angle", "tilt", "contact-tip-distance"});
      WeldParameters weld;
      if (element.Attribute("work-angle") != nullptr) {
        weld.work_angle =
            angle(element, "work-angle", 1e-9, 180.0 - 1e-9, "between 0 and 180 degrees");
      }
      if (element.Attribute("travel-angle") != nullptr) {
        // Beyond 45° the torch lies closer to the seam than across it.
        weld.travel_angle = angle(element, "travel-angle", 0.0, 45.0, "from 0 to 45 degrees");
      }
      if (element.Attribute("tilt") != nullptr) {
        weld.tilt = file_.choice(element, "tilt", {"push", "drag"}) == 0 ? TravelTilt::kPush
                                                                         : TravelTilt::kDrag;
      }
      weld.contact_tip_distance =
          readLengthOr(file_, element, "contact-tip-distance", weld.contact_tip_distance);
      return weld;
    }
    if (kind == "paint") {
      file_.allowOnly(element, {"stand-off"});
      PaintParameters paint;
      paint.stand_off = readLengthOr(file_, element, "stand-off", paint.stand_off);
      return paint;
    }
    file_.allowOnly(element, {"stand-off"});
    DispenseParameters dispense;
    dispense.stand_off = readLength(file_, element, "stand-off");
    return dispense;
  }

  PatchSpec readPatch(const XMLElement& element, const Cell& cell) const {
    file_.allowOnly(element,
                    {"name", "frame", "tool", "speed", "approach", "retract", "step", "parameter-set"},
                    {"outline", "paint"});
    PatchSpec patch;
    readCommon(element, cell, patch);
    patch.step = readLengthOr(file_, element, "step", patch.step);

    const XMLElement& outline = file_.child(element, "outline");
    file_.allowOnly(outline, {"normal", "pass-direction"}, {"corner"});
    const Eigen::Vector3d normal = file_.triple(outline, "normal");
    if (normal.norm() < 1e-9) file_.fail(outline, "normal must not be zero");
    patch.patch.normal = normal.normalized();
    patch.patch.pass_direction = file_.triple(outline, "pass-direction");
    if (patch.patch.pass_direction.norm() < 1e-9) {
      file_.fail(outline, "pass-direction must not be zero");
    }
    patch.patch.pass_direction.normalize();
    for (const XMLElement* corner = outline.FirstChildElement("corner"); corner != nullptr;
         corner = corner->NextSiblingElement("corner")) {
      file_.allowOnly(*corner, {"xyz"});
      patch.patch.outline.push_back(kMmToM * file_.triple(*corner, "xyz"));
    }
    if (std::optional<std::string> problem = paintPatchProblem(patch.patch)) {
      file_.fail(outline, *problem);
    }

    const XMLElement& paint = file_.child(element, "paint");
    file_.allowOnly(paint, {"stand-off", "spray-width", "fan-half-angle", "overlap", "lead",
                            "turnaround-acceleration"});
    RasterParameters& raster = patch.raster;
    raster.stand_off = readLengthOr(file_, paint, "stand-off", raster.stand_off);
    const bool has_width = paint.Attribute("spray-width") != nullptr;
    if (has_width == (paint.Attribute("fan-half-angle") != nullptr)) {
      file_.fail(paint, "give exactly one of spray-width (mm) or fan-half-angle (deg)");
    }
    raster.spray_width = has_width
                             ? readLength(file_, paint, "spray-width")
                             : fanWidth(raster.stand_off, angle(paint, "fan-half-angle", 1e-9, 80.0,
                                                                "above 0 and at most 80 degrees"));
    if (paint.Attribute("overlap") != nullptr) {
      const double percent = file_.number(paint, "overlap");
      if (percent < 0.0 || percent >= 100.0) {
        file_.fail(paint, "overlap must be a percentage from 0 up to (not including) 100");
      }
      raster.overlap = percent / 100.0;
    }
    if (paint.Attribute("lead") != nullptr) {
      if (paint.Attribute("turnaround-acceleration") != nullptr) {
        file_.fail(paint, "give lead or turnaround-acceleration, not both");
      }
      raster.lead = readLength(file_, paint, "lead", true);
    } else {
      const double acceleration = paint.Attribute("turnaround-acceleration") != nullptr
                                      ? kMmToM * positive(paint, "turnaround-acceleration")
                                      : kDefaultTurnaroundAcceleration;
      raster.lead = defaultLead(raster.spray_width, patch.speed, acceleration);
    }
    return patch;
  }

  TransitSettings readTransit(const XMLElement& element) const {
    file_.allowOnly(element, {"joint-speed", "clearance", "time-limit", "seed"});
    TransitSettings transit;
    if (element.Attribute("joint-speed") != nullptr) {
      const double percent = file_.number(element, "joint-speed");
      if (percent <= 0.0 || percent > 100.0) {
        file_.fail(element, "joint-speed must be a percentage above 0 and at most 100");
      }
      transit.joint_speed_fraction = percent / 100.0;
    }
    transit.clearance = readLengthOr(file_, element, "clearance", transit.clearance, true);
    if (element.Attribute("time-limit") != nullptr) {
      transit.time_limit = positive(element, "time-limit");
    }
    if (element.Attribute("seed") != nullptr) {
      const double seed = file_.number(element, "seed");
      if (seed < 0.0 || seed > 4294967295.0 ||
          seed != static_cast<double>(static_cast<long long>(seed))) {
        file_.fail(element, "seed must be a whole number from 0 to 4294967295");
      }
      transit.seed = static_cast<unsigned>(seed);
    }
    return transit;
  }

  void readOutputs(const XMLElement& element, Job& job) const {
    file_.allowOnly(element, {"directory"}, {"output"});
    if (const std::optional<std::string> directory = file_.optionalText(element, "directory")) {
      job.output_directory = resolvePath(file_, *directory);
    }
    std::set<std::string> files;
    for (const XMLElement* output = element.FirstChildElement("output"); output != nullptr;
         output = output->NextSiblingElement("output")) {
      file_.allowOnly(*output, {"writer", "file", "template"});
      OutputRequest request;
      request.writer = file_.text(*output, "writer");
      request.path = file_.text(*output, "file");
      request.line = output->GetLineNum();
      // Only the template writer renders a user's template; it needs one.
      const std::optional<std::string> template_file = file_.optionalText(*output, "template");
      if (request.writer == "template" && !template_file) {
        file_.fail(*output, "writer=\"template\" needs template=\"FILE\" (the template to render)");
      }
      if (request.writer != "template" && template_file) {
        file_.fail(*output, "template=\"...\" is only for writer=\"template\"");
      }
      if (template_file) request.template_path = resolvePath(file_, *template_file);
      if (!files.insert(request.path).second) {
        file_.fail(*output, "file '" + request.path + "' is already written by another <output>");
      }
      if (request.path.front() != '/') request.path = job.output_directory + "/" + request.path;
      job.outputs.push_back(std::move(request));
    }
  }

  XmlFile file_;
};

}  // namespace

Job loadJob(const std::string& path) { return JobFileReader(path).read(); }

}  // namespace tw::planner
