#include "SessionImport.h"

#include "CsvReadings.h"
#include "PlanJson.h"
#include "Planner.h"
#include "SessionStore.h"
#include "SetupJson.h"

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
    for (std::size_t i = 0; i < csv.readings.size(); ++i)
        csv.readings[i].rawText = "imported from " + fileName + " line " + std::to_string(csv.lineNumbers[i]);

    auto fail = [&](const StoreStatus &status) {
        std::error_code error;
        std::filesystem::remove(request.outputPath, error); // no half-imported session is left behind
        ImportResult failed;
        failed.code = status.code;
        failed.message = status.message;
        return failed;
    };
    auto created = SessionStore::create(request.outputPath, session);
    if (!created.ok()) {
        result.code = created.code;
        result.message = created.message;
        return result; // create leaves nothing behind on failure, or refused an existing file
    }
    SessionStore &store = *created.value;
    const auto ids = store.appendReadings(csv.readings);
    if (!ids.ok()) {
        created.value.reset();
        return fail(ids.status());
    }
    for (std::size_t i = 0; i < csv.readings.size(); ++i) {
        if (!csv.readings[i].excluded)
            continue;
        const auto excluded = store.excludeReading(ids.value[i], "marked excluded in " + fileName + " line " +
                                                                     std::to_string(csv.lineNumbers[i]),
                                                   request.person.empty() ? request.operatorName : request.person);
        if (!excluded.ok()) {
            created.value.reset();
            return fail(excluded.status());
        }
        ++result.excluded;
    }
    result.readings = ids.value.size();
    return result;
}

} // namespace sagline
