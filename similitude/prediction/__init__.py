"""prediction"""
