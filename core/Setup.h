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

struct Setup {
    Nameplate nameplate;
    Bench bench;
};

} // namespace sagline
