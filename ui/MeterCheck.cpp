#include "MeterCheck.h"

#include "Clock.h"
#include "InstrumentRig.h"
#include "LinkAddress.h"
#include "Planner.h"
#include "RigForSource.h"
#include "ScpiInstrument.h"
#include "ScpiLink.h"
#include "SweepWorkspace.h"
#include "UiFormat.h"
#include "VirtualBench.h"

namespace sagline {

namespace {
constexpr std::uint64_t checkBenchSeed = 2026; // the sweep's virtual bench uses the same meters
} // namespace

MeterCheck *MeterCheck::forSource(const SourceChoice &source, const Setup *setup, const Plan *plan, QString *error,
                                  QObject *parent)
{
    switch (source.source) {
    case ReadingSource::TypedIn:
        *error = tr("readings typed in by hand: no meter to test");
        return nullptr;
    case ReadingSource::VirtualBench: {
        if (!setup || !plan) {
            *error = tr("the virtual bench is built from the setup: complete the setup first");
            return nullptr;
        }
        auto clock = std::make_unique<SystemClock>();
        auto bench = std::make_unique<VirtualBench>(virtualBenchOptionsFor(*setup, *plan, checkBenchSeed), clock.get());
        InstrumentRig *rig = makeVirtualBenchRig(bench.get(), false);
        return new MeterCheck(rig, std::move(clock), std::move(bench), parent);
    }
    case ReadingSource::SerialPort:
    case ReadingSource::Lan:
        break;
    }
    InstrumentRig *rig = rigForSource(source, error);
    if (!rig)
        return nullptr;
    if (const QString problem = rig->validate(); !problem.isEmpty()) {
        *error = QStringLiteral("instruments: ") + problem;
        delete rig;
        return nullptr;
    }
    return new MeterCheck(rig, nullptr, nullptr, parent);
}

MeterCheck::MeterCheck(InstrumentRig *rig, std::unique_ptr<Clock> clock, std::unique_ptr<VirtualBench> bench, QObject *parent)
    : QObject(parent), m_clock(std::move(clock)), m_bench(std::move(bench)), m_rig(rig)
{
    m_timeout.setSingleShot(true);
    connect(&m_timeout, &QTimer::timeout, this, [this] {
        m_lines << tr("✖ no answer within %1 s; check the cable, the address and the meter's remote settings")
                       .arg(m_timeout.interval() / 1000);
        finish(false);
    });
    connect(m_rig.get(), &InstrumentRig::connectFailed, this, [this](const QString &message) {
        m_lines << tr("✖ cannot connect: %1").arg(message);
        finish(false);
    });
    connect(m_rig.get(), &InstrumentRig::ready, this, [this] {
        const QList<ScpiInstrument *> instruments = m_rig->instruments();
        for (int i = 0; i < instruments.size(); ++i) {
            for (int r = 0; r < instruments[i]->roles().size(); ++r)
                m_queue.append({i, r});
        }
        readNext();
    });
}

MeterCheck::~MeterCheck()
{
    if (m_rig)
        m_rig->disconnectAll();
}

void MeterCheck::start(int timeoutMs)
{
    m_running = true;
    m_lines.clear();
    m_timeout.start(timeoutMs);
    m_rig->connectAll();
}

void MeterCheck::readNext()
{
    if (!m_running)
        return;
    if (m_queue.isEmpty()) {
        finish(!m_failed);
        return;
    }
    const Pending next = m_queue.takeFirst();
    ScpiInstrument *instrument = m_rig->instruments().at(next.instrument);
    const RoleConfig config = instrument->roles().at(next.role);
    if (next.role == 0)
        m_lines << tr("%1 (%2)\n    *IDN?: %3").arg(instrument->name(), instrument->link()->description(), instrument->identityText());
    instrument->measure(config.role, this, [this, config](const MeterValue &value) {
        const QString function = tr("    %1, %2 (%3)").arg(roleName(config.role), unitText(roleUnit(config.role)) + tr(" RMS"),
                                                         config.queryCommand);
        switch (value.status) {
        case MeterValue::Status::Value:
            m_lines << function + tr(": %1").arg(formatQuantity(value.value, roleUnit(config.role), 5));
            break;
        case MeterValue::Status::Overload:
            m_lines << function + tr(": overload (the range is too low)");
            break;
        case MeterValue::Status::NotANumber:
            m_lines << function + tr(": not a number");
            break;
        case MeterValue::Status::Failed:
            m_failed = true;
            m_lines << function + tr(": ✖ %1").arg(value.error);
            break;
        }
        readNext();
    });
}

void MeterCheck::finish(bool ok)
{
    if (!m_running)
        return;
    m_running = false;
    m_timeout.stop();
    m_queue.clear();
    m_rig->disconnectAll();
    emit finished(ok, report());
}

} // namespace sagline
