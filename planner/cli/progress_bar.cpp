#include "planner/cli/progress_bar.hpp"

#include <unistd.h>

#include <algorithm>

namespace tw::cli {
namespace {

constexpr int kBarWidth = 24;
// Long seam names would wrap the line and break the redraw on narrow
// terminals; 40 characters of the description are plenty to recognise it.
constexpr std::size_t kDescriptionWidth = 40;

}  // namespace

ProgressBar::ProgressBar(std::FILE* out, bool enabled, int total)
    : out_(out), enabled_(enabled), total_(std::max(total, 1)) {}

void ProgressBar::stage(const std::string& what) { draw(what); }

void ProgressBar::step(const std::string& finished) {
  ++done_;
  draw(finished);
}

void ProgressBar::finish() {
  if (!enabled_) return;
  std::fputs("\r\033[K", out_);
  std::fflush(out_);
}

std::string ProgressBar::render(int done, int total, const std::string& what) {
  total = std::max(total, 1);
  done = std::clamp(done, 0, total);
  const int filled = done * kBarWidth / total;
  std::string text = "[" + std::string(static_cast<std::size_t>(filled), '#') +
                     std::string(static_cast<std::size_t>(kBarWidth - filled), '.') + "] ";
  const std::string count = std::to_string(done) + "/" + std::to_string(total);
  const std::size_t count_width = 2 * std::to_string(total).size() + 1;
  text += std::string(count_width - count.size(), ' ') + count + "  ";
  text += what.size() > kDescriptionWidth ? what.substr(0, kDescriptionWidth - 3) + "..." : what;
  return text;
}

void ProgressBar::draw(const std::string& what) {
  if (!enabled_) return;
  std::fprintf(out_, "\r\033[K%s", render(done_, total_, what).c_str());
  std::fflush(out_);
}

bool stderrIsTerminal() { return isatty(STDERR_FILENO) != 0; }

}  // namespace tw::cli
