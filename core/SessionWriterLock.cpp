#include "SessionWriterLock.h"

#include "AtomicFile.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fcntl.h>
#include <fstream>
#include <sstream>
#include <sys/file.h>
#include <sys/stat.h>
#include <sys/sysmacros.h>
#include <unistd.h>

namespace sagline {

namespace {

std::string hostName()
{
    char name[256] = {};
    if (::gethostname(name, sizeof name - 1) != 0 || name[0] == '\0')
        return "this host";
    return name;
}

std::string programOf(long pid)
{
    std::ifstream comm("/proc/" + std::to_string(pid) + "/comm");
    std::string name;
    std::getline(comm, name);
    return name;
}

StoreResult<SessionWriterLock> busy(const std::string &path)
{
    return StoreResult<SessionWriterLock>::failure(
        StoreCode::Busy, path + ": being written by " + describeLockHolder(path)
                             + "; one program writes a session at a time (it can still be opened for review)");
}

} // namespace

SessionWriterLock::~SessionWriterLock()
{
    if (m_fd >= 0)
        ::close(m_fd); // closing releases the flock
}

SessionWriterLock::SessionWriterLock(SessionWriterLock &&other) noexcept : m_fd(other.m_fd)
{
    other.m_fd = -1;
}

SessionWriterLock &SessionWriterLock::operator=(SessionWriterLock &&other) noexcept
{
    if (this != &other) {
        if (m_fd >= 0)
            ::close(m_fd);
        m_fd = other.m_fd;
        other.m_fd = -1;
    }
    return *this;
}

StoreResult<SessionWriterLock> SessionWriterLock::acquire(const std::string &path)
{
    const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC | O_NOCTTY);
    if (fd < 0)
        return StoreResult<SessionWriterLock>::failure(StoreCode::CannotOpen,
                                                       path + ": cannot open (" + std::strerror(errno) + ")");
    SessionWriterLock lock(fd);
    if (::flock(fd, LOCK_EX | LOCK_NB) != 0) {
        if (errno == EWOULDBLOCK)
            return busy(path);
        return StoreResult<SessionWriterLock>::failure(StoreCode::IoError,
                                                       path + ": cannot lock (" + std::strerror(errno) + ")");
    }
    return StoreResult<SessionWriterLock>(std::move(lock));
}

StoreResult<SessionWriterLock> SessionWriterLock::createAndAcquire(const std::string &path)
{
    const int fd = ::open(path.c_str(), O_RDWR | O_CREAT | O_EXCL | O_CLOEXEC | O_NOCTTY, 0644);
    if (fd < 0) {
        const int error = errno;
        return StoreResult<SessionWriterLock>::failure(error == EEXIST ? StoreCode::FileExists : StoreCode::CannotOpen,
                                                       path + ": cannot create the file (" + describeFileError(error) + ")");
    }
    SessionWriterLock lock(fd);
    if (::flock(fd, LOCK_EX | LOCK_NB) != 0)
        return StoreResult<SessionWriterLock>::failure(StoreCode::IoError,
                                                       path + ": cannot lock (" + std::strerror(errno) + ")");
    return StoreResult<SessionWriterLock>(std::move(lock));
}

std::string describeLockHolder(const std::string &path)
{
    struct stat file {};
    if (::stat(path.c_str(), &file) != 0)
        return "another process";
    // /proc/locks: "1: FLOCK  ADVISORY  WRITE 4242 08:01:1234567 0 EOF" (device in hex,
    // inode in decimal); waiting requests are marked "->" and are not holders.
    std::ifstream locks("/proc/locks");
    std::string line;
    while (std::getline(locks, line)) {
        if (line.find("->") != std::string::npos)
            continue;
        std::istringstream fields(line);
        std::string ordinal, kind, mode, access, where;
        long pid = 0;
        if (!(fields >> ordinal >> kind >> mode >> access >> pid >> where) || kind != "FLOCK")
            continue;
        unsigned major = 0, minor = 0;
        unsigned long long inode = 0;
        if (std::sscanf(where.c_str(), "%x:%x:%llu", &major, &minor, &inode) != 3)
            continue;
        if (major == ::major(file.st_dev) && minor == ::minor(file.st_dev) && inode == file.st_ino && pid > 0) {
            const std::string program = programOf(pid);
            return "process " + std::to_string(pid) + (program.empty() ? "" : " (" + program + ")") + " on host "
                   + hostName();
        }
    }
    return "another process";
}

} // namespace sagline
