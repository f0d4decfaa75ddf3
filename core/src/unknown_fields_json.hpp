#pragma once
// The JSON behind UnknownFields, for the file's reader and writer and for
// core's optional sections that look a field up by name.
#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/unknown_fields.hpp"

namespace heatchain {

struct UnknownFields::Kept {
    Json object = Json::object();
};

struct UnknownFieldsAccess {
    static const Json& json(const UnknownFields& f);  // an empty object when none
    static UnknownFields of(Json object);
};

namespace detail {
inline const Json& jsonOf(const UnknownFields& f) { return UnknownFieldsAccess::json(f); }
inline UnknownFields unknownFieldsOf(Json object) { return UnknownFieldsAccess::of(std::move(object)); }
}  // namespace detail

}  // namespace heatchain
