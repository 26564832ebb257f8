#include "Setup.h"

namespace sagline {

std::string toString(Construction construction)
{
    switch (construction) {
    case Construction::Laminated: return "laminated";
    case Construction::Toroidal: return "toroidal";
    case Construction::Other: return "other";
    }
    return "other";
}

std::string toString(WindingMaterial material)
{
    switch (material) {
    case WindingMaterial::Copper: return "copper";
    case WindingMaterial::Aluminium: return "aluminium";
    }
    return "copper";
}

std::string toString(FuseType type)
{
    switch (type) {
    case FuseType::TimeLag: return "time-lag";
    case FuseType::QuickActing: return "quick-acting";
    }
    return "time-lag";
}

} // namespace sagline
