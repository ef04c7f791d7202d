// Damaging a closed session file on purpose, the way a failing disk or a
// stray write would: the cell pointers of one leaf page of a table are
// overwritten, so the rows on that page can no longer be found while the
// rest of the file reads normally. Page layout: the SQLite file format
// (sqlite.org/fileformat2.html, §1.3 header, §1.6 b-tree pages).
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <fstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace earmark::test {

// Overwrites the cell pointer array of the leftmost leaf page of `table`
// (whose root must be an interior page, i.e. the table spans several pages).
// Returns the damaged page's number. The file must be closed (no -wal).
inline std::uint32_t damageFirstLeafOf(const std::string& file, const std::string& table) {
    sqlite3* db = nullptr;
    sqlite3_open_v2(file.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
    sqlite3_stmt* st = nullptr;
    sqlite3_prepare_v2(db, "SELECT rootpage FROM sqlite_schema WHERE name = ?1", -1, &st, nullptr);
    sqlite3_bind_text(st, 1, table.c_str(), -1, SQLITE_TRANSIENT);
    const std::uint32_t root = sqlite3_step(st) == SQLITE_ROW ? static_cast<std::uint32_t>(sqlite3_column_int64(st, 0)) : 0;
    sqlite3_finalize(st);
    sqlite3_close(db);
    if (root < 2) throw std::runtime_error("no root page for " + table);

    std::fstream f(file, std::ios::in | std::ios::out | std::ios::binary);
    auto readAt = [&](std::uint64_t offset, std::size_t n) {
        std::vector<unsigned char> b(n);
        f.seekg(static_cast<std::streamoff>(offset));
        f.read(reinterpret_cast<char*>(b.data()), static_cast<std::streamsize>(n));
        return b;
    };
    const auto header = readAt(16, 2);  // page size, big-endian; 1 means 65536
    const std::uint32_t pageSize = header[0] == 0 && header[1] == 1 ? 65536u : (header[0] << 8 | header[1]);
    const std::uint64_t rootAt = std::uint64_t{root - 1} * pageSize;
    const auto rootHeader = readAt(rootAt, 14);
    if (rootHeader[0] != 0x05) throw std::runtime_error(table + " fits on one page; add more rows");
    const std::uint32_t firstCell = rootHeader[12] << 8 | rootHeader[13];  // cell pointer array starts at 12
    const auto cell = readAt(rootAt + firstCell, 4);                     // a cell starts with its left child
    const std::uint32_t leaf = std::uint32_t{cell[0]} << 24 | cell[1] << 16 | cell[2] << 8 | cell[3];
    const std::uint64_t leafAt = std::uint64_t{leaf - 1} * pageSize;
    const auto leafHeader = readAt(leafAt, 8);
    if (leafHeader[0] != 0x0D) throw std::runtime_error("leftmost child of " + table + " is not a leaf");
    const std::size_t cells = leafHeader[3] << 8 | leafHeader[4];
    const std::vector<char> garbage(2 * cells, static_cast<char>(0xFF));  // pointers far past the page
    f.seekp(static_cast<std::streamoff>(leafAt + 8));
    f.write(garbage.data(), static_cast<std::streamsize>(garbage.size()));
    f.flush();
    if (!f) throw std::runtime_error("could not damage " + file);
    return leaf;
}

}  // namespace earmark::test
