// The jobs a meter does in a sweep, with each role's SCPI commands, accuracy specification
// and resolution. All of it is editable and saved with the session.
#pragma once

#include "Setup.h"
#include "Units.h"

#include <QList>
#include <QString>
#include <QStringList>

#include <optional>

namespace sagline {

// The primary roles are optional; a power analyser on the primary side serves several of them
// (voltage, current, active power and reactive power or power factor) on one instrument.
enum class MeterRole {
    SecondaryVoltage, SecondaryCurrent, PrimaryVoltage, PrimaryCurrent,
    PrimaryPower, PrimaryPowerFactor, PrimaryReactivePower,
};

// Every role, the secondary pair first; the primary roles alone.
QList<MeterRole> allMeterRoles();
QList<MeterRole> primaryMeterRoles();

QString roleName(MeterRole role);          // "secondary voltmeter", ...
QString roleKey(MeterRole role);           // "secondary_voltage", ... (files, command line)
std::optional<MeterRole> roleFromKey(const QString &key);
Unit roleUnit(MeterRole role);             // Volt, Ampere, Watt; None for power factor and reactive power
QString roleUnitSymbol(MeterRole role);    // "V", "A", "W", "", "var"
bool roleIsRequired(MeterRole role);       // the secondary roles are; the primary ones are optional

// A meter's accuracy as makers state it: ±(percentOfReading % of reading + counts x resolution).
struct AccuracySpec {
    double percentOfReading = 0.0; // %
    double counts = 0.0;           // least-significant digits
};

struct RoleConfig {
    MeterRole role = MeterRole::SecondaryVoltage;
    QString queryCommand;           // e.g. "MEASure:VOLTage:AC?"
    QStringList configureCommands;  // sent once on connect, e.g. "CONFigure:VOLTage:AC"
    AccuracySpec accuracy;
    double resolution = 0.0;        // one count on the range in use, V or A

    // Standard uncertainty of a reading: the spec is a rectangular limit of half-width a,
    // u = a / sqrt(3) (GUM, JCGM 100:2008, 4.3.7; FACTS.md §6).
    double standardUncertainty(double reading) const;
};

// The setup's view of a meter's accuracy rule: the "% of reading" is its gain, the counts times
// one count its offset (both systematic, the same for every reading on the range), one count its
// resolution.
MeterSpec meterSpecOf(const RoleConfig &config);
// The secondary voltmeter's and ammeter's rules as the setup's `meters` section; the winding
// temperature's uncertainty is left unset (the setup's own, or the default).
MeterSpecs meterSpecsOf(const RoleConfig &voltmeter, const RoleConfig &ammeter);
// The primary meters' specs from the roles' accuracy rules, each only when its role is served
// (null: not served, the spec stays absent).
void addPrimaryMeterSpecs(MeterSpecs &specs, const RoleConfig *voltmeter, const RoleConfig *ammeter,
                          const RoleConfig *powerMeter);

// SCPI-99 defaults: MEASure:VOLTage:AC? / MEASure:CURRent:AC? (FACTS.md §8), configure with
// the matching CONFigure command, a typical bench-meter accuracy (common practice:
// 0.5 % + 3 counts for AC volts, 1 % + 3 counts for AC amps) and resolution (1 mV, 1 mA).
// Power roles: MEASure:POWer:AC? (active), MEASure:POWer:AC:PFACtor?, MEASure:POWer:AC:REACtive?
// in the SCPI style; analysers differ, so these are editable like every query (common practice:
// 0.5 % + 3 counts at 10 mW for power, 5 counts at 0.001 for power factor, 1 % + 3 counts at
// 10 mvar for reactive power).
RoleConfig defaultRoleConfig(MeterRole role);

} // namespace sagline
