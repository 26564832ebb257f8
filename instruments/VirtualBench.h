// The virtual bench: a transformer (core/TransformerModel) fed through a primary fuse
// (core/FuseModel), a programmable load, and meters with resolution, noise, a fixed gain
// error within their accuracy spec and a range (overload above it). Time comes from the
// injected Clock, so copper heating and fuse heating follow simulated or wall time alike.
// The SCPI side (SimInstrument) and the transports (pty, TCP, in-process) are separate.
#pragma once

#include "Clock.h"
#include "FuseModel.h"
#include "MeterRole.h"
#include "Planner.h"
#include "TransformerModel.h"

#include <QObject>

#include <memory>
#include <optional>
#include <random>

namespace sagline {

struct SimMeterSpec {
    double resolution = 0.001;     // one count, V or A
    double noiseSd = 0.002;        // reading noise, standard deviation, V or A
    AccuracySpec accuracy{0.5, 3}; // the meter's gain error is drawn once inside this limit
    double rangeMax = 100.0;       // above this the meter reports overload (9.9E37)
};

struct VirtualBenchOptions {
    TransformerParameters transformer;
    std::optional<FuseSpec> fuse;  // the primary fuse; none = no fuse fitted
    SimMeterSpec voltmeter;
    SimMeterSpec ammeter;
    // The primary power analyser's channels: voltage (V, ranged for the mains), current (A), active
    // and reactive power (W, var). Each has its own gain error, drawn once like the secondary
    // meters' (independent of theirs), and its own noise, from the analyser's own random sequence.
    SimMeterSpec primaryVoltmeter{0.01, 0.01, {0.5, 3}, 750.0};
    SimMeterSpec primaryAmmeter{0.0001, 0.0001, {1.0, 3}, 10.0};
    SimMeterSpec primaryPower{0.01, 0.01, {0.5, 3}, 5000.0};
    SimMeterSpec primaryReactivePower{0.01, 0.01, {1.0, 3}, 5000.0};
    std::uint64_t seed = 1;
    // Ends every instrument's serial number. Empty: processSerialSuffix(), so a bench in another
    // process (a simulator started later on a reused pty or port) never passes for this one.
    QString serialSuffix;
};

// Eight hex digits drawn once per process: the default end of the virtual instruments' serial
// numbers, as a real meter's serial number belongs to that meter alone.
QString processSerialSuffix();

// A bench for a setup: the transformer its nameplate describes (magnetizing current from the
// plan's fraction), its fuse, meters ranged and specified like ordinary bench meters.
VirtualBenchOptions virtualBenchOptionsFor(const Setup &setup, const Plan &plan, std::uint64_t seed);

class SimInstrument;

class VirtualBench : public QObject {
    Q_OBJECT
public:
    VirtualBench(const VirtualBenchOptions &options, Clock *clock, QObject *parent = nullptr);
    ~VirtualBench() override;

    const VirtualBenchOptions &options() const { return m_options; }
    Clock *clock() const { return m_clock; }

    void setLoad(std::optional<double> resistanceOhm); // nullopt = open circuit
    std::optional<double> load() const;
    TransformerState state();                          // brought up to the clock's present time
    bool isFuseOpen();
    void replaceFuse();

    // Meter readings as the meters show them (gain error, noise, resolution). nullopt = overload.
    std::optional<double> readVoltage();
    std::optional<double> readCurrent();
    std::optional<double> readPrimaryVoltage(); // the supply, V RMS (0 once the fuse opened)
    std::optional<double> readPrimaryCurrent(); // through the fuse, A RMS
    std::optional<double> readPrimaryPower();   // active power into the primary, W
    std::optional<double> readPrimaryReactivePower(); // var
    std::optional<double> readPrimaryPowerFactor();   // 0..1, to 0.001

    // The instruments on this bench (owned by it): a voltmeter, an ammeter, a two-channel
    // power meter (both secondary V and I) and the programmable load.
    SimInstrument *voltmeter() const { return m_voltmeter; }
    SimInstrument *ammeter() const { return m_ammeter; }
    SimInstrument *powerMeter() const { return m_powerMeter; }
    SimInstrument *loadInstrument() const { return m_load; }
    SimInstrument *primaryMeter() const { return m_primaryMeter; } // mains-side analyser: V, I, P, Q, PF
    QList<SimInstrument *> instruments() const { return {m_voltmeter, m_ammeter, m_powerMeter, m_load, m_primaryMeter}; }

    std::mt19937_64 &random() { return m_random; }
    // The meters' fixed gain errors (reading = true value x gain), drawn once from the seed.
    double voltmeterGain() const { return m_voltmeterGain; }
    double ammeterGain() const { return m_ammeterGain; }
    double primaryVoltmeterGain() const { return m_primaryVoltmeterGain; }
    double primaryAmmeterGain() const { return m_primaryAmmeterGain; }

signals:
    void fuseOpened(double primaryCurrentA);

private:
    void update();
    std::optional<double> meterReading(double trueValue, const SimMeterSpec &spec, double gain);
    std::optional<double> primaryReading(double trueValue, const SimMeterSpec &spec, double gain);

    VirtualBenchOptions m_options;
    Clock *m_clock;
    TransformerModel m_transformer;
    std::unique_ptr<FuseModel> m_fuse;
    std::int64_t m_lastUpdateMs = 0;
    std::mt19937_64 m_random;
    std::mt19937_64 m_primaryRandom; // the primary analyser's own noise, so reading it leaves the secondary's sequence alone
    double m_powerGain = 1.0;
    double m_reactiveGain = 1.0;
    double m_voltmeterGain = 1.0;
    double m_ammeterGain = 1.0;
    double m_primaryVoltmeterGain = 1.0;
    double m_primaryAmmeterGain = 1.0;
    SimInstrument *m_voltmeter;
    SimInstrument *m_ammeter;
    SimInstrument *m_powerMeter;
    SimInstrument *m_load;
    SimInstrument *m_primaryMeter;
};

} // namespace sagline
