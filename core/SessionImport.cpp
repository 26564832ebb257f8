#include "SessionImport.h"

#include "CsvReadings.h"
#include "PlanJson.h"
#include "Planner.h"
#include "ReadingPlausibility.h"
#include "SessionStore.h"
#include "SetupJson.h"

#include <algorithm>
#include <filesystem>

namespace sagline {

namespace {

ImportResult invalid(FieldErrors errors, const std::string &what)
{
    ImportResult result;
    result.code = StoreCode::InvalidArgument;
    result.message = what + ": " + std::to_string(errors.size()) + " problem" + (errors.size() == 1 ? "" : "s");
    result.errors = std::move(errors);
    result.errorsFile = what;
    return result;
}

} // namespace

ImportResult importReadingsCsv(const ImportRequest &request)
{
    ImportResult result;
    std::error_code ignored;
    if (std::filesystem::exists(request.outputPath, ignored)) {
        result.code = StoreCode::FileExists;
        result.message = request.outputPath + ": already exists; a session file is never overwritten";
        return result;
    }
    const SetupParse setup = loadSetupFile(request.setupPath);
    if (!setup.setup)
        return invalid(setup.errors, request.setupPath);
    ReadingsCsvParse csv = loadReadingsCsv(request.csvPath);
    if (!csv.ok())
        return invalid(csv.errors, request.csvPath);
    if (csv.readings.empty())
        return invalid({{"file", "no readings after the header line"}}, request.csvPath);
    if (FieldErrors implausible = implausibleReadings(csv.readings, csv.lineNumbers, *setup.setup); !implausible.empty())
        return invalid(implausible, request.csvPath);

    NewSession session;
    session.setupJson = setupToJson(*setup.setup);
    const PlanResult plan = makePlan(*setup.setup);
    if (plan.plan)
        session.planJson = planToJson(*plan.plan);
    else
        for (const FieldError &error : plan.errors)
            result.warnings.push_back("no plan stored: " + error.message());
    session.operatorName = request.operatorName;
    session.unitSerial = request.unitSerial;
    session.ambientTemperatureC = request.ambientTemperatureC;
    session.windingTemperatureC = request.windingTemperatureC;
    session.softwareVersion = request.softwareVersion;
    session.createdBy = {request.person, ""};

    const std::string fileName = std::filesystem::path(request.csvPath).filename().string();
    const std::string origin = "imported from " + fileName + " line ";
    for (std::size_t i = 0; i < csv.readings.size(); ++i) {
        std::string &raw = csv.readings[i].rawText;
        raw.reserve(origin.size() + 10);
        raw.append(origin).append(std::to_string(csv.lineNumbers[i]));
    }

    // The readings go in before the file appears under its name: a failed or killed import
    // leaves no session behind, and never removes a file it did not create. The readings and
    // the exclusions marked in the file are one transaction.
    MarkedExclusions marked;
    marked.author = request.person.empty() ? request.operatorName : request.person;
    marked.reason = [&](std::size_t i) {
        return "marked excluded in " + fileName + " line " + std::to_string(csv.lineNumbers[i]);
    };
    std::size_t recorded = 0;
    const StoreStatus created = SessionStore::createClosed(request.outputPath, session, [&](SessionStore &store) {
        const auto ids = store.appendReadings(csv.readings, &marked);
        if (!ids.ok())
            return ids.status();
        recorded = ids.value.size();
        return StoreStatus::success();
    });
    if (!created.ok()) {
        result.code = created.code;
        result.message = created.message;
        return result;
    }
    result.excluded = static_cast<std::size_t>(
        std::count_if(csv.readings.begin(), csv.readings.end(), [](const Reading &r) { return r.excluded; }));
    result.readings = recorded;
    return result;
}

} // namespace sagline
