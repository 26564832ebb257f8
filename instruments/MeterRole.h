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

enum class MeterRole { SecondaryVoltage, SecondaryCurrent, PrimaryVoltage, PrimaryCurrent };

QString roleName(MeterRole role);          // "secondary voltmeter", ...
QString roleKey(MeterRole role);           // "secondary_voltage", ... (files, command line)
std::optional<MeterRole> roleFromKey(const QString &key);
Unit roleUnit(MeterRole role);             // Volt or Ampere
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

// SCPI-99 defaults: MEASure:VOLTage:AC? / MEASure:CURRent:AC? (FACTS.md §8), configure with
// the matching CONFigure command, a typical bench-meter accuracy (common practice:
// 0.5 % + 3 counts for AC volts, 1 % + 3 counts for AC amps) and resolution (1 mV, 1 mA).
RoleConfig defaultRoleConfig(MeterRole role);

} // namespace sagline
