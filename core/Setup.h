// The setup of DESIGN.md: the transformer's nameplate and the bench (load, fuse, sweep).
// Plain values in SI units; parsing and validation live in SetupJson.h.
#pragma once

#include <optional>
#include <string>

namespace sagline {

enum class Construction { Laminated, Toroidal, Other };
enum class WindingMaterial { Copper, Aluminium };
enum class FuseType { TimeLag, QuickActing };

std::string toString(Construction construction);       // "laminated", "toroidal", "other"
std::string toString(WindingMaterial material);         // "copper", "aluminium"
std::string toString(FuseType type);                    // "time-lag", "quick-acting"

struct Nameplate {
    double ratedPowerVa = 0.0;                          // S, VA
    double primaryVoltageV = 0.0;                       // V1, V RMS
    double frequencyHz = 50.0;                          // Hz
    double secondaryVoltageV = 0.0;                     // V2 at rated load (full-load), V RMS
    std::optional<double> secondaryNoLoadVoltageV;      // V2nl; this or regulationPercent is required
    std::optional<double> regulationPercent;            // (V2nl - V2)/V2 * 100
    Construction construction = Construction::Laminated;
    WindingMaterial windingMaterial = WindingMaterial::Copper;
};

struct Rheostat {
    double totalResistanceOhm = 0.0;                    // whole track, Ω
    double powerRatingW = 0.0;                          // whole track, W
};

struct FuseSpec {
    double ratingA = 0.0;                               // In, A
    FuseType type = FuseType::TimeLag;
};

struct Bench {
    int steps = 10;                                     // N equal current increments
    double topFraction = 1.0;                           // top step as a fraction of rated current
    double overloadFactor = 1.1;                        // hard limit = rated VA * overloadFactor (margin above a top step at rated load)
    bool allowOverload = false;
    std::optional<Rheostat> rheostat;                   // absent: load not checked
    std::optional<FuseSpec> fuse;                       // the primary fuse fitted; absent: none known
    std::optional<double> fuseFactor;                   // absent: default per construction
    std::optional<double> magnetizingFraction;          // absent: default per construction
    double dwellS = 10.0;                               // wait at each step before reading, s
};

// One meter's accuracy as a systematic error common to every reading it takes on one range
// (JCGM 100:2008, 5.2: propagated once, never as independent per-point errors). The gain and
// offset are half-widths of rectangular limits (u = a/sqrt(3), GUM 4.3.7); the resolution is
// one count of the last digit (u = δ/sqrt(12), GUM F.2.2.1).
struct MeterSpec {
    double gainPercentOfReading = 0.0;                  // half-width, % of the reading
    double offset = 0.0;                                // half-width, V, A or W (the meter's unit)
    double resolution = 0.0;                            // one count, V, A or W; 0 = not known
};

// The `meters` section: the secondary voltmeter and ammeter, optionally the primary meters, and
// how well the winding's temperature is known (for R referred to a reference temperature).
// A primary meter given here replaces the readings' own stated u for its quantity: its gain is
// one budget line common to every reading (GUM 5.2), its offset and resolution count per reading
// (core/PrimarySideAnalysis.h). Absent: each primary reading's stated u, as recorded.
struct MeterSpecs {
    MeterSpec voltmeter;
    MeterSpec ammeter;
    std::optional<MeterSpec> primaryVoltmeter;          // V1, V
    std::optional<MeterSpec> primaryAmmeter;            // I1, A
    std::optional<MeterSpec> powerMeter;                // P1, W
    std::optional<double> windingTemperatureUncertaintyC; // standard uncertainty, °C; absent: the default
};

// A two-sided (or one-sided) tolerance interval; at least one end is set.
struct ToleranceRange {
    std::optional<double> min;
    std::optional<double> max;
};

// The `specification` section: the limits the unit is judged against, each judged when
// present, with where they come from (drawing, datasheet, standard clause).
struct Specification {
    std::optional<double> regulationMaxPercent;         // %, full-load base
    std::optional<ToleranceRange> fullLoadVoltageV;     // V at rated current
    std::optional<ToleranceRange> noLoadVoltageV;       // V
    std::optional<double> seriesResistanceMaxOhm;       // Ω, referred to the secondary
    std::string source;                                 // free text

    bool hasLimits() const
    {
        return regulationMaxPercent || fullLoadVoltageV || noLoadVoltageV || seriesResistanceMaxOhm;
    }
};

struct Setup {
    // A name the lab gives the design ("PT-60 rev B"); units with the same name are compared with
    // one another. Empty: the design is told by the nameplate (rating, voltages, construction).
    std::string design;
    Nameplate nameplate;
    Bench bench;
    std::optional<MeterSpecs> meters;                   // absent: uncertainty from the scatter only
    std::optional<Specification> specification;         // absent: no pass/fail (not-judged)
};

} // namespace sagline
