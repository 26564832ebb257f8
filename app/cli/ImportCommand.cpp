// sagline-cli import DATA.csv --setup SETUP.json -o SESSION.sagline: readings from a CSV into a
// new session file, with the setup and the plan computed from it.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "BuildInfo.h"
#include "SessionImport.h"
#include "Units.h"

#include <cstdlib>
#include <iostream>

namespace sagline::cli {

namespace {

std::optional<double> parseTemperature(const std::string &text, const char *option, bool &ok)
{
    const QuantityParse parsed = parseQuantity(text, Unit::Celsius);
    if (!parsed.ok) {
        std::cerr << "sagline-cli import: " << option << ": " << parsed.error << '\n';
        ok = false;
        return std::nullopt;
    }
    return parsed.value;
}

} // namespace

int runImport(const Arguments &args)
{
    CommandLine line("sagline-cli import", "DATA.csv --setup SETUP.json -o SESSION.sagline [options]",
                     "Creates a session file from readings in a CSV file, with the setup and the plan made from it. "
                     "Rows marked excluded in the CSV stay excluded.");
    line.addPositional("DATA.csv", "the readings: current_a,voltage_v[,u_current_a,u_voltage_v] and more (DEVELOPERS.md)");
    line.addOption({"setup"}, "SETUP.json", "the setup file (nameplate and bench)");
    line.addOption({"o", "output"}, "SESSION.sagline", "the session file to create (never an existing file)");
    line.addOption({"operator"}, "NAME", "who took the readings (default: $USER)");
    line.addOption({"by"}, "NAME", "who imports them, recorded with every record (the OS account is recorded too)");
    line.addOption({"serial"}, "UNIT_SERIAL", "the unit's serial number");
    line.addOption({"ambient"}, "TEMP", "ambient temperature (°C, or with a unit: \"22.5 °C\")");
    line.addOption({"winding"}, "TEMP", "winding temperature during the test");
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    ImportRequest request;
    request.csvPath = line.positionals().front();
    request.setupPath = line.value("setup");
    request.outputPath = line.value("output");
    request.operatorName = line.value("operator");
    request.person = line.value("by");
    request.unitSerial = line.value("serial");
    bool ok = true;
    if (const auto text = line.valueIfSet("ambient"))
        request.ambientTemperatureC = parseTemperature(*text, "--ambient", ok);
    if (const auto text = line.valueIfSet("winding"); text && ok)
        request.windingTemperatureC = parseTemperature(*text, "--winding", ok);
    if (!ok)
        return exitInvalidInput;
    if (request.setupPath.empty() || request.outputPath.empty())
        return line.fail("DATA.csv, --setup and -o are required");
    if (request.operatorName.empty()) {
        const char *user = std::getenv("USER");
        request.operatorName = user && *user ? user : "not given";
    }
    if (request.unitSerial.empty())
        request.unitSerial = "not given";
    request.softwareVersion = std::string("sagline-cli ") + buildinfo::version;

    const ImportResult result = importReadingsCsv(request);
    if (!result.ok()) {
        for (const FieldError &error : result.errors)
            std::cerr << "sagline-cli import: " << (error.field == result.errorsFile ? std::string() : result.errorsFile + ": ")
                      << error.message() << '\n';
        if (result.errors.empty())
            std::cerr << "sagline-cli import: " << result.message << '\n';
        return exitCodeFor(result.code);
    }
    for (const std::string &warning : result.warnings)
        std::cerr << "sagline-cli import: warning: " << warning << '\n';
    std::cout << "Recorded " << result.readings << " reading" << (result.readings == 1 ? "" : "s") << " ("
              << result.excluded << " marked excluded) in " << request.outputPath << '\n';
    return exitSuccess;
}

} // namespace sagline::cli
