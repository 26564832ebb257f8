#include "DemoSession.h"

#include "PlanJson.h"
#include "Planner.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "UtcTime.h"

#include <algorithm>
#include <chrono>
#include <random>
#include <vector>

namespace sagline {

const char *toString(CurrentOrder order)
{
    switch (order) {
    case CurrentOrder::Rising: return "rising";
    case CurrentOrder::Falling: return "falling";
    case CurrentOrder::Random: return "random";
    }
    return "rising";
}

QString writeDemoSession(const QString &path, const Setup &setup, std::size_t count, CurrentOrder order)
{
    const PlanResult plan = makePlan(setup);
    if (!plan.plan || plan.plan->steps.empty())
        return QStringLiteral("the setup does not plan");
    const Plan &p = *plan.plan;
    NewSession session;
    session.setupJson = setupToJson(setup);
    session.planJson = planToJson(p);
    session.operatorName = "Demo operator";
    session.unitSerial = "DEMO-LONG";
    session.softwareVersion = "sagline demo session";
    auto created = SessionStore::create(path.toStdString(), session);
    if (!created.ok())
        return QString::fromStdString(created.message);

    std::vector<double> currents(count);
    const double top = p.steps.back().currentA;
    for (std::size_t i = 0; i < count; ++i)
        currents[i] = top * static_cast<double>(i) / static_cast<double>(std::max<std::size_t>(count - 1, 1));
    std::mt19937_64 random(20261202);
    if (order == CurrentOrder::Falling)
        std::reverse(currents.begin(), currents.end());
    else if (order == CurrentOrder::Random)
        std::shuffle(currents.begin(), currents.end(), random);
    std::normal_distribution<double> noise(0.0, 0.01);
    const auto start = std::chrono::system_clock::time_point(std::chrono::seconds(1796176800)); // 2026-12-02 02:00 UTC
    std::vector<Reading> readings(count);
    for (std::size_t i = 0; i < count; ++i) {
        Reading &r = readings[i];
        r.step = -1;
        r.currentA = currents[i];
        r.voltageV = p.noLoadVoltageV - p.seriesResistanceOhm * currents[i] + noise(random);
        r.timeUtc = formatUtc(start + std::chrono::milliseconds(100 * static_cast<long long>(i))); // 10 a second
        r.flags = flagSimulated;
    }
    const auto stored = created.value->appendReadings(readings);
    return stored.ok() ? QString() : QString::fromStdString(stored.message);
}

} // namespace sagline
