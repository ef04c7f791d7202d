// The order in which the rater's name is chosen (earmark/marks/rater_name.hpp).
#include "earmark/core/error.hpp"
#include "earmark/marks/rater_name.hpp"

#include <gtest/gtest.h>

#include <cstdlib>

namespace earmark {
namespace {

// Sets or clears an environment variable for one test and restores it after.
class ScopedEnv {
public:
    ScopedEnv(const char* name, const char* value) : name_(name) {
        if (const char* old = std::getenv(name)) old_ = old;
        if (value) ::setenv(name, value, 1);
        else ::unsetenv(name);
    }
    ~ScopedEnv() {
        if (old_) ::setenv(name_, old_->c_str(), 1);
        else ::unsetenv(name_);
    }

private:
    const char* name_;
    std::optional<std::string> old_;
};

TEST(RaterName, ExplicitThenEnvironmentThenSettingsThenSystem) {
    ScopedEnv env(kRaterEnvironmentVariable, "  env-rater ");
    EXPECT_EQ(resolveRaterName({.explicitName = "flag", .settingsName = "stored"}), "flag");
    EXPECT_EQ(resolveRaterName({.explicitName = " ", .settingsName = "stored"}), "env-rater");
    {
        ScopedEnv cleared(kRaterEnvironmentVariable, nullptr);
        EXPECT_EQ(resolveRaterName({.settingsName = "stored"}), "stored");
        const std::string system = resolveRaterName({});
        EXPECT_FALSE(system.empty());  // the test runs as some user
        EXPECT_EQ(resolveRaterName({.settingsName = ""}), system);
    }
}

TEST(RaterName, RefusesNamesThatAreNotText) {
    EXPECT_THROW(resolveRaterName({.explicitName = std::string("a\x01") + "b"}), ParamError);
    EXPECT_THROW(resolveRaterName({.explicitName = std::string(300, 'r')}), ParamError);
    EXPECT_THROW(checkRaterName("\xc3"), ParamError);
    EXPECT_NO_THROW(checkRaterName("Zoë"));
}

}  // namespace
}  // namespace earmark
