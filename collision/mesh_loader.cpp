#include "collision/mesh_loader.hpp"

#include <assimp/Importer.hpp>
#include <assimp/postprocess.h>
#include <assimp/scene.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <fstream>

#include "kinematics/common/input_error.hpp"

namespace tw::collision {
namespace {

std::string lowerCaseExtension(const std::string& path) {
  const std::size_t dot = path.find_last_of('.');
  const std::size_t slash = path.find_last_of('/');
  if (dot == std::string::npos || (slash != std::string::npos && dot < slash)) return "";
  std::string extension = path.substr(dot + 1);
  std::transform(extension.begin(), extension.end(), extension.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return extension;
}

/// A triangle has no area when its edge cross product vanishes relative to
/// its size; the relative threshold keeps the test independent of units.
bool hasNoArea(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c) {
  const Eigen::Vector3d ab = b - a;
  const Eigen::Vector3d ac = c - a;
  const double scale = std::max(ab.squaredNorm(), ac.squaredNorm());
  return ab.cross(ac).norm() <= 1e-12 * scale || scale == 0.0;
}

void appendNode(const aiScene& scene, const aiNode& node, const aiMatrix4x4& parent,
                const std::string& path, double scale, TriangleMesh& mesh) {
  const aiMatrix4x4 transform = parent * node.mTransformation;
  for (unsigned int m = 0; m < node.mNumMeshes; ++m) {
    const aiMesh& source = *scene.mMeshes[node.mMeshes[m]];
    const int offset = static_cast<int>(mesh.vertices.size());
    for (unsigned int v = 0; v < source.mNumVertices; ++v) {
      const aiVector3D p = transform * source.mVertices[v];
      const Eigen::Vector3d vertex(p.x, p.y, p.z);
      if (!vertex.allFinite()) {
        throw InputError(path, 0, "vertex " + std::to_string(v) + " is not a finite number");
      }
      mesh.vertices.push_back(scale * vertex);
    }
    for (unsigned int f = 0; f < source.mNumFaces; ++f) {
      const aiFace& face = source.mFaces[f];
      // Points and lines (which aiProcess_SortByPType separates) carry no surface.
      if (face.mNumIndices != 3) continue;
      const std::array<int, 3> triangle{{offset + static_cast<int>(face.mIndices[0]),
                                         offset + static_cast<int>(face.mIndices[1]),
                                         offset + static_cast<int>(face.mIndices[2])}};
      if (hasNoArea(mesh.vertices[triangle[0]], mesh.vertices[triangle[1]],
                    mesh.vertices[triangle[2]])) {
        ++mesh.degenerate_triangles;
        continue;
      }
      mesh.triangles.push_back(triangle);
    }
  }
  for (unsigned int c = 0; c < node.mNumChildren; ++c) {
    appendNode(scene, *node.mChildren[c], transform, path, scale, mesh);
  }
}

}  // namespace

TriangleMesh loadMesh(const std::string& path, double scale) {
  if (!std::isfinite(scale) || scale <= 0.0) {
    throw InputError(path, 0, "mesh unit scale must be a positive number, got " +
                                  std::to_string(scale));
  }
  const std::string extension = lowerCaseExtension(path);
  if (extension != "stl" && extension != "obj" && extension != "ply") {
    throw InputError(path, 0, "unsupported mesh format: expected a .stl, .obj or .ply file");
  }
  if (!std::ifstream(path, std::ios::binary).good()) {
    throw InputError(path, 0, "cannot open mesh file");
  }

  Assimp::Importer importer;
  // No aiProcess_FindDegenerates: degenerate triangles are counted here, so
  // that the caller can report them instead of having them vanish.
  const aiScene* scene = importer.ReadFile(
      path, aiProcess_Triangulate | aiProcess_SortByPType);
  if (scene == nullptr || scene->mRootNode == nullptr) {
    throw InputError(path, 0, std::string("cannot read mesh: ") + importer.GetErrorString());
  }

  TriangleMesh mesh;
  mesh.source = path;
  appendNode(*scene, *scene->mRootNode, aiMatrix4x4(), path, scale, mesh);
  if (mesh.triangles.empty()) {
    throw InputError(path, 0,
                     mesh.degenerate_triangles > 0
                         ? "mesh is empty: all " + std::to_string(mesh.degenerate_triangles) +
                               " triangles have no area"
                         : std::string("mesh is empty: no triangles"));
  }
  weldIdenticalVertices(mesh);
  mesh.closed = isClosedSurface(mesh.triangles);
  return mesh;
}

}  // namespace tw::collision
