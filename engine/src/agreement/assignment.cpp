#include "earmark/agreement/assignment.hpp"

#include "../listening/seeded_random.hpp"
#include "earmark/core/error.hpp"
#include "earmark/marks/rater_name.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

namespace earmark::agreement {
namespace {

void validate(const AssignmentParams& p) {
    if (p.raters.empty()) throw ParamError("AssignmentParams.raters", "names no rater");
    std::set<std::string> seen;
    for (const std::string& r : p.raters) {
        checkRaterName(r);
        if (r.find_first_not_of(" \t") == std::string::npos)
            throw ParamError("AssignmentParams.raters", "holds a blank name");
        if (!seen.insert(r).second) throw ParamError("AssignmentParams.raters", "names " + r + " twice");
    }
    if (!(p.overlapFraction >= 0.0 && p.overlapFraction <= 1.0))
        throw ParamError("AssignmentParams.overlapFraction",
                         "must be between 0 and 1, not " + std::to_string(p.overlapFraction));
    const int n = static_cast<int>(p.raters.size());
    if (p.ratersPerSharedTake != 0 && (p.ratersPerSharedTake < 2 || p.ratersPerSharedTake > n))
        throw ParamError("AssignmentParams.ratersPerSharedTake",
                         "must be 2 to " + std::to_string(n) + " (the number of raters), or 0 for all; not " +
                             std::to_string(p.ratersPerSharedTake));
    if (p.overlapFraction > 0.0 && n < 2)
        throw ParamError("AssignmentParams.overlapFraction", "an overlap needs at least two raters");
}

}  // namespace

std::vector<Assignment> assignTakes(const std::vector<TakeId>& takes, const AssignmentParams& params) {
    validate(params);
    std::vector<TakeId> unique;
    std::set<TakeId> seen;
    for (TakeId t : takes)
        if (seen.insert(t).second) unique.push_back(t);
    listening::SeededRandom rng(params.seed);
    std::vector<TakeId> order = unique;
    rng.shuffle(order);
    std::vector<std::string> raters = params.raters;
    std::sort(raters.begin(), raters.end());  // the draw depends on the names, not on the order given
    rng.shuffle(raters);

    const std::size_t n = raters.size();
    const auto shared = static_cast<std::size_t>(std::floor(params.overlapFraction * static_cast<double>(order.size()) + 0.5));
    const std::size_t perShared = params.ratersPerSharedTake == 0 ? n : static_cast<std::size_t>(params.ratersPerSharedTake);
    std::map<TakeId, std::vector<std::string>> given;
    std::size_t next = 0;  // round-robin position over the raters
    for (std::size_t i = 0; i < order.size(); ++i) {
        const std::size_t count = i < shared ? perShared : 1;
        for (std::size_t k = 0; k < count; ++k) given[order[i]].push_back(raters[next++ % n]);
    }
    std::vector<Assignment> out;
    for (TakeId t : unique) {
        std::vector<std::string>& who = given[t];
        std::sort(who.begin(), who.end());
        for (std::string& r : who) out.push_back({t, std::move(r)});
    }
    return out;
}

}  // namespace earmark::agreement
