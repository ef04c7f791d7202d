#include "earmark/core/progress.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>

namespace earmark {

void Progress::report(double fraction) const {
    if (!fn_) return;
    const double f = std::clamp(fraction, 0.0, 1.0);
    if (!fn_(begin_ + (end_ - begin_) * f)) throw Cancelled();
}

Progress Progress::sub(double begin, double end) const {
    Progress child = *this;
    const double span = end_ - begin_;
    child.begin_ = begin_ + span * std::clamp(begin, 0.0, 1.0);
    child.end_ = begin_ + span * std::clamp(end, 0.0, 1.0);
    return child;
}

}  // namespace earmark
