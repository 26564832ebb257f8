#include "LabSheetDraft.h"

#include "NumberFormat.h"
#include "SessionComparison.h"

#include <sstream>

namespace sagline {

LabSheetDraft draftLabSheet(const Setup &setup, const std::string &title)
{
    LabSheetDraft draft;
    const PlanResult planned = makePlan(setup);
    if (!planned.plan) {
        for (const FieldError &error : planned.errors)
            draft.errors.push_back({"setup." + error.field, error.rule});
        return draft;
    }
    const Plan &plan = *planned.plan;
    LabSheet sheet;
    sheet.setup = setup;
    sheet.title = title.empty() ? "Load test of a " + designName(setup) + " transformer" : title;
    sheet.locks.planFixed = true;
    sheet.locks.typedInOnly = true;
    sheet.locks.maxLoadFraction = setup.bench.topFraction;
    if (setup.bench.fuse) {
        sheet.locks.requiredFuse = *setup.bench.fuse;
    } else {
        sheet.locks.requiredFuse = {plan.recommendedFuse.ratingA, plan.recommendedFuse.type};
        sheet.setup.bench.fuse = sheet.locks.requiredFuse;
    }

    std::ostringstream text;
    text << "Before you start: the primary side is at mains voltage. Use the fused, isolated supply on your bench, "
            "meters and leads rated for the measurement category, and check every lead before switching on. Never "
            "go above the current of the last step. Follow your laboratory's rules; ask your supervisor when in doubt.\n\n"
         << "Fit a " << formatQuantity(sheet.locks.requiredFuse.ratingA, "A") << " " << toString(sheet.locks.requiredFuse.type)
         << " fuse in the primary.\n\nSteps (plan step number: set the load to this current; expect about this voltage):\n";
    for (const PlanStep &step : plan.steps) {
        text << "  step " << step.index << ": ";
        if (step.index == 0)
            text << "no load (open circuit)";
        else
            text << formatQuantity(step.currentA, "A");
        text << ", about " << formatQuantity(step.predictedVoltageV, "V");
        if (step.loadResistanceOhm)
            text << " (load about " << formatQuantity(*step.loadResistanceOhm, "Ω") << ")";
        text << '\n';
    }
    text << "\nType each reading as the meters show it and press Enter. Watch the line form on the chart: a point far "
            "from it is worth a second look before you go on.";
    sheet.instructions = text.str();
    // Round-trip through the parser: a draft the checker would refuse is never written.
    const LabSheetParse check = parseLabSheetJson(labSheetToJson(sheet));
    if (!check.sheet) {
        draft.errors = check.errors;
        return draft;
    }
    draft.sheet = *check.sheet;
    return draft;
}

} // namespace sagline
