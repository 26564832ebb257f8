// sagline-cli plan SETUP.json [--json]: the safe load sweep for a nameplate and bench.
#include "CliCommands.h"

#include "CommandLine.h"

#include "FuseStandards.h"
#include "NumberFormat.h"
#include "PlanGates.h"
#include "PlanJson.h"
#include "Planner.h"
#include "SetupJson.h"

#include <iomanip>
#include <iostream>
#include <sstream>

namespace sagline::cli {

namespace {

void printSummary(const Setup &setup, const Plan &plan, std::ostream &out)
{
    const Nameplate &p = setup.nameplate;
    auto row = [&](const char *label, const std::string &text) {
        out << "  " << std::left << std::setw(22) << label << text << '\n';
    };
    out << "Load sweep plan: " << formatSignificant(p.ratedPowerVa, 4) << " VA, " << formatSignificant(p.primaryVoltageV, 4)
        << " V to " << formatSignificant(p.secondaryVoltageV, 4) << " V at full load ("
        << formatSignificant(plan.noLoadVoltageV, 4) << " V no-load), " << formatSignificant(p.frequencyHz, 3) << " Hz, "
        << toString(p.construction) << " core, " << toString(p.windingMaterial) << " windings\n\n";
    row("Rated current", "secondary " + formatQuantity(plan.ratedSecondaryCurrentA, "A") + ", primary "
                             + formatQuantity(plan.ratedPrimaryCurrentA, "A"));
    row("Turns ratio", formatSignificant(plan.turnsRatio, 4) + " (primary voltage / secondary no-load voltage)");
    row("Series resistance", formatQuantity(plan.seriesResistanceOhm, "Ω") + " (estimated, referred to the secondary)");
    row("Regulation", formatSignificant(plan.regulationPercent, 3) + " % (of the full-load voltage)");
    const auto &fuse = plan.recommendedFuse;
    row("Recommended fuse", formatQuantity(fuse.ratingA, "A", 3) + " " + toString(fuse.type) + " (IEC 60127, "
                                + formatSignificant(fuse.factor, 3) + " x rated primary current, next R10 rating)");
    row("NEC 450.3(B) ceiling", formatQuantity(plan.maxPrimaryProtectionA, "A") + " primary-only maximum ("
                                    + formatSignificant(necPrimaryOnlyMultiplier(plan.ratedPrimaryCurrentA) * 100.0, 3)
                                    + " %); local codes and licensed practice decide");
    const FuseGates gates = fuseGates(plan.outlookFuse.type);
    row("Fuse outlook for", formatQuantity(plan.outlookFuse.ratingA, "A", 3) + " " + toString(plan.outlookFuse.type)
                                + (plan.outlookFuseIsFitted ? " (fitted)" : " (recommended; none given)") + ": "
                                + gates.source);
    if (plan.rheostatSafeCurrentA)
        row("Rheostat", "safe current " + formatQuantity(*plan.rheostatSafeCurrentA, "A")
                            + " at any setting (sqrt(P rated / R total))");
    row("Overload limit", formatSignificant(plan.overloadLimitVa, 4) + " VA (rated VA x overload factor)");
    const std::string duration = plan.totalTimeS < 120.0 ? formatSignificant(plan.totalTimeS, 3) + " s"
                                                          : formatSignificant(plan.totalTimeS / 60.0, 3) + " min";
    row("Sweep", std::to_string(plan.steps.size()) + " points (steps 0 to " + std::to_string(plan.steps.size() - 1)
                     + "), about " + duration + " of dwell in all");
    row("Primary current", "estimated as sqrt((I2/a)^2 + Im^2), magnetizing current Im = "
                               + formatSignificant(plan.magnetizingFraction * 100.0, 3) + " % of rated primary current");
}

void printSteps(const Plan &plan, std::ostream &out)
{
    struct Column {
        const char *title;
        const char *unit;
        int width;
    };
    const Column columns[] = {{"step", "", 4},       {"current", "A", 9},   {"voltage", "V", 9},
                              {"load", "Ω", 9},      {"load P", "W", 9},    {"output", "VA", 9},
                              {"margin", "VA", 9},   {"Cu loss", "W", 9},   {"primary", "A", 9},
                              {"rheostat", "", 9},   {"fuse", "", 9}};
    out << '\n';
    for (const auto &c : columns)
        out << std::right << std::setw(c.width) << c.title << ' ';
    out << '\n';
    for (const auto &c : columns) {
        // setw counts bytes; "Ω" is two bytes in UTF-8.
        const int extra = std::string(c.unit) == "Ω" ? 1 : 0;
        out << std::right << std::setw(c.width + extra) << c.unit << ' ';
    }
    out << '\n';
    for (const PlanStep &s : plan.steps) {
        out << std::right << std::setw(4) << s.index << ' ' << std::setw(9) << formatFixed(s.currentA, 4) << ' '
            << std::setw(9) << formatFixed(s.predictedVoltageV, 3) << ' ' << std::setw(9)
            << (s.loadResistanceOhm ? formatSignificant(*s.loadResistanceOhm, 4) : std::string("open")) << ' '
            << std::setw(9) << formatFixed(s.loadPowerW, 3) << ' ' << std::setw(9) << formatFixed(s.outputVa, 3) << ' '
            << std::setw(9) << formatFixed(s.vaMargin, 3) << ' ' << std::setw(9) << formatFixed(s.copperLossW, 3) << ' '
            << std::setw(9) << formatFixed(s.primaryCurrentA, 4) << ' ' << std::setw(9) << (s.rheostatOk ? "ok" : "NOT OK")
            << ' ' << std::setw(9) << toString(s.fuseOutlook) << '\n';
    }
}

} // namespace

int runPlan(const Arguments &args)
{
    CommandLine line("sagline-cli plan", "SETUP.json [--json] [--truncate-to-safe]",
                     "Plans a safe load sweep from the nameplate and the bench: rated currents, turns ratio, estimated "
                     "series resistance, regulation, the recommended primary fuse, the NEC 450.3(B) ceiling and one row "
                     "per load step. A nameplate that cannot describe a mains transformer (a voltage in the wrong unit) "
                     "is refused naming the field, and so is a plan with steps the rheostat or the primary fuse cannot "
                     "take (exit 2, the steps named) unless --truncate-to-safe is given.");
    line.addPositional("SETUP.json", "the setup file (JSON: nameplate and bench)");
    line.addFlag({"json"}, "print one JSON object instead of the table");
    line.addFlag({"truncate-to-safe"}, "leave out the steps the rheostat or the fuse cannot take (said in the warnings)");
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    const std::string &path = line.positionals().front();
    const bool asJson = line.isSet("json");

    const SetupParse parsed = loadSetupFile(path);
    if (!parsed.setup) {
        for (const auto &error : parsed.errors)
            std::cerr << "sagline-cli plan: " << error.message() << '\n';
        return exitInvalidInput;
    }
    const PlanResult result = makePlan(*parsed.setup);
    if (!result.plan) {
        for (const auto &error : result.errors)
            std::cerr << "sagline-cli plan: refused: " << error.message() << '\n';
        return exitInvalidInput;
    }
    Plan plan = *result.plan;
    if (const auto unsafe = unsafeSteps(plan); !unsafe.empty()) {
        if (!line.isSet("truncate-to-safe")) {
            std::cerr << "sagline-cli plan: refused: the bench cannot take " << describeUnsafeSteps(unsafe)
                      << ". Give a larger rheostat or fuse in the setup, lower bench.top_fraction, or plan only the safe "
                         "steps with --truncate-to-safe\n";
            return exitInvalidInput;
        }
        plan = truncatedToSafe(plan);
    }
    // Defaults the parser filled in (e.g. frequency) join those the planner chose.
    plan.defaultsUsed.insert(plan.defaultsUsed.begin(), parsed.defaultsUsed.begin(), parsed.defaultsUsed.end());

    if (asJson) {
        std::cout << planToJson(plan) << '\n';
        return exitSuccess;
    }
    printSummary(*parsed.setup, plan, std::cout);
    printSteps(plan, std::cout);
    if (!plan.warnings.empty()) {
        std::cout << "\nWarnings:\n";
        for (const auto &warning : plan.warnings)
            std::cout << "  - " << warning << '\n';
    }
    if (!plan.defaultsUsed.empty()) {
        std::cout << "\nDefaults used (documented in DEVELOPERS.md; set the field to override):\n  ";
        for (std::size_t i = 0; i < plan.defaultsUsed.size(); ++i)
            std::cout << (i ? ", " : "") << plan.defaultsUsed[i];
        std::cout << '\n';
    }
    std::cout << "\nCaution: the primary is at mains voltage. Use a fused, isolated supply and meters rated for the\n"
                 "measurement category; never exceed the ratings; local codes and licensed practice decide.\n";
    return exitSuccess;
}

} // namespace sagline::cli
