#include "SessionCopies.h"

#include "SessionFileCheck.h"

#include <sqlite3.h>

#include <filesystem>
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
