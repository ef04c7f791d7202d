// Progress reporting and cancellation for long work.
//
// A long computation takes a `Progress` by value and calls `report(fraction)`
// now and then. The caller's callback returns false to ask for a stop, and
// `report` then throws `Cancelled`. A default-constructed Progress reports to
// nobody and never cancels. `sub(a, b)` maps a part of the work onto
// [a, b] of the caller's range, so nested steps add up to one bar.
#pragma once

#include <functional>

namespace earmark {

using ProgressFn = std::function<bool(double fraction)>;

class Progress {
public:
    Progress() = default;
    explicit Progress(ProgressFn fn) : fn_(std::move(fn)) {}

    // fraction in [0, 1] of this range. Throws Cancelled if the callback says stop.
    void report(double fraction) const;

    // A child range covering [begin, end] (fractions of this range).
    Progress sub(double begin, double end) const;

    bool active() const { return static_cast<bool>(fn_); }

private:
    ProgressFn fn_;
    double begin_ = 0.0;
    double end_ = 1.0;
};

}  // namespace earmark
