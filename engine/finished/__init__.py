"""The finished composite beam: loads and demand, slab force from the studs, strength and stiffness checks."""
