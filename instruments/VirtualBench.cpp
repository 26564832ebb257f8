#include "VirtualBench.h"

#include "SimInstrument.h"

#include <QRandomGenerator>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

// Resistance set when the load is "on" with no setting: a safe, light load.
constexpr double maxUpdateStepS = 1.0; // physics is integrated in steps no longer than this

} // namespace

VirtualBenchOptions virtualBenchOptionsFor(const Setup &setup, const Plan &plan, std::uint64_t seed)
{
    VirtualBenchOptions options;
    options.seed = seed;
    options.transformer = transformerParametersFor(setup, plan.magnetizingFraction);
    options.fuse = setup.bench.fuse;
    if (!options.fuse) {
        FuseSpec fuse;
        fuse.ratingA = plan.recommendedFuse.ratingA;
        fuse.type = plan.recommendedFuse.type;
        options.fuse = fuse;
    }
    const double v0 = options.transformer.noLoadVoltageV();
    const double ratedCurrent = plan.ratedSecondaryCurrentA;
    // Ranges like a bench meter's: the next decade range above 1.2x the largest expected value.
    auto rangeFor = [](double value) {
        double range = 0.2;
        while (range < 1.2 * value)
            range *= 10.0;
        return range;
    };
    options.voltmeter.rangeMax = rangeFor(v0);
    options.ammeter.rangeMax = rangeFor(std::max(ratedCurrent, 0.01) * 1.6);
    // One count on a 4½-digit display for that range (common practice).
    options.voltmeter.resolution = options.voltmeter.rangeMax / 20000.0;
    options.ammeter.resolution = options.ammeter.rangeMax / 20000.0;
    options.voltmeter.noiseSd = options.voltmeter.resolution;
    options.ammeter.noiseSd = options.ammeter.resolution;
    options.voltmeter.accuracy = {0.5, 3.0};
    options.ammeter.accuracy = {1.0, 3.0};
    return options;
}

VirtualBench::VirtualBench(const VirtualBenchOptions &options, Clock *clock, QObject *parent)
    : QObject(parent), m_options(options), m_clock(clock), m_transformer(options.transformer), m_random(options.seed),
      m_primaryRandom(options.seed ^ 0x5052494D41525931ull)
{
    if (options.fuse && options.fuse->ratingA > 0.0)
        m_fuse = std::make_unique<FuseModel>(options.fuse->ratingA, options.fuse->type);
    m_lastUpdateMs = clock->nowMs();
    // Each meter's gain error is fixed for the session, drawn within a third of its spec
    // (instruments in calibration are usually well inside their limits; common practice).
    std::uniform_real_distribution<double> unit(-1.0, 1.0);
    m_voltmeterGain = 1.0 + unit(m_random) * options.voltmeter.accuracy.percentOfReading / 300.0;
    m_ammeterGain = 1.0 + unit(m_random) * options.ammeter.accuracy.percentOfReading / 300.0;
    m_powerGain = 1.0 + unit(m_primaryRandom) * options.primaryPower.accuracy.percentOfReading / 300.0;
    m_reactiveGain = 1.0 + unit(m_primaryRandom) * options.primaryReactivePower.accuracy.percentOfReading / 300.0;
    // Drawn after the power channels' so theirs stay what they were for a seed.
    m_primaryVoltmeterGain = 1.0 + unit(m_primaryRandom) * options.primaryVoltmeter.accuracy.percentOfReading / 300.0;
    m_primaryAmmeterGain = 1.0 + unit(m_primaryRandom) * options.primaryAmmeter.accuracy.percentOfReading / 300.0;
    m_voltmeter = new SimInstrument(SimInstrumentKind::Voltmeter, this, options.seed * 4 + 1, this);
    m_ammeter = new SimInstrument(SimInstrumentKind::Ammeter, this, options.seed * 4 + 2, this);
    m_powerMeter = new SimInstrument(SimInstrumentKind::PowerMeter, this, options.seed * 4 + 3, this);
    m_load = new SimInstrument(SimInstrumentKind::Load, this, options.seed * 4 + 4, this);
    m_primaryMeter = new SimInstrument(SimInstrumentKind::PrimaryMeter, this, options.seed * 4 + 5, this);
    const QString suffix = options.serialSuffix.isEmpty() ? processSerialSuffix() : options.serialSuffix;
    for (SimInstrument *instrument : instruments())
        instrument->setSerialNumber(instrument->serialNumber() + QLatin1Char('-') + suffix);
}

QString processSerialSuffix()
{
    static const QString suffix =
        QStringLiteral("%1").arg(QRandomGenerator::system()->generate(), 8, 16, QLatin1Char('0')).toUpper();
    return suffix;
}

VirtualBench::~VirtualBench() = default;

