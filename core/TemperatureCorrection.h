// Winding resistance referred to a reference temperature:
// R_ref = R_m (T_k + T_ref) / (T_k + T_m), temperatures in °C, T_k the conductor's constant.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace sagline {

// The user's choice of T_k; it is recorded with the result.
enum class TemperatureConstant {
    CopperIeee, // 234.5 °C, copper, IEEE C57.12.90 / C57.12.91
    CopperIec,  // 235 °C, copper, IEC 60076-1 / 60076-2
    Aluminium,  // 225 °C, aluminium (IEEE C57.12.90 and IEC 60076; IEC 60228 cables use 228)
};

double temperatureConstantC(TemperatureConstant constant);      // 234.5, 235, 225
std::string toString(TemperatureConstant constant);              // "copper-ieee", "copper-iec", "aluminium"
std::optional<TemperatureConstant> temperatureConstantFromString(std::string_view text);
std::string describe(TemperatureConstant constant);              // "copper, T_k = 234.5 °C (IEEE C57.12.90)"

struct TemperatureCorrection {
    bool ok = false;
    std::string error;              // the rule broken when !ok
    double factor = 0.0;            // (T_k + T_ref)/(T_k + T_m), dimensionless
    double resistanceOhm = 0.0;     // R_ref, Ω
    double constantC = 0.0;         // T_k used, °C
    std::string convention;         // describe(constant)
};

// R_m measured at winding temperature measuredC, referred to referenceC. Needs finite values
// with T_k + T_m > 0 and T_k + T_ref > 0 (above absolute zero of the linear law).
TemperatureCorrection correctToReference(double resistanceOhm, double measuredC, double referenceC,
                                         TemperatureConstant constant);

} // namespace sagline
