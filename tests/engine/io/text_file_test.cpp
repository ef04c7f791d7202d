// Text inputs are read once and only up to a limit: a FIFO works like a file,
// /dev/zero is refused instead of filling memory, a folder is named as one.
#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <sys/stat.h>

#include <fstream>
#include <string>
#include <thread>

namespace earmark {
namespace {

using ::testing::HasSubstr;

std::string problemOf(const std::string& path, std::size_t limit = kTextFileMaxBytes) {
    try {
        readTextFile(path, limit);
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        return e.problem();
    }
    return "(no error)";
}

TEST(TextFile, ReadsAWholeFile) {
    test::TempDir dir;
    std::ofstream(dir.file("a.txt"), std::ios::binary) << "one\ntwo\n";
    EXPECT_EQ(readTextFile(dir.file("a.txt")), "one\ntwo\n");
    EXPECT_EQ(withoutByteOrderMark("\xEF\xBB\xBFhi"), "hi");
}

TEST(TextFile, RefusesWhatIsNotATextFile) {
    test::TempDir dir;
    EXPECT_THAT(problemOf(dir.path().string()), HasSubstr("is a folder"));
    EXPECT_THAT(problemOf(dir.file("missing.txt")), HasSubstr("no such file"));
}

TEST(TextFile, StopsAtTheLimit) {
    test::TempDir dir;
    std::ofstream(dir.file("big.txt"), std::ios::binary) << std::string(1000, 'x');
    EXPECT_EQ(readTextFile(dir.file("big.txt"), 1000).size(), 1000u);
    EXPECT_THAT(problemOf(dir.file("big.txt"), 999), HasSubstr("is larger than 999 bytes"));
    // A device without end: refused after the limit, not read until memory runs out.
    EXPECT_THAT(problemOf("/dev/zero", 1 << 20), HasSubstr("is larger than 1 MiB, the limit for a text input"));
}

TEST(TextFile, ReadsAFifoOnce) {
    test::TempDir dir;
    const std::string fifo = dir.file("pipe.txt");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
    std::thread writer([&] { std::ofstream(fifo, std::ios::binary) << "id,audio\r\nx,x.wav\r\n"; });
    const std::string text = readTextFile(fifo);
    writer.join();
    EXPECT_EQ(text, "id,audio\r\nx,x.wav\r\n");
}

}  // namespace
}  // namespace earmark
