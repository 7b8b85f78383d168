"""loadscope: every load in a gear drive, and an interactive explorer of them.

Results are for preliminary design. They must be checked by a qualified
engineer; local codes, standards and licensed practice govern.
"""

from .errors import InputError, MechanismError
from .kernel.cases import CaseResult, apply_case, solve_cases
from .kernel.gears import MeshForces, bevel_mesh_forces, mesh_forces
from .kernel.model import Bolt, Coupling, Drive, Gear, Housing, Mesh, PointLoad, Port, Pulley, Section, Shaft, Support
from .kernel.ratingcheck import RatingCheck
from .kernel.ratingdata import Bearing, BearingPair, Fastener, Feature, LoadCase, Material, StiffnessLimits
from .kernel.ratings import CaseRatings, DriveRatings, rate
from .kernel.solve import DriveResult, solve

__version__ = "0.1.0"

CAUTION = ("Results are for preliminary design only. They must be checked by a qualified engineer; "
           "local codes, standards and licensed practice govern.")

__all__ = [
    "CAUTION", "Bolt", "Coupling", "Drive", "DriveResult", "Gear", "Housing", "InputError", "Mesh", "MeshForces",
    "MechanismError", "PointLoad", "Port", "Pulley", "Section", "Shaft", "Support", "bevel_mesh_forces",
    "mesh_forces", "solve",
    # ratings and load cases
    "Bearing", "BearingPair", "CaseRatings", "CaseResult", "DriveRatings", "Fastener", "Feature", "LoadCase",
    "Material", "RatingCheck", "StiffnessLimits", "apply_case", "rate", "solve_cases",
]
