#include "RigForSource.h"

#include "InstrumentRig.h"
#include "LinkAddress.h"
#include "SweepWorkspace.h"

namespace sagline {

QString withSerialFormat(const QString &address, const QString &serialFormat)
{
    const QString trimmed = address.trimmed();
    if (trimmed.isEmpty() || serialFormat.isEmpty() || trimmed.contains(QLatin1Char(',')))
        return trimmed;
    const LinkAddressParse parsed = parseLinkAddress(trimmed);
    if (!parsed.address || parsed.address->kind != LinkAddress::Kind::Serial)
        return trimmed;
    return trimmed + QLatin1Char(',') + serialFormat;
}

InstrumentRig *rigForSource(const SourceChoice &source, QString *error, QObject *parent)
{
    RigAddresses addresses;
    const bool serial = source.source == ReadingSource::SerialPort;
    const QString meter = serial ? withSerialFormat(source.serialPort, source.serialFormat) : source.lanAddress.trimmed();
    if (meter.isEmpty()) {
        *error = serial ? QObject::tr("instruments.serial_port: pick a port or type its path")
                        : QObject::tr("instruments.lan_address: type the meter's address");
        return nullptr;
    }
    if (source.ammeterAddress.trimmed().isEmpty()) {
        addresses.meter = meter;
    } else {
        addresses.voltmeter = meter; // two meters, one per role
        addresses.ammeter = withSerialFormat(source.ammeterAddress, source.serialFormat);
    }
    addresses.load = withSerialFormat(source.loadAddress, source.serialFormat);
    QString problem;
    InstrumentRig *rig = makeRig(addresses, &problem, parent);
    if (!rig) {
        *error = QStringLiteral("instruments: ") + problem;
        return nullptr;
    }
    return rig;
}

} // namespace sagline
