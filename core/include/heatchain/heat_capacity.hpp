#pragma once
// Heat capacity of one phase as a function of temperature, on a mass basis,
// with its closed-form integrals. One object per phase of a substance.
#include <limits>
#include <span>
#include <string>
#include <vector>

#include "heatchain/result.hpp"

namespace heatchain {

class HeatCapacity {
public:
    // The published forms. Coefficients are stored on a mass basis (J/(kg K)).
    enum class Form {
        Constant,    // cp = c0
        Polynomial,  // cp = c0 + c1 T + c2 T^2 + ...         (T in K)
        Shomate,     // cp = A + B t + C t^2 + D t^3 + E / t^2  (t = T / 1000 K)
    };

    struct Piece {
        double Tmin = 0.0;
        double Tmax = std::numeric_limits<double>::infinity();
        Form form = Form::Constant;
        std::vector<double> c;  // mass basis, J/(kg K) per the form
        // Integration constants so that enthalpy() and entropy() are continuous
        // across pieces; filled by the factory functions.
        double hOffset = 0.0;
        double sOffset = 0.0;
    };

    HeatCapacity() = default;

    static HeatCapacity constant(double cp_J_per_kgK,
                                 double Tmin = 0.0,
                                 double Tmax = std::numeric_limits<double>::infinity());
    // Pieces must be contiguous and increasing in temperature.
    static Result<HeatCapacity> fromPieces(std::vector<Piece> pieces);
    // Least-squares polynomial fit (Eigen) of a cp table; the RMS residual is
    // kept in fitResidual(). degree is reduced when there are too few points.
    static Result<HeatCapacity> fitTable(std::span<const double> T_K,
                                         std::span<const double> cp_J_per_kgK,
                                         int degree = 2);

    double cp(double T) const;
    // ∫ cp dT from the reference temperature (298.15 K) to T, J/kg.
    double enthalpy(double T) const;
    // ∫ cp / T dT from the reference temperature (298.15 K) to T, J/(kg K).
    double entropy(double T) const;

    bool isConstant() const;
    // Inside the stated range, with rangeEndTolerance at either end.
    bool inRange(double T) const { return T >= Tmin() - rangeEndTolerance && T <= Tmax() + rangeEndTolerance; }
    double Tmin() const;
    double Tmax() const;
    double fitResidual() const { return fitResidual_; }  // J/(kg K), 0 unless fitted
    const std::vector<Piece>& pieces() const { return pieces_; }

    static constexpr double referenceTemperature = 298.15;
    // Published cp tables and correlation ranges quote their temperatures to
    // 0.01 K (a water table starting at the triple point, 273.16 K, while
    // ice melts at 273.1525 K at one atmosphere). Within 0.01 K of an end, cp
    // held at the end value differs from any continuation by less than the
    // data's own uncertainty (liquid water: about 0.01 J/(kg K) in 4220), so
    // such a state is not called extrapolated.
    static constexpr double rangeEndTolerance = 0.01;  // K

private:
    const Piece& pieceFor(double T) const;
    template <class Raw, class Beyond>
    double integral(double T, Raw raw, double Piece::*offset, Beyond beyond) const;
    std::vector<Piece> pieces_;
    double fitResidual_ = 0.0;
};

}  // namespace heatchain
