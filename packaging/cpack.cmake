# CPack: `cpack -G DEB` (or `cmake --build build --target package`) makes
# heatchain_<version>_amd64.deb. The library dependencies are worked out from
# the binaries by dpkg-shlibdeps, never listed by hand.
set(CPACK_GENERATOR DEB)
set(CPACK_PACKAGE_NAME heatchain)
set(CPACK_PACKAGE_VERSION "${PROJECT_VERSION}")
set(CPACK_PACKAGE_VENDOR "The Heatchain developers")
set(CPACK_PACKAGE_CONTACT "The Heatchain developers <${HEATCHAIN_MAINTAINER_EMAIL}>")
set(CPACK_PACKAGE_DESCRIPTION_SUMMARY "worksheet for thermal processes")
# The extended description (CPack puts the summary above it as the synopsis).
set(CPACK_DEBIAN_PACKAGE_DESCRIPTION
"Heatchain chains the steps one material passes through (heat, cool, melt,
freeze, boil, condense, sublimate, deposit, compress, expand, throttle) and
computes the state after every step with its duty, work, enthalpy change,
entropy change, entropy generation and exergy destroyed, from published
property models with their sources shown.

This package holds the desktop application heatchain, the command-line
program heatchain-cli and the Python 3 module heatchain.")
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_SECTION science)
set(CPACK_DEBIAN_PACKAGE_PRIORITY optional)
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
# Only what dpkg-shlibdeps cannot see: the interpreter the Python module's
# extension is built for (its ABI tag is cpython-311) and the NumPy it imports.
set(CPACK_DEBIAN_PACKAGE_DEPENDS "python3 (>= 3.11~), python3 (<< 3.12), python3-numpy")
set(CPACK_PACKAGING_INSTALL_PREFIX /usr)
set(CPACK_STRIP_FILES ON)
set(CPACK_SOURCE_IGNORE_FILES "/build[^/]*/" "/\\\\.git/")
include(CPack)
