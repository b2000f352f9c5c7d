using System;
using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class IsotopologueSets : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateTable(
                name: "IsotopologueSets",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ReactionId = table.Column<int>(type: "INTEGER", nullable: false),
                    SaddlePosition = table.Column<int>(type: "INTEGER", nullable: false),
                    Name = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    SaddleSubstitutions = table.Column<string>(type: "TEXT", maxLength: 4000, nullable: false),
                    ReactantSubstitutions = table.Column<string>(type: "TEXT", maxLength: 8000, nullable: false),
                    Mapping = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    CreatedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    CreatedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_IsotopologueSets", x => x.Id);
                    table.ForeignKey(
                        name: "FK_IsotopologueSets_Reactions_ReactionId",
                        column: x => x.ReactionId,
                        principalTable: "Reactions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateIndex(
                name: "IX_IsotopologueSets_ReactionId",
                table: "IsotopologueSets",
                column: "ReactionId");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropTable(
                name: "IsotopologueSets");
        }
    }
}
