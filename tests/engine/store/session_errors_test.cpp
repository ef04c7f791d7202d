// Files that are not sessions, schema versions, read-only places and a full
// disk: each gives one clear message naming the file, and nothing is overwritten.
#include "earmark/core/error.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <sqlite3.h>
#include <sys/resource.h>

#include <csignal>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using test::draftAt;
using test::rawSql;
using test::slurp;
using test::TempDir;
using test::writeTake;

// The message of the error Session::open throws, or "" if it opened.
template <typename ErrorType = Error>
std::string openError(const std::string& path, OpenMode mode = OpenMode::ReadWrite) {
    try {
        Session::open(path, mode);
    } catch (const ErrorType& e) {
        return e.what();
    }
    return "";
}

TEST(SessionErrors, GarbageEmptyAndForeignFilesAreNotSessions) {
    TempDir dir;
    std::ofstream(dir.file("garbage.earmark")) << "this is a text file, not a session\n";
    std::ofstream(dir.file("empty.earmark"));
    rawSql(dir.file("other.db"), "CREATE TABLE t(x); INSERT INTO t VALUES (1);");
    const std::string garbage = slurp(dir.file("garbage.earmark"));

    EXPECT_EQ(openError<InputError>(dir.file("garbage.earmark")),
              dir.file("garbage.earmark") + ": is not an Earmark session (not an SQLite database)");
    EXPECT_EQ(openError<InputError>(dir.file("empty.earmark")),
              dir.file("empty.earmark") + ": is empty, not an Earmark session");
    EXPECT_EQ(openError<InputError>(dir.file("other.db")),
              dir.file("other.db") + ": is an SQLite database but not an Earmark session");
    EXPECT_EQ(openError<InputError>(dir.file("none.earmark")), dir.file("none.earmark") + ": file not found");
    EXPECT_THAT(openError<InputError>(dir.path().string()), HasSubstr("is a folder"));
    EXPECT_EQ(slurp(dir.file("garbage.earmark")), garbage);  // untouched
    EXPECT_FALSE(fs::exists(dir.file("garbage.earmark-wal")));
}

TEST(SessionErrors, NewerSchemaIsRefusedAndLeftUntouched) {
    TempDir dir;
    const std::string file = dir.file("new.earmark");
    {
        Session s = Session::create(file);
        s.addTakes({{writeTake(dir.file("a.wav")), "a", "", ""}});
    }
    rawSql(file, "PRAGMA user_version = 7;");
    const std::string before = slurp(file);
    EXPECT_EQ(openError<InputError>(file),
              file + ": was written by a newer Earmark (session schema 7; this version reads up to " +
                  std::to_string(Session::kSchemaVersion) + "). It was not changed; open it with a newer Earmark");
    EXPECT_THAT(openError<InputError>(file, OpenMode::ReadOnly), HasSubstr("newer Earmark"));
    EXPECT_EQ(slurp(file), before);
}

TEST(SessionErrors, OlderSchemaIsUpgradedInOneTransaction) {
    TempDir dir;
    const std::string file = dir.file("old.earmark");
    createSessionAtSchemaVersion(file, 1);
    writeTake(dir.file("a.wav"), 2.0);
    // A version-1 file with one take and one mark, written as version 1 would.
    rawSql(file,
           "INSERT INTO takes (queue_pos, audio_path, line_id, text, build, status, duration_s, sample_rate, "
           "channels, added_utc) VALUES (0, 'a.wav', 'a', 'Old text.', 'v0', 'has-marks', 2.0, 16000, 1, "
           "'2024-01-02T03:04:05.000Z');"
           "INSERT INTO marks (take_id, category, subtype, severity, start_s, end_s, words, note, rater, "
           "created_utc, updated_utc, measures) VALUES (1, 'timing', 'rushed', 'major', 0.5, 1.25, '', "
           "'kept', 'r', '2024-01-02T03:04:05.000Z', '2024-01-02T03:04:05.000Z', '{\"duration_s\":0.75}');");
    EXPECT_THAT(openError<InputError>(file, OpenMode::ReadOnly), HasSubstr("older session schema 1"));
    {
        Session s = Session::open(file);
        const auto marks = s.marks();
        ASSERT_EQ(marks.size(), 1u);
        EXPECT_EQ(marks[0].note, "kept");
        EXPECT_EQ(marks[0].measures.at("duration_s"), 0.75);
        EXPECT_EQ(s.takes()[0].text, "Old text.");
        EXPECT_EQ(s.takes()[0].statusUtc, "");       // column added by version 2
        s.replaceSuspects(s.takes()[0].id, {{0, 0, "x", 1, 2, 0, 1, "new in version 2"}});
        EXPECT_EQ(s.integrityCheck(), "ok");
    }
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, "PRAGMA user_version", -1, &st, nullptr);
    ASSERT_EQ(sqlite3_step(st), SQLITE_ROW);
    EXPECT_EQ(sqlite3_column_int(st, 0), Session::kSchemaVersion);
    sqlite3_finalize(st);
    sqlite3_close(db);
}

TEST(SessionErrors, FailedUpgradeLeavesTheOldVersion) {
    TempDir dir;
    const std::string file = dir.file("old.earmark");
    createSessionAtSchemaVersion(file, 1);
    // A table of the name version 2 creates makes the upgrade fail half way.
    rawSql(file, "CREATE TABLE suspects (x);");
    EXPECT_THAT(openError(file), HasSubstr("upgrading the session to schema 2"));
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, "SELECT (SELECT user_version FROM pragma_user_version), "
                           "(SELECT count(*) FROM pragma_table_info('takes') WHERE name = 'status_utc')",
                       -1, &st, nullptr);
    ASSERT_EQ(sqlite3_step(st), SQLITE_ROW);
    EXPECT_EQ(sqlite3_column_int(st, 0), 1);  // still version 1 ...
    EXPECT_EQ(sqlite3_column_int(st, 1), 0);  // ... and no part of step 2 remains
    sqlite3_finalize(st);
    sqlite3_close(db);
}

