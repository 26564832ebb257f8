// Real session files for the window tests, written through core's store as the programs write
// them: a complete virtual-bench sweep, a typed-in session the program never ended (a crash),
// a sweep ended by a safety stop, and a complete session signed off. Each has its own unit,
// nameplate, operator, serial and temperatures, so a view that keeps another session's
// details shows the wrong ones. Invented scenarios (demo data, not measurements).
#pragma once

#include "Planner.h"
#include "PlanJson.h"
#include "SessionStore.h"
#include "SetupJson.h"

#include <QDir>
#include <QString>

#include <array>
#include <string>

namespace sagline::test {

struct SessionFile {
    QString path;
    Setup setup;
    std::string operatorName;
    std::string serial;
    double ambientC = 0.0;
    double windingC = 0.0;
    int planned = 0;     // steps in the plan
    int readings = 0;    // readings in the file
    int excluded = 0;    // of which excluded
    bool stopped = false;
    bool signedOff = false;
};

enum class SessionKind { Complete, Crashed, SafetyStopped, Signed };

inline Setup sessionSetup(double va, double primaryV, double secondaryV, double noLoadV, int steps, double hz)
{
    Setup setup;
    setup.nameplate.ratedPowerVa = va;
    setup.nameplate.primaryVoltageV = primaryV;
    setup.nameplate.frequencyHz = hz;
    setup.nameplate.secondaryVoltageV = secondaryV;
    setup.nameplate.secondaryNoLoadVoltageV = noLoadV;
    setup.bench.steps = steps;
    setup.bench.rheostat = Rheostat{100.0, 5000.0}; // safe to 7 A: every step of these units
    setup.bench.dwellS = 1.0;
    return setup;
}

// Writes one session of `kind` into `folder`; the returned record says what the file holds.
inline SessionFile writeSession(const QString &folder, SessionKind kind)
{
    SessionFile file;
    std::uint32_t flags = flagSimulated;
    int upTo = 0; // readings for steps 0..upTo-1
    switch (kind) {
    case SessionKind::Complete:
        file.setup = sessionSetup(100.0, 230.0, 24.0, 26.4, 6, 50.0);
        file.operatorName = "A. Complete";
        file.serial = "C-100";
        file.ambientC = 21.0;
        file.windingC = 23.5;
        file.setup.bench.fuse = FuseSpec{1.0, FuseType::TimeLag}; // well above the 0.43 A rated primary current
        break;
    case SessionKind::Crashed:
        file.setup = sessionSetup(60.0, 230.0, 18.0, 19.6, 8, 50.0);
        file.operatorName = "B. Crashed";
        file.serial = "X-60";
        file.ambientC = 24.0;
        file.windingC = 24.0;
        flags = flagManual;
        upTo = 4;
        break;
    case SessionKind::SafetyStopped:
        file.setup = sessionSetup(50.0, 120.0, 12.0, 13.2, 10, 60.0);
        file.operatorName = "C. Stopped";
        file.serial = "S-50";
        file.ambientC = 19.5;
        file.windingC = 20.0;
        upTo = 6;
        file.stopped = true;
        break;
    case SessionKind::Signed:
        file.setup = sessionSetup(80.0, 230.0, 15.0, 16.5, 7, 50.0);
        file.operatorName = "D. Signed";
        file.serial = "SG-80";
        file.ambientC = 22.0;
        file.windingC = 22.5;
        file.setup.bench.fuse = FuseSpec{0.8, FuseType::QuickActing}; // above the 0.35 A rated primary current
        file.signedOff = true;
        break;
    }
    const Plan plan = *makePlan(file.setup).plan;
    file.planned = static_cast<int>(plan.steps.size());
    if (upTo == 0)
        upTo = file.planned;
    file.path = QDir(folder).filePath(QString::fromStdString(file.serial) + QStringLiteral(".sagline"));
    NewSession session;
    session.setupJson = setupToJson(file.setup);
    session.planJson = planToJson(plan);
    session.operatorName = file.operatorName;
    session.unitSerial = file.serial;
    session.ambientTemperatureC = file.ambientC;
    session.windingTemperatureC = file.windingC;
    session.softwareVersion = "test";
    session.createdBy = {file.operatorName, ""};
    auto created = SessionStore::create(file.path.toStdString(), session);
    if (!created.ok())
        return file;
    SessionStore &store = *created.value;
    if (flags & flagSimulated)
        store.recordInstrument("secondary_voltage,secondary_current", "Sagline Virtual Bench,Power meter,SIM-1,1.0", "virtual; ±0.3 %");
    store.recordSweepEvent(SweepEventKind::Started, 0, {});
    static constexpr std::array<double, 4> noise{0.004, -0.003, 0.002, -0.005};
    std::int64_t lastId = 0;
    for (int k = 0; k < upTo; ++k) {
        const PlanStep &step = plan.steps[static_cast<std::size_t>(k)];
        Reading reading;
        reading.step = step.index;
        reading.currentA = step.currentA;
        reading.voltageV = step.predictedVoltageV + noise[static_cast<std::size_t>(k) % noise.size()];
        reading.flags = flags;
        reading.rawText = "test";
        lastId = store.appendReading(reading).value;
    }
    file.readings = upTo;
    if (kind == SessionKind::SafetyStopped) {
        store.excludeReading(lastId, "reading that tripped the safety stop (output-va)", "sagline");
        file.excluded = 1;
        SafetyStopRecord stop;
        stop.step = upTo - 1;
        stop.rule = "output-va";
        stop.message = "output 55.3 VA at step 5 is above the limit of 55 VA";
        stop.measured = 55.3;
        stop.limitValue = 55.0;
        store.recordSafetyStop(stop);
    }
    if (kind == SessionKind::Complete || kind == SessionKind::Signed)
        store.recordSweepEvent(SweepEventKind::Finished, plan.steps.back().index, {});
    if (kind == SessionKind::Signed) {
        store.setActor({"L. Lead", ""});
        store.addSignOff("L. Lead", ReviewDecision::Accepted, "as planned");
    }
    return file;
}

} // namespace sagline::test
