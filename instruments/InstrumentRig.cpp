#include "InstrumentRig.h"

namespace sagline {

InstrumentRig::InstrumentRig(QObject *parent) : QObject(parent) {}

InstrumentRig::~InstrumentRig() = default;

void InstrumentRig::addInstrument(ScpiInstrument *instrument)
{
    instrument->setParent(this);
    m_instruments << instrument;
    watch(instrument);
}

void InstrumentRig::setLoadInstrument(ScpiInstrument *instrument, const ScpiLoadCommands &commands)
{
    instrument->setParent(this);
    m_loadInstrument = instrument;
    m_load = std::make_unique<ScpiLoad>(instrument, commands);
    watch(instrument);
}

QList<ScpiInstrument *> InstrumentRig::allInstruments() const
{
    QList<ScpiInstrument *> all = m_instruments;
    if (m_loadInstrument)
        all << m_loadInstrument;
    return all;
}

void InstrumentRig::watch(ScpiInstrument *instrument)
{
    connect(instrument, &ScpiInstrument::ready, this, [this] { checkAllReady(false, {}); });
    connect(instrument, &ScpiInstrument::restored, this, [this, instrument](const QString &identity) {
        checkAllReady(true, tr("%1 is back (%2)").arg(instrument->name(), identity));
    });
    connect(instrument, &ScpiInstrument::connectFailed, this, [this](const QString &message) {
        if (!m_connecting)
            return;
        m_connecting = false;
        for (ScpiInstrument *other : allInstruments())
            other->disconnectInstrument();
        emit connectFailed(message);
    });
    connect(instrument, &ScpiInstrument::instrumentError, this, &InstrumentRig::instrumentError);
    connect(instrument, &ScpiInstrument::lost, this, [this](const QString &message) {
        if (m_lostReported)
            return;
        m_lostReported = true;
        emit lost(message);
    });
}

ScpiInstrument *InstrumentRig::instrumentFor(MeterRole role) const
{
    for (ScpiInstrument *instrument : m_instruments) {
        if (instrument->roleConfig(role))
            return instrument;
    }
    return nullptr;
}

std::optional<MeterSpecs> InstrumentRig::meterSpecs(std::optional<double> windingUncertaintyC) const
{
    const RoleConfig *voltmeter = roleConfig(MeterRole::SecondaryVoltage);
    const RoleConfig *ammeter = roleConfig(MeterRole::SecondaryCurrent);
    if (!voltmeter || !ammeter)
        return std::nullopt;
    MeterSpecs specs = meterSpecsOf(*voltmeter, *ammeter);
    addPrimaryMeterSpecs(specs, roleConfig(MeterRole::PrimaryVoltage), roleConfig(MeterRole::PrimaryCurrent),
                         roleConfig(MeterRole::PrimaryPower));
    specs.windingTemperatureUncertaintyC = windingUncertaintyC;
    return specs;
}

const RoleConfig *InstrumentRig::roleConfig(MeterRole role) const
{
    ScpiInstrument *instrument = instrumentFor(role);
    return instrument ? instrument->roleConfig(role) : nullptr;
}

QString InstrumentRig::validate() const
{
    for (MeterRole role : allMeterRoles()) {
        int servedBy = 0;
        for (ScpiInstrument *instrument : m_instruments)
            servedBy += instrument->roleConfig(role) ? 1 : 0;
        if (servedBy == 0 && roleIsRequired(role))
            return tr("no instrument serves the %1 role").arg(roleName(role));
        if (servedBy > 1)
            return tr("the %1 role is served by %2 instruments; give it to one").arg(roleName(role)).arg(servedBy);
    }
    return {};
}

void InstrumentRig::connectAll()
{
    m_connecting = true;
    m_lostReported = false;
    for (ScpiInstrument *instrument : allInstruments())
        instrument->connectInstrument();
}

void InstrumentRig::disconnectAll()
{
    m_connecting = false;
    for (ScpiInstrument *instrument : allInstruments())
        instrument->disconnectInstrument();
}

bool InstrumentRig::isReady() const
{
    const QList<ScpiInstrument *> all = allInstruments();
    if (all.isEmpty())
        return false;
    for (ScpiInstrument *instrument : all) {
        if (!instrument->isReady())
            return false;
    }
    return true;
}

void InstrumentRig::checkAllReady(bool restoring, const QString &message)
{
    if (!isReady())
        return;
    if (m_connecting) {
        m_connecting = false;
        emit ready();
        return;
    }
    if (restoring && m_lostReported) {
        m_lostReported = false;
        emit restored(message);
    }
}

QList<InstrumentIdentityRecord> InstrumentRig::records() const
{
    QList<InstrumentIdentityRecord> records;
    for (ScpiInstrument *instrument : allInstruments()) {
        InstrumentIdentityRecord record;
        QStringList keys;
        QStringList accuracy;
        for (const RoleConfig &role : instrument->roles()) {
            keys << roleKey(role.role);
            accuracy << QStringLiteral("%1: ±(%2 % + %3 counts), resolution %4 %5; query %6")
                            .arg(roleKey(role.role))
                            .arg(role.accuracy.percentOfReading)
                            .arg(role.accuracy.counts)
                            .arg(role.resolution)
                            .arg(roleUnitSymbol(role.role), role.queryCommand);
        }
        if (instrument == m_loadInstrument)
            keys << QStringLiteral("load");
        record.roleKeys = keys.join(QLatin1Char(','));
        record.identity = instrument->identityText();
        record.address = instrument->link()->description();
        record.accuracyText = accuracy.join(QStringLiteral("; "));
        records << record;
    }
    return records;
}

} // namespace sagline
