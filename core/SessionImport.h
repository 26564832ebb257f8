// Import of a readings CSV (DESIGN.md columns) and a setup file into a new session file:
// the setup, the plan computed from it, and every reading with its line of origin. Rows marked
// excluded in the CSV become exclusions with a reason naming the file. All or nothing: on any
// failure no session file is left behind.
#pragma once

#include "FieldError.h"
#include "StoreResult.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

struct ImportRequest {
    std::string csvPath;
    std::string setupPath;
    std::string outputPath;                    // the new .sagline; must not exist
    std::string operatorName;                  // required by the session
    std::string person;                        // who imports it, recorded on every record ("" = not given)
    std::string unitSerial;                    // required by the session
    std::optional<double> ambientTemperatureC; // °C
    std::optional<double> windingTemperatureC; // °C
    std::string softwareVersion;
};

struct ImportResult {
    StoreCode code = StoreCode::Ok;
    FieldErrors errors;            // CSV or setup errors, each naming the line/column or field
    std::string errorsFile;        // the file the errors are about (the CSV or the setup)
    std::string message;           // a store failure, or a summary of errors
    std::size_t readings = 0;      // readings recorded
    std::size_t excluded = 0;      // of which marked excluded
    std::vector<std::string> warnings; // e.g. the setup could not be planned; plan left empty

    bool ok() const { return code == StoreCode::Ok; }
};

ImportResult importReadingsCsv(const ImportRequest &request);

} // namespace sagline
