#include "PrimarySideAnalysis.h"

#include "FitBudget.h"
#include "NumberFormat.h"
#include "TransformerFormulas.h"

#include <algorithm>
#include <cmath>
#include <functional>

namespace sagline {

namespace {

// A measured input with its standard uncertainty (0: not known). Read on a meter the setup
// specifies (`meters.primary_*`), `u` is 0 and the spec's terms are kept apart: offset and
// resolution per reading, the gain as the meter's one common line.
struct Measured {
    Measured() = default;
    Measured(double value_, double u_) : value(value_), u(u_) {}
    Measured(double value_, const MeterSpec *spec_, std::string meter_)
        : value(value_), spec(spec_), meter(std::move(meter_))
    {
    }

    double value = 0.0;
    double u = 0.0;
    const MeterSpec *spec = nullptr;
    std::string meter;           // "primary voltmeter", ...: names the common gain line
};

// u of one reading from a setup's meter spec: offset (rectangular half-width, GUM 4.3.7) and one
// count of resolution (GUM F.2.2.1), both per reading.
double offsetU(const MeterSpec &spec)
{
    return spec.offset / std::sqrt(3.0);
}

double resolutionU(const MeterSpec &spec)
{
    return spec.resolution / std::sqrt(12.0);
}

// Every term of a reading's uncertainty as one standard uncertainty (the gain taken for this
// reading alone): for quantities derived reading by reading, such as Q from V, I and P.
double totalU(const Measured &m)
{
    if (!m.spec)
        return m.u;
    const double gain = m.spec->gainPercentOfReading / 100.0 * std::abs(m.value) / std::sqrt(3.0);
    return std::sqrt(m.u * m.u + std::pow(offsetU(*m.spec), 2) + std::pow(resolutionU(*m.spec), 2) + gain * gain);
}

bool isUsed(const Reading &reading)
{
    return !reading.excluded && (reading.flags & (flagOverload | flagNotANumber)) == 0 && std::isfinite(reading.voltageV)
           && std::isfinite(reading.currentA);
}

// A meter reading's standard uncertainty as a budget line: Type B, rectangular (a specification
// limit divided by sqrt(3), GUM 4.3.7), ν = ∞. Nothing when the uncertainty is not known.
void addLine(std::vector<BudgetComponent> &list, const std::string &source, double u, const std::string &unit,
             double sensitivity)
{
    if (!(u > 0.0) || !std::isfinite(sensitivity))
        return;
    BudgetComponent c;
    c.source = source;
    c.type = EvaluationType::B;
    c.distribution = "rectangular";
    c.shape = DistributionShape::Rectangular;
    c.standardUncertainty = u;
    c.inputUnit = unit;
    c.sensitivity = sensitivity;
    c.contribution = std::abs(sensitivity) * u;
    list.push_back(std::move(c));
}

// With a setup spec: the offset and the resolution as lines of this reading, and the gain as the
// meter's common line with ∂f/∂γ = ∂f/∂x · x / 100 per % (a reading x' = (1 + γ)x); lines of one
// meter's gain are merged by combine().
void addMeter(std::vector<BudgetComponent> &list, const std::string &source, const Measured &input,
              const std::string &unit, double sensitivity)
{
    if (!input.spec) {
        addLine(list, source, input.u, unit, sensitivity);
        return;
    }
    addLine(list, source + ", offset", offsetU(*input.spec), unit, sensitivity);
    addLine(list, source + ", resolution", resolutionU(*input.spec), unit, sensitivity);
    addLine(list, commonGainLineSource(input.meter, input.spec->gainPercentOfReading),
            input.spec->gainPercentOfReading / std::sqrt(3.0), "%", sensitivity * input.value / 100.0);
}

// combineBudget with each meter's common gain lines merged into one.
UncertainValue combine(double value, std::vector<BudgetComponent> components)
{
    return combineBudget(value, mergeCommonGainLines(std::move(components)));
}

// The components of another result, scaled by this result's sensitivity to it.
void addScaled(std::vector<BudgetComponent> &list, const UncertainValue &from, double sensitivity)
{
    for (BudgetComponent c : from.budget) {
        c.sensitivity *= sensitivity;
        c.contribution = std::abs(c.contribution * sensitivity);
        list.push_back(std::move(c));
    }
}

Measured secondaryVoltage(const Reading &r, const AnalysisInput *in)
{
    double u = r.uVoltageV.value_or(0.0);
    if (!r.uVoltageV && in && in->meters) {
        const MeterSpec &m = in->meters->voltmeter;
        u = (m.gainPercentOfReading / 100.0 * r.voltageV + m.offset) / std::sqrt(3.0);
    }
    return {r.voltageV, u};
}

Measured secondaryCurrent(const Reading &r, const AnalysisInput *in)
{
    double u = r.uCurrentA.value_or(0.0);
    if (!r.uCurrentA && in && in->meters) {
        const MeterSpec &m = in->meters->ammeter;
        u = (m.gainPercentOfReading / 100.0 * r.currentA + m.offset) / std::sqrt(3.0);
    }
    return {r.currentA, u};
}

Measured measured(const std::optional<double> &value, const std::optional<double> &u)
{
    return {value.value_or(0.0), u.value_or(0.0)};
}

// A primary reading: on the setup's meter when it gives one (its spec replaces the reading's
// stated u, which would count the gain again), else with the stated u.
Measured measured(const std::optional<double> &value, const std::optional<double> &u,
                  const std::optional<MeterSpec> &spec, const char *meter)
{
    if (!spec)
        return measured(value, u);
    return {value.value_or(0.0), &*spec, meter};
}

// The setup's primary meters (each absent when the setup gives none).
struct PrimarySpecs {
    std::optional<MeterSpec> voltmeter, ammeter, powerMeter;
};

PrimarySpecs primarySpecsOf(const AnalysisInput *in)
{
    if (!in || !in->meters)
        return {};
    return {in->meters->primaryVoltmeter, in->meters->primaryAmmeter, in->meters->powerMeter};
}

Measured primaryVoltage(const PrimaryReading &p, const PrimarySpecs &specs)
{
    return measured(p.voltageV, p.uVoltageV, specs.voltmeter, "primary voltmeter");
}

Measured primaryCurrent(const PrimaryReading &p, const PrimarySpecs &specs)
{
    return measured(p.currentA, p.uCurrentA, specs.ammeter, "primary ammeter");
}

Measured primaryPower(const PrimaryReading &p, const PrimarySpecs &specs)
{
    return measured(p.powerW, p.uPowerW, specs.powerMeter, "power meter");
}

// Q1 of a reading with its standard uncertainty: the reactive-power reading itself, else from
// V1, I1 and P1 (Q = sqrt(S² - P²)), else from P1 and the power factor.
// Every term of the meters' uncertainty counts per reading here (conservative: the reactive
// power's errors are taken as correlated across steps where they are combined).
std::optional<Measured> reactivePowerOf(const PrimaryReading &p, const PrimarySpecs &specs)
{
    if (p.reactivePowerVar)
        return measured(p.reactivePowerVar, p.uReactivePowerVar);
    const double uV = totalU(primaryVoltage(p, specs)), uI = totalU(primaryCurrent(p, specs));
    const double uP = totalU(primaryPower(p, specs));
    if (p.voltageV && p.currentA && p.powerW) {
        const double v = *p.voltageV, i = *p.currentA, w = *p.powerW;
        const double q = formulas::reactivePower(v, i, w);
        if (q > 0.0) {
            const double dv = v * i * i / q, di = v * v * i / q, dp = -w / q;
            const double u = std::sqrt(std::pow(dv * uV, 2) + std::pow(di * uI, 2) + std::pow(dp * uP, 2));
            return Measured{q, u};
        }
        // S at or below P: unity power factor within the meters; Q is zero, known to about u(S).
        return Measured{0.0, std::hypot(i * uV, v * uI)};
    }
    if (p.powerW && p.powerFactor && *p.powerFactor > 0.0) {
        const double w = *p.powerW, pf = *p.powerFactor;
        const double root = std::sqrt(std::max(1e-12, 1.0 - pf * pf));
        const double dp = root / pf, dpf = -w / (pf * pf * root);
        return Measured{formulas::reactivePowerFromPowerFactor(w, pf), std::hypot(dp * uP, dpf * p.uPowerFactor.value_or(0.0))};
    }
    return std::nullopt;
}

// Numerical partial derivative (central difference), for the model quantities of V0, R, P0, X.
double partial(const std::function<double(double)> &f, double x)
{
    const double h = std::max(std::abs(x), 1e-9) * 1e-6;
    return (f(x + h) - f(x - h)) / (2.0 * h);
}

const Reading *findOpenCircuit(const std::vector<Reading> &readings, double ratedSecondaryCurrentA)
{
    const Reading *lowest = nullptr;
    for (const Reading &r : readings) {
        if (!isUsed(r))
            continue;
        if (r.step == 0)
            return &r;
        if (r.step < 0 && (!lowest || r.currentA < lowest->currentA))
            lowest = &r;
    }
    if (lowest && lowest->currentA <= openCircuitCurrentShare * ratedSecondaryCurrentA)
        return lowest;
    return nullptr;
}

FieldErrors checkInput(const PrimarySideInput &in)
{
    FieldErrors errors;
    for (const auto &[value, name] : {std::pair{in.ratedPrimaryVoltageV, "rated_primary_voltage_v"},
                                      std::pair{in.ratedPrimaryCurrentA, "rated_primary_current_a"},
                                      std::pair{in.ratedSecondaryCurrentA, "rated_secondary_current_a"}}) {
        if (!std::isfinite(value) || !(value > 0.0))
            errors.push_back({name, "must be a number above zero"});
    }
    if (!std::isfinite(in.regulationPowerFactor) || !(in.regulationPowerFactor > 0.0) || in.regulationPowerFactor > 1.0)
        errors.push_back({"power_factor", "must be above 0 and at most 1"});
    return errors;
}

class Analyser {
public:
    Analyser(const std::vector<Reading> &readings, const FitSummary *fit, const AnalysisInput *analysisInput,
             const PrimarySideInput &in)
        : m_readings(readings), m_fit(fit && fit->ok() && fit->seriesResistanceOhm() > 0.0 ? fit : nullptr),
          m_analysisInput(analysisInput), m_in(in), m_specs(primarySpecsOf(analysisInput))
    {
        // Without the secondary analysis's input the fit's budget is its scatter alone.
        if (m_fit)
            m_budget.emplace(*m_fit, m_analysisInput ? *m_analysisInput : m_scatterOnly);
    }
    Analyser(const Analyser &) = delete;
    Analyser &operator=(const Analyser &) = delete;

