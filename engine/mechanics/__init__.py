"""Simple-span statics (V, M, deflection with EI(x)) and the level-screed ponding solve."""
