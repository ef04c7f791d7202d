// Command-line take lists: CSV (RFC 4180 quoting) and plain audio paths.
#include "earmark/widgets/take_list.hpp"

#include "earmark/core/error.hpp"
#include "support/temp_dir.hpp"

#include <QDir>
#include <QFile>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

void writeText(const std::string& path, const char* text) {
    QFile f(QString::fromStdString(path));
    ASSERT_TRUE(f.open(QIODevice::WriteOnly));
    f.write(text);
}

TEST(SplitCsvLine, HandlesQuotesCommasAndDoubledQuotes) {
    // RFC 4180 §2: fields with commas or quotes are quoted; a quote inside is doubled.
    const QStringList f = splitCsvLine(R"(a,"b, c","say ""hi""",,e)");
    ASSERT_EQ(f.size(), 5);
    EXPECT_EQ(f[0], "a");
    EXPECT_EQ(f[1], "b, c");
    EXPECT_EQ(f[2], "say \"hi\"");
    EXPECT_EQ(f[3], "");
    EXPECT_EQ(f[4], "e");
}

TEST(ReadTakeList, ResolvesAudioRelativeToTheList) {
    earmark::test::TempDir dir;
    writeText(dir.file("lines.csv"),
              "id,audio,text,fault\r\n"
              "t-1,takes/one.wav,\"Hello, there.\",\r\n"
              "\r\n"
              ",takes/two.wav,Plain text,flat\r\n");
    const auto takes = readTakeList(QString::fromStdString(dir.file("lines.csv")));
    ASSERT_EQ(takes.size(), 2u);
    EXPECT_EQ(takes[0].id, "t-1");
    EXPECT_EQ(takes[0].text, "Hello, there.");
    EXPECT_EQ(takes[0].audio, QDir(QString::fromStdString(dir.path().string())).absoluteFilePath("takes/one.wav"));
    EXPECT_EQ(takes[1].id, "two");  // no id: the file's base name
}

TEST(ReadTakeList, AListWithoutAnAudioColumnIsAnInputError) {
    earmark::test::TempDir dir;
    writeText(dir.file("bad.csv"), "id,path\nx,y.wav\n");
    try {
        readTakeList(QString::fromStdString(dir.file("bad.csv")));
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("bad.csv"), std::string::npos);
    }
}

TEST(TakesFromArguments, MixesAudioFilesAndLists) {
    earmark::test::TempDir dir;
    writeText(dir.file("l.csv"), "audio\na.wav\nb.wav\n");
    const auto takes = takesFromArguments({QString::fromStdString(dir.file("x.flac")), QString::fromStdString(dir.file("l.csv"))});
    ASSERT_EQ(takes.size(), 3u);
    EXPECT_EQ(takes[0].id, "x");
    EXPECT_EQ(takes[2].id, "b");
}

}  // namespace
}  // namespace earmark::widgets
