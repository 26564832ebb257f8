// Where a program may write an output (report, export, copy, lab sheet): never over a session
// file (recognised by its content, whatever its name), never over a file the same command reads,
// never through a folder or a device; over another existing file only when the user said so
// (--force, or a confirmation in the window).
#pragma once

#include "StoreResult.h"

#include <string>
#include <vector>

namespace sagline {

// Ok when `path` may be written; InvalidArgument naming the file and the rule otherwise.
// `inputs`: the files the command reads (compared by device and inode, so another spelling of
// the same file is caught). `replaceExisting`: another existing regular file may be replaced.
// "-" (standard output) is always allowed.
StoreStatus checkOutputPath(const std::string &path, const std::vector<std::string> &inputs, bool replaceExisting);

// True when the file at `path` starts with the SQLite header and carries the session's
// application_id (bytes 68-71): a Sagline session, whatever it is called.
bool isSessionFile(const std::string &path);

} // namespace sagline
