"""The bay: girders and the beams framing into them, through the pour."""
