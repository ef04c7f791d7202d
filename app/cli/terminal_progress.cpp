#include "terminal_progress.hpp"

#include <unistd.h>

#include <atomic>
#include <csignal>
#include <cstdio>

namespace earmark::cli {
namespace {
std::atomic<bool> gInterrupted{false};
extern "C" void onInterrupt(int) { gInterrupted.store(true); }
}  // namespace

void installInterruptHandler() { std::signal(SIGINT, onInterrupt); }
bool interruptRequested() { return gInterrupted.load(); }

TerminalProgress::TerminalProgress(std::string label, bool force)
    : label_(std::move(label)), enabled_(force || isatty(STDERR_FILENO)),
      start_(std::chrono::steady_clock::now()) {}

TerminalProgress::~TerminalProgress() {
    if (enabled_ && lastPercent_ >= 0) std::fputs("\n", stderr);
}

Progress TerminalProgress::progress() {
    return Progress([this](double f) { return update(f); });
}

bool TerminalProgress::update(double fraction) {
    if (enabled_) {
        const int percent = static_cast<int>(fraction * 100.0);
        if (percent != lastPercent_) {
            lastPercent_ = percent;
            const double elapsed =
                std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
            std::fprintf(stderr, "\r%s %3d %%  %.1f s", label_.c_str(), percent, elapsed);
            std::fflush(stderr);
        }
    }
    return !interruptRequested();
}

}  // namespace earmark::cli
