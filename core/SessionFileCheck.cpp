#include "SessionFileCheck.h"

#include "SessionSchema.h"
#include "SqliteHandle.h"
#include "SqliteStatement.h"

#include <sqlite3.h>

#include <array>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

namespace sagline {

namespace {

std::uint32_t bigEndian32(const unsigned char *bytes)
{
    return (std::uint32_t{bytes[0]} << 24) | (std::uint32_t{bytes[1]} << 16) | (std::uint32_t{bytes[2]} << 8) |
           std::uint32_t{bytes[3]};
}

std::string hex32(std::uint32_t value)
{
    char text[16];
    std::snprintf(text, sizeof text, "0x%08X", value);
    return text;
}

} // namespace

StoreStatus checkSessionFileHeader(const std::string &path)
{
    namespace fs = std::filesystem;
    std::error_code error;
    const fs::file_status status = fs::status(path, error);
    if (error || !fs::exists(status))
        return StoreStatus::failure(StoreCode::CannotOpen, path + ": no such file");
    if (!fs::is_regular_file(status))
        return StoreStatus::failure(StoreCode::CannotOpen, path + ": not a regular file");
    const std::uintmax_t size = fs::file_size(path, error);
    if (error)
        return StoreStatus::failure(StoreCode::CannotOpen, path + ": cannot read its size (" + error.message() + ")");
    if (size == 0)
        return StoreStatus::failure(StoreCode::NotASession, path + ": the file is empty, not a Sagline session");

    std::array<unsigned char, 100> header{};
    std::ifstream in(path, std::ios::binary);
    if (!in)
        return StoreStatus::failure(StoreCode::CannotOpen, path + ": cannot be read (permission?)");
    in.read(reinterpret_cast<char *>(header.data()), static_cast<std::streamsize>(header.size()));
    const auto got = static_cast<std::size_t>(in.gcount());

    static constexpr char magic[] = "SQLite format 3"; // 15 characters and its NUL: header bytes 0-15
    if (got < sizeof magic || std::memcmp(header.data(), magic, sizeof magic) != 0)
        return StoreStatus::failure(StoreCode::NotASession, path + ": not a Sagline session (not an SQLite database file)");
    if (got < header.size())
        return StoreStatus::failure(StoreCode::Corrupt, path + ": the file is truncated (shorter than its 100-byte header)");

    const std::uint32_t applicationId = bigEndian32(&header[68]);
    if (applicationId != sessionApplicationId)
        return StoreStatus::failure(StoreCode::NotASession,
                                    path + ": an SQLite database but not a Sagline session (application id " +
                                        hex32(applicationId) + ", expected " + hex32(sessionApplicationId) + ")");

    // Page size: bytes 16-17, big-endian, 1 meaning 65536; a power of two from 512.
    std::uint32_t pageSize = (std::uint32_t{header[16]} << 8) | header[17];
    if (pageSize == 1)
        pageSize = 65536;
    if (pageSize < 512 || pageSize > 65536 || (pageSize & (pageSize - 1)) != 0)
        return StoreStatus::failure(StoreCode::Corrupt, path + ": damaged header (page size " + std::to_string(pageSize) + ")");

    // A hot journal means an interrupted write that SQLite will roll back: sizes may disagree until then.
    if (fs::exists(path + "-journal", error) || fs::exists(path + "-wal", error))
        return StoreStatus::success();
    // Page count (bytes 28-31) is valid when the change counter (24) equals version-valid-for (92).
    const std::uint32_t pageCount = bigEndian32(&header[28]);
    const bool countValid = bigEndian32(&header[24]) == bigEndian32(&header[92]) && pageCount > 0;
    if (size % pageSize != 0 || (countValid && size < std::uintmax_t{pageCount} * pageSize))
        return StoreStatus::failure(StoreCode::Corrupt,
                                    path + ": the file is truncated (" + std::to_string(size) + " bytes, expected " +
                                        std::to_string(std::uintmax_t{pageCount} * pageSize) + ")");
    return StoreStatus::success();
}

StoreStatus hardenConnection(sqlite3 *db)
{
    struct Setting {
        int option;
        int value;
        const char *name;
    };
    static constexpr std::array<Setting, 4> settings{{
        {SQLITE_DBCONFIG_DEFENSIVE, 1, "defensive mode"},
        {SQLITE_DBCONFIG_TRUSTED_SCHEMA, 0, "untrusted schema"},
        {SQLITE_DBCONFIG_ENABLE_TRIGGER, 0, "triggers off"},
        {SQLITE_DBCONFIG_ENABLE_VIEW, 0, "views off"},
    }};
    for (const Setting &setting : settings) {
        int applied = -1;
        const int rc = sqlite3_db_config(db, setting.option, setting.value, &applied);
        if (rc != SQLITE_OK || applied != setting.value)
            return sqliteFailure(db, rc != SQLITE_OK ? rc : SQLITE_ERROR, std::string("setting ") + setting.name);
    }
    // Readings are short; a crafted 1 GB string or blob is refused rather than loaded.
    sqlite3_limit(db, SQLITE_LIMIT_LENGTH, 16 * 1024 * 1024);
    for (const char *pragma : {"PRAGMA cell_size_check = ON", "PRAGMA mmap_size = 0"}) {
        const int rc = sqliteExec(db, pragma);
        if (rc != SQLITE_OK)
            return sqliteFailure(db, rc, pragma);
    }
    const int rc = sqlite3_busy_timeout(db, 5000);
    if (rc != SQLITE_OK)
        return sqliteFailure(db, rc, "setting the busy timeout");
    return StoreStatus::success();
}

StoreResult<SqliteHandle> openHardenedConnection(const std::string &path, int flags)
{
    sqlite3 *raw = nullptr;
    // NOMUTEX: a connection is only ever used by one thread at a time (the review scan opens its
    // own in its worker), so SQLite's per-call connection lock is pure cost: a quarter of the
    // instructions of reading a 100 000-reading session went to locking and unlocking it.
    const int rc = sqlite3_open_v2(path.c_str(), &raw, flags | SQLITE_OPEN_EXRESCODE | SQLITE_OPEN_NOMUTEX, nullptr);
    SqliteHandle db(raw); // owns the handle even when the open failed
    if (rc != SQLITE_OK)
        return StoreResult<SqliteHandle>::failure(sqliteFailure(db.get(), rc, path + ": cannot open"));
    if (StoreStatus status = hardenConnection(db.get()); !status.ok())
        return StoreResult<SqliteHandle>::failure(status);
    return db;
}

StoreStatus quickCheck(sqlite3 *db, bool full)
{
    SqliteStatement check;
    int rc = check.prepare(db, full ? "PRAGMA integrity_check(20)" : "PRAGMA quick_check(20)");
    if (rc != SQLITE_OK)
        return sqliteFailure(db, rc, "checking the file");
    std::string findings;
    while ((rc = check.step()) == SQLITE_ROW) {
        const std::string line = check.columnText(0);
        if (line == "ok")
            continue;
        findings += findings.empty() ? line : "; " + line;
    }
    if (rc != SQLITE_DONE)
        return sqliteFailure(db, rc, "checking the file");
    if (!findings.empty())
        return StoreStatus::failure(StoreCode::Corrupt, "the file is damaged: " + findings);
    return StoreStatus::success();
}

} // namespace sagline
