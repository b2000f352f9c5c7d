using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class SpeciesDescription : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<string>(
                name: "Description",
                table: "Species",
                type: "TEXT",
                maxLength: 4000,
                nullable: false,
                defaultValue: "");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "Description",
                table: "Species");
        }
    }
}
