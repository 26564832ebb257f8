#include "LinkAddress.h"

#include "InstrumentRig.h"
#include "ScpiInstrument.h"
#include "SimInstrument.h"
#include "TcpLink.h"
#include "VirtualBench.h"
#include "VirtualBenchLink.h"

namespace sagline {

namespace {

bool parseFormat(const QString &format, SerialSettings *settings, QString *error)
{
    // "8N1", "7E2", "8O1.5"
    if (format.size() < 3) {
        *error = QStringLiteral("serial format '%1' must look like 8N1 (data bits, parity N/E/O/S/M, stop bits 1/1.5/2)").arg(format);
        return false;
    }
    const int data = format.at(0).digitValue();
    if (data < 5 || data > 8) {
        *error = QStringLiteral("serial format '%1': data bits must be 5 to 8").arg(format);
        return false;
    }
    settings->dataBits = static_cast<QSerialPort::DataBits>(data);
    switch (format.at(1).toUpper().toLatin1()) {
    case 'N': settings->parity = QSerialPort::NoParity; break;
    case 'E': settings->parity = QSerialPort::EvenParity; break;
    case 'O': settings->parity = QSerialPort::OddParity; break;
    case 'S': settings->parity = QSerialPort::SpaceParity; break;
    case 'M': settings->parity = QSerialPort::MarkParity; break;
    default:
        *error = QStringLiteral("serial format '%1': parity must be N, E, O, S or M").arg(format);
        return false;
    }
    const QString stop = format.mid(2);
    if (stop == QStringLiteral("1"))
        settings->stopBits = QSerialPort::OneStop;
    else if (stop == QStringLiteral("1.5"))
        settings->stopBits = QSerialPort::OneAndHalfStop;
    else if (stop == QStringLiteral("2"))
        settings->stopBits = QSerialPort::TwoStop;
    else {
        *error = QStringLiteral("serial format '%1': stop bits must be 1, 1.5 or 2").arg(format);
        return false;
    }
    return true;
}

} // namespace

LinkAddressParse parseLinkAddress(const QString &text)
{
    LinkAddressParse result;
    const QString s = text.trimmed();
    if (s.isEmpty()) {
        result.error = QStringLiteral("the address is empty; give a serial port (/dev/ttyUSB0) or tcp:HOST[:PORT]");
        return result;
    }
    LinkAddress address;
    const bool tcpPrefix = s.startsWith(QStringLiteral("tcp:"), Qt::CaseInsensitive);
    const bool looksTcp = tcpPrefix || (!s.startsWith(QLatin1Char('/')) && s.contains(QLatin1Char(':')) && !s.contains(QLatin1Char(',')));
    if (looksTcp) {
        QString rest = tcpPrefix ? s.mid(4) : s;
        address.kind = LinkAddress::Kind::Tcp;
        const qsizetype colon = rest.lastIndexOf(QLatin1Char(':'));
        if (colon >= 0) {
            bool ok = false;
            const uint port = rest.mid(colon + 1).toUInt(&ok);
            if (!ok || port == 0 || port > 65535) {
                result.error = QStringLiteral("'%1': the TCP port must be 1 to 65535").arg(s);
                return result;
            }
            address.port = static_cast<quint16>(port);
            rest = rest.left(colon);
        }
        if (rest.isEmpty()) {
            result.error = QStringLiteral("'%1': the host is missing").arg(s);
            return result;
        }
        address.host = rest;
        result.address = address;
        return result;
    }
    const QStringList parts = s.split(QLatin1Char(','));
    address.serial.portName = parts.at(0).trimmed();
    if (parts.size() > 1) {
        bool ok = false;
        const int baud = parts.at(1).trimmed().toInt(&ok);
        if (!ok || baud <= 0) {
            result.error = QStringLiteral("'%1': the baud rate must be a positive integer, got '%2'").arg(s, parts.at(1));
            return result;
        }
        address.serial.baudRate = baud;
    }
    if (parts.size() > 2 && !parseFormat(parts.at(2).trimmed(), &address.serial, &result.error))
        return result;
    if (parts.size() > 3) {
        const QString flow = parts.at(3).trimmed().toLower();
        if (flow == QStringLiteral("rtscts"))
            address.serial.flowControl = QSerialPort::HardwareControl;
        else if (flow == QStringLiteral("xonxoff"))
            address.serial.flowControl = QSerialPort::SoftwareControl;
        else if (flow == QStringLiteral("none"))
            address.serial.flowControl = QSerialPort::NoFlowControl;
        else {
            result.error = QStringLiteral("'%1': flow control must be none, rtscts or xonxoff").arg(s);
            return result;
        }
    }
    if (parts.size() > 4) {
        result.error = QStringLiteral("'%1': too many fields; PORT[,BAUD[,FORMAT[,FLOW]]]").arg(s);
        return result;
    }
    result.address = address;
    return result;
}

ScpiLink *makeLink(const LinkAddress &address, QObject *parent)
{
    if (address.kind == LinkAddress::Kind::Tcp)
        return new TcpLink(address.host, address.port, parent);
    return new SerialLink(address.serial, parent);
}

InstrumentRig *makeRig(const RigAddresses &addresses, QString *error, QObject *parent)
{
    struct Wanted {
        QString name;
        QString address;
        QList<MeterRole> roles;
    };
    QList<Wanted> wanted;
    if (!addresses.meter.isEmpty()) {
        if (!addresses.voltmeter.isEmpty() || !addresses.ammeter.isEmpty()) {
            *error = QStringLiteral("give either one meter for both roles or a voltmeter and an ammeter, not both");
            return nullptr;
        }
        wanted << Wanted{QStringLiteral("meter"), addresses.meter, {MeterRole::SecondaryVoltage, MeterRole::SecondaryCurrent}};
    } else {
        if (addresses.voltmeter.isEmpty() || addresses.ammeter.isEmpty()) {
            *error = QStringLiteral("a sweep needs the secondary voltmeter and ammeter (or one meter for both)");
            return nullptr;
        }
        wanted << Wanted{QStringLiteral("voltmeter"), addresses.voltmeter, {MeterRole::SecondaryVoltage}};
        wanted << Wanted{QStringLiteral("ammeter"), addresses.ammeter, {MeterRole::SecondaryCurrent}};
    }
    QList<std::pair<QString, LinkAddress>> parsed;
    for (const Wanted &w : wanted) {
        const LinkAddressParse p = parseLinkAddress(w.address);
        if (!p.address) {
            *error = QStringLiteral("%1 address: %2").arg(w.name, p.error);
            return nullptr;
        }
        parsed << std::make_pair(w.name, *p.address);
    }
    std::optional<LinkAddress> loadAddress;
    if (!addresses.load.isEmpty()) {
        const LinkAddressParse p = parseLinkAddress(addresses.load);
        if (!p.address) {
            *error = QStringLiteral("load address: %1").arg(p.error);
            return nullptr;
        }
        loadAddress = p.address;
    }
    auto *rig = new InstrumentRig(parent);
    for (qsizetype i = 0; i < wanted.size(); ++i) {
        ScpiLink *link = makeLink(parsed[i].second);
        link->setTimeoutMs(addresses.timeoutMs);
        auto *instrument = new ScpiInstrument(wanted[i].name, link);
        QList<RoleConfig> roles;
        for (MeterRole role : wanted[i].roles)
            roles << defaultRoleConfig(role);
        instrument->setRoles(roles);
        instrument->setResetOnConnect(addresses.resetOnConnect);
        rig->addInstrument(instrument);
    }
    if (loadAddress) {
        ScpiLink *link = makeLink(*loadAddress);
        link->setTimeoutMs(addresses.timeoutMs);
        rig->setLoadInstrument(new ScpiInstrument(QStringLiteral("load"), link));
    }
    return rig;
}

RoleConfig virtualBenchPrimaryRoleConfig(const VirtualBenchOptions &options, MeterRole role)
{
    RoleConfig config = defaultRoleConfig(role);
    config.configureCommands.clear(); // one instrument, several functions: no switching
    if (role == MeterRole::PrimaryVoltage)
        config.accuracy = options.primaryVoltmeter.accuracy, config.resolution = options.primaryVoltmeter.resolution;
    else if (role == MeterRole::PrimaryCurrent)
        config.accuracy = options.primaryAmmeter.accuracy, config.resolution = options.primaryAmmeter.resolution;
    else if (role == MeterRole::PrimaryPower)
        config.accuracy = options.primaryPower.accuracy, config.resolution = options.primaryPower.resolution;
    else if (role == MeterRole::PrimaryReactivePower)
        config.accuracy = options.primaryReactivePower.accuracy, config.resolution = options.primaryReactivePower.resolution;
    return config;
}

InstrumentRig *makeVirtualBenchRig(VirtualBench *bench, bool singleMeter, QObject *parent, bool primaryAnalyser)
{
    auto *rig = new InstrumentRig(parent);
    auto roleFor = [bench](MeterRole role) {
        RoleConfig config = defaultRoleConfig(role);
        const SimMeterSpec &spec = roleUnit(role) == Unit::Volt ? bench->options().voltmeter : bench->options().ammeter;
        config.accuracy = spec.accuracy;
        config.resolution = spec.resolution;
        return config;
    };
    if (singleMeter) {
        auto *meter = new ScpiInstrument(QStringLiteral("meter"), new VirtualBenchLink(bench->powerMeter()));
        // One two-channel instrument: configure commands would switch its function back and forth.
        RoleConfig v = roleFor(MeterRole::SecondaryVoltage);
        RoleConfig i = roleFor(MeterRole::SecondaryCurrent);
        v.configureCommands.clear();
        i.configureCommands.clear();
        meter->setRoles({v, i});
        rig->addInstrument(meter);
    } else {
        auto *voltmeter = new ScpiInstrument(QStringLiteral("voltmeter"), new VirtualBenchLink(bench->voltmeter()));
        voltmeter->setRoles({roleFor(MeterRole::SecondaryVoltage)});
        auto *ammeter = new ScpiInstrument(QStringLiteral("ammeter"), new VirtualBenchLink(bench->ammeter()));
        ammeter->setRoles({roleFor(MeterRole::SecondaryCurrent)});
        rig->addInstrument(voltmeter);
        rig->addInstrument(ammeter);
    }
    if (primaryAnalyser) {
        auto *analyser = new ScpiInstrument(QStringLiteral("primary analyser"), new VirtualBenchLink(bench->primaryMeter()));
        QList<RoleConfig> roles;
        for (MeterRole role : {MeterRole::PrimaryVoltage, MeterRole::PrimaryCurrent, MeterRole::PrimaryPower,
                               MeterRole::PrimaryReactivePower})
            roles << virtualBenchPrimaryRoleConfig(bench->options(), role);
        analyser->setRoles(roles);
        rig->addInstrument(analyser);
    }
    rig->setLoadInstrument(new ScpiInstrument(QStringLiteral("load"), new VirtualBenchLink(bench->loadInstrument())));
    return rig;
}

} // namespace sagline
