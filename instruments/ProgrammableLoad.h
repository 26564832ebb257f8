// A load the program can set itself (the virtual bench's, or an electronic load speaking
// SCPI). Without one, the operator sets the load by hand at each step.
#pragma once

#include <QObject>
#include <QString>

#include <functional>
#include <optional>

namespace sagline {

class ScpiInstrument;

class ProgrammableLoad {
public:
    using Done = std::function<void(bool ok, const QString &error)>;
    virtual ~ProgrammableLoad() = default;
    // nullopt = open circuit (input off). `done` runs once the load confirmed the setting.
    virtual void setLoad(std::optional<double> resistanceOhm, QObject *context, Done done) = 0;
    virtual QString description() const = 0;
};

// Commands with %1 for the resistance in ohms. Defaults are SCPI-style for an electronic
// load in constant-resistance mode (common practice; check the load's manual).
struct ScpiLoadCommands {
    QString setResistance = QStringLiteral("RESistance %1");
    QString inputOn = QStringLiteral("INPut ON");
    QString inputOff = QStringLiteral("INPut OFF");
};

class ScpiLoad final : public ProgrammableLoad {
public:
    ScpiLoad(ScpiInstrument *instrument, const ScpiLoadCommands &commands = {});
    void setLoad(std::optional<double> resistanceOhm, QObject *context, Done done) override;
    QString description() const override;
    ScpiInstrument *instrument() const { return m_instrument; }

private:
    ScpiInstrument *m_instrument; // not owned
    ScpiLoadCommands m_commands;
};

} // namespace sagline
