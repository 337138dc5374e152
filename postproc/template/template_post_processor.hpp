#pragma once

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// Renders the program through the user's template named by
/// WriteOptions::template_file (see ProgramTemplate and postproc/FORMAT.md),
/// so that an integrator can target a controller's language without C++.
/// The template is read on every write(); errors in it name its line.
class TemplatePostProcessor : public PostProcessor {
 public:
  std::string name() const override { return "template"; }
  std::string description() const override {
    return "user template for a controller's own language (option: template file)";
  }
  /// The template decides the language; callers usually pick the extension
  /// their controller expects.
  std::string fileExtension() const override { return "txt"; }
  void write(const planner::Program& program, const WriteOptions& options,
             std::ostream& out) const override;
};

}  // namespace tw::postproc
