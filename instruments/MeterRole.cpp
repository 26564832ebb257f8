#include "MeterRole.h"

#include <cmath>

namespace sagline {

QString roleName(MeterRole role)
{
    switch (role) {
    case MeterRole::SecondaryVoltage: return QStringLiteral("secondary voltmeter");
    case MeterRole::SecondaryCurrent: return QStringLiteral("secondary ammeter");
    case MeterRole::PrimaryVoltage: return QStringLiteral("primary voltmeter");
    case MeterRole::PrimaryCurrent: return QStringLiteral("primary ammeter");
    case MeterRole::PrimaryPower: return QStringLiteral("primary power meter");
    case MeterRole::PrimaryPowerFactor: return QStringLiteral("primary power-factor meter");
    case MeterRole::PrimaryReactivePower: return QStringLiteral("primary reactive-power meter");
    }
    return QStringLiteral("meter");
}

QString roleKey(MeterRole role)
{
    switch (role) {
    case MeterRole::SecondaryVoltage: return QStringLiteral("secondary_voltage");
    case MeterRole::SecondaryCurrent: return QStringLiteral("secondary_current");
    case MeterRole::PrimaryVoltage: return QStringLiteral("primary_voltage");
    case MeterRole::PrimaryCurrent: return QStringLiteral("primary_current");
    case MeterRole::PrimaryPower: return QStringLiteral("primary_power");
    case MeterRole::PrimaryPowerFactor: return QStringLiteral("primary_power_factor");
    case MeterRole::PrimaryReactivePower: return QStringLiteral("primary_reactive_power");
    }
    return {};
}

QList<MeterRole> allMeterRoles()
{
    return {MeterRole::SecondaryVoltage, MeterRole::SecondaryCurrent, MeterRole::PrimaryVoltage, MeterRole::PrimaryCurrent,
            MeterRole::PrimaryPower, MeterRole::PrimaryPowerFactor, MeterRole::PrimaryReactivePower};
}

QList<MeterRole> primaryMeterRoles()
{
    return {MeterRole::PrimaryVoltage, MeterRole::PrimaryCurrent, MeterRole::PrimaryPower, MeterRole::PrimaryPowerFactor,
            MeterRole::PrimaryReactivePower};
}

std::optional<MeterRole> roleFromKey(const QString &key)
{
    for (MeterRole role : allMeterRoles()) {
        if (roleKey(role) == key)
            return role;
    }
    return std::nullopt;
}

Unit roleUnit(MeterRole role)
{
    switch (role) {
    case MeterRole::SecondaryVoltage:
    case MeterRole::PrimaryVoltage: return Unit::Volt;
    case MeterRole::SecondaryCurrent:
    case MeterRole::PrimaryCurrent: return Unit::Ampere;
    case MeterRole::PrimaryPower: return Unit::Watt;
    case MeterRole::PrimaryPowerFactor:
    case MeterRole::PrimaryReactivePower: return Unit::None;
    }
    return Unit::None;
}

QString roleUnitSymbol(MeterRole role)
{
    if (role == MeterRole::PrimaryReactivePower)
        return QStringLiteral("var");
    return QString::fromStdString(unitSymbol(roleUnit(role)));
}

bool roleIsRequired(MeterRole role)
{
    return role == MeterRole::SecondaryVoltage || role == MeterRole::SecondaryCurrent;
}

double RoleConfig::standardUncertainty(double reading) const
{
    const double halfWidth = accuracy.percentOfReading / 100.0 * std::fabs(reading) + accuracy.counts * resolution;
    return halfWidth / std::sqrt(3.0);
}

MeterSpec meterSpecOf(const RoleConfig &config)
{
    MeterSpec spec;
    spec.gainPercentOfReading = config.accuracy.percentOfReading;
    spec.offset = config.accuracy.counts * config.resolution;
    spec.resolution = config.resolution;
    return spec;
}

MeterSpecs meterSpecsOf(const RoleConfig &voltmeter, const RoleConfig &ammeter)
{
    MeterSpecs specs;
    specs.voltmeter = meterSpecOf(voltmeter);
    specs.ammeter = meterSpecOf(ammeter);
    return specs;
}

void addPrimaryMeterSpecs(MeterSpecs &specs, const RoleConfig *voltmeter, const RoleConfig *ammeter,
                          const RoleConfig *powerMeter)
{
    if (voltmeter)
        specs.primaryVoltmeter = meterSpecOf(*voltmeter);
    if (ammeter)
        specs.primaryAmmeter = meterSpecOf(*ammeter);
    if (powerMeter)
        specs.powerMeter = meterSpecOf(*powerMeter);
}

RoleConfig defaultRoleConfig(MeterRole role)
{
    RoleConfig config;
    config.role = role;
    if (role == MeterRole::PrimaryPower || role == MeterRole::PrimaryPowerFactor || role == MeterRole::PrimaryReactivePower) {
        config.queryCommand = role == MeterRole::PrimaryPower         ? QStringLiteral("MEASure:POWer:AC?")
                              : role == MeterRole::PrimaryPowerFactor ? QStringLiteral("MEASure:POWer:AC:PFACtor?")
                                                                      : QStringLiteral("MEASure:POWer:AC:REACtive?");
        config.accuracy = role == MeterRole::PrimaryPowerFactor ? AccuracySpec{0.0, 5.0}
                          : role == MeterRole::PrimaryPower     ? AccuracySpec{0.5, 3.0}
                                                                : AccuracySpec{1.0, 3.0};
        config.resolution = role == MeterRole::PrimaryPowerFactor ? 0.001 : 0.01;
    } else if (roleUnit(role) == Unit::Volt) {
        config.queryCommand = QStringLiteral("MEASure:VOLTage:AC?");
        config.configureCommands = {QStringLiteral("CONFigure:VOLTage:AC")};
        config.accuracy = {0.5, 3.0};
        config.resolution = 0.001;
    } else {
        config.queryCommand = QStringLiteral("MEASure:CURRent:AC?");
        config.configureCommands = {QStringLiteral("CONFigure:CURRent:AC")};
        config.accuracy = {1.0, 3.0};
        config.resolution = 0.001;
    }
    return config;
}

} // namespace sagline
