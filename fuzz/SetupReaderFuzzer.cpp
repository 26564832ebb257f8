// libFuzzer target: a setup file or a lab sheet from anywhere (what `plan`, `run`, `import`,
// sagline-sim and the supervised window read first). Reading must never crash, whatever the
// nesting or the bytes; every refusal names a place and a rule and prints as plain text; a
// document that reads must plan without NaN, and survive its own canonical JSON unchanged.
#include "JsonReader.h"
#include "LabSheet.h"
#include "OutputText.h"
#include "Planner.h"
#include "SetupJson.h"

#include <cmath>
#include <cstdint>
#include <string_view>

using namespace sagline;

namespace {

void checkErrors(const FieldErrors &errors)
{
    for (const FieldError &error : errors) {
        if (error.field.empty() || error.rule.empty())
            __builtin_trap(); // every error names a place and a rule
        const std::string message = error.message();
        for (unsigned char c : message) {
            if (c == 0x1B || (c < 0x20 && c != '\n'))
                __builtin_trap(); // a message never carries a control character to the terminal
        }
        if (validUtf8(message) != message)
            __builtin_trap();
    }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string_view text(reinterpret_cast<const char *>(data), size);
    (void)readJson(text);

    const SetupParse setup = parseSetupJson(text);
    checkErrors(setup.errors);
    if (setup.setup) {
        const SetupParse again = parseSetupJson(setupToJson(*setup.setup));
        if (!again.setup || setupToJson(*again.setup) != setupToJson(*setup.setup))
            __builtin_trap(); // the canonical form reads back to itself
        const PlanResult plan = makePlan(*setup.setup);
        checkErrors(plan.errors);
        if (plan.plan) {
            for (const PlanStep &step : plan.plan->steps) {
                if (!std::isfinite(step.currentA) || !std::isfinite(step.predictedVoltageV))
                    __builtin_trap();
            }
        }
    }

    const LabSheetParse sheet = parseLabSheetJson(text);
    checkErrors(sheet.errors);
    if (sheet.sheet) {
        const LabSheetParse again = parseLabSheetJson(labSheetToJson(*sheet.sheet));
        if (!again.sheet || labSheetToJson(*again.sheet) != labSheetToJson(*sheet.sheet))
            __builtin_trap();
    }
    return 0;
}
