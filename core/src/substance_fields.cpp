// The fields of a substance definition and its heat capacity
// (substance_fields.hpp).
#include "substance_fields.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <utility>

namespace heatchain::detail::substance_fields {

std::string join(std::string_view where, std::string_view key) {
    if (where.empty()) return std::string(key);
    return std::string(where) + "." + std::string(key);
}

namespace {

std::string index(std::string_view where, std::size_t i) {
    return std::string(where) + "[" + std::to_string(i) + "]";
}

// Free-text keys allowed in any object beside the ones it defines.
bool isNoteKey(std::string_view k) { return k == "notes" || k == "note" || k == "comment"; }

}  // namespace

// Unknown keys are errors: a misspelt "enthalpy" would otherwise drop data silently.
Status checkKeys(const Json& obj, std::string_view where, std::initializer_list<std::string_view> known) {
    for (auto it = obj.begin(); it != obj.end(); ++it) {
        const std::string& k = it.key();
        if (isNoteKey(k)) continue;
        if (std::find(known.begin(), known.end(), k) != known.end()) continue;
        std::string list;
        for (auto kk : known) {
            if (!list.empty()) list += ", ";
            list += kk;
        }
        // Once, on the way out with an error; not worth an append chain.
        // NOLINTNEXTLINE(performance-inefficient-string-concatenation)
        return makeError("unknown field \"" + k + "\"; expected one of: " + list, join(where, k));
    }
    return Ok{};
}

Result<const Json*> objectAt(const Json& parent, std::string_view key, std::string_view where, bool required) {
    auto it = parent.find(key);
    if (it == parent.end()) {
        if (required) return makeError("missing", join(where, key));
        return static_cast<const Json*>(nullptr);
    }
    if (!it->is_object()) return makeError("must be an object", join(where, key));
    return &*it;
}

Result<std::string> stringAt(const Json& parent, std::string_view key, std::string_view where, bool required) {
    auto it = parent.find(key);
    if (it == parent.end()) {
        if (required) return makeError("missing", join(where, key));
        return std::string();
    }
    if (!it->is_string()) return makeError("must be a string", join(where, key));
    return it->get<std::string>();
}

// A quantity string "<number> <unit>", or a JSON number for dimensionless fields.
Result<double> quantityOf(const Json& value, Dimension d, const std::string& path, const UnitContext& uc) {
    if (value.is_number() && d == Dimension::Dimensionless) return value.get<double>();
    if (!value.is_string()) {
        if (value.is_number())
            return makeError("a bare number needs a unit here: write it as \"<number> <unit>\" (a " +
                                 std::string(dimensionName(d)) + ")",
                             path);
        return makeError("must be a quantity string \"<number> <unit>\" (a " + std::string(dimensionName(d)) + ")",
                         path);
    }
    auto r = parseQuantity(value.get<std::string>(), d, uc);
    if (!r) return makeError(r.error().message, path);
    return *r;
}

Result<std::optional<double>> optionalQuantity(const Json& parent, std::string_view key, Dimension d,
                                               std::string_view where, const UnitContext& uc) {
    auto it = parent.find(key);
    if (it == parent.end()) return std::optional<double>();
    auto r = quantityOf(*it, d, join(where, key), uc);
    if (!r) return r.error();
    return std::optional<double>(*r);
}

Result<double> requiredQuantity(const Json& parent, std::string_view key, Dimension d, std::string_view where,
                                const UnitContext& uc) {
    auto it = parent.find(key);
    if (it == parent.end()) return makeError("missing (a " + std::string(dimensionName(d)) + ")", join(where, key));
    return quantityOf(*it, d, join(where, key), uc);
}

Result<double> positive(Result<double> r, const std::string& path) {
    if (!r) return r;
    if (!(*r > 0)) return makeError("must be positive", path);
    return r;
}

Result<double> coefficientOf(const Json& value, const std::string& path) {
    if (!value.is_number()) return makeError("must be a number", path);
    const double x = value.get<double>();
    if (!std::isfinite(x)) return makeError("must be a finite number", path);
    return x;
}

namespace {

// A heat capacity as a quantity: per kilogram, or per mole and divided by M.
Result<double> heatCapacityOf(const Json& value, const std::string& path, double M, const UnitContext& uc) {
    if (value.is_string()) {
        auto perMass = parseQuantity(value.get<std::string>(), Dimension::SpecificEntropy, uc);
        if (perMass) return positive(*perMass, path);
        auto perMole = parseQuantity(value.get<std::string>(), Dimension::MolarEntropy, uc);
        if (perMole) return positive(*perMole / M, path);
        return makeError(perMass.error().message + " (a heat capacity per kilogram, e.g. \"4.18 kJ/(kg K)\", or per "
                                                    "mole, e.g. \"75.3 J/(mol K)\")",
                         path);
    }
    return quantityOf(value, Dimension::SpecificEntropy, path, uc);
}

// Factor from a polynomial's declared unit to J/(kg K).
Result<double> cpUnitFactor(const Json& parent, std::string_view where, double M, const UnitContext& uc) {
    auto unit = stringAt(parent, "unit", where, true);
    if (!unit) return unit.error();
    if (auto f = toSI(1.0, *unit, Dimension::SpecificEntropy, uc)) return *f;
    if (auto f = toSI(1.0, *unit, Dimension::MolarEntropy, uc)) return *f / M;
    return makeError("unknown heat-capacity unit \"" + *unit +
                         "\"; valid: J/(kmol K), J/(mol K), J/(kg K), kJ/(kg K)",
                     join(where, "unit"));
}

}  // namespace

Result<double> temperatureAt(const Json& parent, std::string_view key, std::string_view where, const UnitContext& uc) {
    return requiredQuantity(parent, key, Dimension::Temperature, where, uc);
}

namespace {

Result<HeatCapacity> parseTable(const Json& cp, const std::string& path, double M, const UnitContext& uc) {
    if (auto ok = checkKeys(cp, path, {"T", "cp", "degree"}); !ok) return ok.error();
    auto Ts = cp.find("T");
    auto cs = cp.find("cp");
    if (Ts == cp.end() || !Ts->is_array()) return makeError("missing or not an array of temperatures", join(path, "T"));
    if (cs == cp.end() || !cs->is_array()) return makeError("missing or not an array of heat capacities", join(path, "cp"));
    if (Ts->size() != cs->size())
        return makeError("has " + std::to_string(cs->size()) + " values but T has " + std::to_string(Ts->size()),
                         join(path, "cp"));
    if (Ts->empty()) return makeError("the table is empty", join(path, "T"));
    std::vector<double> T, c;
    for (std::size_t i = 0; i < Ts->size(); ++i) {
        auto t = quantityOf((*Ts)[i], Dimension::Temperature, index(join(path, "T"), i), uc);
        if (!t) return t.error();
        if (!(*t > 0)) return makeError("must be above absolute zero", index(join(path, "T"), i));
        auto v = heatCapacityOf((*cs)[i], index(join(path, "cp"), i), M, uc);
        if (!v) return v.error();
        T.push_back(*t);
        c.push_back(*v);
    }
    int degree = 2;
    if (auto d = cp.find("degree"); d != cp.end()) {
        if (!d->is_number_integer() || d->get<int>() < 0 || d->get<int>() > 4)
            return makeError("must be an integer from 0 to 4", join(path, "degree"));
        degree = d->get<int>();
    }
    auto hc = HeatCapacity::fitTable(T, c, degree);
    if (!hc) return makeError(hc.error().message, path);
    return hc;
}

// A piece's temperature range, "Tmin" and "Tmax".
Status readRange(const Json& pj, const std::string& pp, const UnitContext& uc, HeatCapacity::Piece& p) {
    auto lo = temperatureAt(pj, "Tmin", pp, uc);
    if (!lo) return lo.error();
    auto hi = temperatureAt(pj, "Tmax", pp, uc);
    if (!hi) return hi.error();
    p.Tmin = *lo;
    p.Tmax = *hi;
    return Ok{};
}

Result<HeatCapacity> parseCorrelation(const Json& cp, const std::string& path, double M, const UnitContext& uc) {
    auto form = stringAt(cp, "form", path, true);
    if (!form) return form.error();
    const bool shomate = *form == "shomate";
    if (!shomate && *form != "polynomial")
        return makeError("unknown form \"" + *form + "\"; valid: shomate, polynomial", join(path, "form"));

    std::vector<HeatCapacity::Piece> pieces;
    if (shomate) {
        // NIST WebBook / NIST-JANAF convention: J/(mol K), t = T / 1000 K.
        if (auto ok = checkKeys(cp, path, {"form", "pieces"}); !ok) return ok.error();
        auto ps = cp.find("pieces");
        if (ps == cp.end() || !ps->is_array() || ps->empty())
            return makeError("missing or not a non-empty array", join(path, "pieces"));
        for (std::size_t i = 0; i < ps->size(); ++i) {
            const std::string pp = index(join(path, "pieces"), i);
            const Json& pj = (*ps)[i];
            if (!pj.is_object()) return makeError("must be an object", pp);
            if (auto ok = checkKeys(pj, pp, {"Tmin", "Tmax", "A", "B", "C", "D", "E"}); !ok) return ok.error();
            HeatCapacity::Piece p;
            p.form = HeatCapacity::Form::Shomate;
            if (auto ok = readRange(pj, pp, uc, p); !ok) return ok.error();
            for (const char* k : {"A", "B", "C", "D", "E"}) {
                auto it = pj.find(k);
                if (it == pj.end()) return makeError("missing", join(pp, k));
                auto x = coefficientOf(*it, join(pp, k));
                if (!x) return x.error();
                p.c.push_back(*x / M);
            }
            pieces.push_back(std::move(p));
        }
    } else {
        // Powers of T in kelvin; one piece inline or several under "pieces".
        if (auto ok = checkKeys(cp, path, {"form", "unit", "Tmin", "Tmax", "coefficients", "pieces"}); !ok)
            return ok.error();
        auto factor = cpUnitFactor(cp, path, M, uc);
        if (!factor) return factor.error();
        auto readPiece = [&](const Json& pj, const std::string& pp) -> Result<HeatCapacity::Piece> {
            HeatCapacity::Piece p;
            p.form = HeatCapacity::Form::Polynomial;
            if (auto ok = readRange(pj, pp, uc, p); !ok) return ok.error();
            auto cs = pj.find("coefficients");
            if (cs == pj.end() || !cs->is_array() || cs->empty())
                return makeError("missing or not a non-empty array of numbers", join(pp, "coefficients"));
            for (std::size_t k = 0; k < cs->size(); ++k) {
                auto x = coefficientOf((*cs)[k], index(join(pp, "coefficients"), k));
                if (!x) return x.error();
                p.c.push_back(*x * *factor);
            }
            return p;
        };
        if (auto ps = cp.find("pieces"); ps != cp.end()) {
            if (cp.contains("coefficients"))
                return makeError("give either coefficients or pieces, not both", join(path, "coefficients"));
            if (!ps->is_array() || ps->empty()) return makeError("must be a non-empty array", join(path, "pieces"));
            for (std::size_t i = 0; i < ps->size(); ++i) {
                const std::string pp = index(join(path, "pieces"), i);
                if (!(*ps)[i].is_object()) return makeError("must be an object", pp);
                if (auto ok = checkKeys((*ps)[i], pp, {"Tmin", "Tmax", "coefficients"}); !ok) return ok.error();
                auto p = readPiece((*ps)[i], pp);
                if (!p) return p.error();
                pieces.push_back(std::move(*p));
            }
        } else {
            auto p = readPiece(cp, path);
            if (!p) return p.error();
            pieces.push_back(std::move(*p));
        }
    }
    auto hc = HeatCapacity::fromPieces(std::move(pieces));
    if (!hc) {
        // fromPieces names "pieces[i]"; put it under this cp's path.
        const auto& e = hc.error();
        return makeError(e.message, e.where.empty() ? path : join(path, e.where));
    }
    return hc;
}

}  // namespace

Result<HeatCapacity> parseHeatCapacity(const Json& cp, const std::string& path, double M, const UnitContext& uc) {
    if (cp.is_string()) {
        auto v = heatCapacityOf(cp, path, M, uc);
        if (!v) return v.error();
        return HeatCapacity::constant(*v);
    }
    if (!cp.is_object())
        return makeError("must be a quantity (\"1.04 kJ/(kg K)\"), a table {\"T\": [...], \"cp\": [...]}, or a "
                         "correlation {\"form\": \"shomate\" | \"polynomial\", ...}",
                         path);
    if (cp.contains("form")) return parseCorrelation(cp, path, M, uc);
    return parseTable(cp, path, M, uc);
}

}  // namespace heatchain::detail::substance_fields
