// The operating-system account this program runs under, recorded beside the person's name on
// every change to a session (a name can be typed by anyone; the account is what logged in).
#pragma once

#include <string>

namespace sagline {

// The login name of the effective user (getpwuid_r), else $USER or $LOGNAME, else "uid N".
std::string currentOsAccount();

} // namespace sagline
