#pragma once

#include <string>

#include "collision/triangle_mesh.hpp"

namespace tw::collision {

/// Reads a triangle mesh from an STL (binary or ASCII), OBJ or PLY file
/// through assimp and scales it to metres: `scale` is metres per file unit
/// (0.001 for a file in mm, the default in the arm and cell formats).
/// Polygons are triangulated and vertices at one position merged; every mesh and
/// node of the file is flattened into one surface in the file's frame.
///
/// Throws tw::InputError naming the file and the problem when the file is
/// missing or unreadable, its extension is not one of .stl .obj .ply, the
/// importer rejects it, it holds no triangles, a vertex is not finite, or
/// the scale is not a positive finite number. Triangles without area are not
/// an error: they are dropped and counted in `degenerate_triangles`, so the
/// caller can report them.
TriangleMesh loadMesh(const std::string& path, double scale);

}  // namespace tw::collision
