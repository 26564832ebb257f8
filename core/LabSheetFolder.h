// The lab sheets a supervised-session window offers: every *.json file directly in a folder
// (not its subfolders), each read and checked as a lab sheet. A file that is not a usable
// sheet stays in the list with its first problem, so a supervisor sees why it is not offered.
#pragma once

#include "LabSheet.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

struct LabSheetListing {
    std::string path;
    std::optional<LabSheet> sheet;  // set when the file is a usable lab sheet
    std::string problem;            // else the first problem, naming the field
};

// Sorted by file name. A folder that cannot be read gives an empty list and `error`.
std::vector<LabSheetListing> findLabSheets(const std::string &folder, std::string *error = nullptr);

} // namespace sagline
