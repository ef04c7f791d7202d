// Script check: code points sorted into scripts by the block ranges of The
// Unicode Standard (Blocks.txt), and voices refusing scripts they cannot read.
#include "earmark/align/script_check.hpp"
#include "earmark/core/error.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace earmark {
namespace {

TEST(ScriptCheck, BlocksFromTheUnicodeStandard) {
    EXPECT_EQ(scriptOf(U'a'), Script::Latin);
    EXPECT_EQ(scriptOf(U'é'), Script::Latin);     // U+00E9, Latin-1 Supplement
    EXPECT_EQ(scriptOf(U'ŋ'), Script::Latin);     // U+014B, Latin Extended-A
    EXPECT_EQ(scriptOf(U'ɔ'), Script::Latin);     // U+0254, IPA Extensions
    EXPECT_EQ(scriptOf(U'ж'), Script::Cyrillic);  // U+0436
    EXPECT_EQ(scriptOf(U'λ'), Script::Greek);     // U+03BB
    EXPECT_EQ(scriptOf(U'ש'), Script::Hebrew);    // U+05E9
    EXPECT_EQ(scriptOf(U'ب'), Script::Arabic);    // U+0628
    EXPECT_EQ(scriptOf(U'क'), Script::Devanagari);  // U+0915
    EXPECT_EQ(scriptOf(U'東'), Script::Han);       // U+6771, CJK Unified Ideographs
    EXPECT_EQ(scriptOf(U'か'), Script::Hiragana);  // U+304B
    EXPECT_EQ(scriptOf(U'カ'), Script::Katakana);  // U+30AB
    EXPECT_EQ(scriptOf(U'한'), Script::Hangul);    // U+D55C, Hangul Syllables
    EXPECT_EQ(scriptOf(U'ก'), Script::Thai);      // U+0E01
    // Not letters: digits, punctuation, symbols, CJK punctuation, emoji.
    for (char32_t c : {U'4', U',', U'€', U'—', U'。', U'🙂', U' ', U'\uFEFF'}) EXPECT_EQ(scriptOf(c), Script::None) << int(c);
}

TEST(ScriptCheck, VoicesReadTheirOwnScriptAndLatin) {
    EXPECT_NO_THROW(checkTextScript("Café, naïve — 42 €!", "en-us", "en-us"));
    EXPECT_NO_THROW(checkTextScript("Привет, world", "ru", "ru"));
    EXPECT_NO_THROW(checkTextScript("東京へ行きます", "ja", "ja"));
    EXPECT_NO_THROW(checkTextScript("灯塔", "cmn", "cmn"));
    EXPECT_NO_THROW(checkTextScript("Γειά σου", "el", "el"));
    EXPECT_NO_THROW(checkTextScript("anything", "xx-unknown", "xx"));
}

TEST(ScriptCheck, OtherScriptsAreRefusedNamingTheFirstLetter) {
    try {
        checkTextScript("Ferry to 東京", "en-us", "en-us");
        FAIL();
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "text");
        EXPECT_THAT(e.problem(), ::testing::HasSubstr("Han script ('東' at character 10)"));
        EXPECT_THAT(e.problem(), ::testing::HasSubstr("voice 'en-us'"));
    }
    EXPECT_THROW(checkTextScript("Привет", "en-gb", "en-gb-x-rp"), InputError);
    EXPECT_THROW(checkTextScript("かな", "cmn", "cmn"), InputError);
    EXPECT_THROW(checkTextScript("bad \xFF", "en-us", "en-us"), InputError);
}

}  // namespace
}  // namespace earmark
