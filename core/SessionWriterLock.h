// One session, one writer. The process writing a session file holds an exclusive advisory lock
// (flock(2)) on it for as long as it may write; a second writer (another run, another window)
// is refused with the holder's host and process. Readers take no such lock: compare and the
// review read a session being written through SQLite's own shared locks, which never see a
// half-written reading. flock is independent of SQLite's fcntl locks, and the lock's file
// descriptor is closed only after SQLite's connection (SessionStore declares it first).
// Locks on network file systems are not reliable; a session is written on a local disk.
#pragma once

#include "StoreResult.h"

#include <string>

namespace sagline {

class SessionWriterLock {
public:
    SessionWriterLock() = default;
    ~SessionWriterLock();
    SessionWriterLock(SessionWriterLock &&other) noexcept;
    SessionWriterLock &operator=(SessionWriterLock &&other) noexcept;
    SessionWriterLock(const SessionWriterLock &) = delete;
    SessionWriterLock &operator=(const SessionWriterLock &) = delete;

    // Takes the lock on the existing file at `path`; Busy naming the holder when another
    // process has it, CannotOpen when the file cannot be opened.
    static StoreResult<SessionWriterLock> acquire(const std::string &path);
    // Creates `path` (it must not exist: FileExists) and takes the lock on it: the file is
    // this process's from its first moment.
    static StoreResult<SessionWriterLock> createAndAcquire(const std::string &path);

    bool isHeld() const { return m_fd >= 0; }

private:
    explicit SessionWriterLock(int fd) : m_fd(fd) {}
    int m_fd = -1;
};

// "process 4242 (sagline-cli) on host bench-7", or "another process" when it cannot be told.
// Looks the holder of the flock on `path` up in /proc/locks (processes of this host).
std::string describeLockHolder(const std::string &path);

} // namespace sagline
