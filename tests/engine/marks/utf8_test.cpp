// UTF-8 validation against RFC 3629 and against CPython's strict UTF-8 decoder.
#include "earmark/marks/utf8.hpp"

#include "support/temp_dir.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace earmark {
namespace {

// Cases from the syntax of RFC 3629, section 4.
TEST(Utf8, Rfc3629Examples) {
    EXPECT_TRUE(isValidUtf8(""));
    EXPECT_TRUE(isValidUtf8("plain ASCII"));
    EXPECT_TRUE(isValidUtf8("\x41\xE2\x89\xA2\xCE\x91\x2E"));            // RFC 3629 §7: "A<NOT IDENTICAL TO><ALPHA>."
    EXPECT_TRUE(isValidUtf8("\xED\x95\x9C\xEA\xB5\xAD\xEC\x96\xB4"));    // RFC 3629 §7: Korean "hangugeo"
    EXPECT_TRUE(isValidUtf8("\xEF\xBB\xBF\xF0\xA3\x8E\xB4"));            // RFC 3629 §7: BOM + U+233B4
    EXPECT_TRUE(isValidUtf8("\xF4\x8F\xBF\xBF"));                        // U+10FFFF, the last code point
    EXPECT_EQ(firstInvalidUtf8("\xF4\x90\x80\x80"), 0u);                 // above U+10FFFF
    EXPECT_EQ(firstInvalidUtf8("ab\xC0\x80"), 2u);                       // overlong NUL
    EXPECT_EQ(firstInvalidUtf8("\xE0\x80\xAF"), 0u);                     // overlong '/'
    EXPECT_EQ(firstInvalidUtf8("\xED\xA0\x80"), 0u);                     // surrogate U+D800
    EXPECT_EQ(firstInvalidUtf8("x\x80"), 1u);                            // lone continuation byte
    EXPECT_EQ(firstInvalidUtf8("x\xE2\x89"), 1u);                        // cut short at the end
    EXPECT_EQ(firstInvalidUtf8("\xFE"), 0u);                             // never a UTF-8 byte
    EXPECT_EQ(firstInvalidUtf8("\xC3\xA9\xE2\x28\xA1"), 2u);             // bad second byte after "é"
}

// CPython's bytes.decode('utf-8') is strict per RFC 3629 (rejects overlongs,
// surrogates, > U+10FFFF): a reference implementation outside this project.
TEST(Utf8, AgreesWithPythonsStrictDecoderOnRandomBytes) {
    test::TempDir dir;
    std::mt19937 rng(5);
    // Each sample mixes correctly encoded code points of every length with
    // stray bytes from the interesting ranges, so valid and invalid strings
    // (cut, overlong, surrogate, out of range) both occur often.
    const std::vector<unsigned char> pool = {0x7F, 0x80, 0x8F, 0x90, 0x9F, 0xA0, 0xBF, 0xC0, 0xC1, 0xC2, 0xDF,
                                             0xE0, 0xE1, 0xEC, 0xED, 0xEE, 0xEF, 0xF0, 0xF1, 0xF3, 0xF4, 0xF5,
                                             0xFF};
    auto encode = [](std::uint32_t cp) {
        std::string e;
        if (cp < 0x80) {
            e += static_cast<char>(cp);
        } else if (cp < 0x800) {
            e += static_cast<char>(0xC0 | (cp >> 6));
            e += static_cast<char>(0x80 | (cp & 0x3F));
        } else if (cp < 0x10000) {
            e += static_cast<char>(0xE0 | (cp >> 12));
            e += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
            e += static_cast<char>(0x80 | (cp & 0x3F));
        } else {
            e += static_cast<char>(0xF0 | (cp >> 18));
            e += static_cast<char>(0x80 | ((cp >> 12) & 0x3F));
            e += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
            e += static_cast<char>(0x80 | (cp & 0x3F));
        }
        return e;
    };
    const std::uint32_t limits[] = {0x80, 0x800, 0x10000, 0x110000};
    std::vector<std::string> samples;
    std::ofstream out(dir.file("samples.txt"));
    for (int i = 0; i < 4000; ++i) {
        std::string s;
        const int n = 1 + static_cast<int>(rng() % 4);
        for (int k = 0; k < n; ++k) {
            if (rng() % 10 < 8) {
                const std::uint32_t cp = rng() % limits[rng() % 4];  // surrogates included on purpose
                s += encode(cp);
            } else {
                s += static_cast<char>(pool[rng() % pool.size()]);
            }
        }
        samples.push_back(s);
        for (unsigned char c : s) {
            char hex[3];
            std::snprintf(hex, sizeof hex, "%02x", c);
            out << hex;
        }
        out << '\n';
    }
    out.close();
    const std::string script =
        "import sys\n"
        "for line in open(sys.argv[1]):\n"
        "    b = bytes.fromhex(line.strip())\n"
        "    try:\n"
        "        b.decode('utf-8', 'strict'); print(1)\n"
        "    except UnicodeDecodeError:\n"
        "        print(0)\n";
    std::ofstream(dir.file("check.py")) << script;
    const std::string cmd = "/usr/bin/python3 '" + dir.file("check.py") + "' '" + dir.file("samples.txt") +
                            "' > '" + dir.file("verdicts.txt") + "'";
    ASSERT_EQ(std::system(cmd.c_str()), 0) << "needs /usr/bin/python3";
    std::ifstream verdicts(dir.file("verdicts.txt"));
    int valid = 0, checked = 0;
    for (const std::string& s : samples) {
        int expected = -1;
        ASSERT_TRUE(verdicts >> expected);
        EXPECT_EQ(isValidUtf8(s), expected == 1) << "sample " << checked;
        valid += expected;
        ++checked;
    }
    EXPECT_EQ(checked, 4000);
    EXPECT_GT(valid, 200);  // both verdicts occur often enough to mean something
    EXPECT_LT(valid, 3800);
}

}  // namespace
}  // namespace earmark
