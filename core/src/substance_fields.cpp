// The fields of a substance definition and its heat capacity
// (substance_fields.hpp).
#include "substance_fields.hpp"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

namespace heatchain::detail::substance_fields {

namespace {

// Free-text keys allowed in any object beside the ones it defines.
bool isNoteKey(std::string_view k) { return k == "notes" || k == "note" || k == "comment"; }

}  // namespace

void checkKeys(const JsonReader& r, const Json& obj, const JsonPath& path,
               std::initializer_list<std::string_view> known) {
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
        r.fail(child(path, k), "unknown field \"" + k + "\"; expected one of: " + list);
    }
}

const Json* objectAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                     bool required) {
    const Json* v = member(parent, key);
    if (!v) {
        if (required) r.fail(child(path, std::string(key)), "missing");
        return nullptr;
    }
    if (!v->is_object()) r.fail(child(path, std::string(key)), "must be an object");
    return v;
}

std::string stringAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                     bool required) {
    const Json* v = member(parent, key);
    if (!v) {
        if (required) r.fail(child(path, std::string(key)), "missing");
        return {};
    }
    if (!v->is_string()) r.fail(child(path, std::string(key)), "must be a string");
    return v->get<std::string>();
}

double quantityOf(const JsonReader& r, const Json& value, const JsonPath& path, Dimension d) {
    if (value.is_number() && d == Dimension::Dimensionless) return value.get<double>();
    if (!value.is_string()) {
        if (value.is_number())
            r.fail(path, "a bare number needs a unit here: write it as \"<number> <unit>\" (a " +
                             std::string(dimensionName(d)) + ")");
        r.fail(path, "must be a quantity string \"<number> <unit>\" (a " + std::string(dimensionName(d)) + ")");
    }
    auto q = parseQuantity(value.get_ref<const std::string&>(), d, r.units);
    if (!q) r.fail(path, q.error().message);
    return *q;
}

std::optional<double> optionalQuantity(const JsonReader& r, const Json& parent, const JsonPath& path,
                                       std::string_view key, Dimension d) {
    const Json* v = member(parent, key);
    if (!v) return std::nullopt;
    return quantityOf(r, *v, child(path, std::string(key)), d);
}

double requiredQuantity(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key,
                        Dimension d) {
    const Json* v = member(parent, key);
    if (!v) r.fail(child(path, std::string(key)), "missing (a " + std::string(dimensionName(d)) + ")");
    return quantityOf(r, *v, child(path, std::string(key)), d);
}

double temperatureAt(const JsonReader& r, const Json& parent, const JsonPath& path, std::string_view key) {
    return requiredQuantity(r, parent, path, key, Dimension::Temperature);
}

double positive(const JsonReader& r, double x, const JsonPath& path) {
    if (!(x > 0)) r.fail(path, "must be positive");
    return x;
}

double coefficientOf(const JsonReader& r, const Json& value, const JsonPath& path) {
    if (!value.is_number()) r.fail(path, "must be a number");
    const double x = value.get<double>();
    if (!std::isfinite(x)) r.fail(path, "must be a finite number");
    return x;
}