    PrimarySideResult run();

private:
    void openCircuit();
    void loadedSteps();
    void seriesReactance();
    void modelResults();
    // A function of V0 and R (and more) with the fit's budget for V0 and R, plus `extra`.
    UncertainValue withFit(double value, double dV0, double dR, std::vector<BudgetComponent> extra) const;
    double coreRatio(const Reading &r) const; // (V1/V1,oc)², 1 without both voltages

    const std::vector<Reading> &m_readings;
    const FitSummary *m_fit;
    const AnalysisInput *m_analysisInput;
    PrimarySideInput m_in;
    PrimarySpecs m_specs;
    AnalysisInput m_scatterOnly;
    std::optional<FitBudget> m_budget;
    PrimarySideResult m_out;
    const Reading *m_oc = nullptr;
    Measured m_p0Measured;           // P1 at the open-circuit point, as read
    std::optional<UncertainValue> m_q0;
};

double Analyser::coreRatio(const Reading &r) const
{
    if (!m_oc || !m_oc->primary.voltageV || !r.primary.voltageV || !(*m_oc->primary.voltageV > 0.0))
        return 1.0;
    const double ratio = *r.primary.voltageV / *m_oc->primary.voltageV;
    return ratio * ratio;
}

UncertainValue Analyser::withFit(double value, double dV0, double dR, std::vector<BudgetComponent> extra) const
{
    std::vector<BudgetComponent> list;
    if (m_budget && m_budget->hasUncertainty())
        list = m_budget->evaluate(value, {dV0, dR, 0.0}).budget;
    list.insert(list.end(), extra.begin(), extra.end());
    return combine(value, std::move(list));
}

void Analyser::openCircuit()
{
    m_oc = findOpenCircuit(m_readings, m_in.ratedSecondaryCurrentA);
    if (!m_oc || !m_oc->primary.hasAny())
        return;
    const PrimaryReading &p = m_oc->primary;
    OpenCircuitResult oc;
    oc.readingId = m_oc->id;
    oc.voltageMeasured = p.voltageV && *p.voltageV > 0.0;
    const Measured v = oc.voltageMeasured ? primaryVoltage(p, m_specs) : Measured{m_in.ratedPrimaryVoltageV, 0.0};
    oc.voltageV = v.value;
    if (!oc.voltageMeasured)
        m_out.notes.push_back("no primary voltage at the open-circuit point: it is taken as the rated " +
                              formatSignificant(m_in.ratedPrimaryVoltageV, 4) + " V");
    if (p.currentA) {
        const Measured i = primaryCurrent(p, m_specs);
        std::vector<BudgetComponent> c, share;
        addMeter(c, "primary ammeter", i, "A", 1.0);
        addMeter(share, "primary ammeter", i, "A", 100.0 / m_in.ratedPrimaryCurrentA);
        oc.noLoadCurrentA = combine(i.value, c);
        oc.noLoadCurrentPercent = combine(100.0 * i.value / m_in.ratedPrimaryCurrentA, share);
    }
    if (p.powerW) {
        m_p0Measured = primaryPower(p, m_specs);
        const double scale = std::pow(m_in.ratedPrimaryVoltageV / v.value, 2);
        std::vector<BudgetComponent> c;
        addMeter(c, "primary power meter", m_p0Measured, "W", scale);
        addMeter(c, "primary voltmeter", v, "V", -2.0 * m_p0Measured.value * scale / v.value);
        oc.noLoadLossW = combine(m_p0Measured.value * scale, c);
        if (m_p0Measured.value > 0.0) {
            std::vector<BudgetComponent> rc;
            addMeter(rc, "primary power meter", m_p0Measured, "W", -v.value * v.value / std::pow(m_p0Measured.value, 2));
            addMeter(rc, "primary voltmeter", v, "V", 2.0 * v.value / m_p0Measured.value);
            oc.coreLossResistanceOhm = combine(formulas::coreLossResistance(v.value, m_p0Measured.value), rc);
        }
    }
    if (p.powerFactor) {
        std::vector<BudgetComponent> c;
        addMeter(c, "primary power-factor reading", measured(p.powerFactor, p.uPowerFactor), "", 1.0);
        oc.noLoadPowerFactor = combine(*p.powerFactor, c);
    } else if (p.powerW && p.currentA && *p.currentA > 0.0 && v.value > 0.0) {
        const Measured i = primaryCurrent(p, m_specs);
        const double pf = std::min(1.0, m_p0Measured.value / (v.value * i.value));
        std::vector<BudgetComponent> c;
        addMeter(c, "primary power meter", m_p0Measured, "W", pf / m_p0Measured.value);
        addMeter(c, "primary voltmeter", v, "V", -pf / v.value);
        addMeter(c, "primary ammeter", i, "A", -pf / i.value);
        oc.noLoadPowerFactor = combine(pf, c);
    }
    if (const auto q = reactivePowerOf(p, m_specs)) {
        std::vector<BudgetComponent> c;
        addMeter(c, "primary reactive power (from the primary meters)", *q, "var", 1.0);
        m_q0 = combine(q->value, c);
        oc.noLoadReactivePowerVar = m_q0;
        if (q->value > 0.0) {
            std::vector<BudgetComponent> xm;
            addMeter(xm, "primary reactive power (from the primary meters)", *q, "var", -v.value * v.value / (q->value * q->value));
            addMeter(xm, "primary voltmeter", v, "V", 2.0 * v.value / q->value);
            oc.magnetizingReactanceOhm = combine(formulas::magnetizingReactance(v.value, q->value), xm);
        }
    }
    m_out.openCircuit = std::move(oc);
}

void Analyser::loadedSteps()
{
    const double r = m_fit ? m_fit->seriesResistanceOhm() : 0.0;
    for (const Reading &reading : m_readings) {
        if (&reading == m_oc || !isUsed(reading) || !reading.primary.powerW || !(reading.currentA > 0.0))
            continue;
        StepLosses s;
        s.readingId = reading.id;
        s.step = reading.step;
        s.currentA = reading.currentA;
        const Measured p1 = primaryPower(reading.primary, m_specs);
        const Measured v2 = secondaryVoltage(reading, m_analysisInput);
        const Measured i2 = secondaryCurrent(reading, m_analysisInput);
        const double p2 = v2.value * i2.value;
        std::vector<BudgetComponent> c;
        addMeter(c, "primary power meter", p1, "W", 1.0);
        s.inputPowerW = combine(p1.value, c);
        c.clear();
        addMeter(c, "secondary voltmeter", v2, "V", i2.value);
        addMeter(c, "secondary ammeter", i2, "A", v2.value);
        s.outputPowerW = combine(p2, c);
        c.clear();
        addMeter(c, "primary power meter", p1, "W", 1.0);
        addMeter(c, "secondary voltmeter", v2, "V", -i2.value);
        addMeter(c, "secondary ammeter", i2, "A", -v2.value);
        s.totalLossW = combine(p1.value - p2, c);
        // The voltage ratio of one voltmeter: its gain cancels, so only P0's reading counts.
        const double ratio = coreRatio(reading);
        const double core = m_p0Measured.value * ratio;
        c.clear();
        addMeter(c, "primary power meter at no load", m_p0Measured, "W", ratio);
        s.coreLossW = combine(core, c);
        if (m_fit) {
            const double copper = r * i2.value * i2.value;
            std::vector<BudgetComponent> extra;
            addMeter(extra, "secondary ammeter", i2, "A", 2.0 * r * i2.value);
            s.copperLossW = withFit(copper, 0.0, i2.value * i2.value, extra);
            extra.clear();
            addMeter(extra, "primary power meter", p1, "W", 1.0);
            addMeter(extra, "secondary voltmeter", v2, "V", -i2.value);
            addMeter(extra, "secondary ammeter", i2, "A", -v2.value - 2.0 * r * i2.value);
            addMeter(extra, "primary power meter at no load", m_p0Measured, "W", -ratio);
            s.remainderW = withFit(p1.value - p2 - core - copper, 0.0, -i2.value * i2.value, extra);
        }
        c.clear();
        if (p1.value > 0.0) {
            addMeter(c, "secondary voltmeter", v2, "V", 100.0 * i2.value / p1.value);
            addMeter(c, "secondary ammeter", i2, "A", 100.0 * v2.value / p1.value);
            addMeter(c, "primary power meter", p1, "W", -100.0 * p2 / (p1.value * p1.value));
            s.efficiencyPercent = combine(100.0 * p2 / p1.value, c);
        } else {
            m_out.errors.push_back({"reading " + std::to_string(reading.id), "primary power is zero under load"});
            continue;
        }
        if (const auto q = reactivePowerOf(reading.primary, m_specs))
            s.reactivePowerVar = q->value;
        m_out.steps.push_back(std::move(s));
    }
    for (const StepLosses &s : m_out.steps) {
        if (s.remainderW && s.remainderW->expandedUncertainty
            && std::abs(s.remainderW->value) > *s.remainderW->expandedUncertainty) {
            m_out.warnings.push_back("the losses do not add up at reading " + std::to_string(s.readingId) + ": P1 - P2 - core - "
                                     "copper = " + formatSignificant(s.remainderW->value, 3) + " W, beyond its U of "
                                     + formatSignificant(*s.remainderW->expandedUncertainty, 2) + " W");
            break; // one line names the first; the table shows every step
        }
    }
}

void Analyser::seriesReactance()
{
    if (!m_q0)
        return;
    struct Point {
        double x;     // I2², A²
        double dq;    // Q1 - Q0·ratio, var
        double ratio; // (V1/V1,oc)²
        Measured q;
        Measured i;
    };
    std::vector<Point> points;
    for (const Reading &reading : m_readings) {
        if (&reading == m_oc || !isUsed(reading) || !(reading.currentA > 0.0))
            continue;
        const auto q = reactivePowerOf(reading.primary, m_specs);
        if (!q)
            continue;
        const double ratio = coreRatio(reading);
        points.push_back({reading.currentA * reading.currentA, q->value - m_q0->value * ratio, ratio, *q,
                          secondaryCurrent(reading, m_analysisInput)});
    }
    if (points.empty())
        return;
    double sxx = 0.0, sxy = 0.0, sx = 0.0, sxu = 0.0, sxr = 0.0;
    for (const Point &p : points) {
        sxx += p.x * p.x;
        sxy += p.x * p.dq;
        sx += p.x;
        sxu += p.x * p.q.u;
        sxr += p.x * p.ratio;
    }
    const double x = sxy / sxx;
    std::vector<BudgetComponent> c;
    // The readings' errors taken as correlated across steps: their x-weighted mean u, sensitivity Σx/Σx².
    addMeter(c, "primary reactive power under load (correlated across steps)", {0.0, sxu / sx}, "var", sx / sxx);
    addScaled(c, *m_q0, -sxr / sxx);
    const Point &top = *std::max_element(points.begin(), points.end(), [](const Point &a, const Point &b) { return a.x < b.x; });
    addMeter(c, "secondary ammeter", top.i, "A", -2.0 * x / top.i.value);
    if (points.size() >= 2) {
        double ss = 0.0;
        for (const Point &p : points)
            ss += std::pow(p.dq - x * p.x, 2);
        BudgetComponent a;
        a.source = "scatter of Q1 - Q0 about X·I²";
        a.type = EvaluationType::A;
        a.distribution = "normal";
        a.standardUncertainty = std::sqrt(ss / static_cast<double>(points.size() - 1) / sxx);
        a.inputUnit = "Ω";
        a.sensitivity = 1.0;
        a.contribution = a.standardUncertainty;
        a.degreesOfFreedom = static_cast<double>(points.size() - 1);
        if (a.standardUncertainty > 0.0)
            c.push_back(std::move(a));
    }
    m_out.seriesReactanceOhm = combine(x, std::move(c));
    const auto &u = m_out.seriesReactanceOhm->expandedUncertainty;
    m_out.seriesReactanceResolved = x > 0.0 && u && *u < x;
    if (!m_out.seriesReactanceResolved)
        m_out.warnings.push_back("the series reactance is not resolved by the meters: X = " + formatSignificant(x, 3) + " Ω" +
                                 (u ? " with U = " + formatSignificant(*u, 2) + " Ω" : std::string(" with no uncertainty")) +
                                 "; the regulation at other power factors is uncertain");
}

void Analyser::modelResults()
{
    if (!m_fit || !m_out.openCircuit || !m_out.openCircuit->noLoadLossW)
        return;
    const double v0 = m_fit->intercept;
    const double r = m_fit->seriesResistanceOhm();
    const UncertainValue &p0 = *m_out.openCircuit->noLoadLossW; // referred to rated V1, as the fit is
    const double i = m_in.ratedSecondaryCurrentA;
    const auto eta = [](double v0_, double r_, double p0_, double i_) {
        return 100.0 * formulas::modelEfficiency(v0_, r_, p0_, i_);
    };
    {
        std::vector<BudgetComponent> extra;
        addScaled(extra, p0, partial([&](double p) { return eta(v0, r, p, i); }, p0.value));
        m_out.efficiencyAtRatedPercent = withFit(eta(v0, r, p0.value, i), partial([&](double a) { return eta(a, r, p0.value, i); }, v0),
                                                 partial([&](double b) { return eta(v0, b, p0.value, i); }, r), extra);
    }
    if (p0.value > 0.0) {
        const auto iStar = [](double r_, double p0_) { return formulas::maxEfficiencyCurrent(p0_, r_); };
        std::vector<BudgetComponent> extra;
        addScaled(extra, p0, partial([&](double p) { return iStar(r, p); }, p0.value));
        m_out.maxEfficiencyCurrentA = withFit(iStar(r, p0.value), 0.0, partial([&](double b) { return iStar(b, p0.value); }, r), extra);
        const auto etaStar = [&](double v0_, double r_, double p0_) { return eta(v0_, r_, p0_, iStar(r_, p0_)); };
        extra.clear();
        addScaled(extra, p0, partial([&](double p) { return etaStar(v0, r, p); }, p0.value));
        m_out.maxEfficiencyPercent = withFit(etaStar(v0, r, p0.value), partial([&](double a) { return etaStar(a, r, p0.value); }, v0),
                                             partial([&](double b) { return etaStar(v0, b, p0.value); }, r), extra);
        if (iStar(r, p0.value) > 1.5 * i)
            m_out.notes.push_back("efficiency would peak at " + formatSignificant(iStar(r, p0.value), 3) +
                                  " A, well above the rated current: the model is extrapolated there");
    }
}

PrimarySideResult Analyser::run()
{
    m_out.regulationPowerFactor = m_in.regulationPowerFactor;
    m_out.leading = m_in.leading;
    m_out.errors = checkInput(m_in);
    if (!m_out.errors.empty())
        return m_out;
    m_out.hasPowerMeter = std::any_of(m_readings.begin(), m_readings.end(), [](const Reading &r) { return r.primary.powerW.has_value(); });
    openCircuit();
    if (m_out.openCircuit && !m_out.openCircuit->noLoadLossW && m_out.hasPowerMeter)
        m_out.notes.push_back("the open-circuit point has no primary power reading: no core loss");
    if (!m_out.openCircuit && m_out.hasPowerMeter)
        m_out.notes.push_back("no open-circuit point (step 0): no core loss, and the loss split takes it as zero");
    loadedSteps();
    seriesReactance();
    modelResults();
    if (m_fit && m_out.seriesReactanceOhm) {
        const double v0 = m_fit->intercept, r = m_fit->seriesResistanceOhm();
        const double i = m_in.ratedSecondaryCurrentA, pf = m_in.regulationPowerFactor;
        const bool leading = m_in.leading;
        const bool fullLoad = m_in.regulationBase == RegulationBase::FullLoad;
        const auto reg = [=](double v0_, double r_, double x_) {
            const double drop = formulas::approximateVoltageDrop(i, r_, x_, pf, leading);
            return 100.0 * drop / (fullLoad ? v0_ - drop : v0_);
        };
        const double x = m_out.seriesReactanceOhm->value;
        std::vector<BudgetComponent> extra;
        addScaled(extra, *m_out.seriesReactanceOhm, partial([&](double b) { return reg(v0, r, b); }, x));
        m_out.regulationAtPowerFactorPercent = withFit(reg(v0, r, x), partial([&](double a) { return reg(a, r, x); }, v0),
                                                       partial([&](double b) { return reg(v0, b, x); }, r), extra);
    }
    if (m_out.hasResults())
        m_out.notes.push_back("P2 = V2·I2 assumes a resistive load; P0 includes the primary winding's loss at I0 (negligible)");
    return m_out;
}

} // namespace

PrimarySideResult analysePrimarySide(const std::vector<Reading> &readings, const FitSummary *fit,
                                     const AnalysisInput *analysisInput, const PrimarySideInput &input)
{
    return Analyser(readings, fit, analysisInput, input).run();
}

std::vector<EfficiencyCurvePoint> efficiencyCurve(const PrimarySideResult &result, const FitSummary &fit,
                                                  double maxCurrentA, int points)
{
    std::vector<EfficiencyCurvePoint> curve;
    if (!result.openCircuit || !result.openCircuit->noLoadLossW || !fit.ok() || !(fit.seriesResistanceOhm() > 0.0)
        || !(maxCurrentA > 0.0) || !std::isfinite(maxCurrentA) || points < 2)
        return curve;
    const double v0 = fit.intercept, r = fit.seriesResistanceOhm(), p0 = result.openCircuit->noLoadLossW->value;
    curve.reserve(static_cast<std::size_t>(points));
    for (int k = 0; k < points; ++k) {
        const double i = maxCurrentA * k / (points - 1);
        if (v0 - r * i <= 0.0)
            break; // beyond where the line reaches zero volts
        curve.push_back({i, 100.0 * formulas::modelEfficiency(v0, r, p0, i), p0, r * i * i});
    }
    return curve;
}

PrimarySideInput primarySideInputFor(const Nameplate &nameplate)
{
    PrimarySideInput in;
    in.ratedPrimaryVoltageV = nameplate.primaryVoltageV;
    if (nameplate.primaryVoltageV > 0.0)
        in.ratedPrimaryCurrentA = formulas::ratedCurrent(nameplate.ratedPowerVa, nameplate.primaryVoltageV);
    if (nameplate.secondaryVoltageV > 0.0)
        in.ratedSecondaryCurrentA = formulas::ratedCurrent(nameplate.ratedPowerVa, nameplate.secondaryVoltageV);
    return in;
}

} // namespace sagline
