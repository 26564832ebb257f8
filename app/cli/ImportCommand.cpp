// sagline-cli import DATA.csv --setup SETUP.json -o SESSION.sagline: readings from a CSV into a
// new session file, with the setup and the plan computed from it.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "BuildInfo.h"
#include "SessionImport.h"
#include "Units.h"

#include <cstdlib>
#include <iostream>

namespace sagline::cli {

namespace {

constexpr const char *usage =
    "usage: sagline-cli import DATA.csv --setup SETUP.json -o SESSION.sagline\n"
    "                          [--operator NAME] [--serial UNIT_SERIAL] [--ambient TEMP] [--winding TEMP]\n";

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
    ImportRequest request;
    bool ok = true;
    for (std::size_t i = 0; i < args.size() && ok; ++i) {
        const std::string &arg = args[i];
        std::optional<std::string> value;
        if (arg == "--setup" || arg == "-o" || arg == "--output" || arg == "--operator" || arg == "--serial" ||
            arg == "--ambient" || arg == "--winding") {
            value = optionValue(args, i, "import");
            if (!value)
                return exitInvalidInput;
        }
        if (arg == "--setup")
            request.setupPath = *value;
        else if (arg == "-o" || arg == "--output")
            request.outputPath = *value;
        else if (arg == "--operator")
            request.operatorName = *value;
        else if (arg == "--serial")
            request.unitSerial = *value;
        else if (arg == "--ambient")
            request.ambientTemperatureC = parseTemperature(*value, "--ambient", ok);
        else if (arg == "--winding")
            request.windingTemperatureC = parseTemperature(*value, "--winding", ok);
        else if (!arg.empty() && arg[0] == '-' && arg != "-") {
            std::cerr << "sagline-cli import: unknown option '" << arg << "'\n" << usage;
            return exitInvalidInput;
        } else if (request.csvPath.empty())
            request.csvPath = arg;
        else {
            std::cerr << "sagline-cli import: one CSV file only, got '" << request.csvPath << "' and '" << arg << "'\n";
            return exitInvalidInput;
        }
    }
    if (!ok)
        return exitInvalidInput;
    if (request.csvPath.empty() || request.setupPath.empty() || request.outputPath.empty()) {
        std::cerr << "sagline-cli import: DATA.csv, --setup and -o are required\n" << usage;
        return exitInvalidInput;
    }
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
            std::cerr << "sagline-cli import: " << result.errorsFile << ": " << error.message() << '\n';
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
