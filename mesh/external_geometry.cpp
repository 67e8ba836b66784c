// External geometry (.geo, STEP, BREP) meshed with our size controls, and .msh import.
#include "mesh/external_geometry.hpp"

#include <gmsh.h>

#include <algorithm>
#include <chrono>
#include <filesystem>
#include <map>
#include <set>

#include "mesh/error.hpp"
#include "mesh/gmsh_model.hpp"
#include "mesh/gmsh_session.hpp"

namespace cladwise {
namespace {

std::string lower_extension(const std::string& path) {
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
  return ext;
}

void require_file(const std::string& path) {
  std::error_code ec;
  if (!std::filesystem::is_regular_file(path, ec)) {
    throw InputError(path, "file not found; check the geometry path");
  }
}

detail::RegionOfGroup material_lookup(const std::map<std::string, std::string>& materials,
                                      const std::string& path) {
  return [&materials, path](const std::string& group) {
    const auto it = materials.find(group);
    if (it == materials.end() || it->second.empty()) {
      throw InputError(path, "surface group '" + group +
                                 "' has no material; add it to the material map");
    }
    const RegionRole role = group.rfind("pml", 0) == 0 ? RegionRole::pml : RegionRole::physical;
    return Region{group, it->second, role};
  };
}

// STEP/BREP: fragment all faces, then one physical group per entity name (or per surface).
void group_imported_surfaces() {
  gmsh::vectorpair surfaces;
  gmsh::model::occ::getEntities(surfaces, 2);
  if (surfaces.size() > 1) {
    gmsh::vectorpair out;
    std::vector<gmsh::vectorpair> map;
    gmsh::model::occ::fragment({surfaces.front()}, {surfaces.begin() + 1, surfaces.end()}, out, map);
  }
  gmsh::model::occ::synchronize();
  gmsh::model::getEntities(surfaces, 2);
  std::map<std::string, std::vector<int>> by_name;
  for (const auto& [d, t] : surfaces) {
    std::string name;
    gmsh::model::getEntityName(d, t, name);
    const auto slash = name.find_last_of('/');
    if (slash != std::string::npos) name = name.substr(slash + 1);
    if (name.empty()) name = "surface_" + std::to_string(t);
    by_name[name].push_back(t);
  }
  int tag = 1;
  for (const auto& [name, tags] : by_name) {
    gmsh::model::addPhysicalGroup(2, tags, tag);
    gmsh::model::setPhysicalName(2, tag, name);
    ++tag;
  }
}

void apply_controls(const ExternalGeometry& g) {
  const auto& c = g.controls;
  double x0, y0, z0, x1, y1, z1;
  gmsh::model::getBoundingBox(-1, -1, x0, y0, z0, x1, y1, z1);
  double h_default = c.default_size > 0 ? c.default_size : 0.5 * std::min(x1 - x0, y1 - y0) / 10.0;
  if (c.max_size > 0) h_default = std::min(h_default, c.max_size);

  gmsh::vectorpair groups;
  gmsh::model::getPhysicalGroups(groups, 2);
  std::vector<detail::SizeZone> zones;
  double largest = 0;
  for (const auto& [dim, tag] : groups) {
    std::string name;
    gmsh::model::getPhysicalName(dim, tag, name);
    detail::SizeZone z;
    gmsh::model::getEntitiesForPhysicalGroup(dim, tag, z.surfaces);
    const auto it = g.sizes.find(name);
    if (it != g.sizes.end() && !(it->second > 0)) {
      throw InputError(g.path, "size of group '" + name + "' must be > 0");
    }
    z.size = it != g.sizes.end() ? it->second : h_default;
    if (c.max_size > 0) z.size = std::min(z.size, c.max_size);
    z.boundary_size = g.guiding.count(name) && c.interface_size > 0 ? c.interface_size : z.size;
    std::set<int> curves;
    for (int s : z.surfaces) {
      gmsh::vectorpair bnd;
      gmsh::model::getBoundary({{2, s}}, bnd, false, false, false);
      for (const auto& b : bnd) curves.insert(std::abs(b.second));
    }
    z.boundary_curves.assign(curves.begin(), curves.end());
    largest = std::max(largest, z.size);
    zones.push_back(z);
  }
  detail::set_mesh_options(c.order);
  detail::apply_size_zones(zones, c.growth, c.max_size > 0 ? c.max_size : largest);
}

void fill_report(const Mesh& mesh, MeshReport* report,
                 std::chrono::steady_clock::time_point start) {
  if (!report) return;
  *report = summarize(mesh);
  report->seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

Mesh mesh_external_geometry(const ExternalGeometry& g, MeshReport* report,
                            const std::string& msh_path) {
  require_file(g.path);
  if (g.controls.order != 1 && g.controls.order != 2) {
    throw InputError(g.path, "order must be 1 or 2");
  }
  if (!(g.controls.growth >= 1)) throw InputError(g.path, "growth must be >= 1");
  const std::string ext = lower_extension(g.path);
  const bool cad = ext == ".step" || ext == ".stp" || ext == ".brep" || ext == ".brp";
  if (ext != ".geo" && !cad) {
    throw InputError(g.path, "unknown geometry format '" + ext +
                                 "'; use .geo, .step, .stp, .brep or .brp (or import a .msh)");
  }
  const auto start = std::chrono::steady_clock::now();
  GmshSession session;
  gmsh_call("loading " + g.path, [&] {
    if (cad) {
      gmsh::model::add("cladwise_external");
      gmsh::vectorpair out;
      gmsh::model::occ::importShapes(g.path, out, true);
      group_imported_surfaces();
    } else {
      gmsh::open(g.path);
      gmsh::model::mesh::clear();  // a script may have meshed already; our controls decide
    }
  });
  // Map the groups before meshing so that a missing material fails fast.
  const auto lookup = material_lookup(g.materials, g.path);
  gmsh_call("checking the groups of " + g.path, [&] {
    gmsh::vectorpair groups;
    gmsh::model::getPhysicalGroups(groups, 2);
    if (groups.empty()) {
      throw InputError(g.path, "has no 2-D physical groups; name the surfaces' materials");
    }
    for (const auto& [dim, tag] : groups) {
      std::string name;
      gmsh::model::getPhysicalName(dim, tag, name);
      lookup(name.empty() ? "surface_group_" + std::to_string(tag) : name);
    }
  });
  gmsh_call("setting mesh sizes for " + g.path, [&] { apply_controls(g); });
  gmsh_call("meshing " + g.path, [&] { detail::generate_mesh(g.controls.order); });
  if (!msh_path.empty()) gmsh_call("writing " + msh_path, [&] { gmsh::write(msh_path); });
  Mesh mesh;
  gmsh_call("reading the mesh of " + g.path,
            [&] { mesh = detail::extract_mesh(g.controls.order, lookup, g.path); });
  fill_report(mesh, report, start);
  return mesh;
}

Mesh import_msh(const std::string& path, const std::map<std::string, std::string>& materials,
                MeshReport* report) {
  require_file(path);
  const auto start = std::chrono::steady_clock::now();
  GmshSession session;
  gmsh_call("reading " + path, [&] { gmsh::open(path); });
  Mesh mesh;
  gmsh_call("reading the mesh of " + path,
            [&] { mesh = detail::extract_mesh(0, material_lookup(materials, path), path); });
  fill_report(mesh, report, start);
  return mesh;
}

}  // namespace cladwise