namespace {

// A heat capacity as a quantity: per kilogram, or per mole and divided by M.
double heatCapacityOf(const JsonReader& r, const Json& value, const JsonPath& path, double M) {
    if (value.is_string()) {
        const std::string& text = value.get_ref<const std::string&>();
        auto perMass = parseQuantity(text, Dimension::SpecificEntropy, r.units);
        if (perMass) return positive(r, *perMass, path);
        auto perMole = parseQuantity(text, Dimension::MolarEntropy, r.units);
        if (perMole) return positive(r, *perMole / M, path);
        r.fail(path, perMass.error().message +
                         " (a heat capacity per kilogram, e.g. \"4.18 kJ/(kg K)\", or per mole, e.g. \"75.3 J/(mol "
                         "K)\")");
    }
    return quantityOf(r, value, path, Dimension::SpecificEntropy);
}

// Factor from a polynomial's declared unit to J/(kg K).
double cpUnitFactor(const JsonReader& r, const Json& parent, const JsonPath& path, double M) {
    const std::string unit = stringAt(r, parent, path, "unit", true);
    if (auto f = toSI(1.0, unit, Dimension::SpecificEntropy, r.units)) return *f;
    if (auto f = toSI(1.0, unit, Dimension::MolarEntropy, r.units)) return *f / M;
    r.fail(child(path, "unit"),
           "unknown heat-capacity unit \"" + unit + "\"; valid: J/(kmol K), J/(mol K), J/(kg K), kJ/(kg K)");
}

HeatCapacity readTable(const JsonReader& r, const Json& cp, const JsonPath& path, double M) {
    checkKeys(r, cp, path, {"T", "cp", "degree"});
    const JsonPath tPath = child(path, "T");
    const JsonPath cpPath = child(path, "cp");
    const Json* Ts = member(cp, "T");
    const Json* cs = member(cp, "cp");
    if (!Ts || !Ts->is_array()) r.fail(tPath, "missing or not an array of temperatures");
    if (!cs || !cs->is_array()) r.fail(cpPath, "missing or not an array of heat capacities");
    if (Ts->size() != cs->size())
        r.fail(cpPath, "has " + std::to_string(cs->size()) + " values but T has " + std::to_string(Ts->size()));
    if (Ts->empty()) r.fail(tPath, "the table is empty");
    std::vector<double> T, c;
    for (std::size_t i = 0; i < Ts->size(); ++i) {
        const JsonPath ti = child(tPath, static_cast<long>(i));
        const double t = quantityOf(r, (*Ts)[i], ti, Dimension::Temperature);
        if (!(t > 0)) r.fail(ti, "must be above absolute zero");
        T.push_back(t);
        c.push_back(heatCapacityOf(r, (*cs)[i], child(cpPath, static_cast<long>(i)), M));
    }
    int degree = 2;
    if (const Json* d = member(cp, "degree")) {
        if (!d->is_number_integer() || d->get<int>() < 0 || d->get<int>() > 4)
            r.fail(child(path, "degree"), "must be an integer from 0 to 4");
        degree = d->get<int>();
    }
    auto hc = HeatCapacity::fitTable(T, c, degree);
    if (!hc) r.fail(path, hc.error().message);
    return std::move(*hc);
}

// A piece's temperature range, "Tmin" and "Tmax".
void readRange(const JsonReader& r, const Json& pj, const JsonPath& pp, HeatCapacity::Piece& p) {
    p.Tmin = temperatureAt(r, pj, pp, "Tmin");
    p.Tmax = temperatureAt(r, pj, pp, "Tmax");
}

// The array under "pieces": non-empty, of objects; calls read(piece, path) for each.
template <class ReadPiece>
void readPieces(const JsonReader& r, const Json& ps, const JsonPath& path, std::vector<JsonPath>& piecePaths,
                ReadPiece read) {
    for (std::size_t i = 0; i < ps.size(); ++i) {
        const JsonPath pp = child(path, static_cast<long>(i));
        if (!ps[i].is_object()) r.fail(pp, "must be an object");
        read(ps[i], pp);
        piecePaths.push_back(pp);
    }
}

void readShomate(const JsonReader& r, const Json& cp, const JsonPath& path, double M,
                 std::vector<HeatCapacity::Piece>& pieces, std::vector<JsonPath>& piecePaths) {
    // NIST WebBook / NIST-JANAF convention: J/(mol K), t = T / 1000 K.
    checkKeys(r, cp, path, {"form", "pieces"});
    const Json* ps = member(cp, "pieces");
    if (!ps || !ps->is_array() || ps->empty()) r.fail(child(path, "pieces"), "missing or not a non-empty array");
    readPieces(r, *ps, child(path, "pieces"), piecePaths, [&](const Json& pj, const JsonPath& pp) {
        checkKeys(r, pj, pp, {"Tmin", "Tmax", "A", "B", "C", "D", "E"});
        HeatCapacity::Piece p;
        p.form = HeatCapacity::Form::Shomate;
        readRange(r, pj, pp, p);
        for (const char* k : {"A", "B", "C", "D", "E"}) {
            const Json* x = member(pj, k);
            if (!x) r.fail(child(pp, k), "missing");
            p.c.push_back(coefficientOf(r, *x, child(pp, k)) / M);
        }
        pieces.push_back(std::move(p));
    });
}

void readPolynomial(const JsonReader& r, const Json& cp, const JsonPath& path, double M,
                    std::vector<HeatCapacity::Piece>& pieces, std::vector<JsonPath>& piecePaths) {
    // Powers of T in kelvin; one piece inline or several under "pieces".
    checkKeys(r, cp, path, {"form", "unit", "Tmin", "Tmax", "coefficients", "pieces"});
    const double factor = cpUnitFactor(r, cp, path, M);
    auto readPiece = [&](const Json& pj, const JsonPath& pp) {
        HeatCapacity::Piece p;
        p.form = HeatCapacity::Form::Polynomial;
        readRange(r, pj, pp, p);
        const JsonPath csPath = child(pp, "coefficients");
        const Json* cs = member(pj, "coefficients");
        if (!cs || !cs->is_array() || cs->empty()) r.fail(csPath, "missing or not a non-empty array of numbers");
        for (std::size_t k = 0; k < cs->size(); ++k)
            p.c.push_back(coefficientOf(r, (*cs)[k], child(csPath, static_cast<long>(k))) * factor);
        pieces.push_back(std::move(p));
    };
    if (const Json* ps = member(cp, "pieces")) {
        if (member(cp, "coefficients"))
            r.fail(child(path, "coefficients"), "give either coefficients or pieces, not both");
        if (!ps->is_array() || ps->empty()) r.fail(child(path, "pieces"), "must be a non-empty array");
        readPieces(r, *ps, child(path, "pieces"), piecePaths, [&](const Json& pj, const JsonPath& pp) {
            checkKeys(r, pj, pp, {"Tmin", "Tmax", "coefficients"});
            readPiece(pj, pp);
        });
    } else {
        readPiece(cp, path);
        piecePaths.push_back(path);
    }
}

HeatCapacity readCorrelation(const JsonReader& r, const Json& cp, const JsonPath& path, double M) {
    const std::string form = stringAt(r, cp, path, "form", true);
    std::vector<HeatCapacity::Piece> pieces;
    std::vector<JsonPath> piecePaths;  // where each piece is written
    if (form == "shomate")
        readShomate(r, cp, path, M, pieces, piecePaths);
    else if (form == "polynomial")
        readPolynomial(r, cp, path, M, pieces, piecePaths);
    else
        r.fail(child(path, "form"), "unknown form \"" + form + "\"; valid: shomate, polynomial");
    auto hc = HeatCapacity::fromPieces(std::move(pieces));
    if (!hc) {
        // fromPieces names a piece by its place in the list, "pieces[i]".
        const Error& e = hc.error();
        for (std::size_t i = 0; i < piecePaths.size(); ++i)
            if (e.where == "pieces[" + std::to_string(i) + "]") r.fail(piecePaths[i], e.message);
        r.fail(path, e.message);
    }
    return std::move(*hc);
}

}  // namespace

HeatCapacity readHeatCapacity(const JsonReader& r, const Json& cp, const JsonPath& path, double M) {
    if (cp.is_string()) return HeatCapacity::constant(heatCapacityOf(r, cp, path, M));
    if (!cp.is_object())
        r.fail(path,
               "must be a quantity (\"1.04 kJ/(kg K)\"), a table {\"T\": [...], \"cp\": [...]}, or a "
               "correlation {\"form\": \"shomate\" | \"polynomial\", ...}");
    if (cp.contains("form")) return readCorrelation(r, cp, path, M);
    return readTable(r, cp, path, M);
}

}  // namespace heatchain::detail::substance_fields
