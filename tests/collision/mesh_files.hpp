#pragma once

#include <string>

#include "collision/triangle_mesh.hpp"

namespace tw::collision::test {

/// Writers of mesh files for tests and benchmarks. Coordinates are written
/// in millimetres (the mesh is in metres), as the cell formats expect.

/// Binary STL laid out byte by byte as the format defines it: an 80-byte
/// header, a little-endian uint32 triangle count, then per triangle 50
/// bytes (normal and three corners as little-endian float32, a uint16
/// attribute count).
void writeBinaryStl(const std::string& path, const TriangleMesh& mesh);
void writeAsciiStl(const std::string& path, const TriangleMesh& mesh);
void writeObj(const std::string& path, const TriangleMesh& mesh);
void writeAsciiPly(const std::string& path, const TriangleMesh& mesh);

/// Writes `text` to `path` as it is.
void writeText(const std::string& path, const std::string& text);

}  // namespace tw::collision::test
