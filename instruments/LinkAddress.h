// Instrument addresses as people type them, and the links and rigs built from them.
//   serial:  PORT[,BAUD[,FORMAT[,FLOW]]]   e.g. "/dev/ttyUSB0", "/dev/ttyUSB0,9600,8N1", "COM3,115200,7E2,rtscts"
//   TCP:     tcp:HOST[:PORT] or HOST:PORT   e.g. "tcp:192.0.2.7", "192.0.2.7:5025" (default port 5025)
#pragma once

#include "MeterRole.h"
#include "SerialLink.h"

#include <QList>
#include <QString>

#include <optional>

namespace sagline {

class InstrumentRig;
class ScpiLink;
class VirtualBench;

struct LinkAddress {
    enum class Kind { Serial, Tcp };
    Kind kind = Kind::Serial;
    SerialSettings serial;  // Serial
    QString host;           // Tcp
    quint16 port = 5025;    // Tcp
};

struct LinkAddressParse {
    std::optional<LinkAddress> address;
    QString error; // names the part that is wrong
};

LinkAddressParse parseLinkAddress(const QString &text);
ScpiLink *makeLink(const LinkAddress &address, QObject *parent = nullptr);

struct RigAddresses {
    QString voltmeter; // the secondary voltmeter's address (with `ammeter`)
    QString ammeter;
    QString meter;     // one instrument in both secondary roles (instead of the two above)
    QString load;      // optional programmable load
    int timeoutMs = 2000;
    bool resetOnConnect = false;
};

// Builds the rig for the given addresses, or says which address is wrong.
InstrumentRig *makeRig(const RigAddresses &addresses, QString *error, QObject *parent = nullptr);
struct VirtualBenchOptions;
// The accuracy and resolution of the virtual bench's mains-side analyser for one primary role,
// as makeVirtualBenchRig configures it (and so as the setup's primary meters are filled).
RoleConfig virtualBenchPrimaryRoleConfig(const VirtualBenchOptions &options, MeterRole role);

// The virtual bench's rig, in process: a voltmeter and an ammeter (or the two-channel power
// meter when `singleMeter`) and the programmable load; with `primaryAnalyser` also the mains-side
// analyser serving the primary voltage, current, active and reactive power.
InstrumentRig *makeVirtualBenchRig(VirtualBench *bench, bool singleMeter, QObject *parent = nullptr,
                                   bool primaryAnalyser = false);

} // namespace sagline
