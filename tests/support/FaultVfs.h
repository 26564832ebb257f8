// A test VFS (after SQLite's src/test_vfs.c): wraps the default VFS and, once armed, makes
// writes, syncs and truncates fail with a chosen code after a given number of them succeeded.
// Registered as the default VFS while a FaultVfsScope lives, so code under test needs no change.
#pragma once

#include <sqlite3.h>

#include <cstring>

namespace sagline::testing {

struct FaultPlan {
    int writesLeft = -1;        // successful write/sync/truncate calls before failing; -1 = never fail
    int failureCode = SQLITE_IOERR_WRITE; // e.g. SQLITE_IOERR_WRITE, SQLITE_FULL
    int failures = 0;           // how many calls were failed so far
};

inline FaultPlan &faultPlan()
{
    static FaultPlan plan;
    return plan;
}

namespace faultvfs {

struct File {
    sqlite3_file base;     // must be first: SQLite sees this
    sqlite3_file *real;    // the wrapped file, allocated right after this struct
};

inline sqlite3_vfs *&realVfs()
{
    static sqlite3_vfs *vfs = nullptr;
    return vfs;
}

inline bool shouldFail()
{
    FaultPlan &plan = faultPlan();
    if (plan.writesLeft < 0)
        return false;
    if (plan.writesLeft == 0) {
        ++plan.failures;
        return true;
    }
    --plan.writesLeft;
    return false;
}

inline sqlite3_file *real(sqlite3_file *file) { return reinterpret_cast<File *>(file)->real; }

inline int xClose(sqlite3_file *f) { return real(f)->pMethods ? real(f)->pMethods->xClose(real(f)) : SQLITE_OK; }
inline int xRead(sqlite3_file *f, void *b, int n, sqlite3_int64 o) { return real(f)->pMethods->xRead(real(f), b, n, o); }
inline int xWrite(sqlite3_file *f, const void *b, int n, sqlite3_int64 o)
{
    return shouldFail() ? faultPlan().failureCode : real(f)->pMethods->xWrite(real(f), b, n, o);
}
inline int xTruncate(sqlite3_file *f, sqlite3_int64 s)
{
    return shouldFail() ? SQLITE_IOERR_TRUNCATE : real(f)->pMethods->xTruncate(real(f), s);
}
inline int xSync(sqlite3_file *f, int flags)
{
    return shouldFail() ? SQLITE_IOERR_FSYNC : real(f)->pMethods->xSync(real(f), flags);
}
inline int xFileSize(sqlite3_file *f, sqlite3_int64 *s) { return real(f)->pMethods->xFileSize(real(f), s); }
inline int xLock(sqlite3_file *f, int l) { return real(f)->pMethods->xLock(real(f), l); }
inline int xUnlock(sqlite3_file *f, int l) { return real(f)->pMethods->xUnlock(real(f), l); }
inline int xCheckReservedLock(sqlite3_file *f, int *r) { return real(f)->pMethods->xCheckReservedLock(real(f), r); }
inline int xFileControl(sqlite3_file *f, int op, void *a) { return real(f)->pMethods->xFileControl(real(f), op, a); }
inline int xSectorSize(sqlite3_file *f) { return real(f)->pMethods->xSectorSize(real(f)); }
inline int xDeviceCharacteristics(sqlite3_file *f) { return real(f)->pMethods->xDeviceCharacteristics(real(f)); }

inline const sqlite3_io_methods *ioMethods()
{
    // Version 1 methods only: no WAL shared memory and no mmap, which the store never uses.
    static const sqlite3_io_methods methods = {1, xClose, xRead, xWrite, xTruncate, xSync, xFileSize, xLock, xUnlock,
                                               xCheckReservedLock, xFileControl, xSectorSize, xDeviceCharacteristics,
                                               nullptr, nullptr, nullptr, nullptr, nullptr, nullptr};
    return &methods;
}

inline int xOpen(sqlite3_vfs *, sqlite3_filename name, sqlite3_file *file, int flags, int *outFlags)
{
    File *wrapper = reinterpret_cast<File *>(file);
    wrapper->real = reinterpret_cast<sqlite3_file *>(wrapper + 1);
    std::memset(wrapper->real, 0, static_cast<std::size_t>(realVfs()->szOsFile));
    const int rc = realVfs()->xOpen(realVfs(), name, wrapper->real, flags, outFlags);
    wrapper->base.pMethods = rc == SQLITE_OK ? ioMethods() : nullptr;
    return rc;
}
inline int xDelete(sqlite3_vfs *, const char *n, int s) { return realVfs()->xDelete(realVfs(), n, s); }
inline int xAccess(sqlite3_vfs *, const char *n, int f, int *o) { return realVfs()->xAccess(realVfs(), n, f, o); }
inline int xFullPathname(sqlite3_vfs *, const char *n, int s, char *o) { return realVfs()->xFullPathname(realVfs(), n, s, o); }
inline int xRandomness(sqlite3_vfs *, int n, char *o) { return realVfs()->xRandomness(realVfs(), n, o); }
inline int xSleep(sqlite3_vfs *, int us) { return realVfs()->xSleep(realVfs(), us); }
inline int xCurrentTime(sqlite3_vfs *, double *t) { return realVfs()->xCurrentTime(realVfs(), t); }

} // namespace faultvfs

// Installs the fault VFS as the default for its lifetime; disarmed (writesLeft = -1) at start.
class FaultVfsScope {
public:
    FaultVfsScope()
    {
        faultvfs::realVfs() = sqlite3_vfs_find(nullptr);
        faultPlan() = FaultPlan{};
        m_vfs.iVersion = 1;
        m_vfs.szOsFile = static_cast<int>(sizeof(faultvfs::File)) + faultvfs::realVfs()->szOsFile;
        m_vfs.mxPathname = faultvfs::realVfs()->mxPathname;
        m_vfs.zName = "sagline-fault";
        m_vfs.xOpen = faultvfs::xOpen;
        m_vfs.xDelete = faultvfs::xDelete;
        m_vfs.xAccess = faultvfs::xAccess;
        m_vfs.xFullPathname = faultvfs::xFullPathname;
        m_vfs.xRandomness = faultvfs::xRandomness;
        m_vfs.xSleep = faultvfs::xSleep;
        m_vfs.xCurrentTime = faultvfs::xCurrentTime;
        m_registered = sqlite3_vfs_register(&m_vfs, 1) == SQLITE_OK;
    }
    ~FaultVfsScope()
    {
        faultPlan() = FaultPlan{};
        sqlite3_vfs_unregister(&m_vfs);
        sqlite3_vfs_register(faultvfs::realVfs(), 1);
    }
    FaultVfsScope(const FaultVfsScope &) = delete;
    FaultVfsScope &operator=(const FaultVfsScope &) = delete;
    bool isRegistered() const { return m_registered; }

private:
    sqlite3_vfs m_vfs{};
    bool m_registered = false;
};

} // namespace sagline::testing
