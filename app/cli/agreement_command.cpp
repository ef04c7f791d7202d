// earmark-cli agreement: how far the raters of a session agree on the takes
// several of them reviewed (docs/agreement.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"

#include "earmark/agreement/agreement_json.hpp"
#include "earmark/agreement/mark_agreement.hpp"
#include "earmark/store/session.hpp"

#include <cmath>
#include <cstdio>
#include <filesystem>

namespace earmark::cli {
namespace {

using agreement::AgreementReport;

std::string figure(double v, const char* format = "%.3f") {
    if (!std::isfinite(v)) return "-";
    char buf[32];
    std::snprintf(buf, sizeof buf, format, v);
    return buf;
}

void printText(const AgreementReport& r) {
    std::printf("raters: ");
    for (std::size_t i = 0; i < r.raters.size(); ++i) std::printf("%s%s", i ? ", " : "", r.raters[i].c_str());
    std::printf("\ntakes compared: %zu; marks compared: %d; span tolerance %.3f s\n\n", r.takes.size(),
                r.marksCompared, r.toleranceSeconds);
    std::printf("%-14s %6s %8s %8s\n", "category", "units", "fleiss", "alpha");
    for (const auto& row : r.rows)
        std::printf("%-14s %6d %8s %8s\n", row.category ? std::string(categoryName(*row.category)).c_str() : "overall",
                    row.alpha.units, figure(row.fleiss.value).c_str(), figure(row.alpha.value).c_str());
    std::printf("\n%-14s %-25s %5s %7s %7s %7s %7s %7s %7s %7s\n", "category", "raters (A / B)", "takes", "cohen",
                "marks A", "marks B", "matched", "recall", "precis.", "F1");
    for (const auto& row : r.rows)
        for (const auto& p : row.pairs)
            std::printf("%-14s %-25s %5d %7s %7d %7d %7d %7s %7s %7s\n",
                        row.category ? std::string(categoryName(*row.category)).c_str() : "overall",
                        (p.raterA + " / " + p.raterB).c_str(), p.takes, figure(p.cohen.value).c_str(),
                        p.spans.spansA, p.spans.spansB, p.spans.matched, figure(p.spans.recall()).c_str(),
                        figure(p.spans.precision()).c_str(), figure(p.spans.f1()).c_str());
}

}  // namespace

int runAgreement(const std::vector<std::string>& argv) {
    const agreement::AgreementParams defaults;
    Arguments args("agreement", "SESSION [--json] [--tolerance S]",
                   {{"json", "", "", "write the report as JSON on stdout instead of tables"},
                    {"tolerance", "S", figure(defaults.toleranceSeconds, "%g"),
                     "largest gap in seconds between two raters' spans that still match"}});
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1) throw UsageError("expects exactly one SESSION file (see --help)");
    agreement::AgreementParams params;
    params.toleranceSeconds = args.number("tolerance").value_or(defaults.toleranceSeconds);
    if (!(params.toleranceSeconds >= 0.0)) throw UsageError("--tolerance expects seconds >= 0");
    const Session session = Session::open(args.positionals().front(), OpenMode::ReadOnly);
    const AgreementReport report = agreement::markAgreement(session.marks(), session.reviewers(), params);
    if (args.has("json")) {
        const std::string name = std::filesystem::path(session.path()).filename().string();
        std::fputs(agreement::agreementToJson(report, name).c_str(), stdout);
    } else {
        printText(report);
    }
    if (report.takes.empty())
        std::fprintf(stderr, "no take was reviewed by two or more raters: nothing to compare (see session assign)\n");
    return kExitOk;
}

}  // namespace earmark::cli
