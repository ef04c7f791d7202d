// Which Qt notices are dropped from the terminal, and that others are not.
#include "earmark/widgets/quiet_terminal.hpp"

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

TEST(QuietTerminal, FrameworkNoticesTheUserCannotActOnAreDropped) {
    EXPECT_TRUE(isFrameworkNoise("PulseAudioService: pa_context_connect() failed"));
    EXPECT_TRUE(isFrameworkNoise("QStandardPaths: XDG_RUNTIME_DIR not set, defaulting to '/tmp/runtime-root'"));
    EXPECT_TRUE(isFrameworkNoise("This plugin does not support propagateSizeHints()"));
}

TEST(QuietTerminal, EverythingElseIsKept) {
    EXPECT_FALSE(isFrameworkNoise("earmark: cannot read /tmp/x.wav"));
    EXPECT_FALSE(isFrameworkNoise("QPainter::begin: Paint device returned engine == 0"));
    EXPECT_FALSE(isFrameworkNoise("A PulseAudioService: pa_context_connect() failed"));  // matched at the start only
    EXPECT_FALSE(isFrameworkNoise(""));
}

}  // namespace
}  // namespace earmark::widgets
