#include "LabSheetFolder.h"

#include <algorithm>
#include <filesystem>

namespace sagline {

std::vector<LabSheetListing> findLabSheets(const std::string &folder, std::string *error)
{
    namespace fs = std::filesystem;
    std::vector<LabSheetListing> sheets;
    std::error_code code;
    fs::directory_iterator it(folder, code);
    if (code) {
        if (error)
            *error = folder + ": " + code.message();
        return sheets;
    }
    for (const fs::directory_entry &entry : it) {
        std::error_code ignored;
        if (!entry.is_regular_file(ignored) || entry.path().extension() != ".json")
            continue;
        LabSheetListing listing;
        listing.path = entry.path().string();
        LabSheetParse parsed = loadLabSheetFile(listing.path);
        if (parsed.sheet)
            listing.sheet = std::move(parsed.sheet);
        else
            listing.problem = parsed.errors.empty() ? std::string("not a lab sheet") : parsed.errors.front().message();
        sheets.push_back(std::move(listing));
    }
    std::sort(sheets.begin(), sheets.end(),
              [](const LabSheetListing &a, const LabSheetListing &b) { return a.path < b.path; });
    return sheets;
}

} // namespace sagline
