"""correlations"""
