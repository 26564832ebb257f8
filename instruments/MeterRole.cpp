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
    }
    return {};
}

std::optional<MeterRole> roleFromKey(const QString &key)
{
    for (MeterRole role : {MeterRole::SecondaryVoltage, MeterRole::SecondaryCurrent, MeterRole::PrimaryVoltage,
                           MeterRole::PrimaryCurrent}) {
        if (roleKey(role) == key)
            return role;
    }
    return std::nullopt;
}

Unit roleUnit(MeterRole role)
{
    return (role == MeterRole::SecondaryVoltage || role == MeterRole::PrimaryVoltage) ? Unit::Volt : Unit::Ampere;
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

RoleConfig defaultRoleConfig(MeterRole role)
{
    RoleConfig config;
    config.role = role;
    if (roleUnit(role) == Unit::Volt) {
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
