// Progress on stderr for long commands, and Ctrl-C as a cancel request.
#pragma once

#include "earmark/core/progress.hpp"

#include <chrono>
#include <string>

namespace earmark::cli {

// Installs a SIGINT handler that turns Ctrl-C into a cancel request (checked
// by the Progress callbacks) instead of killing the process mid-write.
void installInterruptHandler();
bool interruptRequested();

// Draws "label  42 %" on stderr (only when stderr is a terminal, or when
// forced), and asks the work to stop after Ctrl-C.
class TerminalProgress {
public:
    TerminalProgress(std::string label, bool force);
    ~TerminalProgress();
    Progress progress();

private:
    bool update(double fraction);
    std::string label_;
    bool enabled_;
    int lastPercent_ = -1;
    std::chrono::steady_clock::time_point start_;
};

}  // namespace earmark::cli
