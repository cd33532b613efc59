"""The beam as built: inspection findings applied rib by rib, and the repair that restores it."""
