#include "VirtualBenchTruth.h"

#include "TransformerFormulas.h"
#include "VirtualBench.h"

#include <QString>

namespace sagline::cli {

namespace {

std::string fixed(double value, int decimals)
{
    return QString::number(value, 'f', decimals).toStdString();
}

} // namespace

void printVirtualBenchTruth(VirtualBench &bench, double ratedSecondaryCurrentA, bool analyserAttached, std::ostream &out)
{
    const TransformerParameters &t = bench.options().transformer;
    const double v0 = t.noLoadVoltageV();
    const double r = t.seriesResistanceOhm;
    const double p0 = t.coreLossW;
    out << "  simulated primary side: no-load loss P0 " << fixed(p0, 4) << " W and magnetizing current "
        << fixed(t.magnetizingCurrentA, 5) << " A at " << fixed(t.primaryVoltageV, 1) << " V; series reactance X "
        << fixed(t.leakageReactanceOhm, 4) << " Ω (secondary); supply impedance " << fixed(t.supplyResistanceOhm, 3) << " + j"
        << fixed(t.supplyReactanceOhm, 3) << " Ω\n";
    // The analyser's own gain errors (not the secondary meters'), only when it took part.
    if (analyserAttached)
        out << "  primary analyser gain errors: voltmeter " << fixed((bench.primaryVoltmeterGain() - 1.0) * 100.0, 3)
        << " %, ammeter " << fixed((bench.primaryAmmeterGain() - 1.0) * 100.0, 3) << " %\n";
    if (ratedSecondaryCurrentA > 0.0 && r > 0.0) {
        const double iStar = formulas::maxEfficiencyCurrent(p0, r);
        out << "  from them (20 °C, resistive load): efficiency at rated " << fixed(ratedSecondaryCurrentA, 4) << " A "
            << fixed(100.0 * formulas::modelEfficiency(v0, r, p0, ratedSecondaryCurrentA), 3) << " %, peak "
            << fixed(100.0 * formulas::modelEfficiency(v0, r, p0, iStar), 3) << " % at " << fixed(iStar, 4) << " A\n";
    }
}

} // namespace sagline::cli