void VirtualBench::update()
{
    const std::int64_t now = m_clock->nowMs();
    double remaining = static_cast<double>(now - m_lastUpdateMs) / 1000.0;
    m_lastUpdateMs = now;
    while (remaining > 0.0) {
        const double dt = std::min(remaining, maxUpdateStepS);
        const TransformerState s = m_transformer.state();
        if (m_fuse && s.supplied) {
            // Within dt the current is nearly constant: find when the fuse opens, if it does.
            const double before = m_fuse->heat();
            m_fuse->advance(dt, s.primaryCurrentA);
            if (m_fuse->isOpen()) {
                const double used = before < 1.0 && m_fuse->heat() > before ? dt : 0.0;
                m_transformer.advance(used);
                m_transformer.setSupplied(false);
                emit fuseOpened(s.primaryCurrentA);
                remaining -= dt;
                continue;
            }
        }
        m_transformer.advance(dt);
        remaining -= dt;
    }
}

void VirtualBench::setLoad(std::optional<double> resistanceOhm)
{
    update();
    m_transformer.setLoadResistance(resistanceOhm);
    // A heavy overload opens a fuse within milliseconds: let the fuse see the new current now.
    if (m_fuse && !m_fuse->isOpen()) {
        const TransformerState s = m_transformer.state();
        const double t = nominalFuseOpeningTimeS(m_fuse->type(), s.primaryCurrentA / m_fuse->ratingA());
        if (t < 0.001) {
            m_fuse->advance(1.0, s.primaryCurrentA);
            m_transformer.setSupplied(false);
            emit fuseOpened(s.primaryCurrentA);
        }
    }
}

std::optional<double> VirtualBench::load() const
{
    return m_transformer.loadResistance();
}

TransformerState VirtualBench::state()
{
    update();
    return m_transformer.state();
}

bool VirtualBench::isFuseOpen()
{
    update();
    return m_fuse && m_fuse->isOpen();
}

void VirtualBench::replaceFuse()
{
    update();
    if (m_fuse)
        m_fuse->replace();
    m_transformer.setSupplied(true);
}

std::optional<double> VirtualBench::meterReading(double trueValue, const SimMeterSpec &spec, double gain)
{
    double value = trueValue * gain + std::normal_distribution<double>(0.0, spec.noiseSd)(m_random);
    value = std::fabs(value); // an RMS meter shows a magnitude
    if (value > spec.rangeMax)
        return std::nullopt;
    if (spec.resolution > 0.0)
        value = std::round(value / spec.resolution) * spec.resolution;
    return value;
}

std::optional<double> VirtualBench::readVoltage()
{
    return meterReading(state().secondaryVoltageV, m_options.voltmeter, m_voltmeterGain);
}

std::optional<double> VirtualBench::readCurrent()
{
    return meterReading(state().secondaryCurrentA, m_options.ammeter, m_ammeterGain);
}

} // namespace sagline

namespace sagline {

std::optional<double> VirtualBench::primaryReading(double trueValue, const SimMeterSpec &spec, double gain)
{
    double value = trueValue * gain + std::normal_distribution<double>(0.0, spec.noiseSd)(m_primaryRandom);
    value = std::fabs(value);
    if (value > spec.rangeMax)
        return std::nullopt;
    if (spec.resolution > 0.0)
        value = std::round(value / spec.resolution) * spec.resolution;
    return value;
}

std::optional<double> VirtualBench::readPrimaryVoltage()
{
    // The mains meter sits on the supply side of the fuse (common practice: it shows the
    // supply even when the fuse has opened): the terminal voltage while the primary is supplied,
    // the supply's own EMF once the fuse opened.
    const TransformerState s = state();
    return primaryReading(s.supplied ? s.primaryVoltageV : m_options.transformer.primaryVoltageV, m_options.primaryVoltmeter,
                          m_primaryVoltmeterGain);
}

std::optional<double> VirtualBench::readPrimaryCurrent()
{
    return primaryReading(state().primaryCurrentA, m_options.primaryAmmeter, m_primaryAmmeterGain);
}

std::optional<double> VirtualBench::readPrimaryPower()
{
    return primaryReading(state().primaryPowerW, m_options.primaryPower, m_powerGain);
}

std::optional<double> VirtualBench::readPrimaryReactivePower()
{
    return primaryReading(state().primaryReactivePowerVar, m_options.primaryReactivePower, m_reactiveGain);
}

std::optional<double> VirtualBench::readPrimaryPowerFactor()
{
    const double pf = state().primaryPowerFactor;
    return std::min(1.0, std::round((pf + std::normal_distribution<double>(0.0, 0.0005)(m_primaryRandom)) * 1000.0) / 1000.0);
}

} // namespace sagline
