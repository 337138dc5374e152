#pragma once

#include <string>

namespace tw::postproc {

/// The style sheet of the review report, inlined into its <style> element.
/// System fonts only (nothing to download); free of '<' and '&' so that the
/// page stays well-formed XML; a print layout without the page background.
const std::string& reportStyleSheet();

}  // namespace tw::postproc
