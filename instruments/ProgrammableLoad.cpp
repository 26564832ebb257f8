#include "ProgrammableLoad.h"

#include "ScpiInstrument.h"

#include <QPointer>

namespace sagline {

ScpiLoad::ScpiLoad(ScpiInstrument *instrument, const ScpiLoadCommands &commands)
    : m_instrument(instrument), m_commands(commands)
{
}

QString ScpiLoad::description() const
{
    return m_instrument->name();
}

void ScpiLoad::setLoad(std::optional<double> resistanceOhm, QObject *context, Done done)
{
    if (!resistanceOhm) {
        m_instrument->command(m_commands.inputOff.toLatin1(), context, done);
        return;
    }
    const QByteArray set = m_commands.setResistance.arg(*resistanceOhm, 0, 'g', 6).toLatin1();
    QPointer<ScpiInstrument> instrument(m_instrument);
    const QByteArray on = m_commands.inputOn.toLatin1();
    m_instrument->command(set, context, [instrument, context, on, done](bool ok, const QString &error) {
        if (!ok || !instrument) {
            done(false, error);
            return;
        }
        instrument->command(on, context, done);
    });
}

} // namespace sagline
