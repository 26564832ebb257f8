// The instruments a reading source stands for, built the same way for a sweep (SweepRun) and
// for the instruments tab's Connect and test (MeterCheck): one meter in both roles or a
// voltmeter and a separate ammeter, on serial ports or the LAN, with the serial settings of
// the tab, and an optional programmable load.
#pragma once

#include <QString>

class QObject;

namespace sagline {

class InstrumentRig;
struct SourceChoice;

// A serial or LAN source's rig, or null with `error` naming the field ("instruments.serial_port:
// ..."). Not for the virtual bench or typed-in readings.
InstrumentRig *rigForSource(const SourceChoice &source, QString *error, QObject *parent = nullptr);

// `address` with the tab's serial settings appended when it is a serial port given without
// its own ("/dev/ttyUSB0" -> "/dev/ttyUSB0,19200,7E1,rtscts"); anything else unchanged.
QString withSerialFormat(const QString &address, const QString &serialFormat);

} // namespace sagline
