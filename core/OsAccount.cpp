#include "OsAccount.h"

#include <pwd.h>
#include <unistd.h>

#include <cstdlib>
#include <vector>

namespace sagline {

std::string currentOsAccount()
{
    const uid_t uid = geteuid();
    long size = sysconf(_SC_GETPW_R_SIZE_MAX);
    std::vector<char> buffer(static_cast<std::size_t>(size > 0 ? size : 16384));
    passwd entry{};
    passwd *found = nullptr;
    if (getpwuid_r(uid, &entry, buffer.data(), buffer.size(), &found) == 0 && found && found->pw_name && *found->pw_name)
        return found->pw_name;
    for (const char *variable : {"USER", "LOGNAME"}) {
        if (const char *value = std::getenv(variable); value && *value)
            return value;
    }
    return "uid " + std::to_string(uid);
}

} // namespace sagline