TEST(SessionErrors, CreateNamesTheFileWhenTheFolderIsMissing) {
    TempDir dir;
    try {
        Session::create(dir.file("no/such/folder/s.earmark"));
        FAIL() << "expected Error";
    } catch (const Error& e) {
        EXPECT_THAT(e.what(), HasSubstr("s.earmark: cannot be created: folder"));
    }
}

// Runs `body` as an unprivileged user (root ignores file permissions), in a child.
test::ChildResult asUnprivilegedUser(const std::function<int(int)>& body) {
    return test::runInChild([&](int fd) {
        if (geteuid() == 0 && (setgid(65534) != 0 || setuid(65534) != 0)) return 97;
        return body(fd);
    });
}

TEST(SessionErrors, ReadOnlyFileAndReadOnlyFolder) {
    TempDir dir;
    fs::permissions(dir.path(), fs::perms::all);  // the unprivileged child must reach it
    fs::create_directories(dir.path() / "ro");
    const std::string file = dir.file("ro/s.earmark");
    {
        Session s = Session::create(file);
        s.addTakes({{writeTake(dir.file("ro/a.wav")), "a", "", ""}});
        s.addMark(1, draftAt(0.1, 0.2));
    }
    const std::string before = slurp(file);

    // The file is read-only, its folder writable.
    fs::permissions(file, fs::perms::owner_read | fs::perms::group_read | fs::perms::others_read);
    fs::permissions(dir.path() / "ro", fs::perms::all);
    auto fileResult = asUnprivilegedUser([&](int fd) {
        test::writeAll(fd, openError(file));
        return 0;
    });
    ASSERT_EQ(fileResult.exitCode, 0);
    EXPECT_THAT(fileResult.output, HasSubstr(file + ": is read-only (Permission denied); nothing was changed"));

    // The folder is read-only too: writing is refused, reading still works.
    fs::permissions(dir.path() / "ro", fs::perms::owner_read | fs::perms::owner_exec | fs::perms::group_read |
                                           fs::perms::group_exec | fs::perms::others_read | fs::perms::others_exec);
    auto folderResult = asUnprivilegedUser([&](int fd) {
        test::writeAll(fd, openError(file) + "\n");
        try {
            const Session s = Session::open(file, OpenMode::ReadOnly);
            test::writeAll(fd, "marks=" + std::to_string(s.marks().size()));
        } catch (const Error& e) {
            test::writeAll(fd, std::string("read failed: ") + e.what());
        }
        test::writeAll(fd, "\n" + [&] {
            try {
                Session::create(dir.file("ro/new.earmark"));
            } catch (const Error& e) {
                return std::string(e.what());
            }
            return std::string("created");
        }());
        return 0;
    });
    ASSERT_EQ(folderResult.exitCode, 0);
    EXPECT_THAT(folderResult.output, HasSubstr(file + ": is read-only"));
    EXPECT_THAT(folderResult.output, HasSubstr("marks=1"));
    EXPECT_THAT(folderResult.output, HasSubstr("new.earmark: cannot be created: Permission denied"));
    fs::permissions(dir.path() / "ro", fs::perms::all);
    EXPECT_EQ(slurp(file), before);
}

// A full disk, made real with RLIMIT_FSIZE in a child process: writes past
// the limit fail with EFBIG, as they would with ENOSPC on a full disk.
TEST(SessionErrors, FullDiskLosesNoCommittedMarkAndSaysWhy) {
    TempDir dir;
    const std::string file = dir.file("full.earmark");
    {
        Session s = Session::create(file);
        s.addTakes({{writeTake(dir.file("a.wav")), "a", "", ""}});
    }
    const auto child = test::runInChild([&](int fd) {
        std::signal(SIGXFSZ, SIG_IGN);
        Session s = Session::open(file);
        const rlimit limit{256 * 1024, 256 * 1024};
        if (setrlimit(RLIMIT_FSIZE, &limit) != 0) return 96;
        MarkDraft d = draftAt(0.1, 0.2);
        d.note.assign(15000, 'n');
        for (int i = 0; i < 1000; ++i) {
            try {
                const MarkId id = s.addMark(1, d).markId();
                test::writeAll(fd, "id " + std::to_string(id) + "\n");
            } catch (const Error& e) {
                test::writeAll(fd, std::string("error ") + e.what() + "\n");
                return 0;
            }
        }
        return 1;  // the limit was never reached
    });
    ASSERT_EQ(child.exitCode, 0) << child.output;
    EXPECT_THAT(child.output, HasSubstr("error " + file + ":"));
    EXPECT_THAT(child.output, HasSubstr("nothing was changed"));
    std::istringstream lines(child.output);
    std::string word;
    long long id = 0;
    std::vector<long long> returned;
    while (lines >> word)
        if (word == "id" && lines >> id) returned.push_back(id);
    ASSERT_GT(returned.size(), 3u);
    const Session s = Session::open(file);
    EXPECT_EQ(s.integrityCheck(), "ok");
    EXPECT_EQ(s.marks().size(), returned.size());
    for (long long m : returned) EXPECT_NO_THROW(s.mark(m));
}

}  // namespace
}  // namespace earmark
