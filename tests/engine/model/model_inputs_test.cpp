// Hostile side inputs of the model commands: numbers beyond a double in a
// mel sidecar or a token list, or a folder in their place.
#include "earmark/core/error.hpp"
#include "earmark/model/attention.hpp"
#include "earmark/model/mel_settings.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <fstream>
#include <functional>
#include <string>

namespace earmark {
namespace {

using ::testing::HasSubstr;

std::string problemOf(const std::function<void()>& read, const std::string& path) {
    try {
        read();
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        return e.problem();
    }
    return "(no error)";
}

TEST(ModelInputs, NumbersTooLargeNameTheFile) {
    test::TempDir dir;
    const std::string sidecar = dir.file("pred.npy.json"), tokens = dir.file("tokens.json");
    std::ofstream(sidecar, std::ios::binary) << R"({"sample_rate": 1e400})";
    std::ofstream(tokens, std::ios::binary) << "[\"a\", " << std::string(400, '7') << "]";
    EXPECT_THAT(problemOf([&] { readMelSidecar(sidecar); }, sidecar), HasSubstr("number too large"));
    EXPECT_THAT(problemOf([&] { readTokenList(tokens); }, tokens), HasSubstr("number too large"));
}

TEST(ModelInputs, AFolderIsRefused) {
    test::TempDir dir;
    const std::string folder = dir.path().string();
    EXPECT_THAT(problemOf([&] { readMelSidecar(folder); }, folder), HasSubstr("is a folder"));
    EXPECT_THAT(problemOf([&] { readTokenList(folder); }, folder), HasSubstr("is a folder"));
}

}  // namespace
}  // namespace earmark
