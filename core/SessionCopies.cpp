#include "SessionCopies.h"

#include "SessionFileCheck.h"

#include <sqlite3.h>

#include <cstring>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>

namespace sagline {

StoreResult<SqliteHandle> copyIntoMemory(sqlite3 *source)
{
    auto memory = openHardenedConnection(":memory:", SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE);
    if (!memory.ok())
        return memory;
    sqlite3_backup *backup = sqlite3_backup_init(memory.value.get(), "main", source, "main");
    if (backup == nullptr)
        return StoreResult<SqliteHandle>::failure(
            sqliteFailure(memory.value.get(), sqlite3_errcode(memory.value.get()), "copying the file for reading"));
    const int stepRc = sqlite3_backup_step(backup, -1);
    const int finishRc = sqlite3_backup_finish(backup);
    if (stepRc != SQLITE_DONE || finishRc != SQLITE_OK)
        return StoreResult<SqliteHandle>::failure(
            sqliteFailure(source, stepRc != SQLITE_DONE ? stepRc : finishRc, "copying the file for reading"));
    return memory;
}

bool isWalModeFile(const std::string &path)
{
    std::ifstream in(path, std::ios::binary);
    char header[20] = {};
    return in.read(header, sizeof header) && (header[18] == 2 || header[19] == 2);
}

StoreResult<SqliteHandle> copyFileIntoMemory(const std::string &path)
{
    using Result = StoreResult<SqliteHandle>;
    std::ifstream in(path, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    if (in.bad() || bytes.size() < 100)
        return Result::failure(StoreCode::Corrupt, path + ": cannot be read whole");
    bytes[18] = bytes[19] = 1; // legacy (rollback journal) format in the copy: no WAL is opened
    auto memory = openHardenedConnection(":memory:", SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE);
    if (!memory.ok())
        return memory;
    auto *buffer = static_cast<unsigned char *>(sqlite3_malloc64(bytes.size()));
    if (buffer == nullptr)
        return Result::failure(StoreCode::IoError, path + ": not enough memory to read it");
    std::memcpy(buffer, bytes.data(), bytes.size());
    const auto size = static_cast<sqlite3_int64>(bytes.size());
    const int rc = sqlite3_deserialize(memory.value.get(), "main", buffer, size, size,
                                       SQLITE_DESERIALIZE_FREEONCLOSE | SQLITE_DESERIALIZE_RESIZEABLE);
    if (rc != SQLITE_OK)
        return Result::failure(sqliteFailure(memory.value.get(), rc, path + ": cannot read it into memory"));
    return memory;
}

StoreResult<SqliteHandle> recoverIntoMemory(const std::string &path)
{
    namespace fs = std::filesystem;
    using Result = StoreResult<SqliteHandle>;
    std::error_code error;
    std::random_device seed;
    const fs::path folder = fs::temp_directory_path(error) / ("sagline-recover-" + std::to_string(seed()));
    if (error || !fs::create_directory(folder, error))
        return Result::failure(StoreCode::IoError, "cannot create a temporary folder to recover the file");
    struct RemoveFolder {
        fs::path folder;
        ~RemoveFolder()
        {
            std::error_code ignored;
            fs::remove_all(folder, ignored);
        }
    } cleanup{folder};
    const fs::path copy = folder / "recovering.sagline";
    fs::copy_file(path, copy, error);
    if (!error)
        fs::copy_file(path + "-journal", copy.string() + "-journal", error);
    if (error)
        return Result::failure(StoreCode::IoError, "cannot copy the file to recover it: " + error.message());
    auto recovering = openHardenedConnection(copy.string(), SQLITE_OPEN_READWRITE);
    if (!recovering.ok())
        return recovering;
    // The first read rolls the copy back from its journal; then make sure what remains is sound.
    if (StoreStatus status = quickCheck(recovering.value.get()); !status.ok())
        return Result::failure(status);
    return copyIntoMemory(recovering.value.get());
}

} // namespace sagline
